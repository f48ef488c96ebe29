"use client";
/** The plain-language account of an ARD catch, beside the replay, with a button to go to the catch. */
import { useMemo } from "react";
import { Button } from "@/components/ui/Button";
import { useReplayStore, useReplayTime } from "@/components/replay/store";
import type { RunData } from "./types";
import { settleBackAccount, type SettleBackAccount } from "@/lib/runs/settle-back";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { runTrains } from "./runTrains";
import { stopAccount, type StopAccount } from "@/lib/runs/stop-account";

/** The first time the train's ARD force is above zero, s (null: never). */
function firstCatch(signals: { t: readonly number[]; ardForce: readonly number[] }): number | null {
  const i = signals.ardForce.findIndex((f) => f > 0);
  return i >= 0 ? signals.t[i]! : null;
}

/**
 * One account per train: a settle-back at the pick-up (onto the ARD before any stop), and what a stop on the
 * lift did to it (the inequality that decides a rollback, the ARD catch, the restart), in the reader's units.
 */
export function SettleBackPanel({ data, units }: { data: RunData; units: UnitSystem }) {
  const accounts = useMemo(
    () =>
      runTrains(data).flatMap((rt) => {
        const stop = data.summary.trains?.[rt.index]?.stop ?? (rt.index === 0 ? (data.summary.stop ?? null) : null);
        const out: ({ kind: "pickup"; label: string; account: SettleBackAccount } | { kind: "stop"; label: string; account: StopAccount })[] = [];
        const caught = firstCatch(rt.signals);
        // A catch that comes only after the stop is the stop's, not the pick-up's.
        if (!stop || (caught !== null && caught < stop.time)) {
          const account = settleBackAccount({
            lift: data.scenario.lift,
            chain: data.scenario.chain,
            drive: data.scenario.drive,
            train: rt.train,
            gravity: data.scenario.run.gravity,
            summary: data.summary,
            series: rt.signals,
          }, units);
          if (account) out.push({ kind: "pickup", label: rt.label, account });
        }
        if (stop) {
          const duration = data.scenario.drive.stop?.duration ?? null;
          out.push({ kind: "stop", label: rt.label, account: stopAccount({ stop, duration, series: rt.signals }, units) });
        }
        return out;
      }),
    [data, units],
  );
  if (!accounts.length) return null;
  return (
    <div className="space-y-3">
      {accounts.map((a) =>
        a.kind === "pickup" ? (
          <SettleBackCard key={`p-${a.label || "train"}`} label={a.label} account={a.account} units={units} />
        ) : (
          <StopCard key={`s-${a.label || "train"}`} label={a.label} account={a.account} />
        ),
      )}
    </div>
  );
}

function StopCard({ label, account }: { label: string; account: StopAccount }) {
  const t = useReplayTime(200);
  const near = account.catchTime !== null && (Math.abs(t - account.catchTime) < 0.6 || (account.pickupTime !== null && t >= account.catchTime && t <= account.pickupTime));
  return (
    <aside className={`rounded-lg border bg-white px-4 py-3 transition-colors ${near ? "border-fail/50 ring-2 ring-fail/15" : "border-steel-300/70"}`} data-testid="stop-account">
      <div className="flex items-start justify-between gap-3">
        <div>
          <p className="font-mono text-[10.5px] font-semibold uppercase tracking-[0.14em] text-fail">
            {label ? `${label}: ` : ""}stop on the lift · {account.inequality}
          </p>
          <h3 className="text-[14.5px] font-bold text-ink-900">{account.predictsRollback ? "Why the train settled back at the stop" : "Why the chain held the train at the stop"}</h3>
        </div>
        {account.catchTime !== null && (
          <GoToCatch time={account.catchTime!} testId="go-to-stop-catch" />
        )}
      </div>
      <div className="mt-2 space-y-1.5 text-[13px] leading-relaxed text-ink-800" data-testid="stop-account-text">
        {account.sentences.map((s, i) => (
          <p key={i}>{s}</p>
        ))}
      </div>
      <p className="mt-2 text-[11px] text-steel-500">
        The inequality is that of a suddenly stopped spring and mass; a slower brake or a coasting drive swings less. Results support, and never replace, review by a qualified engineer.
      </p>
    </aside>
  );
}

/** Stops the replay at the catch: the panel's link between the account and the picture. */
function GoToCatch({ time, testId }: { time: number; testId: string }) {
  return (
    <Button
      size="sm"
      variant="secondary"
      onClick={() => {
        const s = useReplayStore.getState();
        s.setPlaying(false);
        s.setT(time);
      }}
      data-testid={testId}
      className="shrink-0 whitespace-nowrap"
    >
      Go to the catch
    </Button>
  );
}

function SettleBackCard({ label, account, units }: { label: string; account: SettleBackAccount; units: UnitSystem }) {
  const t = useReplayTime(200);
  const near = Math.abs(t - account.catchTime) < 0.6 || (account.pickupTime !== null && t >= account.catchTime && t <= account.pickupTime);
  return (
    <aside className={`rounded-lg border bg-white px-4 py-3 transition-colors ${near ? "border-fail/50 ring-2 ring-fail/15" : "border-steel-300/70"}`} data-testid="settle-back">
      <div className="flex items-start justify-between gap-3">
        <div>
          <p className="font-mono text-[10.5px] font-semibold uppercase tracking-[0.14em] text-fail">{label ? `${label}: ` : ""}ARD catch at {formatQuantity(account.catchTime, "time", units)}</p>
          <h3 className="text-[14.5px] font-bold text-ink-900">Why the train settled back</h3>
        </div>
        <GoToCatch time={account.catchTime} testId="go-to-catch" />
      </div>
      <div className="mt-2 space-y-1.5 text-[13px] leading-relaxed text-ink-800" data-testid="settle-back-text">
        {account.sentences.map((s, i) => (
          <p key={i}>{s}</p>
        ))}
      </div>
      <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 border-t border-steel-100 pt-2 font-mono text-[11.5px] tabular-nums text-steel-500">
        <dt>stretch needed</dt>
        <dd className="text-right text-ink-900">{formatQuantity(account.stretch, "smallLength", units, units === "si" ? 0 : undefined)}</dd>
        <dt>pay-out at chain speed</dt>
        <dd className="text-right text-ink-900">{formatQuantity(account.stretchTime, "time", units)}</dd>
        <dt>rest on the ARD (run)</dt>
        <dd className="text-right text-ink-900" data-testid="settle-rest">{formatQuantity(account.restTime, "time", units)}</dd>
        <dt>rollback</dt>
        <dd className="text-right text-ink-900">{formatQuantity(account.rollback, "smallLength", units, units === "si" ? 0 : undefined)}</dd>
      </dl>
      <p className="mt-2 text-[11px] text-steel-500">
        A simple reading of the run (static stretch of the loaded chain); the simulation itself includes the take-up, damping and the dog contact.
      </p>
    </aside>
  );
}
