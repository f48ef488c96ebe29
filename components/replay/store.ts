"use client";
/** The replay clock and view settings (zustand). The canvas subscribes outside React for every frame. */
import { create } from "zustand";

export const SPEEDS = [0.25, 0.5, 1, 2, 4, 8] as const;

interface ReplayState {
  t: number;
  duration: number;
  playing: boolean;
  speed: number;
  /** Take-up drawing magnification (its real motion is centimetres on a drawing of tens of metres). */
  magnify: number;
  setT(t: number): void;
  setDuration(d: number): void;
  setPlaying(p: boolean): void;
  setSpeed(s: number): void;
  faster(): void;
  slower(): void;
  setMagnify(m: number): void;
}

export const useReplayStore = create<ReplayState>((set, get) => ({
  t: 0,
  duration: 0,
  playing: false,
  speed: 1,
  magnify: 20,
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
}));
