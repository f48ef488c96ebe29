"use client";
/** Everything a result shows: headline figures, notes, replay with the settle-back account, plots, caution. */
import { memo, useCallback, useLayoutEffect } from "react";
import { Card } from "@/components/ui/Card";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { RunPlots } from "@/components/plot/RunPlots";
import { ReplayPanel } from "@/components/replay/ReplayPanel";
import type { UnitSystem } from "@/lib/client/units";
import { HeadlineFigures } from "./HeadlineFigures";
import { MeshConfidenceNote } from "./MeshConfidenceNote";
import { SettleBackPanel } from "./SettleBackPanel";
import { DriveDampingPanel } from "./DriveDampingPanel";
import { runTrains } from "./runTrains";
import type { RunData } from "./types";
import { previewCommitted, previewDrawn } from "./previewTiming";
import { useRunStore } from "./store";

const ORIGIN: Record<RunData["origin"], string> = {
  browser: "Run in this browser",
  preview: "Coarse what-if preview",
  server: "Saved run",
};

/** Memoised: slider moves and progress ticks re-render the run view, not the result until it changes. */
export const RunResults = memo(function RunResults({ data, units, initialT, fileStem }: { data: RunData; units: UnitSystem; initialT?: number; fileStem: string }) {
  const s = data.summary;
  const previewId = data.previewId;
  useLayoutEffect(() => previewCommitted(previewId), [previewId]);
  // A preview's latency is counted to the plots drawing it (see previewTiming.ts).
  const onDrawn = useCallback(() => {
    const b = previewDrawn(previewId);
    if (b) useRunStore.getState().set({ previewLatencyMs: b.total });
  }, [previewId]);
  return (
    <div className="min-w-0 space-y-5" data-testid="run-results" data-origin={data.origin}>
      <SafetyNote className="rounded-md border border-caution/40 bg-caution/[0.06] px-3 py-2" />
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1 font-mono text-[11.5px] text-steel-500" data-testid="run-origin">
        <span className="font-sans text-[12px] font-semibold text-ink-800">{ORIGIN[data.origin]}</span>
        <span>{s.segments} segments</span>
        <span>{s.integrator}</span>
        <span>{s.simulatedTime.toFixed(1)} s simulated</span>
        <span>{data.frames.length} frames</span>
        {data.wallTimeMs > 0 && <span>{(data.wallTimeMs / 1000).toFixed(2)} s to compute</span>}
      </div>
      <HeadlineFigures checks={data.checks} summary={s} units={units} dim={data.origin === "preview"} />
      <MeshConfidenceNote confidence={data.meshConfidence} error={data.meshError} />
      {data.notes.length > 0 && (
        <ul className="space-y-0.5 text-[12.5px] text-ink-800" data-testid="run-notes">
          {data.notes
            .filter((n) => !n.startsWith("Results support"))
            .map((n) => (
              <li key={n} className="flex gap-2">
                <span aria-hidden className="text-steel-500">–</span>
                {n}
              </li>
            ))}
        </ul>
      )}
      <DriveDampingPanel data={data} units={units} />
      <Card className="p-3">
        <div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_300px]">
          <ReplayPanel scenario={data.scenario} frames={data.frames} layout={data.layout} series={data.series} summary={s} units={units} initialT={initialT} />
          <SettleBackPanel data={data} units={units} />
        </div>
      </Card>
      <RunPlots
        series={data.series}
        units={units}
        chainSpeed={data.scenario.drive.speed}
        rampTime={data.scenario.drive.rampTime}
        fileStem={fileStem}
        frames={data.frames}
        layout={data.layout}
        dogOffset={runTrains(data)[0]!.train.dogOffset}
        dogRelease={data.scenario.lift.dogRelease}
        onDrawn={onDrawn}
      />
      <SafetyNote />
    </div>
  );
});
