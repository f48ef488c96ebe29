"use client";
/** Headline figures with their check state (colour + word + icon, so colour is never the only signal). */
import { LIMIT_SOURCES, SUMMARY_DEFINITIONS, type Check, type CheckState, type Summary } from "@/sim";
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

const secs = (v: number | null | undefined) => (typeof v === "number" ? `${v.toFixed(2)} s` : "—");

function headline(c: Check, s: Summary, units: UnitSystem): { value: string; sub?: string } {
  switch (c.key) {
    case "snatch": {
      // Summaries stored before the surge figures lack them: show what there is.
      const surge = typeof s.surgeAmplitude === "number" ? ` · surge ±${formatQuantity(s.surgeAmplitude, "speed", units)}` : "";
      const zeta = typeof s.surgeDampingRatio === "number" ? `, ζ ${(s.surgeDampingRatio * 100).toFixed(1)} %` : "";
      return {
        value: formatQuantity(s.peakTension, "force", units),
        sub: `${s.snatchFactor !== null ? `snatch factor ${s.snatchFactor.toFixed(2)}× (peak / steady drive tension)` : "no steady climb"}${surge}${zeta}`,
      };
    }
    case "safetyFactor":
      return { value: typeof c.value === "number" ? c.value.toFixed(2) : "—", sub: `required ${c.limit}` };
    case "workingLoad":
      return { value: typeof c.value === "number" ? `${(c.value * 100).toFixed(0)} %` : "—", sub: "peak tension / allowable working load" };
    case "breakingStrength":
      return { value: typeof c.value === "number" ? `${c.value.toFixed(2)}×` : "—", sub: "breaking strength / 12,500·P² lbf (ASME B29.1)" };
    case "rollback": {
      const bounces = typeof s.ardBounces === "number" && s.ardBounces > 0 ? ` · ${s.ardBounces} bounce${s.ardBounces === 1 ? "" : "s"}` : "";
      return { value: formatQuantity(s.rollbackDistance, "smallLength", units), sub: `${s.ardCatches} ARD catch${s.ardCatches === 1 ? "" : "es"}${bounces}` };
    }
    case "pickup":
      return {
        value: `${secs(s.pickupDelay)} / ${secs(s.timeToChainSpeed)}`,
        sub: `load pick-up delay / time to chain speed${s.engagementTime !== null ? ` · dog engages at ${s.engagementTime.toFixed(2)} s` : " · no engagement"}`,
      };
    case "takeUpTravel":
      return { value: `${formatQuantity(s.takeUpMaxDrop, "smallLength", units, 0)} / ${formatQuantity(s.takeUpMaxRise, "smallLength", units, 0)}`, sub: `down / up${s.takeUpEndStop ? " · hit an end stop" : ""}` };
    case "takeUpWear":
      return { value: typeof c.value === "number" ? `${c.value.toFixed(1)} %` : "—", sub: `wear elongation the take-up absorbs · allowance ${c.limit} %` };
    case "takeUpCreep":
      return { value: formatQuantity(s.takeUpCreepRate, "rate", units), sub: "drop rate over the steady climb (negative: rising)" };
    case "drivePower":
    {
      // Runs stored before the drive had its own speed lack the steady chain speed.
      const steady = typeof s.steadyChainSpeed === "number" ? ` · steady chain speed ${formatQuantity(s.steadyChainSpeed, "speed", units)}` : "";
      return { value: formatQuantity(s.peakDrivePower, "power", units), sub: `${typeof c.limit === "number" ? `motor ${formatQuantity(c.limit, "power", units)}` : "no motor rating"}${steady}` };
    }
    case "release": {
      const r = s.release ?? null;
      if (!r) return { value: "—", sub: "the dog was not released during the run" };
      return {
        value: r.margin !== null ? `${r.margin.toFixed(2)}×` : "—",
        sub: `kinetic energy / energy to clear the crest at ${formatQuantity(r.speed, "speed", units)}${typeof c.limit === "number" ? ` · needs ${c.limit}×` : ""}`,
      };
    }
    case "riderAccel":
      return { value: `${s.peakRiderAccel.toFixed(2)} g`, sub: typeof c.value === "number" ? `uses ${(c.value * 100).toFixed(0)} % of the envelope` : `limit ${c.limit}` };
    default:
      return { value: typeof c.value === "number" ? c.value.toPrecision(3) : String(c.value ?? "—") };
  }
}

/** What each card's figures mean and where its limit comes from, one click away. */
const DEFINITIONS: Record<string, string[]> = {
  snatch: [SUMMARY_DEFINITIONS.snatchFactor, SUMMARY_DEFINITIONS.steadyTension, SUMMARY_DEFINITIONS.surgeAmplitude, SUMMARY_DEFINITIONS.surgeDampingRatio, `Limit: ${LIMIT_SOURCES.maxSnatchFactor}`],
  safetyFactor: [SUMMARY_DEFINITIONS.minSafetyFactor, `Limit: ${LIMIT_SOURCES.requiredSafetyFactor}`],
  workingLoad: ["Steady tension (statics, worst train position) and peak tension (run) against the chain's allowable working load.", `Limit: ${LIMIT_SOURCES.allowableWorkingLoad} ${LIMIT_SOURCES.workingLoadFraction}`],
  breakingStrength: [`Limits: ${LIMIT_SOURCES.minBreakingRatio} ${LIMIT_SOURCES.maxBreakingRatio}`],
  rollback: [SUMMARY_DEFINITIONS.rollbackDistance, SUMMARY_DEFINITIONS.ardCatches, SUMMARY_DEFINITIONS.ardBounces, `Limit: ${LIMIT_SOURCES.allowRollback}`],
  pickup: [SUMMARY_DEFINITIONS.pickupDelay, SUMMARY_DEFINITIONS.timeToChainSpeed, `Limits: ${LIMIT_SOURCES.maxPickupDelay} ${LIMIT_SOURCES.maxTimeToChainSpeed}`],
  takeUpTravel: [SUMMARY_DEFINITIONS.takeUpMaxDrop, SUMMARY_DEFINITIONS.takeUpMaxRise, "The running budget is the elastic drop at the longest loaded length plus thermal growth, against the travel; wear is judged apart."],
  takeUpWear: ["Wear elongation of the loop that the travel left after the elastic drop and thermal growth can take up.", `Allowance: ${LIMIT_SOURCES.wearAllowance}`],
  takeUpCreep: [SUMMARY_DEFINITIONS.takeUpCreepRate],
  drivePower: ["Motor power = chain pull × speed / efficiency.", SUMMARY_DEFINITIONS.steadyChainSpeed, `Limit: ${LIMIT_SOURCES.motorRating}`],
  release: [SUMMARY_DEFINITIONS.release, `Limit: ${LIMIT_SOURCES.releaseEnergyMargin}`],
  riderAccel: [SUMMARY_DEFINITIONS.peakRiderAccel, SUMMARY_DEFINITIONS.riderAccelExposure, `Limits: ${LIMIT_SOURCES.maxRiderAccel} ${LIMIT_SOURCES.riderAccelSustained} ${LIMIT_SOURCES.riderAccelCeiling} ${LIMIT_SOURCES.riderAccelBackwardScale}`],
};

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
              {DEFINITIONS[c.key] && (
                <details className="mt-1 text-[11px] leading-snug text-steel-500" data-testid={`definition-${c.key}`}>
                  <summary className="cursor-pointer select-none">Definition and limit</summary>
                  {DEFINITIONS[c.key].map((line) => (
                    <p key={line} className="mt-0.5">
                      {line}
                    </p>
                  ))}
                </details>
              )}
            </article>
          );
        })}
      </div>
      <OperationsLines checks={checks} summary={summary} units={units} />
    </section>
  );
}

/**
 * Per train: what a stop on the lift did (peak ARD force, rollback, restart to pick-up), a release that did not
 * clear the crest with the margin asked, and a re-engagement after the release, each on its own line.
 */
function OperationsLines({ checks, summary, units }: { checks: Check[]; summary: Summary; units: UnitSystem }) {
  const trains = summary.trains ?? [];
  const many = trains.length > 1;
  const margin = checks.find((c) => c.key === "release")?.limit;
  const lines: { id: string; tone: "fail" | "note"; text: string }[] = [];
  trains.forEach((t, i) => {
    const who = many ? `Train ${i + 1}: ` : "";
    // With several trains, each one's own pick-up and release first.
    if (many)
      lines.push({
        id: `train-${i + 1}`,
        tone: "note",
        text: `${who}${t.engagementTime !== null ? `dog engages at ${secs(t.engagementTime)}` : "not picked up"}${t.release ? ` · released at the crest at ${secs(t.release.time)}` : ""} · peak dog force ${formatQuantity(t.peakDogForce, "force", units)} · ${t.ardCatches} ARD catch${t.ardCatches === 1 ? "" : "es"}`,
      });
    const st = t.stop;
    if (st) {
      const restart =
        st.restartTime === null
          ? "no restart in the run"
          : st.restartToPickup !== null
            ? `restart → pick-up ${secs(st.restartToPickup)}`
            : "not picked up again after the restart";
      lines.push({
        id: `stop-${i}`,
        tone: st.ardCatches > 0 ? "fail" : "note",
        text: `${who}${st.kind === "brake" ? "brake stop" : "power loss"} at ${secs(st.time)} · peak ARD force ${formatQuantity(st.peakArdForce, "force", units)} · rollback ${formatQuantity(st.rollback, "smallLength", units)} · ${restart}`,
      });
    }
    const r = t.release;
    if (r && r.margin !== null && typeof margin === "number" && r.margin < margin)
      lines.push({
        id: `release-${i}`,
        tone: "fail",
        text: `${who}release check failed: at the release the train carried ${r.margin.toFixed(2)}× the energy to clear the crest, less than the ${margin}× asked`,
      });
    if (r && r.reengagedAt !== null)
      lines.push({ id: `reengaged-${i}`, tone: "fail", text: `${who}fell back onto the chain after the release: a dog engaged again at ${secs(r.reengagedAt)}` });
  });
  if (!lines.length) return null;
  return (
    <ul className="space-y-1 text-[12.5px]" data-testid="operations-lines">
      {lines.map((l) => (
        <li key={l.id} data-testid={`line-${l.id}`} className={cx("rounded-md border px-3 py-1.5 font-mono tabular-nums", l.tone === "fail" ? "border-fail/30 bg-fail/[0.04] text-ink-900" : "border-steel-300/70 bg-white text-ink-800")}>
          {l.text}
        </li>
      ))}
    </ul>
  );
}
