"use client";
/** The plain-language account of an ARD catch, beside the replay, with a button to go to the catch. */
import { useMemo } from "react";
import { Button } from "@/components/ui/Button";
import { useReplayStore, useReplayTime } from "@/components/replay/store";
import type { RunData } from "./types";
import { settleBackAccount } from "./settleBack";

export function SettleBackPanel({ data }: { data: RunData }) {
  const account = useMemo(
    () =>
      settleBackAccount({
        lift: data.scenario.lift,
        chain: data.scenario.chain,
        drive: data.scenario.drive,
        train: data.scenario.train,
        gravity: data.scenario.run.gravity,
        summary: data.summary,
        series: data.series,
      }),
    [data],
  );
  const t = useReplayTime(200);
  if (!account) return null;
  const near = Math.abs(t - account.catchTime) < 0.6 || (account.pickupTime !== null && t >= account.catchTime && t <= account.pickupTime);
  return (
    <aside className={`rounded-lg border bg-white px-4 py-3 transition-colors ${near ? "border-fail/50 ring-2 ring-fail/15" : "border-steel-300/70"}`} data-testid="settle-back">
      <div className="flex items-start justify-between gap-3">
        <div>
          <p className="font-mono text-[10.5px] font-semibold uppercase tracking-[0.14em] text-fail">ARD catch at {account.catchTime.toFixed(2)} s</p>
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
        <dd className="text-right text-ink-900">{(account.stretch * 1000).toFixed(0)} mm</dd>
        <dt>pay-out at chain speed</dt>
        <dd className="text-right text-ink-900">{account.stretchTime.toFixed(2)} s</dd>
        <dt>rest on the ARD (run)</dt>
        <dd className="text-right text-ink-900" data-testid="settle-rest">{account.restTime === null ? "—" : `${account.restTime.toFixed(2)} s`}</dd>
        <dt>rollback</dt>
        <dd className="text-right text-ink-900">{(account.rollback * 1000).toFixed(0)} mm</dd>
      </dl>
      <p className="mt-2 text-[11px] text-steel-500">
        A simple reading of the run (static stretch of the loaded chain); the simulation itself includes the take-up, damping and the dog contact.
      </p>
    </aside>
  );
}
