"use client";
/** The run view's short account of the drive model and the damping sources, with the numbers the run used. */
import { useMemo } from "react";
import type { UnitSystem } from "@/lib/client/units";
import { driveDampingAccount } from "./driveDamping";
import type { RunData } from "./types";

export function DriveDampingPanel({ data, units }: { data: RunData; units: UnitSystem }) {
  const lines = useMemo(() => {
    const s = data.scenario;
    // Surge figures of the engine's summary (absent in runs made before they existed).
    const figures = data.summary as unknown as Record<string, unknown>;
    // null: the engine could not measure it; undefined: the run's figures do not include it.
    const n = (k: string) => (typeof figures[k] === "number" ? (figures[k] as number) : figures[k] === null ? null : undefined);
    const summary = { steadyChainSpeed: n("steadyChainSpeed"), surgeAmplitude: n("surgeAmplitude"), surgeDampingRatio: n("surgeDampingRatio") };
    return driveDampingAccount({ drive: s.drive, chain: s.chain, takeUp: s.takeUp, contacts: s.contacts, gravity: s.run.gravity, summary }, units);
  }, [data, units]);
  return (
    <details className="rounded-lg border border-steel-300/70 bg-white" data-testid="drive-damping" open>
      <summary className="cursor-pointer px-4 py-2.5 text-[13px] font-semibold text-ink-900">Drive model and damping in this run</summary>
      <dl className="grid gap-x-6 gap-y-2 border-t border-steel-100 px-4 py-3 text-[12.5px] md:grid-cols-2">
        {lines.map((l) => (
          <div key={l.key} data-testid={`drive-damping-${l.key}`}>
            <dt className="font-semibold text-ink-900">{l.title}</dt>
            <dd className="leading-snug text-ink-800">{l.text}</dd>
          </div>
        ))}
      </dl>
      <p className="border-t border-steel-100 px-4 py-2 text-[11.5px] text-steel-500">
        The model leaves out the gearbox&apos;s backlash, the chain&apos;s polygon (chordal) action at the sprocket and any damping not listed here;
        calibrate the loss factor and friction against recordings of the lift.
      </p>
    </details>
  );
}
