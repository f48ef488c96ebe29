/**
 * Design studies: create (validate every case before anything is stored), read with progress, time
 * left, the case table and the operating window, cancel, resume. Route handlers only call these.
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Study } from "@/models/Study";
import type { StudyCase } from "@/models/StudyCase";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { recordAudit } from "@/lib/audit/record";
import { conflict } from "@/lib/http/errors";
import { fromZod } from "@/lib/http/errors";
import { resolveRunInputs } from "@/lib/runs/service";
import { runConfig } from "@/lib/runs/config";
import { recoverInterruptedRuns } from "@/lib/runs/recover";
import { runnerMayBeAlive, RUNNER_ID } from "@/lib/jobs/runner-id";
import { abortRun } from "@/lib/runs/runner";
import { removeQueuedRun } from "@/lib/runs/queue";
import { jobMode } from "@/lib/jobs/dispatch";
import type { UnitSystem } from "@/lib/units/display";
import { createStudySchema, type StudyParameter } from "./schema";
import { planStudy } from "./plan";
import { abortStudyMesh, driveStudy, storedSettings } from "./driver";
import { settleOpenCases, refreshStudy } from "./progress";
import { operatingWindow, type OperatingWindow, type ValueNamer } from "./window";
import { describeRegion, studyRegion, type StudyRegion } from "./region";
import { caseMeshConfidence, type CaseMeshConfidence } from "./headline";
import type { Scenario as EngineScenario } from "@/sim/schema";

const NOT_FOUND = "Study";

export interface StudyCaseView {
  id: number;
  idx: number;
  values: Record<string, number | string>;
  status: string;
  runId: number | null;
  headline: Record<string, number | null> | null;
  checks: unknown[] | null;
  acceptable: boolean | null;
  /** Against the coarser mesh: null when not measured. `verdictSettled` false = acceptability may change. */
  mesh: { converged: boolean; verdictSettled: boolean; message: string } | null;
  error: string | null;
  wallTimeMs: number | null;
}

export interface StudyView {
  id: number;
  scenarioId: number;
  liftRevisionId: number;
  name: string;
  parameters: StudyParameter[];
  requireNoArdCatch: boolean;
  status: string;
  mode: string;
  casesTotal: number;
  casesDone: number;
  casesFailed: number;
  /** Estimated seconds until every case is finished (null before the first case finishes). */
  secondsLeft: number | null;
  chains: { id: number; designation: string }[];
  createdBy: number | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  version: number;
  /** The mesh the cases run at and why (null until it is chosen, before the first case runs). */
  mesh: { segments: number; settled: boolean; capped: boolean; reason: string } | null;
  cases?: StudyCaseView[];
  window?: OperatingWindow;
  /** Two-parameter studies: the grid as a region (states, governing check, recommended window, holes). */
  region?: StudyRegion | null;
  /** The recommended window in words, in the reader's units (two-parameter studies). */
  regionText?: string | null;
}

function caseView(c: StudyCase, mc: CaseMeshConfidence | null = null): StudyCaseView {
  return {
    id: c.id,
    idx: c.idx,
    values: c.values,
    status: c.status,
    runId: c.runId,
    headline: c.headline,
    checks: c.checks,
    acceptable: c.acceptable,
    mesh: mc ? { converged: mc.converged, verdictSettled: mc.verdictSettled, message: mc.message } : null,
    error: c.error,
    wallTimeMs: c.wallTimeMs,
  };
}

/** A namer for window sentences that knows the study's chain designations. */
export function studyNamer(study: Pick<Study, "settings">): ValueNamer {
  const chains = new Map(storedSettings(study).chains.map((c) => [c.id, c.designation]));
  return (key, value) => {
    if (key === "chainSpec") return `chain ${chains.get(Number(value)) ?? value}`;
    if (key === "loading") return value === "full" ? "the full train" : value === "empty" ? "the empty train" : "the part-loaded train";
    return String(value);
  };
}

/**
 * Each finished case against the same case on the coarser mesh, judged with the study's rule: from its run's
 * stored coarse summary (lib/engine/worker.ts). Cases whose run holds none (older runs) are left out.
 */
export async function casesMesh(study: Study, cases: StudyCase[]): Promise<Map<number, CaseMeshConfidence>> {
  const out = new Map<number, CaseMeshConfidence>();
  const done = cases.filter((c) => c.status === "done" && c.runId !== null);
  if (!done.length) return out;
  const runs = await getModels().Run.findAll({ where: { id: done.map((c) => c.runId!) }, attributes: ["id", "inputs", "summary", "diagnostics"] });
  const byId = new Map(runs.map((r) => [r.id, r]));
  const requireNoArd = storedSettings(study).requireNoArdCatch;
  for (const c of done) {
    const run = byId.get(c.runId!);
    if (!run?.summary) continue;
    const mc = caseMeshConfidence(run.inputs as unknown as EngineScenario, run.summary as Record<string, unknown>, run.diagnostics, requireNoArd);
    if (mc) out.set(c.id, mc);
  }
  return out;
}

/** The cases as the operating window reads them, each with whether its verdict is settled on the mesh. */
export function windowCasesOf(cases: StudyCase[], mesh: Map<number, CaseMeshConfidence>) {
  return cases.map((c) => ({ values: c.values, status: c.status, acceptable: c.acceptable, meshSettled: mesh.get(c.id)?.verdictSettled ?? null }));
}

function secondsLeft(study: Study, cases: StudyCase[] | null): number | null {
  const finished = study.casesDone + study.casesFailed;
  const open = study.casesTotal - finished;
  if (open <= 0) return 0;
  if (!study.startedAt || finished === 0 || (study.status !== "running" && study.status !== "queued")) return null;
  // Elapsed time per finished case so far, times what is left (covers parallel workers too).
  const elapsed = (Date.now() - study.startedAt.getTime()) / 1000;
  const doneHere = cases ? cases.filter((c) => c.finishedAt && c.finishedAt >= study.startedAt!).length : finished;
  const per = elapsed / Math.max(1, doneHere || finished);
  return Math.round(per * open);
}

function toView(study: Study, cases: StudyCase[] | null, units: UnitSystem = "si", mesh: Map<number, CaseMeshConfidence> = new Map()): StudyView {
  const st = storedSettings(study);
  const view: StudyView = {
    id: study.id,
    scenarioId: study.scenarioId,
    liftRevisionId: study.liftRevisionId,
    name: study.name,
    parameters: study.parameters as StudyParameter[],
    requireNoArdCatch: st.requireNoArdCatch,
    status: study.status,
    mode: study.mode,
    casesTotal: study.casesTotal,
    casesDone: study.casesDone,
    casesFailed: study.casesFailed,
    secondsLeft: secondsLeft(study, cases),
    chains: st.chains.map((c) => ({ id: c.id, designation: c.designation })),
    createdBy: study.createdBy,
    createdAt: study.createdAt.toISOString(),
    startedAt: study.startedAt?.toISOString() ?? null,
    finishedAt: study.finishedAt?.toISOString() ?? null,
    version: study.version,
    mesh: st.mesh ? { segments: st.mesh.segments, settled: st.mesh.settled, capped: st.mesh.capped, reason: st.mesh.reason } : null,
  };
  if (cases) {
    view.cases = cases.map((c) => caseView(c, mesh.get(c.id) ?? null));
    view.window = operatingWindow(view.parameters, windowCasesOf(cases, mesh), { units, name: studyNamer(study) });
    view.region = studyRegion(view.parameters, cases);
    view.regionText = view.region ? describeRegion(view.region, units, studyNamer(study)) : null;
  }
  return view;
}

/** Validates and stores a study with all its cases (queued), then starts running it. */
export async function createStudy(actor: Actor, raw: unknown): Promise<StudyView> {
  assertCan(actor, "study:run");
  const parsed = createStudySchema.safeParse(raw);
  if (!parsed.success) throw fromZod(parsed.error, "The study has invalid fields.");
  const body = parsed.data;
  const { ChainSpec, Train, Scenario, Study, StudyCase } = getModels();
  // Only the settings of the scenario's run section apply to the base scenario (resolveRunInputs picks them).
  const resolved = await resolveRunInputs(actor, body.scenarioId, body.settings);
  const scenario = await Scenario.findByPk(resolved.scenarioId);
  const train = await Train.findByPk(scenario!.trainId);
  const chainIds = body.parameters.flatMap((p) => (p.key === "chainSpec" ? p.values : []));
  const chainRows = chainIds.length ? await ChainSpec.findAll({ where: { id: { [Op.in]: chainIds } } }) : [];
  const { grid, stored } = planStudy({
    body,
    organisationId: actor.organisationId,
    base: resolved.inputs,
    train: { carMassEmpty: train!.carMassEmpty, seatsPerCar: train!.seatsPerCar, riderMass: train!.riderMass },
    chainRows,
    defaultBudgetSeconds: runConfig().defaultBudgetSeconds,
  });

  const study = await Study.sequelize!.transaction(async (transaction) => {
    const s = await Study.create(
      {
        organisationId: actor.organisationId,
        scenarioId: resolved.scenarioId,
        liftRevisionId: resolved.liftRevisionId,
        name: body.name,
        parameters: body.parameters,
        settings: stored as unknown as Record<string, unknown>,
        mode: jobMode(),
        casesTotal: grid.length,
        driver: null,
        createdBy: actor.id,
        startedAt: null,
        finishedAt: null,
      },
      { transaction },
    );
    await StudyCase.bulkCreate(
      grid.map((values, idx) => ({
        studyId: s.id,
        organisationId: actor.organisationId,
        idx,
        values,
        runId: null,
        headline: null,
        checks: null,
        acceptable: null,
        error: null,
        wallTimeMs: null,
        finishedAt: null,
      })),
      { transaction },
    );
    await recordAudit({
      transaction,
      actor,
      entity: "study",
      entityId: s.id,
      action: "create",
      before: null,
      after: { name: s.name, scenarioId: s.scenarioId, parameters: body.parameters, cases: grid.length, mode: s.mode },
    });
    return s;
  });
  void driveStudy(study.id);
  return toView(study, null);
}

async function findOwnStudy(actor: Actor, id: number): Promise<Study> {
  return ownOr404(await getModels().Study.findByPk(id), actor, NOT_FOUND);
}

/** A study's id and name, for its page's heading (404 for another organisation's). */
export async function getStudyHeading(actor: Actor, id: number): Promise<{ id: number; name: string }> {
  assertCan(actor, "study:read");
  const study = ownOr404(await getModels().Study.findByPk(id, { attributes: ["id", "organisationId", "name"] }), actor, NOT_FOUND);
  return { id: study.id, name: study.name };
}

export async function getStudy(actor: Actor, id: number, opts: { units?: UnitSystem } = {}): Promise<StudyView> {
  assertCan(actor, "study:read");
  let study = await findOwnStudy(actor, id);
  if (study.status === "running" || study.status === "queued") {
    await settleOpenCases(study.id);
    study = await findOwnStudy(actor, id);
  }
  const cases = await getModels().StudyCase.findAll({ where: { studyId: id }, order: [["idx", "ASC"]] });
  return toView(study, cases, opts.units, await casesMesh(study, cases));
}

export async function listStudies(actor: Actor, q: { scenarioId?: number; page: number; pageSize: number }) {
  assertCan(actor, "study:read");
  const { Study } = getModels();
  const { rows, count } = await Study.findAndCountAll({
    where: { organisationId: actor.organisationId, ...(q.scenarioId ? { scenarioId: q.scenarioId } : {}) },
    order: [["id", "DESC"]],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  return { items: rows.map((s) => toView(s, null)), total: count, page: q.page, pageSize: q.pageSize };
}

/** Cancels a study: waiting cases are dropped, running cases' runs are cancelled; finished cases stay. */
export async function cancelStudy(actor: Actor, id: number): Promise<StudyView> {
  assertCan(actor, "study:run");
  const { Study, StudyCase, Run } = getModels();
  const study = await findOwnStudy(actor, id);
  if (study.status !== "queued" && study.status !== "running") throw conflict(`The study is already ${study.status}.`);
  const open = await StudyCase.findAll({ where: { studyId: id, status: { [Op.in]: ["queued", "running"] } } });
  const runIds = open.map((c) => c.runId).filter((r): r is number => r !== null);
  await Study.sequelize!.transaction(async (transaction) => {
    const [n] = await Study.update(
      { status: "cancelled", finishedAt: new Date(), version: Study.sequelize!.literal("version + 1") as never },
      { where: { id, status: { [Op.in]: ["queued", "running"] } }, transaction },
    );
    if (!n) throw conflict("The study has just finished.");
    if (runIds.length) {
      await Run.update(
        { status: "cancelled", finishedAt: new Date(), version: Run.sequelize!.literal("version + 1") as never },
        { where: { id: { [Op.in]: runIds }, status: { [Op.in]: ["queued", "running"] } }, transaction },
      );
    }
    await StudyCase.update(
      { status: "cancelled", finishedAt: new Date(), error: "Cancelled with the study." },
      { where: { studyId: id, status: { [Op.in]: ["queued", "running"] } }, transaction },
    );
    await recordAudit({ transaction, actor, entity: "study", entityId: id, action: "update", before: { status: study.status }, after: { status: "cancelled" } });
  });
  abortStudyMesh(id);
  for (const runId of runIds) await abortRun(runId);
  for (const runId of runIds) await removeQueuedRun({ id: runId, organisationId: study.organisationId });
  await refreshStudy(id);
  return getStudy(actor, id);
}

/** Puts the unfinished cases back in the queue (finished ones are kept) and runs the study again. */
async function requeueOpenCases(studyId: number): Promise<number> {
  const { StudyCase } = getModels();
  const [n] = await StudyCase.update(
    { status: "queued", runId: null, error: null, finishedAt: null },
    { where: { studyId, status: { [Op.ne]: "done" } } },
  );
  return n;
}

export async function resumeStudy(actor: Actor, id: number): Promise<StudyView> {
  assertCan(actor, "study:run");
  const { Study } = getModels();
  const study = await findOwnStudy(actor, id);
  const driverGone = study.status === "running" && study.mode === "pool" && !runnerMayBeAlive(study.driver);
  if (study.status === "done" && study.casesFailed === 0) throw conflict("Every case of this study has finished.");
  if ((study.status === "running" || study.status === "queued") && !driverGone) throw conflict("The study is still running.");
  await Study.sequelize!.transaction(async (transaction) => {
    await Study.update(
      { status: "queued", finishedAt: null, version: Study.sequelize!.literal("version + 1") as never },
      { where: { id }, transaction },
    );
    await recordAudit({ transaction, actor, entity: "study", entityId: id, action: "update", before: { status: study.status }, after: { status: "queued", resumed: true } });
  });
  await requeueOpenCases(id);
  await refreshStudy(id);
  void driveStudy(id);
  return getStudy(actor, id);
}

/**
 * After a restart: studies driven by a process that is gone continue in this one, keeping every
 * finished case (cases whose run was interrupted are queued again). Queue-mode studies need no driver.
 * Called at server start (lib/engine/startup.ts).
 */
export async function recoverStudies(): Promise<number> {
  const { Study } = getModels();
  await recoverInterruptedRuns();
  const stale = await Study.findAll({ where: { status: { [Op.in]: ["queued", "running"] }, mode: "pool" } });
  let n = 0;
  for (const s of stale) {
    if (s.driver === RUNNER_ID || (s.driver !== null && runnerMayBeAlive(s.driver))) continue;
    if (s.driver === null && s.status === "queued" && s.createdAt.getTime() > Date.now() - 60_000) continue; // just created
    await settleOpenCases(s.id);
    await requeueOpenCases(s.id);
    await Study.update({ status: "queued", finishedAt: null }, { where: { id: s.id } });
    void driveStudy(s.id);
    n += 1;
  }
  return n;
}
