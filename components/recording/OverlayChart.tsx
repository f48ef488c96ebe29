"use client";
/** The recorded take-up trace over a run's (or a fitted run's), aligned at engagement, with uPlot. */
import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

export interface Trace {
  label: string;
  t: number[];
  y: (number | null)[];
  colour: string;
}

export function OverlayChart({ traces, unit, scale, testId, height = 260 }: { traces: Trace[]; unit: string; scale: number; testId: string; height?: number }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!box.current || traces.length === 0) return;
    const xs = [...new Set(traces.flatMap((tr) => tr.t.map((x) => Math.round(x * 1000) / 1000)))].sort((a, b) => a - b);
    const cols = traces.map((tr) => {
      const m = new Map(tr.t.map((x, i) => [Math.round(x * 1000) / 1000, tr.y[i]]));
      return xs.map((x) => {
        const v = m.get(x);
        return v === undefined || v === null ? null : v * scale;
      });
    });
    const u = new uPlot(
      {
        width: Math.max(280, box.current.clientWidth - 8),
        height,
        scales: { x: { time: false } },
        axes: [{ stroke: "#5f7386", label: "time (s)", grid: { stroke: "#e3e8ec" } }, { stroke: "#5f7386", label: unit, size: 56, grid: { stroke: "#e3e8ec" } }],
        series: [{}, ...traces.map((tr) => ({ label: tr.label, stroke: tr.colour, width: 1.5, spanGaps: true }))],
      },
      [xs, ...cols] as uPlot.AlignedData,
      box.current,
    );
    return () => u.destroy();
  }, [traces, unit, scale, height]);
  return <div ref={box} data-testid={testId} />;
}
