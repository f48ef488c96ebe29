/**
 * What approval signs. The snapshot keeps every input of the report as it stood (the scenario row, its
 * lift revision with chain and limits, the train, the engine scenario the run solved, the formats of the
 * engine) and the content the PDF was drawn from. An approved report reads only its snapshot, so later
 * edits of the live rows never change it. Rows are copied generically (their JSON), so new fields of the
 * scenario format travel without code here.
 */
import type { Transaction } from "sequelize";
import { getModels } from "@/models";
import type { Report } from "@/models/Report";
import { json } from "@/lib/runs/serialize";
import { loadFollowerTrains } from "@/lib/scenarios/service";
import type { ReportContent } from "./content";

export interface ReportSnapshot {
  takenAt: string;
  /** The engine scenario the reported run solved (any scenario format version, kept as it is). */
  inputs: Record<string, unknown>;
  scenario: Record<string, unknown> | null;
  liftRevision: Record<string, unknown> | null;
  train: Record<string, unknown> | null;
  /** The train rows of the scenario's following trains, in order (absent in snapshots taken before several trains). */
  followerTrains?: Record<string, unknown>[];
  /** The limits the checks used (from the run's inputs). */
  limits: Record<string, unknown> | null;
  engine: { scenarioFormat: string | null; resultFormat: string | null; solver: Record<string, unknown> | null };
  content: ReportContent;
}

const plain = (row: { toJSON(): object } | null): Record<string, unknown> | null =>
  row ? (JSON.parse(JSON.stringify(row.toJSON())) as Record<string, unknown>) : null;

export async function takeSnapshot(report: Report, content: ReportContent, transaction?: Transaction): Promise<ReportSnapshot> {
  const { Scenario, LiftRevision, Train, Run } = getModels();
  const scenario = await Scenario.findByPk(report.scenarioId, { transaction });
  const run = report.runId ? await Run.findByPk(report.runId, { transaction }) : null;
  const inputs = json<Record<string, unknown>>(run?.inputs ?? content.inputs);
  const [revision, train] = await Promise.all([
    LiftRevision.findByPk(report.liftRevisionId, { transaction }),
    scenario ? Train.findByPk(scenario.trainId, { transaction }) : null,
  ]);
  const followerTrains = scenario ? await loadFollowerTrains(scenario, transaction) : [];
  return {
    takenAt: new Date().toISOString(),
    inputs,
    scenario: plain(scenario),
    liftRevision: plain(revision),
    train: plain(train),
    followerTrains: followerTrains.map((t) => plain(t)!),
    limits: (inputs.limits as Record<string, unknown> | undefined) ?? null,
    engine: {
      scenarioFormat: typeof inputs.format === "string" ? inputs.format : null,
      resultFormat: run?.resultFormat ?? null,
      solver: run ? json<Record<string, unknown>>(run.solver) : null,
    },
    content: JSON.parse(JSON.stringify(content)) as ReportContent,
  };
}

/** The snapshot of an approved report (null for drafts and for reports approved before snapshots existed). */
export function reportSnapshot(report: Pick<Report, "snapshot">): ReportSnapshot | null {
  const s = report.snapshot ? json<ReportSnapshot | null>(report.snapshot) : null;
  return s && s.content ? s : null;
}
