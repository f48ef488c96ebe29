"use client";
/**
 * The operating window as a shaded map over the study's two varied inputs (plain canvas): each case a
 * cell coloured pass / caution / fail (grey while unfinished), contours of the governing check's
 * utilisation at its caution level (80 % of the limit, dashed) and at the limit (solid), and the
 * recommended window outlined. Axis names and tick values are HTML beside the canvas, in the reader's
 * units, so they print, zoom and read like text. Pointing at a cell names what fails there.
 */
import { useEffect, useMemo, useRef, useState } from "react";
import type { UnitSystem } from "@/lib/units/display";
import { CAUTION_FRACTION } from "@/sim/checks";
import { axisTitle, axisValue, type RegionCell, type StudyRegion } from "@/lib/studies/region";
import type { ValueNamer } from "@/lib/studies/window";
import { contourSegments } from "./contours";

const FILL: Record<RegionCell["state"], string> = { pass: "#2e7d4f", caution: "#d99a1e", fail: "#b3261e", open: "#d5dde3" };
const W = 560;
const H = 320;

export function OperatingMap({ region, units, name }: { region: StudyRegion; units: UnitSystem; name?: ValueNamer }) {
  const canvas = useRef<HTMLCanvasElement>(null);
  const [hover, setHover] = useState<RegionCell | null>(null);
  const nx = region.xs.length;
  const ny = region.ys.length;
  const inWindow = useMemo(() => new Set((region.window?.cells ?? []).map(([i, j]) => `${i},${j}`)), [region]);

  useEffect(() => {
    const c = canvas.current;
    if (!c) return;
    const dpr = window.devicePixelRatio || 1;
    c.width = W * dpr;
    c.height = H * dpr;
    const ctx = c.getContext("2d")!;
    ctx.scale(dpr, dpr);
    ctx.clearRect(0, 0, W, H);
    const cw = W / nx;
    const ch = H / ny;
    // y grows upward: row j is drawn from the bottom.
    const top = (j: number) => H - (j + 1) * ch;
    region.cells.forEach((row, j) =>
      row.forEach((cell, i) => {
        ctx.fillStyle = FILL[cell.state];
        ctx.globalAlpha = cell.state === "open" ? 1 : 0.78;
        ctx.fillRect(i * cw, top(j), cw, ch);
      }),
    );
    ctx.globalAlpha = 1;
    ctx.strokeStyle = "rgba(255,255,255,0.7)";
    ctx.lineWidth = 1;
    for (let i = 1; i < nx; i++) ctx.strokeRect(i * cw, 0, 0, H);
    for (let j = 1; j < ny; j++) ctx.strokeRect(0, j * ch, W, 0);
    // Contours through the cell centres (marching squares on the governing check's utilisation).
    const field = region.cells.map((row) => row.map((cell) => cell.utilisation));
    const px = (fi: number) => (fi + 0.5) * cw;
    const py = (fj: number) => H - (fj + 0.5) * ch;
    for (const [level, dash, width] of [
      [CAUTION_FRACTION, [6, 4], 1.5],
      [1, [], 2.5],
    ] as const) {
      ctx.strokeStyle = "#10202e";
      ctx.lineWidth = width;
      ctx.setLineDash([...dash]);
      ctx.beginPath();
      for (const [[a, b], [c2, d]] of contourSegments(field, level)) {
        ctx.moveTo(px(a), py(b));
        ctx.lineTo(px(c2), py(d));
      }
      ctx.stroke();
    }
    ctx.setLineDash([]);
    // The recommended window: a heavy outline along the edges of its cells.
    ctx.strokeStyle = "#0b3d91";
    ctx.lineWidth = 3;
    ctx.beginPath();
    for (const [i, j] of region.window?.cells ?? []) {
      const x0 = i * cw;
      const y0 = top(j);
      const edge = (xa: number, ya: number, xb: number, yb: number) => {
        ctx.moveTo(xa, ya);
        ctx.lineTo(xb, yb);
      };
      if (!inWindow.has(`${i},${j + 1}`)) edge(x0, y0, x0 + cw, y0);
      if (!inWindow.has(`${i},${j - 1}`)) edge(x0, y0 + ch, x0 + cw, y0 + ch);
      if (!inWindow.has(`${i - 1},${j}`)) edge(x0, y0, x0, y0 + ch);
      if (!inWindow.has(`${i + 1},${j}`)) edge(x0 + cw, y0, x0 + cw, y0 + ch);
    }
    ctx.stroke();
  }, [region, nx, ny, inWindow]);

  const pick = (e: React.MouseEvent<HTMLCanvasElement>) => {
    const box = e.currentTarget.getBoundingClientRect();
    const i = Math.floor(((e.clientX - box.left) / box.width) * nx);
    const j = ny - 1 - Math.floor(((e.clientY - box.top) / box.height) * ny);
    setHover(region.cells[j]?.[i] ?? null);
  };
  const xTitle = axisTitle(region.xKey, units);
  const yTitle = axisTitle(region.yKey, units);
  const tick = (k: typeof region.xKey, v: number | string) => axisValue(k, v, units, name).replace(/ \S+$/, (m) => (typeof v === "number" ? "" : m));

  return (
    <figure className="space-y-2" data-testid="operating-map">
      <div className="flex items-stretch gap-2">
        <div className="flex w-6 items-center justify-center">
          <span className="-rotate-90 whitespace-nowrap text-[12.5px] font-semibold text-ink-900" data-testid="map-y-axis">
            {yTitle}
          </span>
        </div>
        <div className="flex flex-col-reverse justify-around text-right text-[11.5px] text-steel-600" style={{ height: H }} data-testid="map-y-ticks">
          {region.ys.map((y) => (
            <span key={String(y)}>{tick(region.yKey, y)}</span>
          ))}
        </div>
        <div className="min-w-0">
          <canvas
            ref={canvas}
            style={{ width: W, height: H, maxWidth: "100%" }}
            role="img"
            aria-label={`Operating map: ${yTitle} against ${xTitle}, pass, caution and fail per case`}
            onMouseMove={pick}
            onMouseLeave={() => setHover(null)}
            data-testid="map-canvas"
          />
          <div className="flex justify-around text-[11.5px] text-steel-600" style={{ width: W, maxWidth: "100%" }} data-testid="map-x-ticks">
            {region.xs.map((x) => (
              <span key={String(x)}>{tick(region.xKey, x)}</span>
            ))}
          </div>
          <p className="text-center text-[12.5px] font-semibold text-ink-900" data-testid="map-x-axis">
            {xTitle}
          </p>
        </div>
      </div>
      <p className="min-h-[1.25rem] text-[12.5px] text-ink-800" data-testid="map-hover">
        {hover
          ? `${axisValue(region.xKey, hover.x, units, name)} with ${axisValue(region.yKey, hover.y, units, name)}: ${
              hover.state === "fail" ? `fails — ${hover.failing.join(", ")}` : hover.state === "caution" ? `caution — ${hover.cautions.join(", ")}` : hover.state === "pass" ? "every check passes" : "not finished"
            }${hover.utilisation !== null && region.governing ? `; ${region.governing.label} at ${(hover.utilisation * 100).toFixed(0)} % of its limit` : ""}.`
          : "Point at a case to see what fails there."}
      </p>
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 text-[11.5px] text-steel-600" data-testid="map-legend">
        {(["pass", "caution", "fail", "open"] as const).map((s) => (
          <span key={s} className="inline-flex items-center gap-1">
            <span className="inline-block h-3 w-3 rounded-sm" style={{ background: FILL[s] }} /> {s === "open" ? "not finished" : s}
          </span>
        ))}
        <span className="inline-flex items-center gap-1">
          <span className="inline-block h-0 w-5 border-t-[3px] border-[#0b3d91]" /> recommended window
        </span>
        {region.governing && (
          <>
            <span className="inline-flex items-center gap-1">
              <span className="inline-block h-0 w-5 border-t-[2.5px] border-[#10202e]" /> {region.governing.label} at its limit
            </span>
            <span className="inline-flex items-center gap-1">
              <span className="inline-block h-0 w-5 border-t-[1.5px] border-dashed border-[#10202e]" /> at {Math.round(CAUTION_FRACTION * 100)} % of its limit
            </span>
          </>
        )}
      </figcaption>
    </figure>
  );
}
