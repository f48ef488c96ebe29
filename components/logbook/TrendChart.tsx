"use client";
/**
 * A logbook trend with uPlot: the readings as points (earlier ones, before links were removed, hollow and
 * grey), the least-squares line with its 95 % band, the limit and warning levels, and a mark where links
 * were removed. Each series has its own colour and line style, named in the legend. The chart always
 * draws its levels, so it stays on screen with no readings (e.g. right after links were removed).
 * Values are shown in the unit the caller gives (`scale` × SI).
 */
import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import type { ForecastJson } from "./types";

type Point = { at: string; value: number };

const STYLE = {
  reading: "#1f5fa8",
  earlier: "#8796a5",
  trend: "#0f766e",
  band: "#0f766e",
  limit: "#b3261e",
  warning: "#b86e00",
  reset: "#6a3fa0",
};

export function TrendChart({
  title,
  unit,
  scale,
  digits,
  points,
  earlier = [],
  resets = [],
  forecast,
  limit,
  warning,
  testId,
}: {
  title: string;
  unit: string;
  scale: number;
  digits: number;
  points: Point[];
  earlier?: Point[];
  resets?: string[];
  forecast: ForecastJson | null;
  limit: number;
  warning: number;
  testId: string;
}) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!box.current) return;
    const sec = (iso: string) => Date.parse(iso) / 1000;
    const line = forecast?.line ?? [];
    let xs = [...new Set([...points, ...earlier, ...line].map((p) => sec(p.at)))].sort((a, b) => a - b);
    // Nothing to show yet: a 90-day window to today, so the levels and axes are still drawn.
    if (xs.length < 2) {
      const now = Date.now() / 1000;
      xs = [...new Set([...xs, now - 90 * 86_400, now])].sort((a, b) => a - b);
    }
    const column = (list: Point[], get: (i: number) => number) => {
      const byX = new Map(list.map((p, i) => [sec(p.at), i]));
      return xs.map((x) => (byX.has(x) ? get(byX.get(x)!) * scale : null));
    };
    const data: uPlot.AlignedData = [
      xs,
      column(points, (i) => points[i].value),
      column(earlier, (i) => earlier[i].value),
      column(line, (i) => line[i].value),
      column(line, (i) => line[i].lower),
      column(line, (i) => line[i].upper),
      xs.map(() => limit * scale),
      xs.map(() => warning * scale),
    ];
    const fmt = (v: number | null | undefined) => (v === null || v === undefined ? "—" : `${v.toFixed(digits)} ${unit}`);
    const value = (_u: uPlot, v: number | null) => fmt(v);
    const resetXs = resets.map(sec);
    const u = new uPlot(
      {
        width: Math.max(280, box.current.clientWidth - 8),
        height: 230,
        scales: { x: { time: true } },
        axes: [{ stroke: "#5f7386", grid: { stroke: "#e3e8ec" } }, { stroke: "#5f7386", grid: { stroke: "#e3e8ec" }, label: unit, size: 60 }],
        legend: { markers: { dash: (self, i) => { const d = self.series[i].dash; return !d || d.length === 0 ? "solid" : d[0] >= 5 ? "dashed" : "dotted"; } } },
        series: [
          {},
          { label: "reading", stroke: STYLE.reading, width: 0, points: { show: true, size: 7, fill: STYLE.reading, stroke: STYLE.reading }, value },
          { label: "before links removed", stroke: STYLE.earlier, width: 0, points: { show: true, size: 7, fill: "#ffffff", stroke: STYLE.earlier, width: 1.5 }, value },
          { label: "trend", stroke: STYLE.trend, width: 2, spanGaps: true, points: { show: false }, value },
          { label: "95 % band", stroke: STYLE.band, width: 1, dash: [2, 3], spanGaps: true, points: { show: false }, value },
          { label: "95 % band (upper)", stroke: STYLE.band, width: 1, dash: [2, 3], spanGaps: true, points: { show: false }, value },
          { label: "limit", stroke: STYLE.limit, width: 2.5, points: { show: false }, value },
          { label: "warning", stroke: STYLE.warning, width: 1.5, dash: [8, 4], points: { show: false }, value },
        ],
        bands: [{ series: [5, 4], fill: "rgba(15,118,110,0.08)" }],
        hooks: {
          // Links removed: a vertical dash-dot line, labelled, where each reset happened.
          draw: [
            (self) => {
              const ctx = self.ctx;
              ctx.save();
              ctx.strokeStyle = STYLE.reset;
              ctx.fillStyle = STYLE.reset;
              ctx.lineWidth = 1.5 * devicePixelRatio;
              ctx.setLineDash([6 * devicePixelRatio, 3 * devicePixelRatio, 1.5 * devicePixelRatio, 3 * devicePixelRatio]);
              ctx.font = `${11 * devicePixelRatio}px sans-serif`;
              for (const x of resetXs) {
                const px = self.valToPos(x, "x", true);
                if (px < self.bbox.left || px > self.bbox.left + self.bbox.width) continue;
                ctx.beginPath();
                ctx.moveTo(px, self.bbox.top);
                ctx.lineTo(px, self.bbox.top + self.bbox.height);
                ctx.stroke();
                ctx.fillText("links removed", px + 4 * devicePixelRatio, self.bbox.top + 12 * devicePixelRatio);
              }
              ctx.restore();
            },
          ],
        },
      },
      data,
      box.current,
    );
    // The band's upper edge shares the legend entry of the lower one.
    const legendRows = box.current.querySelectorAll(".u-legend .u-series");
    (legendRows[5] as HTMLElement | undefined)?.style.setProperty("display", "none");
    if (!earlier.length) (legendRows[2] as HTMLElement | undefined)?.style.setProperty("display", "none");
    return () => u.destroy();
  }, [points, earlier, resets, forecast, limit, warning, scale, digits, unit]);
  return (
    <figure className="space-y-1" data-testid={testId}>
      <figcaption className="text-[13px] font-semibold text-ink-800">{title}</figcaption>
      <div ref={box} />
      {resets.length > 0 && <p className="text-[12px] text-steel-500">Dash-dot purple line: links removed (the take-up trend starts again after the latest).</p>}
    </figure>
  );
}
