import { Op, type WhereOptions } from "sequelize";
import { z } from "zod";
import { getModels } from "@/models";
import type { AuditEntry } from "@/models/AuditEntry";
import { AUDIT_ACTIONS } from "@/models/AuditEntry";
import type { User } from "@/models/User";
import { assertCan, type Actor } from "@/lib/api/actor";
import { listQuerySchema, pageOptions, queryId, toPage, type Page } from "@/lib/api/list-query";
import { validate } from "@/lib/api/validate";
import { diffValues, type FieldChange } from "@/lib/diff/values";

const isoDate = (name: string) =>
  z
    .string()
    .trim()
    .refine((v) => !Number.isNaN(Date.parse(v)), { error: `${name} must be a date and time (ISO 8601)` })
    .transform((v) => new Date(v));

export const auditListQuery = listQuerySchema({
  sortFields: ["at", "entity", "action"],
  defaultSort: "at",
  defaultOrder: "desc",
  filters: {
    entity: z.string().trim().regex(/^[a-z_]{1,40}$/, { error: "entity must be a name like lift or chain_spec" }).optional(),
    entityId: z.string().trim().max(64, { error: "entityId must be at most 64 characters" }).optional(),
    action: z.enum(AUDIT_ACTIONS, { error: `action must be one of ${AUDIT_ACTIONS.join(", ")}` }).optional(),
    userId: queryId("userId").optional(),
    from: isoDate("from").optional(),
    to: isoDate("to").optional(),
  },
});
export type AuditListQuery = z.input<typeof auditListQuery>;

export interface AuditView {
  id: number;
  at: Date;
  user: { id: number; name: string } | null;
  entity: string;
  entityId: string;
  action: string;
  before: unknown;
  after: unknown;
  /** For updates: what changed, field by field. */
  changes: FieldChange[];
}

export function auditView(e: AuditEntry): AuditView {
  const u = (e as AuditEntry & { user?: User | null }).user ?? null;
  return {
    id: e.id,
    at: e.at,
    user: u ? { id: u.id, name: u.name } : null,
    entity: e.entity,
    entityId: e.entityId,
    action: e.action,
    before: e.before,
    after: e.after,
    changes: e.action === "update" ? diffValues(e.before, e.after).filter((c) => !/(^|\.)(updatedAt|version)$/.test(c.path)) : [],
  };
}

/** The organisation's audit trail, newest first by default. */
export async function listAudit(actor: Actor, query: AuditListQuery = {}): Promise<Page<AuditView>> {
  assertCan(actor, "audit:read");
  const q = validate(auditListQuery, query);
  const { AuditEntry, User } = getModels();
  const at = { ...(q.from ? { [Op.gte]: q.from } : {}), ...(q.to ? { [Op.lte]: q.to } : {}) };
  const where: WhereOptions = {
    organisationId: actor.organisationId,
    ...(q.entity ? { entity: q.entity } : {}),
    ...(q.entityId ? { entityId: q.entityId } : {}),
    ...(q.action ? { action: q.action } : {}),
    ...(q.userId ? { userId: q.userId } : {}),
    ...(q.from || q.to ? { at } : {}),
  };
  const { rows, count } = await AuditEntry.findAndCountAll({
    where,
    include: [{ model: User, as: "user", attributes: ["id", "name"] }],
    ...pageOptions(q),
  });
  return toPage(rows.map(auditView), count, q);
}
