/**
 * Everything a design-check report shows, gathered from the database into one plain object. The PDF
 * is drawn from it, and its hash (sha256 of canonical JSON) is what approval stamps: the same content
 * always gives the same hash, whenever the PDF is drawn.
 */
import crypto from "node:crypto";
import { Op } from "sequelize";
import { getModels } from "@/models";
import { conflict } from "@/lib/http/errors";
import type { Report } from "@/models/Report";
import { designStatics } from "@/sim/statics";
import { summaryForReport, type ReportSummaryValue } from "./figures";
import { evaluateChecks, type Check } from "@/sim/checks";
import { LIMIT_SOURCES, limitsSchema, type Scenario as EngineScenario } from "@/sim/schema";
import type { Summary } from "@/sim/summary";
import { decodeResult } from "@/lib/runs/result-format";
import { json } from "@/lib/runs/serialize";
import { OVERRIDE_FIELDS, RUN_OVERRIDE_KEYS, type RunOverrideKey } from "@/lib/runs/overrides";
import { fmtQ, reasonIn } from "./format";
import { limitLabel, limitValue } from "./assumptions";
import { DEFAULT_RIDER_MASS } from "@/lib/trains/schema";
import { operatingWindow } from "@/lib/studies/window";
import { casesMesh, studyNamer, windowCasesOf } from "@/lib/studies/service";
import { reportSnapshot } from "./snapshot";
import type { StudyParameter } from "@/lib/studies/schema";

export const REPORT_CAUTIONS = [
  "Results support, and never replace, review by a qualified engineer.",
  "The governing standards of the jurisdiction, the ride's manufacturer data and licensed practice govern.",
  "The model is a spring-segment chain with a weighted 2:1 gravity take-up; its assumptions are listed in this report.",
];

export interface ReportSeries {
  t: number[];
  maxTension: number[];
  driveTension: number[];
  trainSpeed: number[];
  takeUpPosition: number[];
}

export type ReportCheck = Omit<Check, "parts">;

export interface ReportContent {
  title: string;
  units: "si" | "us";
  organisation: string;
  scenario: { id: number; name: string; loading: string; entrySpeed: number; notes: string | null };
  lift: { name: string; site: string | null; revision: number; revisionId: number; changeSummary: string | null };
  train: { name: string; cars: number; carMassEmpty: number; seatsPerCar: number; riderMass: number };
  inputs: EngineScenario;
  /** Each assumption in words: label, value in the report's units, and its source. */
  assumptions: { key: string; label: string; value: string; source: string }[];
  /** What makes this run's case differ from the scenario (a what-if, a study case), in words; null for the scenario itself. */
  case: string | null;
  statics: {
    steadyTension: number;
    takeUpTension: number;
    loadedStretch: number;
    takeUp: { required: number; travel: number; margin: number; elasticExcursion: number; wearAllowance: number; thermal: number };
    motorPower: number;
    drivePull: number;
    torque: number;
    chordalSpeedVariation: number;
    safetyFactor: number;
    waveSpeed: number;
  };
  run: { id: number; finishedAt: string | null; summary: Record<string, ReportSummaryValue> } | null;
  series: ReportSeries | null;
  /** The checks with their reason already in the report's units (no parts: the content is what is printed). */
  checks: ReportCheck[];
  study: { id: number; name: string; cases: number; done: number; window: string } | null;
  revisions: { number: number; changeSummary: string | null; createdAt: string }[];
  cautions: string[];
}

function pick(series: Record<string, ArrayLike<number>>, key: string, every: number): number[] {
  const a = series[key];
  if (!a) return [];
  const out: number[] = [];
  for (let i = 0; i < a.length; i += every) out.push(Number(a[i]));
  return out;
}

function whatIfText(o: Partial<Record<RunOverrideKey, number>>, from: Partial<Record<RunOverrideKey, number>> | null, units: "si" | "us"): string {
  const q = (k: RunOverrideKey, v: number) => fmtQ(v, OVERRIDE_FIELDS[k].quantity, units, OVERRIDE_FIELDS[k].quantity === "mass" ? 0 : 2);
  return RUN_OVERRIDE_KEYS.filter((k) => o[k] !== undefined)
    .map((k) => `${OVERRIDE_FIELDS[k].label} ${q(k, o[k]!)}${from?.[k] !== undefined ? ` (scenario: ${q(k, from[k]!)})` : ""}`)
    .join(", ");
}

export async function buildReportContent(report: Report): Promise<ReportContent> {
  const { Scenario, LiftRevision, Lift, Train, Run, Organisation, Study, StudyCase, Report: Reports } = getModels();
  // An approved report is what was approved: its snapshot, never the live rows.
  if (report.status === "approved") {
    const held = report.snapshot !== undefined ? report : await Reports.scope("withSnapshot").findByPk(report.id, { attributes: ["id", "snapshot"] });
    const snap = held ? reportSnapshot(held) : null;
    if (snap) return snap.content;
  }
  const scenario = (await Scenario.findByPk(report.scenarioId))!;
  const revision = (await LiftRevision.findByPk(report.liftRevisionId))!;
  const lift = (await Lift.findByPk(revision.liftId))!;
  const train = (await Train.findByPk(scenario.trainId))!;
  const org = await Organisation.findByPk(report.organisationId);
  const run = report.runId ? await Run.scope("withResult").findByPk(report.runId) : null;
  if (!run || run.status !== "done" || !run.summary) throw conflict("This report's run is no longer there or has no result; create the report again from a finished run.");
  const inputs = run.inputs as unknown as EngineScenario;
  const limits = limitsSchema.parse(inputs.limits ?? {});
  const statics = designStatics(inputs, { limits });
  const summary = run.summary as Record<string, unknown>;
  const checks = evaluateChecks(summary as unknown as Summary, statics, limits);

  let series: ReportSeries | null = null;
  if (run.result) {
    const decoded = decodeResult(run.result, { arrays: "plain" }) as { series?: Record<string, number[]> };
    const s = decoded.series;
    if (s?.t?.length) {
      const every = Math.max(1, Math.ceil(s.t.length / 400)); // enough points for a printed plot
      series = {
        t: pick(s, "t", every),
        maxTension: pick(s, "maxTension", every),
        driveTension: pick(s, "driveTension", every),
        trainSpeed: pick(s, "trainSpeed", every),
        takeUpPosition: pick(s, "takeUpPosition", every),
      };
    }
  }

  // The case this run solved, when it is not the scenario as saved.
  let caseText: string | null = null;
  if (run.overrides) {
    caseText = `What-if run: the server ran the scenario with ${whatIfText(json(run.overrides), json(run.overridesFrom ?? null), report.units)}; the scenario itself is unchanged.`;
  } else {
    const sc = await StudyCase.findOne({ where: { runId: run.id } });
    if (sc) {
      const st = await Study.findByPk(sc.studyId, { attributes: ["id", "name"] });
      caseText = `Case ${sc.idx + 1} of the study "${st?.name ?? sc.studyId}": the inputs below are this case's own.`;
    }
  }

  let study: ReportContent["study"] = null;
  if (report.studyId) {
    const st = await Study.findByPk(report.studyId);
    if (st) {
      const cases = await StudyCase.findAll({ where: { studyId: st.id }, order: [["idx", "ASC"]] });
      const windowCases = windowCasesOf(cases, await casesMesh(st, cases));
      const w = operatingWindow(st.parameters as StudyParameter[], windowCases, { units: report.units, name: studyNamer(st) });
      study = { id: st.id, name: st.name, cases: st.casesTotal, done: st.casesDone, window: w.text };
    }
  }

  const revisions = await LiftRevision.findAll({
    where: { liftId: lift.id, number: { [Op.lte]: revision.number } },
    order: [["number", "ASC"]],
    attributes: ["number", "changeSummary", "createdAt"],
  });

  const summaryOut = summaryForReport(summary);

  return {
    title: report.title,
    units: report.units,
    organisation: org?.name ?? "",
    scenario: { id: scenario.id, name: scenario.name, loading: scenario.loading, entrySpeed: inputs.trains[0]!.entrySpeed, notes: scenario.notes },
    lift: { name: lift.name, site: lift.site, revision: revision.number, revisionId: revision.id, changeSummary: revision.changeSummary },
    train: { name: train.name, cars: train.cars, carMassEmpty: train.carMassEmpty, seatsPerCar: train.seatsPerCar, riderMass: train.riderMass },
    inputs,
    assumptions: [
      ...(Object.keys(LIMIT_SOURCES) as (keyof typeof LIMIT_SOURCES)[]).map((k) => ({
        key: k as string,
        label: limitLabel(k),
        value: limitValue(k, limits[k], report.units),
        source: LIMIT_SOURCES[k],
      })),
      // Rider mass matters only when riders are aboard.
      ...(scenario.loading !== "empty"
        ? [{ key: "riderMass", label: "Mass of one rider", value: fmtQ(train.riderMass, "mass", report.units, 0), source: `Mass per rider used for loaded cars: an assumption of the train entry (default ${fmtQ(DEFAULT_RIDER_MASS, "mass", report.units, 0)}).` }]
        : []),
      {
        key: "gravity",
        label: "Standard gravity (accelerations in g)",
        value: report.units === "si" ? "9.81 m/s²" : "32.17 ft/s²",
        source: "Standard acceleration of gravity 9.806 65 m/s² (3rd CGPM, 1901; NIST SP 811).",
      },
      // A what-if run's inputs already hold its overrides; say so beside the scenario's own values.
      ...(run.overrides
        ? [{ key: "whatIf", label: "What-if values", value: whatIfText(json(run.overrides), json(run.overridesFrom ?? null), report.units), source: "What-if run: the server ran the scenario with these values in place of its own; the scenario itself is unchanged." }]
        : []),
      { key: "model", label: "Chain model", value: `${inputs.run.segments} spring segments, ${inputs.run.integrator} integrator`, source: "Chain as spring segments, solved by the Tautline engine; see the engine's notes." },
    ],
    case: caseText,
    statics: {
      steadyTension: statics.worst.driveTension ?? 0,
      takeUpTension: statics.takeUpTension,
      loadedStretch: statics.loadedStretch,
      takeUp: {
        required: statics.takeUp.required,
        travel: statics.takeUp.travel,
        margin: statics.takeUp.margin,
        elasticExcursion: statics.takeUp.elasticExcursion,
        wearAllowance: statics.takeUp.wearAllowance,
        thermal: statics.takeUp.thermal,
      },
      motorPower: statics.motorPower,
      drivePull: statics.drivePull,
      torque: statics.torque,
      chordalSpeedVariation: statics.chordalSpeedVariation,
      safetyFactor: statics.safetyFactor,
      waveSpeed: statics.waveSpeed,
    },
    run: { id: run.id, finishedAt: run.finishedAt?.toISOString() ?? null, summary: summaryOut },
    series,
    checks: checks.map(({ parts, ...c }) => ({ ...c, reason: reasonIn({ reason: c.reason, parts }, report.units) })),
    study,
    revisions: revisions.map((r) => ({ number: r.number, changeSummary: r.changeSummary, createdAt: r.createdAt.toISOString() })),
    cautions: REPORT_CAUTIONS,
  };
}

function canonical(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(canonical);
  if (v && typeof v === "object") {
    return Object.fromEntries(Object.keys(v as object).sort().map((k) => [k, canonical((v as Record<string, unknown>)[k])]));
  }
  return v;
}

/** sha256 (hex) of the content as canonical JSON (keys sorted). */
export function contentHash(content: ReportContent): string {
  return crypto.createHash("sha256").update(JSON.stringify(canonical(content))).digest("hex");
}
