"use client";
import type { UnitSystem } from "@/lib/client/units";
import { NUMERIC_PARAMETERS } from "@/lib/studies/schema";
import type { StudyView } from "@/lib/studies/service";
import { FIGURES, figure, paramHeader, paramValue, unitLabel } from "./format";

const COLOURS = ["#e08a00", "#1a6fb5", "#1f7a3a", "#8a3fb0", "#b3261e", "#4c5d6e"];

type Cases = NonNullable<StudyView["cases"]>;

/** Line plots of headline figures against the study's numeric parameter, one line per value of the other. */
export function StudyLinePlots({ study, units }: { study: StudyView; units: UnitSystem }) {
  const axis = study.parameters.find((p) => (NUMERIC_PARAMETERS as readonly string[]).includes(p.key));
  if (!axis) return null;
  const other = study.parameters.find((p) => p !== axis);
  const chains = new Map(study.chains.map((c) => [c.id, c.designation]));
  const cases = (study.cases ?? []).filter((c) => c.status === "done" && c.headline);
  const groups = new Map<string, Cases>();
  for (const c of cases) {
    const g = other ? String(c.values[other.key]) : "";
    groups.set(g, [...(groups.get(g) ?? []), c]);
  }
  const plotted = FIGURES.filter((f) => ["peakTension", "snatchFactor", "rollbackDistance", "pickupDelay"].includes(f.key));
  return (
    <div className="grid gap-4 md:grid-cols-2" data-testid="study-line-plots">
      {plotted.map((f) => (
        <LinePlot
          key={f.key}
          title={`${f.label}${unitLabel(f.quantity, units)} against ${paramHeader(axis.key, units)}`}
          series={[...groups.entries()].map(([g, cs], i) => ({
            label: other ? paramValue(other.key, other.key === "chainSpec" ? Number(g) : g, units, chains) : "all cases",
            colour: COLOURS[i % COLOURS.length],
            points: cs
              .map((c) => [Number(paramValue(axis.key, c.values[axis.key], units, chains)), Number(figure(c.headline![f.key], f.quantity, units, 6))] as [number, number])
              .filter(([, y]) => Number.isFinite(y))
              .sort((a, b) => a[0] - b[0]),
          }))}
        />
      ))}
    </div>
  );
}

function LinePlot({ title, series }: { title: string; series: { label: string; colour: string; points: [number, number][] }[] }) {
  const W = 420;
  const H = 200;
  const pad = { l: 52, r: 10, t: 10, b: 28 };
  const all = series.flatMap((s) => s.points);
  if (!all.length) return null;
  const xs = all.map((p) => p[0]);
  const ys = all.map((p) => p[1]);
  const [x0, x1] = [Math.min(...xs), Math.max(...xs) || 1];
  let [y0, y1] = [Math.min(...ys), Math.max(...ys)];
  if (y1 <= y0) [y0, y1] = [y0 - 1, y1 + 1];
  const sx = (x: number) => pad.l + ((x - x0) / (x1 - x0 || 1)) * (W - pad.l - pad.r);
  const sy = (y: number) => H - pad.b - ((y - y0) / (y1 - y0)) * (H - pad.t - pad.b);
  return (
    <figure className="rounded-md border border-steel-200 bg-white p-3">
      <figcaption className="mb-1 text-[12.5px] font-semibold text-ink-900">{title}</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="w-full" role="img" aria-label={title}>
        <rect x={pad.l} y={pad.t} width={W - pad.l - pad.r} height={H - pad.t - pad.b} fill="none" stroke="#cbd5dd" />
        {[0, 0.5, 1].map((f) => (
          <text key={f} x={pad.l - 4} y={sy(y0 + f * (y1 - y0)) + 3} textAnchor="end" fontSize="10" fill="#5f7386">
            {(y0 + f * (y1 - y0)).toPrecision(3)}
          </text>
        ))}
        {[0, 0.5, 1].map((f) => (
          <text key={f} x={sx(x0 + f * (x1 - x0))} y={H - 10} textAnchor="middle" fontSize="10" fill="#5f7386">
            {(x0 + f * (x1 - x0)).toPrecision(3)}
          </text>
        ))}
        {series.map((s) => (
          <g key={s.label}>
            <polyline fill="none" stroke={s.colour} strokeWidth="1.8" points={s.points.map(([x, y]) => `${sx(x)},${sy(y)}`).join(" ")} />
            {s.points.map(([x, y]) => (
              <circle key={`${x}`} cx={sx(x)} cy={sy(y)} r="2.4" fill={s.colour} />
            ))}
          </g>
        ))}
      </svg>
      <div className="mt-1 flex flex-wrap gap-3 text-[11.5px] text-steel-600">
        {series.map((s) => (
          <span key={s.label} className="inline-flex items-center gap-1">
            <span className="inline-block h-0.5 w-4" style={{ background: s.colour }} /> {s.label}
          </span>
        ))}
      </div>
    </figure>
  );
}
