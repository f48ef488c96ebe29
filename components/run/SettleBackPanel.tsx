"use client";
/** The plain-language account of an ARD catch, beside the replay, with a button to go to the catch. */
import { useMemo } from "react";
import { Button } from "@/components/ui/Button";
import { useReplayStore, useReplayTime } from "@/components/replay/store";
import type { RunData } from "./types";
import { settleBackAccount, type SettleBackAccount } from "@/lib/runs/settle-back";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { runTrains } from "./runTrains";

/** One account per train that settled back onto the ARD, in the reader's units. */
export function SettleBackPanel({ data, units }: { data: RunData; units: UnitSystem }) {
  const accounts = useMemo(
    () =>
      runTrains(data).flatMap((rt) => {
        const account = settleBackAccount({
          lift: data.scenario.lift,
          chain: data.scenario.chain,
          drive: data.scenario.drive,
          train: rt.train,
          gravity: data.scenario.run.gravity,
          summary: data.summary,
          series: rt.signals,
        }, units);
        return account ? [{ label: rt.label, account }] : [];
      }),
    [data, units],
  );
  if (!accounts.length) return null;
  return (
    <div className="space-y-3">
      {accounts.map((a) => (
        <SettleBackCard key={a.label || "train"} label={a.label} account={a.account} units={units} />
      ))}
    </div>
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
        <Button
          size="sm"
          variant="secondary"
          onClick={() => {
            const s = useReplayStore.getState();
            s.setPlaying(false);
            s.setT(account.catchTime);
          }}
          data-testid="go-to-catch"
          className="shrink-0 whitespace-nowrap"
        >
          Go to the catch
        </Button>
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
