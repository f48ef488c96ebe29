import { Op, type WhereOptions } from "sequelize";
import { z } from "zod";
import { getSequelize } from "@/lib/db/sequelize";
import { getModels } from "@/models";
import type { ChainSpec } from "@/models/ChainSpec";
import { forbidden } from "@/lib/http/errors";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { assertVersion, versionField } from "@/lib/http/concurrency";
import { archivedFilter, likePattern, listQuerySchema, pageOptions, toPage, type Page } from "@/lib/http/list-query";
import { validate } from "@/lib/http/validate";
import { recordAudit } from "@/lib/audit/record";
import { assertNotArchived, isRestoreRequest, type DeleteOutcome } from "@/lib/http/outcome";
import { chainSpecInputSchema } from "./schema";

export interface ChainSpecView {
  id: number;
  designation: string;
  pitch: number;
  massPerLength: number;
  axialStiffness: number;
  breakingStrength: number;
  source: string;
  note: string | null;
  /** True for the shared standard catalogue (read-only). */
  standard: boolean;
  version: number;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
}

export function chainSpecView(c: ChainSpec): ChainSpecView {
  return {
    id: c.id,
    designation: c.designation,
    pitch: c.pitch,
    massPerLength: c.massPerLength,
    axialStiffness: c.axialStiffness,
    breakingStrength: c.breakingStrength,
    source: c.source,
    note: c.note,
    standard: c.organisationId === null,
    version: c.version,
    archivedAt: c.archivedAt,
    createdAt: c.createdAt,
    updatedAt: c.updatedAt,
  };
}

export const chainSpecListQuery = listQuerySchema({
  sortFields: ["designation", "pitch", "massPerLength", "breakingStrength", "axialStiffness", "createdAt", "updatedAt"],
  defaultSort: "pitch",
  filters: {
    /** standard = the shared catalogue, own = this organisation's chains, all = both. */
    scope: z.enum(["all", "standard", "own"], { error: "scope must be all, standard or own" }).default("all"),
    archived: archivedFilter,
  },
});
export type ChainSpecListQuery = z.input<typeof chainSpecListQuery>;

export async function listChainSpecs(actor: Actor, query: ChainSpecListQuery = {}): Promise<Page<ChainSpecView>> {
  assertCan(actor, "design:read");
  const q = validate(chainSpecListQuery, query);
  const { ChainSpec } = getModels();
  const scope =
    q.scope === "standard"
      ? { organisationId: null }
      : q.scope === "own"
        ? { organisationId: actor.organisationId }
        : { [Op.or]: [{ organisationId: null }, { organisationId: actor.organisationId }] };
  const where: WhereOptions = {
    [Op.and]: [
      scope,
      q.archived === "all" ? {} : { archivedAt: q.archived === "true" ? { [Op.ne]: null } : null },
      q.q
        ? { [Op.or]: [{ designation: { [Op.like]: likePattern(q.q) } }, { source: { [Op.like]: likePattern(q.q) } }] }
        : {},
    ],
  };
  const { rows, count } = await ChainSpec.findAndCountAll({ where, ...pageOptions(q) });
  return toPage(rows.map(chainSpecView), count, q);
}

/** A chain the actor may see: the standard catalogue or the organisation's own. */
export async function findVisibleChainSpec(actor: Actor, id: number): Promise<ChainSpec> {
  const { ChainSpec } = getModels();
  return ownOr404(await ChainSpec.findByPk(id), actor, "Chain", true);
}

export async function getChainSpec(actor: Actor, id: number): Promise<ChainSpecView> {
  assertCan(actor, "design:read");
  return chainSpecView(await findVisibleChainSpec(actor, id));
}

export async function createChainSpec(actor: Actor, input: unknown): Promise<ChainSpecView> {
  assertCan(actor, "design:write");
  const data = validate(chainSpecInputSchema, input);
  const { ChainSpec } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = await ChainSpec.create(
      { ...data, organisationId: actor.organisationId, archivedAt: null, createdBy: actor.id },
      { transaction },
    );
    await recordAudit({ transaction, actor, entity: "chain_spec", entityId: row.id, action: "create", after: chainSpecView(row) });
    return chainSpecView(row);
  });
}

const readOnlyStandard = () =>
  forbidden("The standard chain catalogue is read-only. Add your organisation's own chain instead.");

export const chainSpecUpdateSchema = z.object({ version: versionField }).loose();

export async function updateChainSpec(actor: Actor, id: number, input: unknown): Promise<ChainSpecView> {
  assertCan(actor, "design:write");
  const { ChainSpec } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = ownOr404(await ChainSpec.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }), actor, "Chain", true);
    if (row.organisationId === null) throw readOnlyStandard();
    if (row.archivedAt && isRestoreRequest(input)) {
      assertVersion(row.version, input.version, "chain");
      const before = chainSpecView(row);
      await row.update({ archivedAt: null, version: row.version + 1 }, { transaction });
      await recordAudit({ transaction, actor, entity: "chain_spec", entityId: row.id, action: "update", before, after: chainSpecView(row) });
      return chainSpecView(row);
    }
    const { version, ...changes } = validate(chainSpecUpdateSchema, input);
    assertNotArchived(row, "chain");
    const current = {
      designation: row.designation,
      pitch: row.pitch,
      massPerLength: row.massPerLength,
      axialStiffness: row.axialStiffness,
      breakingStrength: row.breakingStrength,
      source: row.source,
      note: row.note,
    };
    // The merged entry must pass the same rules as a new one; nothing is written before that.
    const data = validate(chainSpecInputSchema, { ...current, ...changes });
    assertVersion(row.version, version, "chain");
    const before = chainSpecView(row);
    await row.update({ ...data, version: row.version + 1 }, { transaction });
    await recordAudit({ transaction, actor, entity: "chain_spec", entityId: row.id, action: "update", before, after: chainSpecView(row) });
    return chainSpecView(row);
  });
}

/** Archives a chain that lift revisions came from (they keep their copied values), deletes an unused one. */
export async function deleteChainSpec(actor: Actor, id: number): Promise<DeleteOutcome> {
  assertCan(actor, "design:write");
  const { ChainSpec, LiftRevision } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = ownOr404(await ChainSpec.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }), actor, "Chain", true);
    if (row.organisationId === null) throw readOnlyStandard();
    const before = chainSpecView(row);
    const used = await LiftRevision.count({ where: { chainSpecId: row.id }, transaction });
    if (used > 0) {
      if (!row.archivedAt) await row.update({ archivedAt: new Date(), version: row.version + 1 }, { transaction });
      await recordAudit({ transaction, actor, entity: "chain_spec", entityId: row.id, action: "archive", before, after: chainSpecView(row) });
      return { id: row.id, outcome: "archived" };
    }
    await row.destroy({ transaction });
    await recordAudit({ transaction, actor, entity: "chain_spec", entityId: id, action: "delete", before, after: null });
    return { id, outcome: "deleted" };
  });
}
