"use client";
/**
 * Replay of a run: the canvas, play/pause, speed 0.25×–8×, frame steps, a timeline with event marks,
 * jump to event, keyboard shortcuts and a link to the moment on screen (?t=).
 */
import dynamic from "next/dynamic";
import { useCallback, useEffect, useMemo, useState } from "react";
import type { Frame, Layout, Scenario, Series, Summary } from "@/sim";
import { Button } from "@/components/ui/Button";
import { cx } from "@/components/ui/cx";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { frameAt, frameIndexAt } from "./frames";
import { runEvents, type EventKind, type RunEvent } from "./events";
import { viridis } from "./palette";
import { SPEEDS, ZOOMS, useReplayStore, useReplayTime } from "./store";

const ReplayCanvas = dynamic(() => import("./ReplayCanvas").then((m) => m.ReplayCanvas), {
  ssr: false,
  loading: () => <div className="h-[400px] animate-pulse rounded-md bg-steel-100" />,
});

const EVENT_STYLE: Record<EventKind, { mark: string; colour: string }> = {
  engagement: { mark: "▲", colour: "#1f6fb2" },
  ard: { mark: "◆", colour: "#c0392b" },
  pickup: { mark: "●", colour: "#1f6fb2" },
  peak: { mark: "★", colour: "#b86e00" },
  stop: { mark: "▮", colour: "#c0392b" },
  restart: { mark: "▷", colour: "#2f7d4f" },
  release: { mark: "■", colour: "#5f7386" },
  reengage: { mark: "▼", colour: "#b86e00" },
};

export const SHORTCUTS: [string, string][] = [
  ["Space", "play / pause"],
  ["← →", "step one frame"],
  ["Shift + ← →", "step one second"],
  ["[ ]", "slower / faster"],
  ["Home End", "start / end"],
  ["N P", "next / previous event"],
];

export function ReplayPanel({
  scenario,
  frames,
  layout,
  series,
  summary,
  units,
  initialT,
}: {
  scenario: Scenario;
  frames: Frame[];
  layout: Layout;
  series: Series;
  summary: Summary;
  units: UnitSystem;
  initialT?: number;
}) {
  const duration = frames.length ? frames[frames.length - 1].t : 0;
  const events = useMemo(() => runEvents(summary, series, scenario.drive), [summary, series, scenario.drive]);
  const playing = useReplayStore((s) => s.playing);
  const speed = useReplayStore((s) => s.speed);
  const magnify = useReplayStore((s) => s.magnify);
  const zoom = useReplayStore((s) => s.zoom);
  const follow = useReplayStore((s) => s.follow);
  const t = useReplayTime();
  const st = useReplayStore.getState;
  const [fps, setFps] = useState(0);
  const [drawMs, setDrawMs] = useState(0);
  const onFps = useCallback((f: number, ms: number) => {
    setFps(f);
    setDrawMs(ms);
  }, []);
  const [copied, setCopied] = useState(false);

  useEffect(() => {
    useReplayStore.getState().setDuration(duration);
    if (initialT !== undefined && Number.isFinite(initialT)) useReplayStore.getState().setT(initialT);
  }, [duration, initialT]);

  // Playback clock.
  useEffect(() => {
    if (!playing) return;
    let raf = 0;
    let last = performance.now();
    const tick = (now: number) => {
      const s = st();
      const dt = Math.min(0.1, (now - last) / 1000);
      last = now;
      const next = s.t + dt * s.speed;
      if (next >= s.duration) {
        s.setT(s.duration);
        s.setPlaying(false);
        return;
      }
      s.setT(next);
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
  }, [playing, st]);

  // The moment on screen goes into the address (?t=) when paused, so the link can be shared.
  useEffect(() => {
    if (playing) return;
    const h = setTimeout(() => {
      const url = new URL(window.location.href);
      url.searchParams.set("t", t.toFixed(2));
      window.history.replaceState(window.history.state, "", url);
    }, 250);
    return () => clearTimeout(h);
  }, [t, playing]);

  const step = useCallback(
    (dir: 1 | -1) => {
      const s = st();
      s.setPlaying(false);
      const i = frameIndexAt(frames, s.t + (dir > 0 ? 1e-9 : -1e-9));
      const j = dir > 0 ? (frames[i].t > s.t + 1e-9 ? i : Math.min(frames.length - 1, i + 1)) : frames[i].t < s.t - 1e-9 ? i : Math.max(0, i - 1);
      s.setT(frames[j].t);
    },
    [frames, st],
  );
  const jump = useCallback(
    (dir: 1 | -1) => {
      const s = st();
      const e = dir > 0 ? events.find((x) => x.t > s.t + 1e-3) : [...events].reverse().find((x) => x.t < s.t - 1e-3);
      if (e) {
        s.setPlaying(false);
        s.setT(e.t);
      }
    },
    [events, st],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const tag = (e.target as HTMLElement | null)?.tagName;
      if (tag === "INPUT" || tag === "TEXTAREA" || tag === "SELECT" || (e.target as HTMLElement | null)?.isContentEditable) return;
      const s = st();
      if (e.key === " ") {
        e.preventDefault();
        if (!s.playing && s.t >= s.duration) s.setT(0);
        s.setPlaying(!s.playing);
      } else if (e.key === "ArrowRight" || e.key === "ArrowLeft") {
        e.preventDefault();
        const dir = e.key === "ArrowRight" ? 1 : -1;
        if (e.shiftKey) {
          s.setPlaying(false);
          s.setT(s.t + dir);
        } else step(dir);
      } else if (e.key === "]") s.faster();
      else if (e.key === "[") s.slower();
      else if (e.key === "Home") s.setT(0);
      else if (e.key === "End") s.setT(s.duration);
      else if (e.key === "n" || e.key === "N") jump(1);
      else if (e.key === "p" || e.key === "P") jump(-1);
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [st, step, jump]);

  const f = frames.length ? frameAt(frames, t) : null;
  const driveTension = f ? f.tensions[layout.driveStation] ?? 0 : 0;
  const maxT = summary.peakTension;
  const copyLink = async () => {
    const url = new URL(window.location.href);
    url.searchParams.set("t", t.toFixed(2));
    try {
      await navigator.clipboard.writeText(url.toString());
    } catch {
      // Clipboard may be refused (insecure origin): the address bar holds the same link.
    }
    setCopied(true);
    setTimeout(() => setCopied(false), 1500);
  };

  return (
    <section className="min-w-0 space-y-2" data-testid="replay" data-fps={fps} data-draw-ms={drawMs.toFixed(3)} data-segments={layout.stations.length}>
      <ReplayCanvas scenario={scenario} frames={frames} layout={layout} maxTension={maxT} onFps={onFps} units={units} />
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <div className="flex items-center gap-1.5">
          <Button
            size="sm"
            variant="primary"
            onClick={() => {
              const s = st();
              if (!s.playing && s.t >= s.duration) s.setT(0);
              s.setPlaying(!s.playing);
            }}
            data-testid="replay-play"
            aria-label={playing ? "Pause" : "Play"}
            className="min-w-[5.5rem] whitespace-nowrap"
          >
            {playing ? "❚❚ Pause" : "▶ Play"}
          </Button>
          <Button size="sm" variant="secondary" onClick={() => step(-1)} aria-label="Previous frame" data-testid="replay-prev">
            ◀|
          </Button>
          <Button size="sm" variant="secondary" onClick={() => step(1)} aria-label="Next frame" data-testid="replay-next">
            |▶
          </Button>
        </div>
        <label className="flex items-center gap-1.5 text-[12.5px] text-steel-500">
          Speed
          <select className="h-8 rounded-md border border-steel-300 bg-white px-1.5 text-[13px] text-ink-900" value={speed} onChange={(e) => useReplayStore.getState().setSpeed(Number(e.target.value))} data-testid="replay-speed">
            {SPEEDS.map((s) => (
              <option key={s} value={s}>
                {s}×
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-1.5 text-[12.5px] text-steel-500">
          Take-up
          <select className="h-8 rounded-md border border-steel-300 bg-white px-1.5 text-[13px] text-ink-900" value={magnify} onChange={(e) => useReplayStore.getState().setMagnify(Number(e.target.value))} data-testid="replay-magnify">
            {[1, 5, 20, 50, 100].map((m) => (
              <option key={m} value={m}>
                ×{m}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-1.5 whitespace-nowrap text-[12.5px] text-steel-500">
          Zoom
          <select className="h-8 rounded-md border border-steel-300 bg-white px-1.5 text-[13px] text-ink-900" value={zoom} onChange={(e) => useReplayStore.getState().setZoom(Number(e.target.value))} data-testid="replay-zoom">
            {ZOOMS.map((z) => (
              <option key={z} value={z}>
                ×{z}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-1.5 whitespace-nowrap text-[12.5px] text-steel-500">
          <input type="checkbox" checked={follow} onChange={(e) => useReplayStore.getState().setFollow(e.target.checked)} data-testid="replay-follow" />
          Follow the train
        </label>
        <div className="ml-auto flex items-center gap-3 whitespace-nowrap font-mono text-[12.5px] tabular-nums text-ink-900" data-testid="replay-readout">
          <span data-testid="replay-time">t = {t.toFixed(2)} s</span>
          <span className="text-steel-500">/ {duration.toFixed(1)} s</span>
        </div>
      </div>
      <Timeline duration={duration} t={t} events={events} />
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-6" data-testid="replay-values">
        <Readout label="Train speed" value={formatQuantity(f?.trainSpeed, "speed", units)} />
        <Readout label="Drive tension" value={formatQuantity(driveTension, "force", units)} />
        <Readout label="Dog force" value={formatQuantity(f?.dogForce, "force", units)} />
        <Readout label="ARD force" value={formatQuantity(f?.ardForce, "force", units)} alert={!!f && f.ardForce > 0} />
        <Readout label="Take-up (true)" value={f ? `${formatQuantity(Math.abs(f.takeUpPosition), "smallLength", units, units === "si" ? 1 : 2)} ${f.takeUpPosition >= 0 ? "down" : "up"}` : "—"} testId="takeup-true" />
        <Readout label="Frame" value={f ? `${f.index + 1} / ${frames.length}` : "—"} />
      </div>
      <div className="flex flex-wrap items-start justify-between gap-4">
        <Legend max={maxT} units={units} />
        <div className="flex items-center gap-2">
          <Button size="sm" variant="ghost" onClick={() => void copyLink()} data-testid="copy-moment">
            {copied ? "Link copied" : "Copy link to this moment"}
          </Button>
          <span className="text-[11.5px] text-steel-500" data-testid="replay-fps">
            {fps} frames/s · {layout.stations.length} segments
          </span>
        </div>
      </div>
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-[11.5px] text-steel-500" data-testid="shortcuts">
        {SHORTCUTS.map(([k, what]) => (
          <li key={k}>
            <kbd className="rounded border border-steel-300 bg-white px-1 font-mono text-[10.5px] text-ink-800">{k}</kbd> {what}
          </li>
        ))}
      </ul>
    </section>
  );
}

function Readout({ label, value, alert, testId }: { label: string; value: string; alert?: boolean; testId?: string }) {
  return (
    <div className={cx("rounded-md border px-2.5 py-1.5", alert ? "border-fail/40 bg-fail/5" : "border-steel-300/60 bg-white")} data-testid={testId}>
      <p className="text-[10.5px] font-semibold uppercase tracking-wide text-steel-500">{label}</p>
      <p className="font-mono text-[13px] font-semibold tabular-nums text-ink-900">{value}</p>
    </div>
  );
}

function Legend({ max, units }: { max: number; units: UnitSystem }) {
  const stops = Array.from({ length: 11 }, (_, i) => `${viridis(i / 10)} ${i * 10}%`).join(", ");
  return (
    <div className="w-72" data-testid="tension-legend">
      <p className="mb-1 text-[11px] font-semibold uppercase tracking-wide text-steel-500">Chain tension</p>
      <div className="h-2.5 rounded-sm" style={{ background: `linear-gradient(to right, ${stops})` }} />
      <div className="mt-0.5 flex justify-between font-mono text-[10.5px] text-steel-500">
        <span>0</span>
        <span>{formatQuantity(max / 2, "force", units, 0)}</span>
        <span>{formatQuantity(max, "force", units, 0)}</span>
      </div>
      <p className="mt-0.5 text-[10.5px] text-steel-500">Dashed grey: slack (no tension). Viridis scale, readable without colour.</p>
    </div>
  );
}

function Timeline({ duration, t, events }: { duration: number; t: number; events: RunEvent[] }) {
  const pct = (x: number) => `${duration > 0 ? (x / duration) * 100 : 0}%`;
  // With several trains, each train's marks carry its number.
  const many = events.some((e) => e.train !== null && e.train > 0);
  return (
    <div className="space-y-1">
      <div className="relative h-5" aria-hidden>
        {events.map((e, i) => (
          <span key={`${e.kind}-${i}`} className="absolute top-0 -translate-x-1/2 whitespace-nowrap text-[12px] leading-none" style={{ left: pct(e.t), color: EVENT_STYLE[e.kind].colour }} title={`${e.label} at ${e.t.toFixed(2)} s`}>
            {EVENT_STYLE[e.kind].mark}
            {e.train !== null && many ? <sub className="text-[9px]">{e.train + 1}</sub> : null}
          </span>
        ))}
      </div>
      <input
        type="range"
        min={0}
        max={duration}
        step={0.01}
        value={t}
        aria-label="Replay time"
        className="w-full accent-lamp-600"
        data-testid="replay-scrubber"
        onChange={(e) => {
          const s = useReplayStore.getState();
          s.setPlaying(false);
          s.setT(Number(e.target.value));
        }}
      />
      <div className="flex flex-wrap gap-1.5" data-testid="event-list">
        {events.map((e, i) => (
          <button
            key={`${e.kind}-${i}`}
            type="button"
            onClick={() => {
              const s = useReplayStore.getState();
              s.setPlaying(false);
              s.setT(e.t);
            }}
            className="inline-flex items-center gap-1 rounded border border-steel-300/70 bg-white px-2 py-0.5 text-[12px] text-ink-800 hover:border-steel-500"
            data-testid={`event-${e.kind}`}
            data-train={e.train === null ? undefined : e.train + 1}
          >
            <span style={{ color: EVENT_STYLE[e.kind].colour }} aria-hidden>
              {EVENT_STYLE[e.kind].mark}
            </span>
            {e.label} <span className="font-mono text-steel-500">{e.t.toFixed(2)} s</span>
          </button>
        ))}
      </div>
    </div>
  );
}
