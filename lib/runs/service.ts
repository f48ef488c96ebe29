import { Op, type Transaction, type WhereOptions } from "sequelize";
import { getModels } from "@/models";
import type { Run } from "@/models/Run";
import { ownOr404, type Actor } from "@/lib/http/actor";
import { recordAudit } from "@/lib/audit/record";
import { engineScenarioInput } from "@/lib/scenarios/resolve";
import { loadFollowerTrains } from "@/lib/scenarios/service";
import { badRequest, conflict, HttpError, notFound, unavailable } from "@/lib/http/errors";
import { parseScenario, type Scenario as EngineScenario } from "@/sim/schema";
import { getJobPool, QueueFullError, type Slot } from "@/lib/jobs/pool";
import { runConfig } from "./config";
import { decodeResult } from "./result-format";
import { resultJsonStream } from "./result-stream";
import { abortRun, type SolverSettings } from "./runner";
import { dispatchRunJob, removeQueuedRun } from "./queue";
import { assertRunNotFrozen } from "@/lib/review/freeze";
import { RUNNER_ID } from "@/lib/jobs/runner-id";
import { RUN_OVERRIDE_KEYS, RUN_SECTION_OVERRIDES, type ListRunsQuery, type StartRunInput } from "./schema";
import { applyOverrides, overridableValues } from "./overrides";
import { ACTIVE_RUN_STATUSES, isFinished } from "./status";
import { json, toRunView, type OverrideValues, type RunView } from "./serialize";



/** The scenario, its pinned lift revision and train as one validated engine scenario, with overrides applied. */
export async function resolveRunInputs(
  user: Actor,
  scenarioId: number,
  overrides: StartRunInput,
): Promise<{
  scenarioId: number;
  liftRevisionId: number;
  inputs: EngineScenario;
  overrides: OverrideValues | null;
  overridesFrom: OverrideValues | null;
}> {
  const { Scenario, LiftRevision, Train } = getModels();
  const scenario = ownOr404(await Scenario.findByPk(scenarioId), user, "Scenario");
  if (scenario.archivedAt) throw conflict("This scenario is archived; restore it before starting a run.");
  const [revision, train, followerTrains] = await Promise.all([
    LiftRevision.findByPk(scenario.liftRevisionId),
    Train.findByPk(scenario.trainId),
    loadFollowerTrains(scenario),
  ]);
  if (!revision || !train) throw notFound("The scenario's lift revision or train is missing.");
  const resolved = engineScenarioInput(scenario, revision, train, followerTrains);
  const run = { ...(resolved.run as Record<string, unknown>) };
  for (const k of RUN_SECTION_OVERRIDES) if (overrides[k] !== undefined) run[k] = overrides[k];
  const parsed = parseScenario({ ...resolved, run });
  if (!parsed.ok) {
    throw badRequest("The scenario cannot be run as it stands: fix these fields first.", parsed.issues);
  }
  const base = { scenarioId: scenario.id, liftRevisionId: scenario.liftRevisionId };
  const what = overrides.overrides;
  const keys = what ? RUN_OVERRIDE_KEYS.filter((k) => what[k] !== undefined) : [];
  if (!what || keys.length === 0) return { ...base, inputs: parsed.scenario, overrides: null, overridesFrom: null };
  // A what-if run: the server applies the values itself and keeps what they replaced beside them.
  const own = overridableValues(parsed.scenario);
  const varied = parseScenario(applyOverrides(parsed.scenario, what));
  if (!varied.ok) throw badRequest("These what-if values do not make a valid scenario.", varied.issues);
  return {
    ...base,
    inputs: varied.scenario,
    overrides: Object.fromEntries(keys.map((k) => [k, what[k]!])),
    overridesFrom: Object.fromEntries(keys.map((k) => [k, own[k]])),
  };
}

function reserveSlot(organisationId: number): Slot {
  try {
    return getJobPool().reserve(organisationId);
  } catch (err) {
    if (err instanceof QueueFullError) {
      throw unavailable("Every run worker is busy and the queue is full; try again shortly.", err.retryAfterSeconds);
    }
    throw err;
  }
}

/**
 * Accepts a run: validates the inputs, holds a place in the job pool (503 when full, nothing stored),
 * stores the run as queued with its audit entry, and hands it to the pool. Answers at once.
 */
export async function startRun(user: Actor, scenarioId: number, body: StartRunInput): Promise<RunView> {
  const { scenarioId: sid, liftRevisionId, inputs, overrides, overridesFrom } = await resolveRunInputs(user, scenarioId, body);
  const solver: SolverSettings = {
    budgetSeconds: body.budgetSeconds ?? runConfig().defaultBudgetSeconds,
    ...(body.frameBudget !== undefined ? { frameBudget: body.frameBudget } : {}),
  };
  const slot = reserveSlot(user.organisationId);
  let run: Run;
  try {
    const { Run } = getModels();
    run = await Run.sequelize!.transaction(async (transaction) => {
      const row = await Run.create(
        {
          organisationId: user.organisationId,
          scenarioId: sid,
          liftRevisionId,
          startedBy: user.id,
          inputs: inputs as unknown as Record<string, unknown>,
          solver: { ...solver, run: inputs.run },
          overrides,
          overridesFrom,
          runner: RUNNER_ID,
          queuedAt: new Date(),
        },
        { transaction },
      );
      await recordAudit({
        transaction,
        actor: user,
        entity: "run",
        entityId: row.id,
        action: "create",
        before: null,
        after: { scenarioId: sid, liftRevisionId, status: "queued", solver: row.solver, ...(overrides ? { overrides, overridesFrom } : {}) },
      });
      return row;
    });
  } catch (err) {
    slot.release();
    throw err;
  }
  // Pool by default; BullMQ on Redis when REDIS_URL is set (lib/jobs/dispatch.ts).
  void dispatchRunJob(run, solver, slot).catch((err) => console.error(`run ${run.id}: could not queue`, err));
  return toRunView(run);
}

/** 404 unless the scenario exists in the user's organisation (checked before the body is read). */
export async function assertOwnScenario(user: Actor, scenarioId: number): Promise<void> {
  const { Scenario } = getModels();
  ownOr404(await Scenario.findByPk(scenarioId, { attributes: ["id", "organisationId"] }), user, "Scenario");
}

/** Loads a run of the user's organisation (404 for another organisation's). */
export async function findOwnRun(user: Actor, runId: number, opts: { withResult?: boolean } = {}): Promise<Run> {
  const { Run } = getModels();
  const model = opts.withResult ? Run.scope("withResult") : Run;
  return ownOr404(await model.findByPk(runId), user, "Run");
}

export async function getRun(user: Actor, runId: number): Promise<RunView> {
  return toRunView(await findOwnRun(user, runId), { inputs: true });
}

/** A run that is a case of a study: listed with a label, never opened as the scenario's own result. */
export interface StudyCaseLabel {
  studyId: number;
  studyName: string;
  index: number;
}

/** One page of runs, in the project's list shape (lib/http/list-query.ts). */
export interface RunPage {
  items: (RunView & { studyCase: StudyCaseLabel | null })[];
  total: number;
  page: number;
  pageSize: number;
}

/** SQL for the ids of runs that are a study's cases (a case's run is linked in the transaction that creates it). */
export const STUDY_RUN_IDS = "(SELECT sc.run_id FROM study_cases sc WHERE sc.run_id IS NOT NULL)";

export async function listRuns(user: Actor, scenarioId: number, q: Omit<ListRunsQuery, "source"> & Partial<Pick<ListRunsQuery, "source">>): Promise<RunPage> {
  const { Run } = getModels();
  await assertOwnScenario(user, scenarioId);
  const bySource =
    q.source === "own"
      ? { id: { [Op.notIn]: Run.sequelize!.literal(STUDY_RUN_IDS) } }
      : q.source === "study"
        ? { id: { [Op.in]: Run.sequelize!.literal(STUDY_RUN_IDS) } }
        : {};
  const where: WhereOptions = { organisationId: user.organisationId, scenarioId, ...(q.status ? { status: q.status } : {}), ...bySource };
  const { rows, count } = await Run.findAndCountAll({
    where,
    attributes: { exclude: ["result", "inputs"] },
    order: [["id", q.sort === "oldest" ? "ASC" : "DESC"]],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  const caseOf = await studyCaseLabels(rows.map((r) => r.id));
  return {
    items: rows.map((r) => ({ ...toRunView(r), studyCase: caseOf.get(r.id) ?? null })),
    total: count,
    page: q.page,
    pageSize: q.pageSize,
  };
}

/** Run id → its study-case label, for lists that show runs of every kind. */
export async function studyCaseLabels(runIds: number[]): Promise<Map<number, StudyCaseLabel>> {
  const { StudyCase, Study } = getModels();
  if (!runIds.length) return new Map();
  const cases = await StudyCase.findAll({ where: { runId: runIds }, attributes: ["runId", "studyId", "idx"] });
  const names = new Map(
    (cases.length ? await Study.findAll({ where: { id: [...new Set(cases.map((c) => c.studyId))] }, attributes: ["id", "name"] }) : []).map((st) => [st.id, st.name]),
  );
  return new Map(cases.map((c) => [c.runId!, { studyId: c.studyId, studyName: names.get(c.studyId) ?? `Study ${c.studyId}`, index: c.idx + 1 }]));
}

/** The study a run is a case of (for the run page's label), or null. */
export async function studyCaseOf(runId: number): Promise<StudyCaseLabel | null> {
  const { StudyCase, Study } = getModels();
  const c = await StudyCase.findOne({ where: { runId }, attributes: ["studyId", "idx"] });
  if (!c) return null;
  const st = await Study.findByPk(c.studyId, { attributes: ["id", "name"] });
  return { studyId: c.studyId, studyName: st?.name ?? `Study ${c.studyId}`, index: c.idx + 1 };
}

/** What a run's page heads itself with: its scenario's name and, for a study's case, whose case it is (404 for another organisation's run). */
export async function getRunHeading(
  user: Actor,
  runId: number,
): Promise<{ id: number; scenarioId: number; scenarioName: string; studyCase: StudyCaseLabel | null }> {
  const { Run, Scenario } = getModels();
  const run = ownOr404(await Run.findByPk(runId, { attributes: ["id", "organisationId", "scenarioId"] }), user, "Run");
  const scenario = await Scenario.findOne({ where: { id: run.scenarioId, organisationId: user.organisationId }, attributes: ["name"] });
  return { id: run.id, scenarioId: run.scenarioId, scenarioName: scenario?.name ?? "", studyCase: await studyCaseOf(run.id) };
}

/** Cancels a queued or running run; a finished one answers 409. */
export async function cancelRun(user: Actor, runId: number): Promise<RunView> {
  const { Run } = getModels();
  const run = await findOwnRun(user, runId);
  await assertRunNotFrozen(run);
  if (isFinished(run.status)) throw conflict(`The run is already ${run.status}.`);
  const before = { status: run.status, progress: run.progress };
  const changed = await Run.sequelize!.transaction(async (transaction) => {
    const [count] = await Run.update(
      { status: "cancelled", finishedAt: new Date(), version: Run.sequelize!.literal("version + 1") as never },
      { where: { id: run.id, status: { [Op.in]: [...ACTIVE_RUN_STATUSES] } }, transaction },
    );
    if (count) {
      await recordAudit({ transaction, actor: user, entity: "run", entityId: run.id, action: "update", before, after: { status: "cancelled" } });
    }
    return count > 0;
  });
  // Stop the worker (ends its thread if the task is running, drops it if it waits).
  await abortRun(run.id);
  // A job still waiting in Redis leaves the queue now (one taken by a worker sees the cancel itself).
  if (changed) await removeQueuedRun(run);
  const fresh = await findOwnRun(user, run.id);
  if (!changed && fresh.status !== "cancelled") throw conflict(`The run is already ${fresh.status}.`);
  return toRunView(fresh);
}

/**
 * Deletes a run (cancelling it first if it is still active). `version` is the run version the caller saw
 * (query ?version=): a missing one is a 400, a stale one a 409, so nobody deletes a run they have not seen.
 */
export async function deleteRun(user: Actor, runId: number, version: string | null): Promise<void> {
  const { Run } = getModels();
  const run = await findOwnRun(user, runId);
  await assertRunNotFrozen(run);
  if (version === null || !/^\d{1,10}$/.test(version)) {
    throw badRequest("Say which version of the run you are deleting.", [
      { path: "version", message: "version is required (the run's current version, a whole number)" },
    ]);
  }
  if (Number(version) !== run.version) {
    throw conflict(`The run has changed since you loaded it (version ${run.version}, not ${version}); reload and try again.`);
  }
  await assertRunUnreferenced(run.id);
  if (!isFinished(run.status)) await abortRun(run.id);
  await Run.sequelize!.transaction(async (transaction) => {
    // Checked again under a lock of the run, so a report or session made meanwhile cannot lose its run.
    await Run.findByPk(run.id, { transaction, lock: transaction.LOCK.UPDATE, attributes: ["id"] });
    await assertRunUnreferenced(run.id, transaction);
    await Run.destroy({ where: { id: run.id }, transaction });
    await recordAudit({
      transaction,
      actor: user,
      entity: "run",
      entityId: run.id,
      action: "delete",
      before: toRunView(run),
      after: null,
    });
  });
}

/**
 * A run that a design-check report, a replay session or a review comment points at is part of a record:
 * deleting it answers 409 naming what holds it (the report's PDF and submission keep working).
 */
async function assertRunUnreferenced(runId: number, transaction?: Transaction): Promise<void> {
  const { Report, TrainingItem, Comment } = getModels();
  const [reports, items, comments] = await Promise.all([
    Report.findAll({ where: { runId }, attributes: ["id", "title", "status"], transaction }),
    TrainingItem.findAll({ where: { runId }, attributes: ["id", "sessionId"], transaction }),
    Comment.count({ where: { runId }, transaction }),
  ]);
  const reasons: string[] = [];
  if (reports.length) reasons.push(`design-check report${reports.length > 1 ? "s" : ""} ${reports.map((r) => `no. ${r.id} "${r.title}" (${r.status})`).join(", ")}`);
  const sessions = [...new Set(items.map((i) => i.sessionId))];
  if (sessions.length) reasons.push(`replay session${sessions.length > 1 ? "s" : ""} no. ${sessions.join(", ")}`);
  if (comments) reasons.push(`${comments} review comment${comments > 1 ? "s" : ""}`);
  if (reasons.length) {
    throw conflict(`This run cannot be deleted: it is used by ${reasons.join("; ")}. Remove it from those first, or keep it.`);
  }
}

export interface RunResult {
  runId: number;
  format: string;
  summary: Record<string, unknown> | null;
  /** series, frames, notes as the engine produced them (float arrays at f32 precision). */
  result: Record<string, unknown>;
}

/** The stored result of a finished run: the raw blob, or decoded for JSON. 409 while there is none. */
export async function getRunResultBlob(user: Actor, runId: number): Promise<{ run: Run; blob: Buffer }> {
  const run = await findOwnRun(user, runId, { withResult: true });
  if (run.status !== "done" || !run.result) {
    throw new HttpError(409, run.status === "done" ? "This run stored no result." : `The run is ${run.status}; it has no result yet.`);
  }
  return { run, blob: run.result };
}

/** The JSON of getRunResult as a stream (lib/runs/result-stream.ts): what the download route answers. */
export async function getRunResultStream(user: Actor, runId: number): Promise<ReadableStream<Uint8Array>> {
  const { run, blob } = await getRunResultBlob(user, runId);
  return resultJsonStream(run, blob);
}

export async function getRunResult(user: Actor, runId: number): Promise<RunResult> {
  const { run, blob } = await getRunResultBlob(user, runId);
  return {
    runId: run.id,
    format: run.resultFormat ?? "",
    summary: json(run.summary ?? null),
    result: decodeResult(blob, { arrays: "plain" }) as Record<string, unknown>,
  };
}
