/**
 * Trainers' replay sessions. Trainers (training:manage) build an ordered list of saved runs with captions
 * pinned to moments and share it; then the organisation's viewers (training:watch) may play it read-only,
 * and their progress is recorded. A draft, or any session of another organisation, is 404 to them.
 */
import { Op, type Transaction } from "sequelize";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { assertVersion } from "@/lib/http/concurrency";
import { throwIfIssues, validate } from "@/lib/http/validate";
import { recordAudit } from "@/lib/audit/record";
import { can } from "@/lib/auth/permissions";
import { getSequelize } from "@/lib/db/sequelize";
import { notFound, type FieldIssue } from "@/lib/http/errors";
import { sendMail } from "@/lib/mail/send";
import { getModels, type TrainingSession } from "@/models";
import { z } from "zod";
import { sessionInviteMail } from "./mail";
import { itemSchema, sessionCreateSchema, sessionUpdateSchema, shareSchema, viewSchema } from "./schema";

export interface SessionView {
  id: number;
  title: string;
  description: string | null;
  sharedAt: string | null;
  version: number;
  createdBy: number | null;
  canEdit: boolean;
  items: { id: number; runId: number; position: number; title: string | null; scenarioName: string; duration: number; captions: { id: number; at: number; text: string }[] }[];
}

async function loadVisible(actor: Actor, id: number, transaction?: Transaction): Promise<TrainingSession> {
  assertCan(actor, "training:watch");
  const s = ownOr404(await getModels().TrainingSession.findByPk(id, { transaction }), actor, "Session");
  if (!s.sharedAt && !can(actor.role, "training:manage")) throw notFound("Session not found.");
  return s;
}

async function sessionView(actor: Actor, s: TrainingSession, transaction?: Transaction): Promise<SessionView> {
  const { TrainingItem, TrainingCaption, Run, Scenario } = getModels();
  const items = await TrainingItem.findAll({ where: { sessionId: s.id }, order: [["position", "ASC"]], transaction });
  const captions = items.length ? await TrainingCaption.findAll({ where: { itemId: items.map((i) => i.id) }, order: [["at", "ASC"], ["id", "ASC"]], transaction }) : [];
  const runs = items.length ? await Run.findAll({ where: { id: items.map((i) => i.runId) }, attributes: ["id", "scenarioId", "inputs"], transaction }) : [];
  const scenarios = runs.length ? await Scenario.findAll({ where: { id: runs.map((r) => r.scenarioId) }, attributes: ["id", "name"], transaction }) : [];
  return {
    id: s.id,
    title: s.title,
    description: s.description,
    sharedAt: s.sharedAt ? s.sharedAt.toISOString() : null,
    version: s.version,
    createdBy: s.createdBy,
    canEdit: can(actor.role, "training:manage"),
    items: items.map((i) => {
      const run = runs.find((r) => r.id === i.runId);
      return {
        id: i.id,
        runId: i.runId,
        position: i.position,
        title: i.title,
        scenarioName: scenarios.find((sc) => sc.id === run?.scenarioId)?.name ?? "",
        duration: Number((run?.inputs as { run?: { duration?: number } } | undefined)?.run?.duration ?? 0),
        captions: captions.filter((c) => c.itemId === i.id).map((c) => ({ id: c.id, at: c.at, text: c.text })),
      };
    }),
  };
}

/** Checks the runs (own organisation, done) and caption moments (within each run), listing every problem. */
async function checkItems(actor: Actor, items: z.infer<typeof itemSchema>[], transaction: Transaction): Promise<void> {
  const { Run } = getModels();
  const runs = items.length ? await Run.findAll({ where: { id: items.map((i) => i.runId), organisationId: actor.organisationId }, transaction }) : [];
  const issues: FieldIssue[] = [];
  items.forEach((it, k) => {
    const run = runs.find((r) => r.id === it.runId);
    if (!run) return issues.push({ path: `items.${k}.runId`, message: `run ${it.runId} was not found` });
    if (run.status !== "done") return issues.push({ path: `items.${k}.runId`, message: `run ${it.runId} is ${run.status}; only finished runs can be replayed` });
    const duration = Number((run.inputs as { run?: { duration?: number } }).run?.duration ?? 0);
    it.captions.forEach((c, j) => {
      if (c.at > duration) issues.push({ path: `items.${k}.captions.${j}.at`, message: `must be within the run's ${duration} s` });
    });
  });
  throwIfIssues(issues);
}

async function writeItems(sessionId: number, items: z.infer<typeof itemSchema>[], transaction: Transaction): Promise<void> {
  const { TrainingItem, TrainingCaption } = getModels();
  await TrainingItem.destroy({ where: { sessionId }, transaction });
  for (const [position, it] of items.entries()) {
    const row = await TrainingItem.create({ sessionId, runId: it.runId, position, title: it.title ?? null }, { transaction });
    if (it.captions.length) await TrainingCaption.bulkCreate(it.captions.map((c) => ({ itemId: row.id, at: c.at, text: c.text })), { transaction });
  }
}

export async function createSession(actor: Actor, input: unknown): Promise<SessionView> {
  assertCan(actor, "training:manage");
  const body = validate(sessionCreateSchema, input);
  return getSequelize().transaction(async (transaction) => {
    await checkItems(actor, body.items ?? [], transaction);
    const s = await getModels().TrainingSession.create(
      { organisationId: actor.organisationId, title: body.title, description: body.description ?? null, createdBy: actor.id },
      { transaction },
    );
    await writeItems(s.id, body.items ?? [], transaction);
    await recordAudit({ transaction, actor, entity: "training-session", entityId: s.id, action: "create", after: { title: s.title } });
    return sessionView(actor, s, transaction);
  });
}

export async function updateSession(actor: Actor, id: number, input: unknown): Promise<SessionView> {
  assertCan(actor, "training:manage");
  return getSequelize().transaction(async (transaction) => {
    const s = ownOr404(await getModels().TrainingSession.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }), actor, "Session");
    const body = validate(sessionUpdateSchema, input);
    assertVersion(s.version, body.version, "session");
    if (body.items) {
      await checkItems(actor, body.items, transaction);
      await writeItems(s.id, body.items, transaction);
    }
    await s.update(
      { ...(body.title !== undefined ? { title: body.title } : {}), ...(body.description !== undefined ? { description: body.description } : {}), version: s.version + 1 },
      { transaction },
    );
    await recordAudit({ transaction, actor, entity: "training-session", entityId: s.id, action: "update", after: { title: s.title, items: body.items?.length } });
    return sessionView(actor, s, transaction);
  });
}

export async function deleteSession(actor: Actor, id: number): Promise<void> {
  assertCan(actor, "training:manage");
  await getSequelize().transaction(async (transaction) => {
    const s = ownOr404(await getModels().TrainingSession.findByPk(id, { transaction }), actor, "Session");
    await recordAudit({ transaction, actor, entity: "training-session", entityId: s.id, action: "delete", before: { title: s.title } });
    await s.destroy({ transaction });
  });
}

export async function getSession(actor: Actor, id: number): Promise<SessionView> {
  return sessionView(actor, await loadVisible(actor, id));
}

export async function listSessions(actor: Actor): Promise<{ id: number; title: string; sharedAt: string | null; items: number }[]> {
  assertCan(actor, "training:watch");
  const { TrainingSession: S, TrainingItem } = getModels();
  const rows = await S.findAll({
    where: { organisationId: actor.organisationId, ...(can(actor.role, "training:manage") ? {} : { sharedAt: { [Op.ne]: null } }) },
    order: [["id", "DESC"]],
  });
  const counts = rows.length ? await TrainingItem.findAll({ where: { sessionId: rows.map((r) => r.id) }, attributes: ["sessionId"] }) : [];
  return rows.map((r) => ({ id: r.id, title: r.title, sharedAt: r.sharedAt ? r.sharedAt.toISOString() : null, items: counts.filter((c) => c.sessionId === r.id).length }));
}

function appUrl(): string {
  return (process.env.NEXTAUTH_URL ?? "http://localhost:3000").replace(/\/$/, "");
}

/** Shares a session with the organisation: e-mails its viewers and anyone invited (people of the organisation). */
export async function shareSession(actor: Actor, id: number, input: unknown): Promise<{ session: SessionView; mailed: string[]; failed: string[] }> {
  assertCan(actor, "training:manage");
  const { TrainingSession: S, User } = getModels();
  const s = ownOr404(await S.findByPk(id), actor, "Session");
  const body = validate(shareSchema, input);
  const invite = (body.invite ?? []).map((e) => e.toLowerCase());
  const members = await User.findAll({ where: { organisationId: actor.organisationId, active: true } });
  const issues: FieldIssue[] = [];
  invite.forEach((e, k) => {
    if (!members.some((m) => m.email.toLowerCase() === e)) issues.push({ path: `invite.${k}`, message: `${e} is not in your organisation; an administrator can invite them first` });
  });
  throwIfIssues(issues);
  const items = await getModels().TrainingItem.count({ where: { sessionId: s.id } });
  if (!items) throwIfIssues([{ path: "items", message: "add at least one run before sharing" }]);
  await s.update({ sharedAt: s.sharedAt ?? new Date(), version: s.version + 1 });
  const to = [...new Set([...members.filter((m) => m.role === "viewer").map((m) => m.email.toLowerCase()), ...invite])].filter((e) => e !== members.find((m) => m.id === actor.id)?.email.toLowerCase());
  const mailed: string[] = [];
  const failed: string[] = [];
  const trainer = members.find((m) => m.id === actor.id)?.name ?? "A trainer";
  for (const e of to) {
    try {
      await sendMail(e, sessionInviteMail({ title: s.title, trainer, link: `${appUrl()}/replays/${s.id}` }));
      mailed.push(e);
    } catch {
      failed.push(e);
    }
  }
  return { session: await sessionView(actor, s), mailed, failed };
}

export async function recordView(actor: Actor, id: number, input: unknown): Promise<{ watchedTo: number; completed: boolean }> {
  const s = await loadVisible(actor, id);
  const body = validate(viewSchema, input);
  const { TrainingItem, TrainingView } = getModels();
  const item = await TrainingItem.findOne({ where: { id: body.itemId, sessionId: s.id } });
  if (!item) throwIfIssues([{ path: "itemId", message: "not an item of this session" }]);
  const existing = await TrainingView.findOne({ where: { itemId: body.itemId, userId: actor.id } });
  if (existing) {
    const watchedTo = Math.max(existing.watchedTo, body.watchedTo);
    const completed = existing.completed || !!body.completed;
    await existing.update({ watchedTo, completed });
    return { watchedTo, completed };
  }
  await TrainingView.create({ sessionId: s.id, itemId: body.itemId, userId: actor.id, watchedTo: body.watchedTo, completed: !!body.completed });
  return { watchedTo: body.watchedTo, completed: !!body.completed };
}

export interface ProgressRow {
  userId: number;
  name: string;
  email: string;
  items: { itemId: number; watchedTo: number; completed: boolean; lastAt: string }[];
}

/** Who has watched what (trainers only). */
export async function sessionProgress(actor: Actor, id: number): Promise<ProgressRow[]> {
  assertCan(actor, "training:manage");
  const s = ownOr404(await getModels().TrainingSession.findByPk(id), actor, "Session");
  const { TrainingView, User } = getModels();
  const views = await TrainingView.findAll({ where: { sessionId: s.id }, order: [["userId", "ASC"], ["itemId", "ASC"]] });
  const users = views.length ? await User.findAll({ where: { id: [...new Set(views.map((v) => v.userId))] }, attributes: ["id", "name", "email"] }) : [];
  return users.map((u) => ({
    userId: u.id,
    name: u.name,
    email: u.email,
    items: views.filter((v) => v.userId === u.id).map((v) => ({ itemId: v.itemId, watchedTo: v.watchedTo, completed: v.completed, lastAt: v.updatedAt.toISOString() })),
  }));
}
