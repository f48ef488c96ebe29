import { Op, type WhereOptions } from "sequelize";
import { z } from "zod";
import { getModels } from "@/models";
import type { AuditEntry } from "@/models/AuditEntry";
import { AUDIT_ACTIONS } from "@/models/AuditEntry";
import type { User } from "@/models/User";
import { assertCan, type Actor } from "@/lib/http/actor";
import { listQuerySchema, pageOptions, queryId, toPage, type Page } from "@/lib/http/list-query";
import { validate } from "@/lib/http/validate";
import { isoDateField } from "@/lib/http/dates";
import { diffValues, type FieldChange } from "@/lib/diff/values";

export const auditListQuery = listQuerySchema({
  sortFields: ["at", "entity", "action"],
  defaultSort: "at",
  defaultOrder: "desc",
  filters: {
    entity: z.string().trim().regex(/^[a-z_]{1,40}$/, { error: "entity must be a name like lift or chain_spec" }).optional(),
    entityId: z.string().trim().max(64, { error: "entityId must be at most 64 characters" }).optional(),
    action: z.enum(AUDIT_ACTIONS, { error: `action must be one of ${AUDIT_ACTIONS.join(", ")}` }).optional(),
    userId: queryId("userId").optional(),
    /** Entries about the lift, its scenarios, their runs and their reports. */
    liftId: queryId("liftId").optional(),
    from: isoDateField("from").optional(),
    to: isoDateField("to").optional(),
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
    changes: e.action === "update" || e.action === "archive" ? diffValues(e.before, e.after).filter((c) => !/(^|\.)(updatedAt|version)$/.test(c.path)) : [],
  };
}

/** Where conditions for every entry about a lift: the lift, its scenarios, their runs and reports. */
async function liftScope(organisationId: number, liftId: number): Promise<WhereOptions[]> {
  const { Scenario, Run, Report } = getModels();
  const scenarioIds = (await Scenario.findAll({ where: { organisationId, liftId }, attributes: ["id"] })).map((s) => s.id);
  const [runIds, reportIds] = scenarioIds.length
    ? await Promise.all([
        Run.findAll({ where: { scenarioId: scenarioIds }, attributes: ["id"] }).then((r) => r.map((x) => x.id)),
        Report.findAll({ where: { scenarioId: scenarioIds }, attributes: ["id"] }).then((r) => r.map((x) => x.id)),
      ])
    : [[], []];
  const about = (entity: string, ids: number[]) => (ids.length ? [{ entity, entityId: ids.map(String) }] : []);
  return [{ entity: "lift", entityId: String(liftId) }, ...about("scenario", scenarioIds), ...about("run", runIds), ...about("report", reportIds)];
}

/** The people and lifts of the organisation, for the audit screen's filters. */
export async function auditFilterOptions(actor: Actor): Promise<{ users: { id: number; name: string }[]; lifts: { id: number; name: string }[] }> {
  assertCan(actor, "audit:read");
  const { User, Lift } = getModels();
  const [users, lifts] = await Promise.all([
    User.findAll({ where: { organisationId: actor.organisationId }, attributes: ["id", "name"], order: [["name", "ASC"]] }),
    Lift.findAll({ where: { organisationId: actor.organisationId }, attributes: ["id", "name"], order: [["name", "ASC"]] }),
  ]);
  return { users: users.map((u) => ({ id: u.id, name: u.name })), lifts: lifts.map((l) => ({ id: l.id, name: l.name })) };
}

/** The organisation's audit trail, newest first by default. */
export async function listAudit(actor: Actor, query: AuditListQuery = {}): Promise<Page<AuditView>> {
  assertCan(actor, "audit:read");
  const q = validate(auditListQuery, query);
  const { AuditEntry, User } = getModels();
  const at = { ...(q.from ? { [Op.gte]: q.from } : {}), ...(q.to ? { [Op.lte]: q.to } : {}) };
  const aboutLift = q.liftId ? await liftScope(actor.organisationId, q.liftId) : null;
  const where: WhereOptions = {
    organisationId: actor.organisationId,
    ...(q.entity ? { entity: q.entity } : {}),
    ...(q.entityId ? { entityId: q.entityId } : {}),
    ...(q.action ? { action: q.action } : {}),
    ...(q.userId ? { userId: q.userId } : {}),
    ...(q.from || q.to ? { at } : {}),
    ...(aboutLift ? { [Op.or]: aboutLift } : {}),
  };
  const { rows, count } = await AuditEntry.findAndCountAll({
    where,
    include: [{ model: User, as: "user", attributes: ["id", "name"] }],
    ...pageOptions(q),
  });
  return toPage(rows.map(auditView), count, q);
}
