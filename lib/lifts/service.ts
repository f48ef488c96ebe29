import { Op, type Transaction, type WhereOptions } from "sequelize";
import { z } from "zod";
import { getSequelize } from "@/lib/db/sequelize";
import { getModels } from "@/models";
import type { Lift } from "@/models/Lift";
import type { LiftRevision } from "@/models/LiftRevision";
import { notFound } from "@/lib/http/errors";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { assertVersion } from "@/lib/http/concurrency";
import { archivedFilter, likePattern, listQuerySchema, pageOptions, toPage, type Page } from "@/lib/http/list-query";
import { assertNotArchived, isRestoreRequest, type DeleteOutcome } from "@/lib/http/outcome";
import { validate } from "@/lib/http/validate";
import { recordAudit } from "@/lib/audit/record";
import { buildRevisionData } from "./build";
import { diffRevisions, type FieldChange } from "./diff";
import { liftCreateBodySchema, liftUpdateBodySchema, type LiftRevisionData } from "./schema";

export interface RevisionView extends LiftRevisionData {
  id: number;
  liftId: number;
  number: number;
  changeSummary: string | null;
  createdBy: number | null;
  createdAt: Date;
}

export interface LiftView {
  id: number;
  name: string;
  site: string | null;
  notes: string | null;
  version: number;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  currentRevision: RevisionView;
}

export interface LiftListItem extends Omit<LiftView, "currentRevision"> {
  currentRevisionId: number | null;
  currentRevisionNumber: number | null;
}

/** The stored revision as the data a new revision is built from. */
export function revisionData(r: LiftRevision): LiftRevisionData {
  return {
    name: r.name,
    site: r.site,
    notes: r.notes,
    chainSpecId: r.chainSpecId,
    lift: r.geometry as LiftRevisionData["lift"],
    chain: r.chain as LiftRevisionData["chain"],
    drive: r.drive as LiftRevisionData["drive"],
    takeUp: r.takeUp as LiftRevisionData["takeUp"],
    antiRollback: r.antiRollback as LiftRevisionData["antiRollback"],
    limits: (r.limits ?? {}) as LiftRevisionData["limits"],
  };
}

export function revisionView(r: LiftRevision): RevisionView {
  return {
    id: r.id,
    liftId: r.liftId,
    number: r.number,
    ...revisionData(r),
    changeSummary: r.changeSummary,
    createdBy: r.createdBy,
    createdAt: r.createdAt,
  };
}

function liftMeta(l: Lift) {
  return {
    id: l.id,
    name: l.name,
    site: l.site,
    notes: l.notes,
    version: l.version,
    archivedAt: l.archivedAt,
    createdAt: l.createdAt,
    updatedAt: l.updatedAt,
  };
}

export function liftView(l: Lift, current: LiftRevision): LiftView {
  return { ...liftMeta(l), currentRevision: revisionView(current) };
}

export const liftListQuery = listQuerySchema({
  sortFields: ["name", "site", "createdAt", "updatedAt"],
  defaultSort: "name",
  filters: {
    site: z.string().trim().max(120, { error: "site must be at most 120 characters" }).optional(),
    archived: archivedFilter,
  },
});
export type LiftListQuery = z.input<typeof liftListQuery>;

export async function listLifts(actor: Actor, query: LiftListQuery = {}): Promise<Page<LiftListItem>> {
  assertCan(actor, "design:read");
  const q = validate(liftListQuery, query);
  const { Lift, LiftRevision } = getModels();
  const where: WhereOptions = {
    organisationId: actor.organisationId,
    ...(q.archived === "all" ? {} : { archivedAt: q.archived === "true" ? { [Op.ne]: null } : null }),
    ...(q.site ? { site: q.site } : {}),
    ...(q.q
      ? {
          [Op.or]: [
            { name: { [Op.like]: likePattern(q.q) } },
            { site: { [Op.like]: likePattern(q.q) } },
            { notes: { [Op.like]: likePattern(q.q) } },
          ],
        }
      : {}),
  };
  const { rows, count } = await Lift.findAndCountAll({
    where,
    ...pageOptions(q),
    include: [{ model: LiftRevision, as: "currentRevision", attributes: ["id", "number"] }],
  });
  const items = rows.map((l) => {
    const rev = (l as Lift & { currentRevision?: LiftRevision | null }).currentRevision;
    return { ...liftMeta(l), currentRevisionId: l.currentRevisionId, currentRevisionNumber: rev?.number ?? null };
  });
  return toPage(items, count, q);
}

/** The organisation's lifts in use (not archived), by name: the choice of lift on the logbook's pages. */
export async function liftChoices(actor: Actor): Promise<{ id: number; name: string }[]> {
  assertCan(actor, "design:read");
  const lifts = await getModels().Lift.findAll({
    where: { organisationId: actor.organisationId, archivedAt: { [Op.is]: null } },
    order: [["name", "ASC"]],
    attributes: ["id", "name"],
  });
  return lifts.map((l) => ({ id: l.id, name: l.name }));
}

async function loadOwnLift(actor: Actor, id: number, transaction?: Transaction, lock = false): Promise<Lift> {
  const { Lift } = getModels();
  return ownOr404(
    await Lift.findByPk(id, { transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) }),
    actor,
    "Lift",
  );
}

async function currentRevisionOf(lift: Lift, transaction?: Transaction): Promise<LiftRevision> {
  const { LiftRevision } = getModels();
  const rev = lift.currentRevisionId ? await LiftRevision.findByPk(lift.currentRevisionId, { transaction }) : null;
  if (!rev) throw new Error(`Lift ${lift.id} has no current revision.`);
  return rev;
}

export async function getLift(actor: Actor, id: number): Promise<LiftView> {
  assertCan(actor, "design:read");
  const lift = await loadOwnLift(actor, id);
  return liftView(lift, await currentRevisionOf(lift));
}

/** Inserts revision `number` of a lift (inside the caller's transaction). */
export async function insertRevision(
  liftId: number,
  number: number,
  data: LiftRevisionData,
  changeSummary: string | null,
  createdBy: number | null,
  transaction: Transaction,
): Promise<LiftRevision> {
  const { LiftRevision } = getModels();
  return LiftRevision.create(
    {
      liftId,
      number,
      name: data.name,
      site: data.site,
      notes: data.notes,
      geometry: data.lift,
      chain: data.chain,
      chainSpecId: data.chainSpecId,
      drive: data.drive,
      takeUp: data.takeUp,
      antiRollback: data.antiRollback,
      limits: data.limits,
      changeSummary,
      createdBy,
    },
    { transaction },
  );
}

/**
 * Creates a lift with revision 1 inside `transaction` (also used by scenario import). Validates first;
 * the audit entry uses `action`.
 */
export async function createLiftIn(
  actor: Actor,
  data: LiftRevisionData,
  changeSummary: string | null,
  action: "create" | "import",
  transaction: Transaction,
): Promise<LiftView> {
  const { Lift } = getModels();
  const lift = await Lift.create(
    {
      organisationId: actor.organisationId,
      name: data.name,
      site: data.site,
      notes: data.notes,
      currentRevisionId: null,
      archivedAt: null,
      createdBy: actor.id,
    },
    { transaction },
  );
  const rev = await insertRevision(lift.id, 1, data, changeSummary, actor.id, transaction);
  await lift.update({ currentRevisionId: rev.id }, { transaction });
  const view = liftView(lift, rev);
  await recordAudit({ transaction, actor, entity: "lift", entityId: lift.id, action, after: view });
  return view;
}

export async function createLift(actor: Actor, input: unknown): Promise<LiftView> {
  assertCan(actor, "design:write");
  const body = validate(liftCreateBodySchema, input);
  const data = await buildRevisionData(actor, body, null);
  return getSequelize().transaction((transaction) =>
    createLiftIn(actor, data, body.changeSummary ?? "First revision", "create", transaction),
  );
}

export interface LiftUpdateResult extends LiftView {
  /** What the new revision changed (empty when the save changed nothing and no revision was written). */
  changes: FieldChange[];
}

/**
 * Saves a lift: a new revision (number = last + 1) and version + 1 in one transaction. The body carries
 * the version it edits (stale → 409, nothing written). A save that changes nothing writes nothing.
 * `{ version, archived: false }` restores an archived lift (no new revision).
 */
export async function updateLift(actor: Actor, id: number, input: unknown): Promise<LiftUpdateResult> {
  assertCan(actor, "design:write");
  const { LiftRevision } = getModels();
  return getSequelize().transaction(async (transaction) => {
    // Another organisation's lift is 404 whatever the body says, so the row comes first.
    const lift = await loadOwnLift(actor, id, transaction, true);
    if (lift.archivedAt && isRestoreRequest(input)) {
      assertVersion(lift.version, input.version, "lift");
      const current = await currentRevisionOf(lift, transaction);
      const before = liftView(lift, current);
      await lift.update({ archivedAt: null, version: lift.version + 1 }, { transaction });
      const after = liftView(lift, current);
      await recordAudit({ transaction, actor, entity: "lift", entityId: lift.id, action: "update", before, after });
      return { ...after, changes: [{ path: "archivedAt", before: before.archivedAt, after: null }] };
    }
    const { version, changeSummary, ...changes } = validate(liftUpdateBodySchema, input);
    assertNotArchived(lift, "lift");
    const current = await currentRevisionOf(lift, transaction);
    const before = revisionData(current);
    const data = await buildRevisionData(actor, changes, before, transaction);
    assertVersion(lift.version, version, "lift");
    const diff = diffRevisions(before, data);
    if (diff.length === 0) return { ...liftView(lift, current), changes: [] };
    const beforeView = liftView(lift, current);
    const last = (await LiftRevision.max("number", { where: { liftId: lift.id }, transaction })) as number | null;
    const rev = await insertRevision(lift.id, (last ?? 0) + 1, data, changeSummary ?? null, actor.id, transaction);
    await lift.update(
      { name: data.name, site: data.site, notes: data.notes, currentRevisionId: rev.id, version: lift.version + 1 },
      { transaction },
    );
    const after = liftView(lift, rev);
    await recordAudit({ transaction, actor, entity: "lift", entityId: lift.id, action: "update", before: beforeView, after });
    return { ...after, changes: diff };
  });
}

/**
 * Archives a lift that scenarios (and so runs) use — they keep their pinned revisions — or that has
 * operations records (logbook entries, recordings, uploaded photos and logger files, even one not yet
 * attached: its stored file would be left behind), else deletes it with its revisions.
 */
export async function deleteLift(actor: Actor, id: number): Promise<DeleteOutcome> {
  assertCan(actor, "design:write");
  const { Lift, LiftRevision, Scenario } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const lift = await loadOwnLift(actor, id, transaction, true);
    const current = await currentRevisionOf(lift, transaction);
    const before = liftView(lift, current);
    const used = await Scenario.count({ where: { liftId: lift.id }, transaction });
    const runs = await countRunsOfLift(lift.id, transaction);
    const records = await countOperationsRecords(lift.id, transaction);
    if (used + runs + records > 0) {
      if (!lift.archivedAt) await lift.update({ archivedAt: new Date(), version: lift.version + 1 }, { transaction });
      await recordAudit({ transaction, actor, entity: "lift", entityId: lift.id, action: "archive", before, after: liftView(lift, current) });
      return { id: lift.id, outcome: "archived" };
    }
    await lift.update({ currentRevisionId: null }, { transaction });
    await LiftRevision.destroy({ where: { liftId: lift.id }, transaction });
    await Lift.destroy({ where: { id: lift.id }, transaction });
    await recordAudit({ transaction, actor, entity: "lift", entityId: id, action: "delete", before, after: null });
    return { id, outcome: "deleted" };
  });
}

/** Logbook entries, recordings and uploads of the lift: records of the ride that deleting would lose. */
async function countOperationsRecords(liftId: number, transaction: Transaction): Promise<number> {
  const { LogbookEntry, Recording, Upload } = getModels();
  const counts = await Promise.all([
    LogbookEntry.count({ where: { liftId }, transaction }),
    Recording.count({ where: { liftId }, transaction }),
    Upload.count({ where: { liftId }, transaction }),
  ]);
  return counts.reduce((a, b) => a + b, 0);
}

/** Runs pinned to any revision of the lift (the runs table may not be registered in every process). */
async function countRunsOfLift(liftId: number, transaction: Transaction): Promise<number> {
  const Run = getSequelize().models.Run;
  if (!Run) return 0;
  const { LiftRevision } = getModels();
  const ids = (await LiftRevision.findAll({ where: { liftId }, attributes: ["id"], transaction })).map((r) => r.id);
  return ids.length ? Run.count({ where: { liftRevisionId: ids }, transaction }) : 0;
}

export const revisionListQuery = listQuerySchema({
  sortFields: ["number", "createdAt"],
  defaultSort: "number",
  defaultOrder: "desc",
  filters: {},
});
export type RevisionListQuery = z.input<typeof revisionListQuery>;

export interface RevisionListItem {
  id: number;
  number: number;
  name: string;
  changeSummary: string | null;
  chainSpecId: number | null;
  createdBy: number | null;
  createdAt: Date;
  current: boolean;
}

export async function listRevisions(actor: Actor, liftId: number, query: RevisionListQuery = {}): Promise<Page<RevisionListItem>> {
  assertCan(actor, "design:read");
  const q = validate(revisionListQuery, query);
  const lift = await loadOwnLift(actor, liftId);
  const { LiftRevision } = getModels();
  const { rows, count } = await LiftRevision.findAndCountAll({
    where: { liftId: lift.id },
    attributes: ["id", "number", "name", "changeSummary", "chainSpecId", "createdBy", "createdAt"],
    ...pageOptions(q),
  });
  const items = rows.map((r) => ({
    id: r.id,
    number: r.number,
    name: r.name,
    changeSummary: r.changeSummary,
    chainSpecId: r.chainSpecId,
    createdBy: r.createdBy,
    createdAt: r.createdAt,
    current: r.id === lift.currentRevisionId,
  }));
  return toPage(items, count, q);
}

export const revisionQuery = z.object({
  /** Revision number to compare against; default the one before. */
  compare: z.coerce
    .number({ error: "compare must be a revision number" })
    .int({ error: "compare must be a whole number" })
    .positive({ error: "compare must be a revision number" })
    .optional(),
});

export interface RevisionDetail {
  revision: RevisionView;
  current: boolean;
  /** Compared revision number (null for revision 1 without `compare`). */
  comparedWith: number | null;
  /** Field changes from `comparedWith` to this revision. */
  changes: FieldChange[];
}

export async function getRevision(
  actor: Actor,
  liftId: number,
  number: number,
  query: z.input<typeof revisionQuery> = {},
): Promise<RevisionDetail> {
  assertCan(actor, "design:read");
  const { compare } = validate(revisionQuery, query);
  const lift = await loadOwnLift(actor, liftId);
  const { LiftRevision } = getModels();
  const rev = await LiftRevision.findOne({ where: { liftId: lift.id, number } });
  if (!rev) throw notFound("Revision not found.");
  const otherNumber = compare ?? (number > 1 ? number - 1 : null);
  let changes: FieldChange[] = [];
  if (otherNumber !== null) {
    const other = await LiftRevision.findOne({ where: { liftId: lift.id, number: otherNumber } });
    if (!other) throw notFound(`Revision ${otherNumber} (compare) not found.`);
    changes = diffRevisions(revisionData(other), revisionData(rev));
  }
  return { revision: revisionView(rev), current: rev.id === lift.currentRevisionId, comparedWith: otherNumber, changes };
}
