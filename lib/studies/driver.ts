/**
 * Runs a study's cases. Pool mode: this process feeds the cases to the worker-thread pool a few at a time
 * (at most JOB_ORG_CONCURRENCY of one organisation at once, so other users' runs get in between).
 * Queue mode: every case's run is created and queued in Redis at once; the workers limit each
 * organisation. Either way the case's run row is the same, and so are its figures.
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Run } from "@/models/Run";
import type { Study } from "@/models/Study";
import type { StudyCase } from "@/models/StudyCase";
import type { Scenario as EngineScenario } from "@/sim/schema";
import { getJobPool, QueueFullError, type Slot } from "@/lib/jobs/pool";
import { jobMode, orgConcurrency, QUEUE_RUNNER } from "@/lib/jobs/dispatch";
import { OrgLimiter } from "@/lib/jobs/org-limiter";
import { dispatchRunJob } from "@/lib/runs/queue";
import type { SolverSettings } from "@/lib/runs/runner";
import { RUNNER_ID } from "@/lib/jobs/runner-id";
import { caseScenario, type ChainValues, type TrainMasses } from "./cases";
import { settleCase, refreshStudy } from "./progress";
import { unprobedMeshChoice, type MeshChoice } from "./mesh-choice";
import type { StudyMeshOutcome, StudyMeshTask } from "@/lib/engine/protocol";

/** What a study stores beside its definition so every case can be rebuilt exactly (pinned like a run). */
export interface StoredStudySettings {
  requireNoArdCatch: boolean;
  solver: SolverSettings;
  /** The validated engine scenario every case starts from (scenario + pinned revision + train + overrides). */
  base: EngineScenario;
  chains: ChainValues[];
  train: TrainMasses;
  /** The mesh every case runs at, chosen before the grid (lib/studies/mesh-choice.ts); absent until then. */
  mesh?: MeshChoice;
}

export function storedSettings(study: Pick<Study, "settings">): StoredStudySettings {
  return study.settings as unknown as StoredStudySettings;
}

/** Creates the run row of one case (queued) and links it; a case whose inputs no longer validate fails. */
export async function createCaseRun(study: Study, c: StudyCase, runner: string): Promise<Run | null> {
  const { Run, StudyCase } = getModels();
  const st = storedSettings(study);
  const built = caseScenario(st.base, c.values, { chains: new Map(st.chains.map((x) => [x.id, x])), train: st.train });
  if (!built.ok) {
    await StudyCase.update(
      { status: "failed", error: built.issues.map((i) => `${i.path}: ${i.message}`).join("; "), finishedAt: new Date() },
      { where: { id: c.id } },
    );
    return null;
  }
  if (st.mesh) built.scenario.run.segments = st.mesh.segments;
  return Run.sequelize!.transaction(async (transaction) => {
    const run = await Run.create(
      {
        organisationId: study.organisationId,
        scenarioId: study.scenarioId,
        liftRevisionId: study.liftRevisionId,
        startedBy: study.createdBy,
        inputs: built.scenario as unknown as Record<string, unknown>,
        solver: { ...st.solver, run: built.scenario.run, studyId: study.id, studyCaseId: c.id },
        runner,
        queuedAt: new Date(),
      },
      { transaction },
    );
    const [n] = await StudyCase.update(
      { runId: run.id, status: "queued", error: null },
      { where: { id: c.id, status: "queued", runId: null }, transaction },
    );
    if (!n) throw new Error(`case ${c.id} was taken by another driver`);
    return run;
  });
}

// Per-organisation limit inside this process (pool mode): cases handed out at once.
const limiterState = globalThis as unknown as { tautlineStudyOrgLimiter?: OrgLimiter };
function acquireOrg(organisationId: number): Promise<() => void> {
  limiterState.tautlineStudyOrgLimiter ??= new OrgLimiter(() => orgConcurrency());
  return limiterState.tautlineStudyOrgLimiter.acquire(organisationId);
}

async function reserveWithWait(organisationId: number): Promise<Slot> {
  for (;;) {
    try {
      return getJobPool().reserve(organisationId);
    } catch (err) {
      if (!(err instanceof QueueFullError)) throw err;
      await new Promise((r) => setTimeout(r, 250));
    }
  }
}

/**
 * Chooses the study's mesh once, before its first case runs: its first and last case (opposite corners of the
 * grid) at doubling meshes in a worker thread, the choice stored in the study's settings. A study that already
 * holds a choice (resumed, recovered) keeps it.
 */
const probeState = globalThis as unknown as { tautlineMeshProbes?: Map<number, AbortController> };
function meshProbes(): Map<number, AbortController> {
  if (!probeState.tautlineMeshProbes) probeState.tautlineMeshProbes = new Map();
  return probeState.tautlineMeshProbes;
}

/** Stops a study's mesh probe (the study was cancelled): its thread is free for the next job at once. */
export function abortStudyMesh(studyId: number): void {
  meshProbes().get(studyId)?.abort("the study was cancelled");
}

async function chooseStudyMesh(studyId: number): Promise<void> {
  const { Study, StudyCase } = getModels();
  const study = await Study.findByPk(studyId);
  if (!study || storedSettings(study).mesh) return;
  const st = storedSettings(study);
  const first = await StudyCase.findOne({ where: { studyId }, order: [["idx", "ASC"]] });
  const last = await StudyCase.findOne({ where: { studyId }, order: [["idx", "DESC"]] });
  const ctx = { chains: new Map(st.chains.map((x) => [x.id, x])), train: st.train };
  const probes = [first, last === null || last.id === first?.id ? null : last]
    .filter((c): c is StudyCase => c !== null)
    .map((c) => caseScenario(st.base, c.values, ctx))
    .flatMap((r) => (r.ok ? [r.scenario] : []));
  let choice: MeshChoice;
  if (!probes.length) choice = unprobedMeshChoice(st.base.run.segments, "no case makes a valid scenario");
  else {
    const slot = await reserveWithWait(study.organisationId);
    const abort = new AbortController();
    meshProbes().set(studyId, abort);
    try {
      const outcome = await getJobPool().run<StudyMeshOutcome, StudyMeshTask>(
        { kind: "study-mesh", studyId, probes, budgetMs: st.solver.budgetSeconds * 1000 * probes.length },
        { organisationId: study.organisationId, signal: abort.signal },
      );
      choice = outcome.ok ? outcome.choice : unprobedMeshChoice(probes[0].run.segments, outcome.message);
    } catch (err) {
      choice = unprobedMeshChoice(probes[0].run.segments, err instanceof Error ? err.message : String(err));
    } finally {
      meshProbes().delete(studyId);
      slot.release();
    }
  }
  if (!(await stillRunning(studyId))) return;
  const fresh = await Study.findByPk(studyId, { attributes: ["id", "settings"] });
  if (!fresh) return;
  await Study.update({ settings: { ...fresh.settings, mesh: choice } }, { where: { id: studyId } });
}

const driverState = globalThis as unknown as { tautlineStudyDrivers?: Map<number, Promise<void>> };
function drivers(): Map<number, Promise<void>> {
  if (!driverState.tautlineStudyDrivers) driverState.tautlineStudyDrivers = new Map();
  return driverState.tautlineStudyDrivers;
}

async function stillRunning(studyId: number): Promise<boolean> {
  const s = await getModels().Study.findByPk(studyId, { attributes: ["id", "status"] });
  return !!s && (s.status === "queued" || s.status === "running");
}

async function drivePool(studyId: number): Promise<void> {
  const { Study, StudyCase } = getModels();
  const inflight = new Set<Promise<void>>();
  for (;;) {
    if (!(await stillRunning(studyId))) break;
    const study = await Study.findByPk(studyId);
    if (!study) break;
    const next = await StudyCase.findOne({ where: { studyId, status: "queued", runId: null }, order: [["idx", "ASC"]] });
    if (!next) break;
    const release = await acquireOrg(study.organisationId);
    if (!(await stillRunning(studyId))) {
      release();
      break;
    }
    let run: Run | null;
    try {
      run = await createCaseRun(study, next, RUNNER_ID);
    } catch (err) {
      release();
      throw err;
    }
    if (!run) {
      release();
      continue;
    }
    await StudyCase.update({ status: "running" }, { where: { id: next.id, status: "queued" } });
    const slot = await reserveWithWait(study.organisationId);
    const caseId = next.id;
    const p: Promise<void> = dispatchRunJob(run, storedSettings(study).solver, slot)
      .then(() => settleCase(caseId).then(() => undefined))
      .catch((err) => console.error(`study ${studyId} case ${caseId}:`, err))
      .finally(() => {
        release();
        inflight.delete(p);
      });
    inflight.add(p);
  }
  await Promise.all([...inflight]);
  await refreshStudy(studyId);
}

async function driveQueue(studyId: number): Promise<void> {
  const { Study, StudyCase } = getModels();
  const study = await Study.findByPk(studyId);
  if (!study) return;
  const open = await StudyCase.findAll({ where: { studyId, status: "queued", runId: null }, order: [["idx", "ASC"]] });
  const st = storedSettings(study);
  for (const c of open) {
    const run = await createCaseRun(study, c, QUEUE_RUNNER);
    if (!run) continue;
    // Queue mode: the slot is not used (released by dispatchJob); a dummy keeps the call shape.
    await dispatchRunJob(run, st.solver, { organisationId: study.organisationId, release() {} }, { studyCaseId: c.id });
  }
  await refreshStudy(studyId);
}

/**
 * Starts (or joins) the driver of a study in this process. Marks the study running, owned by this
 * process in pool mode. Resolves when every case has been handed out and (pool mode) has finished.
 */
export function driveStudy(studyId: number): Promise<void> {
  const map = drivers();
  const existing = map.get(studyId);
  if (existing) return existing;
  const mode = jobMode();
  const p = (async () => {
    const { Study } = getModels();
    await Study.update(
      { status: "running", mode, driver: mode === "pool" ? RUNNER_ID : null, startedAt: new Date(), finishedAt: null },
      { where: { id: studyId, status: { [Op.in]: ["queued", "running"] } } },
    );
    if (await stillRunning(studyId)) await chooseStudyMesh(studyId);
    if (mode === "pool") await drivePool(studyId);
    else await driveQueue(studyId);
  })()
    .catch((err) => console.error(`study ${studyId}: driver stopped`, err))
    .finally(() => map.delete(studyId));
  map.set(studyId, p);
  return p;
}

/** Resolves when this process's driver of the study (if any) has stopped. For tests and the bench. */
export async function waitForStudyDriver(studyId: number): Promise<void> {
  await drivers().get(studyId);
}

export function hasStudyDriver(studyId: number): boolean {
  return drivers().has(studyId);
}
