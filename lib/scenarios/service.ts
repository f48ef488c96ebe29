import { Op, type Transaction, type WhereOptions } from "sequelize";
import { z } from "zod";
import { getSequelize } from "@/lib/db/sequelize";
import { getModels } from "@/models";
import type { Scenario } from "@/models/Scenario";
import type { Lift } from "@/models/Lift";
import type { LiftRevision } from "@/models/LiftRevision";
import type { Train } from "@/models/Train";
import { LOADINGS } from "@/models/Scenario";
import { conflict, zodIssues, type FieldIssue } from "@/lib/http/errors";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { assertVersion } from "@/lib/http/concurrency";
import { archivedFilter, likePattern, listQuerySchema, pageOptions, queryBoolean, queryId, toPage, type Page } from "@/lib/http/list-query";
import { assertNotArchived, isRestoreRequest, type DeleteOutcome } from "@/lib/http/outcome";
import { throwIfIssues, validate } from "@/lib/http/validate";
import { clipText } from "@/lib/http/text";
import { recordAudit } from "@/lib/audit/record";
import { carMassFor, ridersFor } from "@/lib/trains/mass";
import { resolveEngineScenario, toEngineScenario, toScenarioIssue } from "./resolve";
import { scenarioInputSchema, scenarioIssueMessage, scenarioUpdateSchema, type ScenarioData } from "./schema";
import { compactDynamics, mergeDynamics, type Dynamics } from "./dynamics";
import { compactFollowers, storedFollowers, type ScenarioFollower } from "./followers";

/** A following train as the API shows it: the stored fields and its train's name. */
export interface ScenarioFollowerView extends ScenarioFollower {
  trainName: string | null;
}

export interface ScenarioView {
  id: number;
  name: string;
  notes: string | null;
  liftId: number;
  liftName: string | null;
  liftRevisionId: number;
  liftRevisionNumber: number | null;
  /** False when the lift has been saved again since this scenario was pinned. */
  pinnedToCurrent: boolean;
  trainId: number;
  trainName: string | null;
  loading: Scenario["loading"];
  riderCount: number | null;
  /** Riders in the whole train for this loading case. */
  riders: number | null;
  /** kg per car as the engine sees it (empty mass + riders spread over the cars). */
  carMass: number | null;
  entrySpeed: number;
  startPosition: number;
  /** s, when the train appears at its start position. */
  startTime: number;
  runSettings: Record<string, unknown>;
  /** The scenario's drive model and damping over the pinned revision; null = the revision's values and defaults. */
  dynamics: Dynamics | null;
  /** The trains after the lead train on the lift (engine trains[1..n]); empty = the lead train alone. */
  followers: ScenarioFollowerView[];
  version: number;
  archivedAt: Date | null;
  frozenAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
}

type WithParts = Scenario & { lift?: Lift | null; liftRevision?: LiftRevision | null; train?: Train | null };

export function scenarioView(
  s: Scenario,
  parts: { lift?: Lift | null; revision?: LiftRevision | null; train?: Train | null; followerTrains?: readonly (Train | null)[] } = {},
): ScenarioView {
  const w = s as WithParts;
  const lift = parts.lift ?? w.lift ?? null;
  const revision = parts.revision ?? w.liftRevision ?? null;
  const train = parts.train ?? w.train ?? null;
  const riders = train ? ridersFor(train, s.loading, s.riderCount) : null;
  return {
    id: s.id,
    name: s.name,
    notes: s.notes,
    liftId: s.liftId,
    liftName: lift?.name ?? null,
    liftRevisionId: s.liftRevisionId,
    liftRevisionNumber: revision?.number ?? null,
    pinnedToCurrent: lift ? lift.currentRevisionId === s.liftRevisionId : false,
    trainId: s.trainId,
    trainName: train?.name ?? null,
    loading: s.loading,
    riderCount: s.riderCount,
    riders,
    carMass: train && riders !== null ? carMassFor(train, riders) : null,
    entrySpeed: s.entrySpeed,
    startPosition: s.startPosition,
    startTime: s.startTime ?? 0,
    runSettings: s.runSettings,
    dynamics: compactDynamics(s.dynamics),
    followers: storedFollowers(s.followers).map((f, i) => ({ ...f, trainName: parts.followerTrains?.[i]?.name ?? null })),
    version: s.version,
    archivedAt: s.archivedAt,
    frozenAt: s.frozenAt,
    createdAt: s.createdAt,
    updatedAt: s.updatedAt,
  };
}

function includes() {
  const { Lift, LiftRevision, Train } = getModels();
  return [
    { model: Lift, as: "lift", attributes: ["id", "name", "currentRevisionId"] },
    { model: LiftRevision, as: "liftRevision", attributes: ["id", "number"] },
    { model: Train, as: "train" },
  ];
}

export const scenarioListQuery = listQuerySchema({
  sortFields: ["name", "createdAt", "updatedAt", "entrySpeed"],
  defaultSort: "name",
  filters: {
    liftId: queryId("liftId").optional(),
    trainId: queryId("trainId").optional(),
    loading: z.enum(LOADINGS, { error: `loading must be one of ${LOADINGS.join(", ")}` }).optional(),
    frozen: queryBoolean("frozen").optional(),
    archived: archivedFilter,
  },
});
export type ScenarioListQuery = z.input<typeof scenarioListQuery>;

export async function listScenarios(actor: Actor, query: ScenarioListQuery = {}): Promise<Page<ScenarioView>> {
  assertCan(actor, "design:read");
  const q = validate(scenarioListQuery, query);
  const { Scenario } = getModels();
  const where: WhereOptions = {
    organisationId: actor.organisationId,
    ...(q.archived === "all" ? {} : { archivedAt: q.archived === "true" ? { [Op.ne]: null } : null }),
    ...(q.liftId ? { liftId: q.liftId } : {}),
    ...(q.trainId ? { trainId: q.trainId } : {}),
    ...(q.loading ? { loading: q.loading } : {}),
    ...(q.frozen === undefined ? {} : { frozenAt: q.frozen ? { [Op.ne]: null } : null }),
    ...(q.q ? { [Op.or]: [{ name: { [Op.like]: likePattern(q.q) } }, { notes: { [Op.like]: likePattern(q.q) } }] } : {}),
  };
  const { rows, count } = await Scenario.findAndCountAll({ where, ...pageOptions(q), include: includes(), distinct: true });
  return toPage(rows.map((s) => scenarioView(s)), count, q);
}

async function loadOwnScenario(actor: Actor, id: number, transaction?: Transaction, lock = false): Promise<Scenario> {
  const { Scenario } = getModels();
  return ownOr404(
    await Scenario.findByPk(id, { transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) }),
    actor,
    "Scenario",
  );
}

/** The train rows of a scenario's following trains, in order (throws if one is missing: they are never deleted while used). */
export async function loadFollowerTrains(scenario: Pick<Scenario, "id" | "followers">, transaction?: Transaction): Promise<Train[]> {
  const list = storedFollowers(scenario.followers);
  if (!list.length) return [];
  const { Train } = getModels();
  const rows = await Train.findAll({ where: { id: [...new Set(list.map((f) => f.trainId))] }, transaction });
  return list.map((f) => {
    const t = rows.find((r) => r.id === f.trainId);
    if (!t) throw new Error(`Scenario ${scenario.id} points at a missing following train ${f.trainId}.`);
    return t;
  });
}

/** The scenario with its pinned revision, lead train and following trains (what a run or an export needs). */
export async function loadScenarioParts(actor: Actor, id: number, transaction?: Transaction) {
  const { Lift, LiftRevision, Train } = getModels();
  const scenario = await loadOwnScenario(actor, id, transaction);
  const [lift, revision, train, followerTrains] = await Promise.all([
    Lift.findByPk(scenario.liftId, { transaction }),
    LiftRevision.findByPk(scenario.liftRevisionId, { transaction }),
    Train.findByPk(scenario.trainId, { transaction }),
    loadFollowerTrains(scenario, transaction),
  ]);
  if (!lift || !revision || !train) throw new Error(`Scenario ${id} points at a missing lift, revision or train.`);
  return { scenario, lift, revision, train, followerTrains };
}

export async function getScenario(actor: Actor, id: number): Promise<ScenarioView> {
  assertCan(actor, "design:read");
  const { scenario, lift, revision, train, followerTrains } = await loadScenarioParts(actor, id);
  return scenarioView(scenario, { lift, revision, train, followerTrains });
}

interface Resolved {
  data: ScenarioData & { liftRevisionId: number };
  lift: Lift;
  revision: LiftRevision;
  train: Train;
  followerTrains: Train[];
}

/**
 * Validates scenario fields and everything they point at (own lift and revision, own train, rider
 * count within the seats, and the whole engine scenario), collecting every problem into one 400.
 * `keep` lists references that may stay pointing at archived rows (unchanged on an update).
 */
async function resolveInput(
  actor: Actor,
  raw: Record<string, unknown>,
  keep: { liftId?: number; trainId?: number; followerTrainIds?: number[] },
  transaction?: Transaction,
): Promise<Resolved> {
  const parsed = scenarioInputSchema.safeParse(raw);
  if (!parsed.success) throwIfIssues(zodIssues(parsed.error).map((i) => ({ ...i, message: scenarioIssueMessage(i.message, i.path) })));
  const data = parsed.data!;
  const { Lift, LiftRevision, Train } = getModels();
  const issues: FieldIssue[] = [];

  const lift = await Lift.findByPk(data.liftId, { transaction });
  const liftOk = lift && lift.organisationId === actor.organisationId;
  if (!liftOk) issues.push({ path: "liftId", message: `liftId ${data.liftId}: no such lift` });
  else if (lift.archivedAt && keep.liftId !== lift.id) issues.push({ path: "liftId", message: "that lift is archived" });

  let revision: LiftRevision | null = null;
  if (liftOk) {
    const revisionId = data.liftRevisionId ?? lift.currentRevisionId;
    revision = revisionId ? await LiftRevision.findByPk(revisionId, { transaction }) : null;
    if (!revision || revision.liftId !== lift.id)
      issues.push({ path: "liftRevisionId", message: `liftRevisionId ${data.liftRevisionId}: not a revision of lift ${lift.id}` });
  }

  const train = await Train.findByPk(data.trainId, { transaction });
  const trainOk = train && train.organisationId === actor.organisationId;
  if (!trainOk) issues.push({ path: "trainId", message: `trainId ${data.trainId}: no such train` });
  else {
    if (train.archivedAt && keep.trainId !== train.id) issues.push({ path: "trainId", message: "that train is archived" });
    const seats = train.cars * train.seatsPerCar;
    if (data.loading === "riders" && (data.riderCount ?? 0) > seats)
      issues.push({ path: "riderCount", message: `riderCount must be at most the train's ${seats} seats` });
  }

  // Each following train: a train of this organisation, not archived (unless it was already there), riders within its seats.
  const followers = compactFollowers(data.followers) ?? [];
  const followerTrains: Train[] = [];
  for (const [i, f] of followers.entries()) {
    const t = await Train.findByPk(f.trainId, { transaction });
    if (!t || t.organisationId !== actor.organisationId) {
      issues.push({ path: `followers.${i}.trainId`, message: `followers.${i}.trainId ${f.trainId}: no such train` });
      continue;
    }
    if (t.archivedAt && !keep.followerTrainIds?.includes(t.id)) issues.push({ path: `followers.${i}.trainId`, message: `followers.${i}.trainId: that train is archived` });
    const seats = t.cars * t.seatsPerCar;
    if (f.loading === "riders" && (f.riderCount ?? 0) > seats)
      issues.push({ path: `followers.${i}.riderCount`, message: `followers.${i}.riderCount must be at most the train's ${seats} seats` });
    followerTrains.push(t);
  }

  const dynamics = compactDynamics(data.dynamics);
  if (revision && trainOk && issues.length === 0) {
    const r = resolveEngineScenario({ ...data, riderCount: data.riderCount ?? null, dynamics, followers }, revision, train, followerTrains);
    if (!r.ok) issues.push(...r.issues.map((i) => toScenarioIssue(i, dynamics)));
  }
  throwIfIssues(issues);
  return { data: { ...data, liftRevisionId: revision!.id }, lift: lift!, revision: revision!, train: train!, followerTrains };
}

function rowFields(d: Resolved["data"]) {
  return {
    name: d.name,
    notes: d.notes,
    liftId: d.liftId,
    liftRevisionId: d.liftRevisionId,
    trainId: d.trainId,
    loading: d.loading,
    riderCount: d.loading === "riders" ? (d.riderCount ?? 0) : null,
    entrySpeed: d.entrySpeed,
    startPosition: d.startPosition,
    startTime: d.startTime ?? 0,
    runSettings: d.runSettings as Record<string, unknown>,
    dynamics: compactDynamics(d.dynamics),
    followers: compactFollowers(d.followers),
  };
}

/** Creates a scenario inside `transaction` (also used by import). */
export async function createScenarioIn(actor: Actor, r: Resolved, action: "create" | "import", transaction: Transaction): Promise<ScenarioView> {
  const { Scenario } = getModels();
  const row = await Scenario.create(
    { ...rowFields(r.data), organisationId: actor.organisationId, archivedAt: null, frozenAt: null, createdBy: actor.id },
    { transaction },
  );
  const view = scenarioView(row, { lift: r.lift, revision: r.revision, train: r.train, followerTrains: r.followerTrains });
  await recordAudit({ transaction, actor, entity: "scenario", entityId: row.id, action, after: view });
  return view;
}

export async function createScenario(actor: Actor, input: unknown): Promise<ScenarioView> {
  assertCan(actor, "design:write");
  const raw = validate(z.record(z.string(), z.unknown(), { error: "the body must be a JSON object" }), input);
  const resolved = await resolveInput(actor, raw, {});
  return getSequelize().transaction((transaction) => createScenarioIn(actor, resolved, "create", transaction));
}

function assertNotFrozen(s: Scenario): void {
  if (s.frozenAt) throw conflict("This scenario is frozen (approved); it cannot be changed. Copy it (POST …/copy) to change it.");
}

/**
 * Partial update: given fields replace, `runSettings` merges field by field, the merged scenario must
 * pass every rule. Changing `liftId` without `liftRevisionId` pins the new lift's current revision;
 * send the lift's current revision id as `liftRevisionId` to re-pin the same lift to its latest save.
 * `{ version, archived: false }` restores an archived scenario.
 */
export async function updateScenario(actor: Actor, id: number, input: unknown): Promise<ScenarioView> {
  assertCan(actor, "design:write");
  return getSequelize().transaction(async (transaction) => {
    const row = await loadOwnScenario(actor, id, transaction, true);
    if (row.archivedAt && isRestoreRequest(input)) {
      assertVersion(row.version, input.version, "scenario");
      const parts = await loadScenarioParts(actor, id, transaction);
      const before = scenarioView(row, parts);
      await row.update({ archivedAt: null, version: row.version + 1 }, { transaction });
      const after = scenarioView(row, parts);
      await recordAudit({ transaction, actor, entity: "scenario", entityId: row.id, action: "update", before, after });
      return after;
    }
    const { version, ...changes } = validate(scenarioUpdateSchema, input);
    assertNotFrozen(row);
    assertNotArchived(row, "scenario");
    const current: Record<string, unknown> = {
      name: row.name,
      notes: row.notes,
      liftId: row.liftId,
      trainId: row.trainId,
      loading: row.loading,
      entrySpeed: row.entrySpeed,
      startPosition: row.startPosition,
      startTime: row.startTime ?? 0,
      followers: storedFollowers(row.followers),
    };
    // Changing the lift without naming a revision pins the new lift's current one.
    if (!("liftId" in changes) || changes.liftId === row.liftId) current.liftRevisionId = row.liftRevisionId;
    // Changing the loading away from "riders" drops the rider count unless it is sent again.
    if (row.riderCount !== null && (changes.loading ?? row.loading) === "riders") current.riderCount = row.riderCount;
    const runSettings =
      changes.runSettings && typeof changes.runSettings === "object" && !Array.isArray(changes.runSettings)
        ? { ...row.runSettings, ...(changes.runSettings as Record<string, unknown>) }
        : (changes.runSettings ?? row.runSettings);
    // Dynamics merge section by section, field by field; a null field goes back to the revision's value.
    const dynamics = "dynamics" in changes ? mergeDynamics(row.dynamics, changes.dynamics) : compactDynamics(row.dynamics);
    const merged: Record<string, unknown> = { ...current, ...changes, runSettings, dynamics };
    const keepFollowers = storedFollowers(row.followers).map((f) => f.trainId);
    const resolved = await resolveInput(actor, merged, { liftId: row.liftId, trainId: row.trainId, followerTrainIds: keepFollowers }, transaction);
    assertVersion(row.version, version, "scenario");
    const parts = await loadScenarioParts(actor, id, transaction);
    const before = scenarioView(row, parts);
    await row.update({ ...rowFields(resolved.data), version: row.version + 1 }, { transaction });
    const after = scenarioView(row, { lift: resolved.lift, revision: resolved.revision, train: resolved.train, followerTrains: resolved.followerTrains });
    await recordAudit({ transaction, actor, entity: "scenario", entityId: row.id, action: "update", before, after });
    return after;
  });
}

export const scenarioCopySchema = z
  .object({ name: scenarioInputSchema.shape.name.optional() })
  .strict();

/**
 * A new scenario with the same inputs, pinned to the same lift revision (e.g. to change a frozen,
 * approved scenario without touching the record of what was approved). Runs and comments stay with the original.
 */
export async function copyScenario(actor: Actor, id: number, input: unknown = {}): Promise<ScenarioView> {
  assertCan(actor, "design:write");
  const { scenario } = await loadScenarioParts(actor, id);
  const { name } = validate(scenarioCopySchema, input);
  return getSequelize().transaction((transaction) =>
    deriveScenarioIn(actor, scenario, { name: name ?? `${clipText(scenario.name, 193)} (copy)` }, "create", transaction),
  );
}

/**
 * A new scenario from a stored one (same revision, train, followers and inputs) with a new name and, if
 * given, dynamics merged over its own field by field; validated like any save (400 with every problem,
 * nothing stored) and audited. The caller checks the permission: copyScenario (design) and the logbook's
 * run with today's chain.
 */
export async function deriveScenarioIn(
  actor: Actor,
  scenario: Scenario,
  changes: { name: string; notes?: string | null; dynamics?: unknown },
  action: "create",
  transaction: Transaction,
): Promise<ScenarioView> {
  const raw: Record<string, unknown> = {
    name: changes.name,
    notes: changes.notes === undefined ? scenario.notes : changes.notes,
    liftId: scenario.liftId,
    liftRevisionId: scenario.liftRevisionId,
    trainId: scenario.trainId,
    loading: scenario.loading,
    ...(scenario.loading === "riders" ? { riderCount: scenario.riderCount } : {}),
    entrySpeed: scenario.entrySpeed,
    startPosition: scenario.startPosition,
    startTime: scenario.startTime ?? 0,
    runSettings: scenario.runSettings,
    dynamics: changes.dynamics === undefined ? compactDynamics(scenario.dynamics) : mergeDynamics(scenario.dynamics, changes.dynamics),
    followers: storedFollowers(scenario.followers),
  };
  const resolved = await resolveInput(
    actor,
    raw,
    { liftId: scenario.liftId, trainId: scenario.trainId, followerTrainIds: storedFollowers(scenario.followers).map((f) => f.trainId) },
    transaction,
  );
  return createScenarioIn(actor, resolved, action, transaction);
}

async function countRuns(scenarioId: number, transaction: Transaction): Promise<number> {
  const Run = getSequelize().models.Run;
  return Run ? Run.count({ where: { scenarioId }, transaction }) : 0;
}

/** Archives a scenario that has runs or review comments (they stay readable), deletes one without. */
export async function deleteScenario(actor: Actor, id: number): Promise<DeleteOutcome> {
  assertCan(actor, "design:write");
  const { Scenario, Comment } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = await loadOwnScenario(actor, id, transaction, true);
    assertNotFrozen(row);
    const before = scenarioView(row);
    const dependants = (await countRuns(row.id, transaction)) + (await Comment.count({ where: { scenarioId: row.id }, transaction }));
    if (dependants > 0) {
      if (!row.archivedAt) await row.update({ archivedAt: new Date(), version: row.version + 1 }, { transaction });
      await recordAudit({ transaction, actor, entity: "scenario", entityId: row.id, action: "archive", before, after: scenarioView(row) });
      return { id: row.id, outcome: "archived" };
    }
    await Scenario.destroy({ where: { id: row.id }, transaction });
    await recordAudit({ transaction, actor, entity: "scenario", entityId: id, action: "delete", before, after: null });
    return { id, outcome: "deleted" };
  });
}

/** A file name for the export: letters, digits and dashes from the scenario's name. */
export function exportFileName(name: string): string {
  const slug = name
    .normalize("NFKD")
    .replace(/[^A-Za-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .toLowerCase()
    .slice(0, 80);
  return `${slug || "scenario"}.tautline.json`;
}

/** The scenario as a `tautline-scenario/2` file (the engine's format, SI units). */
export async function exportScenario(actor: Actor, id: number) {
  assertCan(actor, "design:read");
  const { scenario, revision, train, followerTrains } = await loadScenarioParts(actor, id);
  return { fileName: exportFileName(scenario.name), scenario: toEngineScenario(scenario, revision, train, followerTrains) };
}
