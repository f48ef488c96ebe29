import { Op, type Transaction, type WhereOptions } from "sequelize";
import { z } from "zod";
import { getSequelize } from "@/lib/db/sequelize";
import { getModels } from "@/models";
import type { Train } from "@/models/Train";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { assertVersion, versionField } from "@/lib/http/concurrency";
import { archivedFilter, likePattern, listQuerySchema, pageOptions, toPage, type Page } from "@/lib/http/list-query";
import { validate } from "@/lib/http/validate";
import { recordAudit } from "@/lib/audit/record";
import { trainFields, trainInputSchema, trainIssues, type TrainData } from "./schema";
import { badRequest } from "@/lib/http/errors";
import { loadedCarMass } from "./mass";
import { assertNotArchived, isRestoreRequest, type DeleteOutcome } from "@/lib/http/outcome";

/** Validates a train with the shared schema; 400 with every problem, messages made for a train row. */
function validateTrain(input: unknown): TrainData {
  const r = trainInputSchema.safeParse(input);
  if (r.success) return r.data;
  throw badRequest("The request has invalid fields.", trainIssues(r.error.issues).map((i) => ({ path: i.path.map(String).join("."), message: i.message })));
}

export interface TrainView extends TrainData {
  id: number;
  /** kg per car with every seat taken. */
  carMassLoaded: number;
  version: number;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
}

export function trainView(t: Train): TrainView {
  return {
    id: t.id,
    ...trainFields(t),
    carMassLoaded: loadedCarMass(t),
    version: t.version,
    archivedAt: t.archivedAt,
    createdAt: t.createdAt,
    updatedAt: t.updatedAt,
  };
}

export const trainListQuery = listQuerySchema({
  sortFields: ["name", "cars", "carMassEmpty", "createdAt", "updatedAt"],
  defaultSort: "name",
  filters: { archived: archivedFilter },
});
export type TrainListQuery = z.input<typeof trainListQuery>;

export async function listTrains(actor: Actor, query: TrainListQuery = {}): Promise<Page<TrainView>> {
  assertCan(actor, "design:read");
  const q = validate(trainListQuery, query);
  const { Train } = getModels();
  const where: WhereOptions = {
    organisationId: actor.organisationId,
    ...(q.archived === "all" ? {} : { archivedAt: q.archived === "true" ? { [Op.ne]: null } : null }),
    ...(q.q ? { name: { [Op.like]: likePattern(q.q) } } : {}),
  };
  const { rows, count } = await Train.findAndCountAll({ where, ...pageOptions(q) });
  return toPage(rows.map(trainView), count, q);
}

export async function findOwnTrain(actor: Actor, id: number): Promise<Train> {
  const { Train } = getModels();
  return ownOr404(await Train.findByPk(id), actor, "Train");
}

export async function getTrain(actor: Actor, id: number): Promise<TrainView> {
  assertCan(actor, "design:read");
  return trainView(await findOwnTrain(actor, id));
}

export async function createTrain(actor: Actor, input: unknown): Promise<TrainView> {
  assertCan(actor, "design:write");
  const data = validateTrain(input);
  const { Train } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = await Train.create(
      { ...data, organisationId: actor.organisationId, archivedAt: null, createdBy: actor.id },
      { transaction },
    );
    await recordAudit({ transaction, actor, entity: "train", entityId: row.id, action: "create", after: trainView(row) });
    return trainView(row);
  });
}

export const trainUpdateSchema = z.object({ version: versionField }).loose();

/** Partial update: given fields replace, the merged train must pass the full rules. `{ version, archived: false }` restores. */
export async function updateTrain(actor: Actor, id: number, input: unknown): Promise<TrainView> {
  assertCan(actor, "design:write");
  const { Train } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = ownOr404(await Train.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }), actor, "Train");
    if (row.archivedAt && isRestoreRequest(input)) {
      assertVersion(row.version, input.version, "train");
      const before = trainView(row);
      await row.update({ archivedAt: null, version: row.version + 1 }, { transaction });
      await recordAudit({ transaction, actor, entity: "train", entityId: row.id, action: "update", before, after: trainView(row) });
      return trainView(row);
    }
    const { version, ...changes } = validate(trainUpdateSchema, input);
    assertNotArchived(row, "train");
    const data = validateTrain({ ...trainFields(row), ...changes });
    assertVersion(row.version, version, "train");
    const before = trainView(row);
    await keepTrainForApprovedScenarios(actor, row, transaction);
    await row.update({ ...data, version: row.version + 1 }, { transaction });
    await recordAudit({ transaction, actor, entity: "train", entityId: row.id, action: "update", before, after: trainView(row) });
    return trainView(row);
  });
}

/**
 * Approval froze the scenarios that use this train: before the train changes, they move to an archived
 * copy of it as it stands, so what was approved (and new runs of it) never changes. Other scenarios
 * follow the edit as before.
 */
async function keepTrainForApprovedScenarios(actor: Actor, row: Train, transaction: Transaction): Promise<void> {
  const { Train, Scenario } = getModels();
  const frozen = await Scenario.findAll({ where: { trainId: row.id, frozenAt: { [Op.ne]: null } }, transaction, lock: transaction.LOCK.UPDATE });
  if (!frozen.length) return;
  const copy = await Train.create(
    { ...trainFields(row), name: `${row.name.slice(0, 170)} (as approved)`, organisationId: row.organisationId, archivedAt: new Date(), createdBy: actor.id },
    { transaction },
  );
  await recordAudit({ transaction, actor, entity: "train", entityId: copy.id, action: "create", before: null, after: { ...trainView(copy), copyOf: row.id } });
  for (const s of frozen) {
    await Scenario.update({ trainId: copy.id }, { where: { id: s.id }, transaction });
    await recordAudit({ transaction, actor, entity: "scenario", entityId: s.id, action: "update", before: { trainId: row.id }, after: { trainId: copy.id } });
  }
}

/** Archives a train that scenarios use (they keep pointing at it), deletes an unused one. */
export async function deleteTrain(actor: Actor, id: number): Promise<DeleteOutcome> {
  assertCan(actor, "design:write");
  const { Train, Scenario } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = ownOr404(await Train.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }), actor, "Train");
    const before = trainView(row);
    const used = await Scenario.count({ where: { trainId: row.id }, transaction });
    if (used > 0) {
      if (!row.archivedAt) await row.update({ archivedAt: new Date(), version: row.version + 1 }, { transaction });
      await recordAudit({ transaction, actor, entity: "train", entityId: row.id, action: "archive", before, after: trainView(row) });
      return { id: row.id, outcome: "archived" };
    }
    await row.destroy({ transaction });
    await recordAudit({ transaction, actor, entity: "train", entityId: id, action: "delete", before, after: null });
    return { id, outcome: "deleted" };
  });
}
