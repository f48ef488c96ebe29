"use client";
/** The replay clock and view settings (zustand). The canvas subscribes outside React for every frame. */
import { useEffect, useState } from "react";
import { create } from "zustand";

export const SPEEDS = [0.25, 0.5, 1, 2, 4, 8] as const;

interface ReplayState {
  t: number;
  duration: number;
  playing: boolean;
  speed: number;
  /** Take-up drawing magnification (its real motion is centimetres on a drawing of tens of metres). */
  magnify: number;
  /** Drawing zoom (1 = the whole lift) and whether the view follows the train. */
  zoom: number;
  follow: boolean;
  setT(t: number): void;
  setDuration(d: number): void;
  setPlaying(p: boolean): void;
  setSpeed(s: number): void;
  faster(): void;
  slower(): void;
  setMagnify(m: number): void;
  setZoom(z: number): void;
  setFollow(f: boolean): void;
}

export const ZOOMS = [1, 2, 4, 8] as const;

export const useReplayStore = create<ReplayState>((set, get) => ({
  t: 0,
  duration: 0,
  playing: false,
  speed: 1,
  magnify: 20,
  zoom: 1,
  follow: false,
  setT: (t) => set({ t: Math.max(0, Math.min(get().duration, t)) }),
  setDuration: (d) => set({ duration: d, t: Math.min(get().t, d) }),
  setPlaying: (p) => set({ playing: p }),
  setSpeed: (s) => set({ speed: s }),
  faster: () => {
    const i = SPEEDS.indexOf(get().speed as (typeof SPEEDS)[number]);
    set({ speed: SPEEDS[Math.min(SPEEDS.length - 1, (i < 0 ? 2 : i) + 1)] });
  },
  slower: () => {
    const i = SPEEDS.indexOf(get().speed as (typeof SPEEDS)[number]);
    set({ speed: SPEEDS[Math.max(0, (i < 0 ? 2 : i) - 1)] });
  },
  setMagnify: (m) => set({ magnify: m }),
  setZoom: (z) => set({ zoom: z }),
  setFollow: (f) => set({ follow: f }),
}));

/**
 * The replay time for read-outs: immediate while paused, at most every `intervalMs` while playing, so text
 * and plot cursors do not re-render at the canvas's frame rate.
 */
export function useReplayTime(intervalMs = 80): number {
  const [t, setT] = useState(() => useReplayStore.getState().t);
  useEffect(() => {
    let last = 0;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const unsub = useReplayStore.subscribe((s, prev) => {
      if (s.t === prev.t) return;
      const now = Date.now();
      if (timer) clearTimeout(timer);
      if (!s.playing || now - last >= intervalMs) {
        last = now;
        setT(s.t);
      } else timer = setTimeout(() => setT(useReplayStore.getState().t), intervalMs);
    });
    return () => {
      unsub();
      if (timer) clearTimeout(timer);
    };
  }, [intervalMs]);
  return t;
}
