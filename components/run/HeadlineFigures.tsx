"use client";
/** Headline figures with their check state (colour + word + icon, so colour is never the only signal). */
import type { Check, CheckState, Summary } from "@/sim";
import { cx } from "@/components/ui/cx";
import { formatQuantity, formatReason, type UnitSystem } from "@/lib/client/units";

const STATE: Record<CheckState, { word: string; icon: string; box: string; text: string }> = {
  pass: { word: "Pass", icon: "✓", box: "border-pass/30 bg-pass/[0.04]", text: "text-pass" },
  caution: { word: "Caution", icon: "!", box: "border-caution/50 bg-caution/[0.07]", text: "text-[#7a5400]" },
  fail: { word: "Fail", icon: "✕", box: "border-fail/40 bg-fail/[0.05]", text: "text-fail" },
};

export function StateMark({ state }: { state: CheckState }) {
  const s = STATE[state];
  return (
    <span className={cx("inline-flex items-center gap-1 text-[11.5px] font-bold uppercase tracking-wide", s.text)} data-state={state}>
      <span aria-hidden className={cx("inline-flex size-4 items-center justify-center rounded-full border text-[10px] leading-none", state === "caution" ? "border-caution" : state === "pass" ? "border-pass" : "border-fail")}>
        {s.icon}
      </span>
      {s.word}
    </span>
  );
}

function headline(c: Check, s: Summary, units: UnitSystem): { value: string; sub?: string } {
  switch (c.key) {
    case "snatch":
      return { value: formatQuantity(s.peakTension, "force", units), sub: s.snatchFactor !== null ? `snatch factor ${s.snatchFactor.toFixed(2)}×` : "no steady climb" };
    case "safetyFactor":
      return { value: typeof c.value === "number" ? c.value.toFixed(2) : "—", sub: `required ${c.limit}` };
    case "rollback":
      return { value: formatQuantity(s.rollbackDistance, "smallLength", units), sub: `${s.ardCatches} ARD catch${s.ardCatches === 1 ? "" : "es"}` };
    case "pickup":
      return { value: s.pickupDelay === null ? "—" : `${s.pickupDelay.toFixed(2)} s`, sub: s.engagementTime !== null ? `dog engages at ${s.engagementTime.toFixed(2)} s` : "no engagement" };
    case "takeUpTravel":
      return { value: `${formatQuantity(s.takeUpMaxDrop, "smallLength", units, 0)} / ${formatQuantity(s.takeUpMaxRise, "smallLength", units, 0)}`, sub: `down / up${s.takeUpEndStop ? " · hit an end stop" : ""}` };
    case "takeUpCreep":
      return { value: formatQuantity(s.takeUpCreepRate, "rate", units), sub: "over the steady climb" };
    case "drivePower":
      return { value: formatQuantity(s.peakDrivePower, "power", units), sub: typeof c.limit === "number" ? `motor ${formatQuantity(c.limit, "power", units)}` : "no motor rating" };
    case "riderAccel":
      return { value: `${s.peakRiderAccel.toFixed(2)} g`, sub: `limit ${c.limit} g` };
    default:
      return { value: typeof c.value === "number" ? c.value.toPrecision(3) : String(c.value ?? "—") };
  }
}

export function HeadlineFigures({ checks, summary, units, dim }: { checks: Check[]; summary: Summary; units: UnitSystem; dim?: boolean }) {
  const counts = { pass: 0, caution: 0, fail: 0 };
  for (const c of checks) counts[c.state]++;
  return (
    <section aria-label="Headline figures" data-testid="headline-figures" className={cx("space-y-2 transition-opacity", dim && "opacity-60")}>
      <div className="flex items-center gap-3 text-[12.5px] text-steel-500">
        <span data-testid="check-counts">
          {counts.fail} fail · {counts.caution} caution · {counts.pass} pass
        </span>
      </div>
      <div className="grid gap-2 sm:grid-cols-2 xl:grid-cols-4">
        {checks.map((c) => {
          const h = headline(c, summary, units);
          return (
            <article key={c.key} className={cx("rounded-md border px-3 py-2.5", STATE[c.state].box)} data-testid={`check-${c.key}`} data-state={c.state}>
              <div className="flex items-start justify-between gap-2">
                <h3 className="text-[12px] font-semibold leading-tight text-ink-800">{c.label}</h3>
                <StateMark state={c.state} />
              </div>
              <p className="mt-1 font-mono text-[17px] font-bold leading-tight tabular-nums text-ink-950" data-testid={`figure-${c.key}`}>
                {h.value}
              </p>
              {h.sub && <p className="text-[11.5px] text-steel-500">{h.sub}</p>}
              <p className="mt-1 text-[11.5px] leading-snug text-ink-800" data-testid={`reason-${c.key}`}>
                {formatReason(c, units)}
              </p>
            </article>
          );
        })}
      </div>
    </section>
  );
}
