"use client";
/**
 * A logbook trend with uPlot: the readings as points, the least-squares line with its 95 % band, and the
 * limit and warning levels. Values are shown in the unit the caller gives (`scale` × SI).
 */
import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import type { ForecastJson } from "./types";

export function TrendChart({
  title,
  unit,
  scale,
  digits,
  points,
  forecast,
  limit,
  warning,
  testId,
}: {
  title: string;
  unit: string;
  scale: number;
  digits: number;
  points: { at: string; value: number }[];
  forecast: ForecastJson | null;
  limit: number;
  warning: number;
  testId: string;
}) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!box.current) return;
    const sec = (iso: string) => Date.parse(iso) / 1000;
    const xs = [...new Set([...points.map((p) => sec(p.at)), ...(forecast?.line ?? []).map((p) => sec(p.at))])].sort((a, b) => a - b);
    const at = (list: { at: string }[], x: number) => list.findIndex((p) => sec(p.at) === x);
    const col = (get: (x: number) => number | null) => xs.map(get);
    const data: uPlot.AlignedData = [
      xs,
      col((x) => {
        const i = at(points, x);
        return i < 0 ? null : points[i].value * scale;
      }),
      col((x) => {
        const i = forecast ? at(forecast.line, x) : -1;
        return i < 0 ? null : forecast!.line[i].value * scale;
      }),
      col((x) => {
        const i = forecast ? at(forecast.line, x) : -1;
        return i < 0 ? null : forecast!.line[i].lower * scale;
      }),
      col((x) => {
        const i = forecast ? at(forecast.line, x) : -1;
        return i < 0 ? null : forecast!.line[i].upper * scale;
      }),
      col(() => limit * scale),
      col(() => warning * scale),
    ];
    const fmt = (v: number | null | undefined) => (v === null || v === undefined ? "—" : v.toFixed(digits));
    const u = new uPlot(
      {
        width: Math.max(280, box.current.clientWidth - 8),
        height: 220,
        scales: { x: { time: true } },
        axes: [{ stroke: "#5f7386", grid: { stroke: "#e3e8ec" } }, { stroke: "#5f7386", grid: { stroke: "#e3e8ec" }, label: unit, size: 56 }],
        series: [
          {},
          { label: "reading", stroke: "#1f6fb2", width: 0, points: { show: true, size: 7, fill: "#1f6fb2" }, value: (_u, v) => fmt(v) },
          { label: "trend", stroke: "#b86e00", width: 1.5, spanGaps: true, value: (_u, v) => fmt(v) },
          { label: "95 % low", stroke: "#b86e00", width: 1, dash: [4, 4], spanGaps: true, value: (_u, v) => fmt(v) },
          { label: "95 % high", stroke: "#b86e00", width: 1, dash: [4, 4], spanGaps: true, value: (_u, v) => fmt(v) },
          { label: "limit", stroke: "#c0392b", width: 1.5, value: (_u, v) => fmt(v) },
          { label: "warning", stroke: "#e08a00", width: 1, dash: [2, 3], value: (_u, v) => fmt(v) },
        ],
      },
      data,
      box.current,
    );
    return () => u.destroy();
  }, [points, forecast, limit, warning, scale, digits, unit]);
  return (
    <figure className="space-y-1" data-testid={testId}>
      <figcaption className="text-[13px] font-semibold text-ink-800">{title}</figcaption>
      <div ref={box} />
    </figure>
  );
}
