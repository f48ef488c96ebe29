"use client";
/**
 * One uPlot chart as a React component: made on mount and whenever its options or data change, resized with
 * its box, destroyed on unmount. The axis look matches the run's plots (components/plot/RunPlots.tsx).
 */
import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

const FONT = "11px ui-sans-serif, system-ui";

/** An axis in the plots' look, named with its label (quantity and unit). */
export function plotAxis(label: string, size = 56): uPlot.Axis {
  return { stroke: "#5f7386", grid: { stroke: "#e3e8ec", width: 1 }, ticks: { stroke: "#e3e8ec" }, label, size, font: FONT, labelFont: FONT };
}

export function UPlotChart({
  options,
  data,
  height = 200,
  testId,
  label,
}: {
  options: Omit<uPlot.Options, "width" | "height">;
  data: uPlot.AlignedData;
  height?: number;
  testId?: string;
  /** Accessible name of the chart. */
  label: string;
}) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const width = () => Math.max(240, el.clientWidth);
    const plot = new uPlot({ ...options, width: width(), height }, data, el);
    const ro = new ResizeObserver(() => plot.setSize({ width: width(), height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      plot.destroy();
    };
  }, [options, data, height]);
  return <div ref={box} className="min-w-0" role="img" aria-label={label} data-testid={testId} />;
}
