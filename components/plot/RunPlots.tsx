"use client";
/**
 * The run's time series with uPlot (fast with tens of thousands of points): four panels on one time
 * axis, drag to zoom (all panels follow), double-click to zoom out, a hover read-out, the cursor synced
 * with the replay (click a plot to move the replay there), CSV and PNG export. The chain tension at the
 * dog comes from the replay frames (sim's dogTensionAt), put on the series' times. The plots are made once per
 * set of panels and units; a new result (a what-if preview while a slider moves) only replaces their data
 * (uPlot setData), so the panels are redrawn, not rebuilt.
 */
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import { dogTensionAt, type Frame, type Layout, type Series } from "@/sim";
import { Button } from "@/components/ui/Button";
import { unitOf, type UnitSystem } from "@/lib/client/units";
import { useReplayStore } from "@/components/replay/store";
import { DOG_TENSION_NOTE, chainSpeedOf, nearestSample, panelData, panelsFor, seriesCsv } from "./plotData";

function download(name: string, href: string) {
  const a = document.createElement("a");
  a.href = href;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
}

export function RunPlots({
  series,
  units,
  chainSpeed,
  rampTime,
  fileStem,
  frames,
  layout,
  dogOffset,
  dogRelease,
  onDrawn,
}: {
  series: Series;
  units: UnitSystem;
  chainSpeed: number;
  rampTime: number;
  fileStem: string;
  /** Replay frames and layout of the run, for the chain tension at the dog (left out: no such line). */
  frames?: readonly Frame[];
  layout?: Layout;
  dogOffset?: number;
  dogRelease?: number;
  /** Called when the plots have drawn a new result (after their data was replaced). */
  onDrawn?: () => void;
}) {
  const holders = useRef<(HTMLDivElement | null)[]>([]);
  const plots = useRef<uPlot[]>([]);
  const box = useRef<HTMLDivElement>(null);
  const [cursorIdx, setCursorIdx] = useState<number | null>(null);
  const chain = useMemo(() => chainSpeedOf(series, chainSpeed, rampTime), [series, chainSpeed, rampTime]);
  const dogTension = useMemo(
    () =>
      frames?.length && layout && dogOffset !== undefined && dogRelease !== undefined
        ? dogTensionAt(layout, { dogOffset, dogRelease }, frames, series.t)
        : undefined,
    [frames, layout, dogOffset, dogRelease, series],
  );
  // Without frames there is no tension at the dog: leave its line (and its note) out.
  const panels = useMemo(() => panelsFor(series).map((p) => ({ ...p, lines: p.lines.filter((l) => l.key !== "dogTension" || dogTension) })), [series, dogTension]);
  const hovering = useRef(false);
  // The latest series and drawn-callback for the handlers of plots that outlive one result.
  const seriesRef = useRef(series);
  const onDrawnRef = useRef(onDrawn);
  const dataFor = (ps: typeof panels) => ps.map((p) => panelData(p, series, { chainSpeed: chain, dogTension }, units) as uPlot.AlignedData);
  // Plots are rebuilt only when the panels' lines or the units change.
  const shape = `${units}|${panels.map((p) => `${p.id}:${p.lines.map((l) => `${l.key}${l.train ? `.${l.train.index}.${l.train.key}` : ""}`).join(",")}`).join("|")}`;
  const shapeMade = useRef<string | null>(null);
  const placeRef = useRef<(t: number) => void>(() => {});

  useEffect(() => {
    const width = Math.max(280, (box.current?.clientWidth ?? 800) - 16);
    const syncKey = `run-${Math.random().toString(36).slice(2)}`;
    const initial = dataFor(panels);
    let syncing = false;
    const made: uPlot[] = panels.map((p, pi) => {
      const u = unitOf(p.q, units).label;
      const opts: uPlot.Options = {
        width,
        height: 150,
        legend: { show: true, live: true },
        cursor: {
          sync: { key: syncKey, setSeries: false },
          drag: { x: true, y: false, setScale: true },
          points: { size: 6 },
        },
        scales: { x: { time: false } },
        axes: [
          { stroke: "#5f7386", grid: { stroke: "#e3e8ec", width: 1 }, ticks: { stroke: "#e3e8ec" }, label: pi === panels.length - 1 ? "time (s)" : undefined, size: pi === panels.length - 1 ? 44 : 30, font: "11px ui-sans-serif, system-ui", labelFont: "11px ui-sans-serif, system-ui" },
          { stroke: "#5f7386", grid: { stroke: "#e3e8ec", width: 1 }, ticks: { stroke: "#e3e8ec" }, label: u, size: 56, font: "11px ui-sans-serif, system-ui", labelFont: "11px ui-sans-serif, system-ui" },
        ],
        series: [
          { label: "t (s)", value: (_u, v) => (v === null || v === undefined ? "—" : v.toFixed(2)) },
          ...p.lines.map((l) => ({
            label: `${l.label} (${u})`,
            stroke: l.colour,
            width: 1.5,
            dash: l.dash,
            value: (_u: uPlot, v: number | null) => (v === null || v === undefined ? "—" : v.toFixed(unitOf(p.q, units).digits)),
          })),
        ],
        hooks: {
          setScale: [
            (self, key) => {
              if (key !== "x" || syncing) return;
              syncing = true;
              const { min, max } = self.scales.x;
              for (const o of plots.current) if (o !== self && min !== undefined && max !== undefined) o.setScale("x", { min, max });
              syncing = false;
            },
          ],
          setCursor: [
            (self) => {
              if (pi !== 0) return;
              const idx = self.cursor.idx;
              if (idx !== null && idx !== undefined) setCursorIdx(idx);
            },
          ],
        },
      };
      const el = holders.current[pi]!;
      if (pi === panels.length - 1) opts.hooks!.draw = [() => onDrawnRef.current?.()];
      const plot = new uPlot(opts, initial[pi], el);
      plot.over.addEventListener("mouseenter", () => (hovering.current = true));
      plot.over.addEventListener("mouseleave", () => (hovering.current = false));
      plot.over.addEventListener("click", () => {
        const left = plot.cursor.left;
        if (left === undefined || left < 0) return;
        const s = useReplayStore.getState();
        s.setPlaying(false);
        s.setT(plot.posToVal(left, "x"));
      });
      plot.over.addEventListener("dblclick", () => {
        const t = seriesRef.current.t;
        for (const o of plots.current) o.setScale("x", { min: t[0], max: t[t.length - 1] });
      });
      return plot;
    });
    plots.current = made;

    // The replay clock moves the cursor on every panel (unless the pointer is over a plot).
    const place = (t: number) => {
      if (hovering.current) return;
      const ts = seriesRef.current.t;
      const idx = nearestSample(ts, t);
      for (const plot of made) {
        const left = plot.valToPos(ts[idx], "x");
        if (Number.isFinite(left)) plot.setCursor({ left, top: 10 }, false);
      }
      setCursorIdx(idx);
    };
    placeRef.current = place;
    shapeMade.current = shape;
    place(useReplayStore.getState().t);
    // While playing, follow at most ~12 times a second (the canvas keeps its own frame rate).
    let lastPlace = 0;
    let pendingPlace: ReturnType<typeof setTimeout> | undefined;
    const unsub = useReplayStore.subscribe((s, prev) => {
      if (s.t === prev.t) return;
      const now = Date.now();
      if (pendingPlace) clearTimeout(pendingPlace);
      if (!s.playing || now - lastPlace > 80) {
        lastPlace = now;
        place(s.t);
      } else pendingPlace = setTimeout(() => place(useReplayStore.getState().t), 80);
    });
    const ro = new ResizeObserver(() => {
      const w = Math.max(280, (box.current?.clientWidth ?? 800) - 16);
      for (const plot of made) plot.setSize({ width: w, height: 150 });
    });
    if (box.current) ro.observe(box.current);
    return () => {
      unsub();
      if (pendingPlace) clearTimeout(pendingPlace);
      ro.disconnect();
      for (const plot of made) plot.destroy();
      plots.current = [];
      shapeMade.current = null;
    };
    // Made once per shape; the data effect below keeps them current.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [shape]);

  // A new result on the same panels: replace the data in place (uPlot redraws, then calls onDrawn).
  useLayoutEffect(() => {
    seriesRef.current = series;
    onDrawnRef.current = onDrawn;
    // First mount or new shape: the effect above (re)makes the plots with this data.
    if (shapeMade.current !== shape) return;
    const data = dataFor(panels);
    plots.current.forEach((plot, i) => plot.setData(data[i]));
    placeRef.current(useReplayStore.getState().t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [series, chain, dogTension, panels, units, onDrawn]);

  const exportCsv = () => {
    const blob = new Blob([seriesCsv(series, chain, units, dogTension)], { type: "text/csv" });
    const url = URL.createObjectURL(blob);
    download(`${fileStem}.csv`, url);
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };
  const exportPng = () => {
    const canvases = plots.current.map((p) => p.ctx.canvas);
    if (!canvases.length) return;
    const titleH = 22;
    const w = Math.max(...canvases.map((c) => c.width));
    const h = canvases.reduce((s, c) => s + c.height + titleH, 0);
    const out = document.createElement("canvas");
    out.width = w;
    out.height = h;
    const ctx = out.getContext("2d")!;
    ctx.fillStyle = "#ffffff";
    ctx.fillRect(0, 0, w, h);
    let y = 0;
    canvases.forEach((c, i) => {
      ctx.fillStyle = "#10202e";
      ctx.font = "bold 14px sans-serif";
      ctx.fillText(`${panels[i].title} (${unitOf(panels[i].q, units).label})`, 8, y + 16);
      ctx.drawImage(c, 0, y + titleH);
      y += c.height + titleH;
    });
    download(`${fileStem}.png`, out.toDataURL("image/png"));
  };

  const i = cursorIdx;
  const show = (si: number | null | undefined, q: Parameters<typeof unitOf>[0]) => {
    if (si === null || si === undefined) return "—";
    const u = unitOf(q, units);
    return `${(si * u.factor).toFixed(u.digits)} ${u.label}`;
  };
  const val = (key: keyof Series, q: Parameters<typeof unitOf>[0]) => (i === null ? "—" : show((series[key] as number[])[i], q));

  return (
    <section className="min-w-0 space-y-2" data-testid="run-plots">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-[12px] text-steel-500">Drag across a plot to zoom all four; double-click to zoom out; click to move the replay there.</p>
        <div className="flex gap-2">
          <Button size="sm" variant="secondary" onClick={exportCsv} data-testid="export-csv">
            Export CSV
          </Button>
          <Button size="sm" variant="secondary" onClick={exportPng} data-testid="export-png">
            Export PNG
          </Button>
        </div>
      </div>
      <div className="flex flex-wrap gap-x-4 gap-y-1 rounded-md border border-steel-300/60 bg-white px-3 py-1.5 font-mono text-[12px] tabular-nums text-ink-900" data-testid="plot-readout">
        <span>
          cursor t = <b data-testid="cursor-time">{i === null ? "—" : series.t[i].toFixed(2)}</b> s
        </span>
        <span>
          drive <b data-testid="cursor-drive-tension">{val("driveTension", "force")}</b>
        </span>
        <span>
          highest <b data-testid="cursor-max-tension">{val("maxTension", "force")}</b>
        </span>
        {dogTension && (
          <span title={DOG_TENSION_NOTE}>
            at dog <b data-testid="cursor-dog-tension">{i === null ? "—" : show(dogTension[i], "force")}</b>
          </span>
        )}
        <span>
          dog <b>{val("dogForce", "force")}</b>
        </span>
        <span>
          ARD <b>{val("ardForce", "force")}</b>
        </span>
        <span>
          speed <b>{val("trainSpeed", "speed")}</b>
        </span>
        <span>
          take-up <b>{val("takeUpPosition", "smallLength")}</b>
        </span>
      </div>
      <div ref={box} className="min-w-0 space-y-1 overflow-hidden rounded-md border border-steel-300/60 bg-white p-2">
        {panels.map((p, pi) => (
          <div key={p.id} className="min-w-0 overflow-hidden">
            <p className="px-1 text-[12px] font-semibold text-ink-800">{p.title}</p>
            {p.note && p.lines.some((l) => l.key === "dogTension") && (
              <p className="px-1 text-[11.5px] text-steel-500" data-testid={`plot-note-${p.id}`}>
                {p.note}
              </p>
            )}
            <div
              ref={(el) => {
                holders.current[pi] = el;
              }}
              data-testid={`plot-${p.id}`}
            />
          </div>
        ))}
      </div>
    </section>
  );
}
