"use client";
/**
 * Line plots of a study's headline figures against its numeric parameter (uPlot, components/plot/UPlotChart),
 * one line per value of the other parameter. A dispatch study plots the chain tension and the take-up's travel
 * and marks the intervals where the following train's pick-up falls into the first train's release surge.
 */
import { useMemo } from "react";
import type uPlot from "uplot";
import type { UnitSystem } from "@/lib/client/units";
import { NUMERIC_PARAMETERS } from "@/lib/studies/schema";
import type { StudyView } from "@/lib/studies/service";
import { pickupMeetsReleaseSurge } from "@/lib/studies/dispatch";
import { UPlotChart, plotAxis } from "@/components/plot/UPlotChart";
import { DISPATCH_FIGURES, FIGURES, figure, paramHeader, paramValue, unitLabel } from "./format";

const COLOURS = ["#e08a00", "#1a6fb5", "#1f7a3a", "#8a3fb0", "#b3261e", "#4c5d6e"];
const MARK = "#b3261e";
export const SURGE_MARK_LABEL = "pick-up in the release surge";

type Case = NonNullable<StudyView["cases"]>[number];

interface Line {
  label: string;
  colour: string;
  /** y on the shared x values (null where the line has no case). */
  ys: (number | null)[];
}

/** Whether a dispatch case's second pick-up met the first train's release surge (lib/studies/dispatch.ts). */
export function meetsSurge(c: Case): boolean {
  const h = c.headline ?? {};
  return pickupMeetsReleaseSurge({ secondPickupTime: h.secondPickupTime ?? null, firstReleaseTime: h.firstReleaseTime ?? null, surgePeriod: h.surgePeriod ?? null }) === true;
}

export function StudyLinePlots({ study, units }: { study: StudyView; units: UnitSystem }) {
  const axis = study.parameters.find((p) => (NUMERIC_PARAMETERS as readonly string[]).includes(p.key));
  const charts = useMemo(() => {
    if (!axis) return [];
    const other = study.parameters.find((p) => p !== axis);
    const chains = new Map(study.chains.map((c) => [c.id, c.designation]));
    const cases = (study.cases ?? []).filter((c) => c.status === "done" && c.headline);
    const xOf = (c: Case) => Number(paramValue(axis.key, c.values[axis.key], units, chains));
    const xs = [...new Set(cases.map(xOf))].filter(Number.isFinite).sort((a, b) => a - b);
    const groups = new Map<string, Case[]>();
    for (const c of cases) {
      const g = other ? String(c.values[other.key]) : "";
      groups.set(g, [...(groups.get(g) ?? []), c]);
    }
    const dispatch = axis.key === "dispatchInterval";
    const plotted = dispatch ? DISPATCH_FIGURES : FIGURES.filter((f) => ["peakTension", "snatchFactor", "rollbackDistance", "pickupDelay"].includes(f.key));
    const xLabel = paramHeader(axis.key, units);
    return plotted.map((f) => {
      const yOf = (c: Case) => {
        const v = Number(figure(c.headline![f.key], f.quantity, units, 6));
        return Number.isFinite(v) ? v : null;
      };
      const lines: Line[] = [...groups.entries()].map(([g, cs], i) => ({
        label: other ? paramValue(other.key, other.key === "chainSpec" ? Number(g) : g, units, chains) : "all cases",
        colour: COLOURS[i % COLOURS.length],
        ys: xs.map((x) => {
          const c = cs.find((k) => xOf(k) === x);
          return c ? yOf(c) : null;
        }),
      }));
      // The surge mark sits on the line's point of each case whose second pick-up met the release surge.
      const marks = dispatch
        ? xs.map((x) => {
            const c = cases.find((k) => xOf(k) === x && meetsSurge(k));
            return c ? yOf(c) : null;
          })
        : null;
      const yLabel = `${f.label}${unitLabel(f.quantity, units)}`;
      const options: Omit<uPlot.Options, "width" | "height"> = {
        legend: { show: true, live: true },
        cursor: { drag: { x: false, y: false }, points: { size: 6 } },
        scales: { x: { time: false } },
        axes: [plotAxis(xLabel, 44), plotAxis(yLabel)],
        series: [
          { label: xLabel, value: (_u, v) => (v === null || v === undefined ? "—" : String(v)) },
          ...lines.map((l) => ({ label: l.label, stroke: l.colour, width: 1.8, spanGaps: true, points: { show: true, size: 5, fill: l.colour } })),
          ...(marks && marks.some((m) => m !== null)
            ? [{ label: SURGE_MARK_LABEL, stroke: MARK, width: 0, paths: () => null, points: { show: true, size: 12, stroke: MARK, fill: "transparent", width: 2 } }]
            : []),
        ],
      };
      const data = [xs, ...lines.map((l) => l.ys), ...(marks && marks.some((m) => m !== null) ? [marks] : [])] as uPlot.AlignedData;
      return { key: f.key, title: `${yLabel} against ${xLabel}`, options, data };
    });
  }, [axis, study.parameters, study.chains, study.cases, units]);
  if (!axis || !charts.some((c) => c.data[0].length)) return null;
  const dispatch = axis.key === "dispatchInterval";
  const notCrested = dispatch ? (study.cases ?? []).filter((c) => c.status === "done" && c.headline?.lastTrainCrested === 0) : [];
  return (
    <div className="space-y-3">
      {dispatch ? (
        <p className="text-[12.5px] text-steel-600" data-testid="study-surge-note">
          A ring marks an interval where the following train&apos;s pick-up comes within one surge period of the first train&apos;s release at the crest ({SURGE_MARK_LABEL}): the two loads add on a chain that still rings.
          {notCrested.length ? ` In ${notCrested.length} case(s) the run ended before the last train's release: its crest is not in those figures.` : ""}
        </p>
      ) : null}
      <div className="grid gap-4 md:grid-cols-2" data-testid="study-line-plots">
        {charts.map((c) => (
          <figure key={c.key} className="min-w-0 rounded-md border border-steel-200 bg-white p-3">
            <figcaption className="mb-1 text-[12.5px] font-semibold text-ink-900">{c.title}</figcaption>
            <UPlotChart options={c.options} data={c.data} label={c.title} testId={`study-plot-${c.key}`} />
          </figure>
        ))}
      </div>
    </div>
  );
}
