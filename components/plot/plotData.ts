/** The run's series as plot panels in the user's units, and their CSV export (pure). */
import { toCsv } from "@/lib/csv/write";
import type { Series } from "@/sim";
import type { SeriesKey, TrainSeriesKey } from "@/sim/frames";
import { toDisplay, unitOf, type Quantity, type UnitSystem } from "@/lib/client/units";

export interface PanelLine {
  /**
   * A series of the run, or one derived from it here (chain speed) or from the frames (tension at the dog), or
   * "train": one train's own signal `series.trains[train.index][train.key]`.
   */
  key: SeriesKey | "chainSpeed" | "dogTension" | "train";
  train?: { index: number; key: TrainSeriesKey };
  label: string;
  colour: string;
  dash?: number[];
}

export interface Panel {
  id: string;
  title: string;
  q: Quantity;
  lines: PanelLine[];
  /** What a line means where its label cannot say it all. */
  note?: string;
}

/** Series that are not in the engine's `Series`: computed from it or from the replay frames. */
export interface DerivedSeries {
  chainSpeed: number[];
  /** Chain tension at the dog (sim `dogTensionAt`), null where the dog is off the chain; absent: no frames. */
  dogTension?: (number | null)[];
}

export const DOG_TENSION_NOTE =
  "At the dog: tension of the chain just ahead of the dog's catch point, the side that pulls the train; " +
  "taken from the replay frames, so as fine in time as they are. Before pick-up it is the chain under the dog; " +
  "a gap where the dog is off the chain (before it starts, after the release at the crest).";

/** Line colours: blue/orange/grey, told apart by dash as well as hue. */
export const PANELS: Panel[] = [
  {
    id: "tension",
    title: "Chain tension",
    q: "force",
    lines: [
      { key: "driveTension", label: "At the drive", colour: "#1f6fb2" },
      { key: "maxTension", label: "Highest along the chain", colour: "#b86e00", dash: [6, 3] },
      { key: "dogTension", label: "At the dog", colour: "#5f7386", dash: [8, 3, 2, 3] },
    ],
    note: DOG_TENSION_NOTE,
  },
  {
    id: "forces",
    title: "Dog and ARD forces",
    q: "force",
    lines: [
      { key: "dogForce", label: "Dog (chain on the train)", colour: "#1f6fb2" },
      { key: "ardForce", label: "ARD", colour: "#c0392b", dash: [4, 3] },
    ],
  },
  {
    id: "speed",
    title: "Train speed",
    q: "speed",
    lines: [
      { key: "trainSpeed", label: "Train", colour: "#1a2f42" },
      { key: "chainSpeed", label: "Chain (drive)", colour: "#5f7386", dash: [2, 3] },
    ],
  },
  {
    id: "takeUp",
    title: "Take-up position (down from start)",
    q: "smallLength",
    lines: [{ key: "takeUpPosition", label: "Counterweight", colour: "#e08a00" }],
  },
];

/** Chain speed at the drive over time: the ramp from rest to full speed over rampTime (linear). */
export function chainSpeedSeries(t: readonly number[], speed: number, rampTime: number): number[] {
  return t.map((x) => (rampTime > 0 ? Math.min(1, x / rampTime) : 1) * speed);
}

/**
 * The chain speed line: the drive's own speed as the engine computed it (`series.driveSpeed`, which shows the
 * motor's slip and the surge at the drive) when the run has it; the set ramp only for runs stored without it.
 */
export function chainSpeedOf(series: Series, speed: number, rampTime: number): number[] {
  const d = series.driveSpeed;
  return d && d.length === series.t.length && d.length > 0 ? Array.from(d) : chainSpeedSeries(series.t, speed, rampTime);
}

/** Colours of trains 1, 2, 3 … (cycled), each dashed differently as well. */
const TRAIN_COLOURS = ["#1a2f42", "#1f6fb2", "#b86e00", "#2e7d4f", "#7b3fa0", "#c0392b"];
const TRAIN_DASHES: (number[] | undefined)[] = [undefined, [6, 3], [2, 3], [8, 3, 2, 3]];

const trainLine = (j: number, key: TrainSeriesKey, what: string): PanelLine => ({
  key: "train",
  train: { index: j, key },
  label: `${what}, train ${j + 1}`,
  colour: TRAIN_COLOURS[j % TRAIN_COLOURS.length],
  dash: TRAIN_DASHES[j % TRAIN_DASHES.length],
});

/**
 * The panels for this run: with several trains, the dog and ARD forces and the speed panel draw one line per
 * train (from `series.trains[j]`) on the shared time axis instead of the flat keys, which are train 1's.
 */
export function panelsFor(series: Series): Panel[] {
  const n = series.trains?.length ?? 0;
  if (n <= 1) return PANELS;
  const trains = Array.from({ length: n }, (_, j) => j);
  return PANELS.map((p) => {
    if (p.id === "forces")
      return { ...p, lines: [...trains.map((j) => trainLine(j, "dogForce", "Dog")), ...trains.map((j) => ({ ...trainLine(j, "ardForce", "ARD"), dash: [4, 3] }))] };
    if (p.id === "speed") return { ...p, lines: [...trains.map((j) => trainLine(j, "speed", "Train")), ...p.lines.filter((l) => l.key === "chainSpeed")] };
    return p;
  });
}

/** The SI values of one line, or undefined when the run has none (no frames for the tension at the dog). */
export function lineValues(l: PanelLine, series: Series, derived: DerivedSeries): readonly (number | null)[] | undefined {
  if (l.key === "chainSpeed") return derived.chainSpeed;
  if (l.key === "dogTension") return derived.dogTension;
  if (l.key === "train") return l.train ? series.trains?.[l.train.index]?.[l.train.key] : undefined;
  return series[l.key];
}

export function panelData(panel: Panel, series: Series, derived: DerivedSeries, units: UnitSystem): (number | null)[][] {
  return [
    series.t.slice(),
    ...panel.lines.map((l) => {
      const raw = lineValues(l, series, derived) ?? series.t.map(() => null);
      return raw.map((v) => (v === null ? null : toDisplay(v, panel.q, units)));
    }),
  ];
}

/**
 * Every series as CSV, one row per sample, units in the headings; the tension at the dog only when given,
 * with empty cells where the dog is off the chain.
 */
export function seriesCsv(series: Series, chainSpeed: number[], units: UnitSystem, dogTension?: (number | null)[]): string {
  const derived: DerivedSeries = { chainSpeed, dogTension };
  const cols: { head: string; values: (i: number) => number | null }[] = [{ head: "time (s)", values: (i) => series.t[i] }];
  for (const p of panelsFor(series))
    for (const l of p.lines) {
      const raw = lineValues(l, series, derived);
      if (!raw) continue;
      const u = unitOf(p.q, units).label;
      cols.push({
        head: `${p.title}: ${l.label} (${u})`,
        values: (i) => {
          const v = raw[i];
          return v === null || v === undefined ? null : toDisplay(v, p.q, units);
        },
      });
    }
  const rows = series.t.map((_, i) =>
    cols.map((c) => {
      const v = c.values(i);
      return v === null ? null : Number(v.toPrecision(7));
    }),
  );
  return toCsv(
    cols.map((c) => c.head),
    rows,
  );
}

/** Index of the sample nearest to t (series on an even grid, searched anyway). */
export function nearestSample(t: readonly number[], x: number): number {
  let lo = 0;
  let hi = t.length - 1;
  if (hi <= 0) return 0;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid] <= x) lo = mid;
    else hi = mid;
  }
  return Math.abs(t[hi] - x) < Math.abs(t[lo] - x) ? hi : lo;
}
