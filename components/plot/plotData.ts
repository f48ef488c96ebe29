/** The run's series as plot panels in the user's units, and their CSV export (pure). */
import type { Series } from "@/sim";
import { toDisplay, unitOf, type Quantity, type UnitSystem } from "@/lib/client/units";

export interface PanelLine {
  key: keyof Series | "chainSpeed";
  label: string;
  colour: string;
  dash?: number[];
}

export interface Panel {
  id: string;
  title: string;
  q: Quantity;
  lines: PanelLine[];
}

/** Line colours: blue/orange/grey, told apart by dash as well as hue. */
export const PANELS: Panel[] = [
  {
    id: "tension",
    title: "Chain tension",
    q: "force",
    lines: [
      { key: "driveTension", label: "At the drive", colour: "#1f6fb2" },
      { key: "maxTension", label: "Highest along the chain", colour: "#b86e00", dash: [6, 3] },
    ],
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

export function panelData(panel: Panel, series: Series, chainSpeed: number[], units: UnitSystem): number[][] {
  return [
    series.t.slice(),
    ...panel.lines.map((l) => {
      const raw = l.key === "chainSpeed" ? chainSpeed : (series[l.key as keyof Series] as number[]);
      return raw.map((v) => toDisplay(v, panel.q, units));
    }),
  ];
}

/** Every series as CSV, one row per sample, units in the headings. */
export function seriesCsv(series: Series, chainSpeed: number[], units: UnitSystem): string {
  const cols: { head: string; values: (i: number) => number }[] = [{ head: "time (s)", values: (i) => series.t[i] }];
  for (const p of PANELS)
    for (const l of p.lines) {
      const raw = l.key === "chainSpeed" ? chainSpeed : (series[l.key as keyof Series] as number[]);
      const u = unitOf(p.q, units).label;
      cols.push({ head: `${p.title}: ${l.label} (${u})`, values: (i) => toDisplay(raw[i], p.q, units) });
    }
  const esc = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  const lines = [cols.map((c) => esc(c.head)).join(",")];
  for (let i = 0; i < series.t.length; i++) lines.push(cols.map((c) => Number(c.values(i).toPrecision(7))).join(","));
  return lines.join("\n") + "\n";
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
