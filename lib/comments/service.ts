import type { Transaction } from "sequelize";
import { z } from "zod";
import { getSequelize } from "@/lib/db/sequelize";
import { getModels } from "@/models";
import type { Comment } from "@/models/Comment";
import type { User } from "@/models/User";
import { badRequest, forbidden, notFound } from "@/lib/http/errors";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { listQuerySchema, pageOptions, queryId, toPage, type Page } from "@/lib/http/list-query";
import { validate } from "@/lib/http/validate";
import { recordAudit } from "@/lib/audit/record";

export const commentInputSchema = z
  .object({
    body: z
      .string({ error: "body must be text" })
      .trim()
      .min(1, { error: "body must not be empty" })
      .max(5000, { error: "body must be at most 5000 characters" }),
    /** A run of this scenario the comment is about. */
    runId: z
      .number({ error: "runId must be a run id" })
      .int({ error: "runId must be a whole number" })
      .positive({ error: "runId must be a run id" })
      .nullish(),
  })
  .strict();

export const commentUpdateSchema = commentInputSchema.pick({ body: true }).strict();

export interface CommentView {
  id: number;
  scenarioId: number;
  runId: number | null;
  body: string;
  author: { id: number; name: string; role: string } | null;
  createdAt: Date;
  updatedAt: Date;
}

export function commentView(c: Comment, author?: User | null): CommentView {
  const a = author ?? (c as Comment & { author?: User | null }).author ?? null;
  return {
    id: c.id,
    scenarioId: c.scenarioId,
    runId: c.runId,
    body: c.body,
    author: a ? { id: a.id, name: a.name, role: a.role } : null,
    createdAt: c.createdAt,
    updatedAt: c.updatedAt,
  };
}

export const commentListQuery = listQuerySchema({
  sortFields: ["createdAt"],
  defaultSort: "createdAt",
  filters: { runId: queryId("runId").optional() },
});

async function ownScenarioId(actor: Actor, scenarioId: number, transaction?: Transaction): Promise<number> {
  const { Scenario } = getModels();
  const s = ownOr404(await Scenario.findByPk(scenarioId, { attributes: ["id", "organisationId"], transaction }), actor, "Scenario");
  return s.id;
}

export async function listComments(actor: Actor, scenarioId: number, query: z.input<typeof commentListQuery> = {}): Promise<Page<CommentView>> {
  assertCan(actor, "design:read");
  const q = validate(commentListQuery, query);
  const id = await ownScenarioId(actor, scenarioId);
  const { Comment, User } = getModels();
  const { rows, count } = await Comment.findAndCountAll({
    where: { scenarioId: id, ...(q.runId ? { runId: q.runId } : {}) },
    include: [{ model: User, as: "author", attributes: ["id", "name", "role"] }],
    ...pageOptions(q),
  });
  return toPage(rows.map((c) => commentView(c)), count, q);
}

/** The run must belong to this scenario (checked when the runs table is registered in this process). */
async function assertRunOfScenario(runId: number, scenarioId: number, transaction: Transaction): Promise<void> {
  const Run = getSequelize().models.Run;
  if (!Run) return;
  const n = await Run.count({ where: { id: runId, scenarioId }, transaction });
  if (n === 0) throw badRequest("The request has invalid fields.", [{ path: "runId", message: `runId ${runId}: not a run of this scenario` }]);
}

export async function createComment(actor: Actor, scenarioId: number, input: unknown): Promise<CommentView> {
  assertCan(actor, "comment:write");
  const { Comment, User } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const id = await ownScenarioId(actor, scenarioId, transaction);
    const data = validate(commentInputSchema, input);
    if (data.runId) await assertRunOfScenario(data.runId, id, transaction);
    const row = await Comment.create(
      { organisationId: actor.organisationId, scenarioId: id, runId: data.runId ?? null, userId: actor.id, body: data.body },
      { transaction },
    );
    const view = commentView(row, await User.findByPk(actor.id, { transaction }));
    await recordAudit({ transaction, actor, entity: "comment", entityId: row.id, action: "create", after: view });
    return view;
  });
}

async function loadOwnComment(actor: Actor, scenarioId: number, commentId: number, transaction: Transaction): Promise<Comment> {
  await ownScenarioId(actor, scenarioId, transaction);
  const { Comment } = getModels();
  const row = await Comment.findByPk(commentId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!row || row.scenarioId !== scenarioId || row.organisationId !== actor.organisationId) throw notFound("Comment not found.");
  return row;
}

/** Only the author edits a comment (a review record is the author's own words). */
export async function updateComment(actor: Actor, scenarioId: number, commentId: number, input: unknown): Promise<CommentView> {
  assertCan(actor, "comment:write");
  const { User } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = await loadOwnComment(actor, scenarioId, commentId, transaction);
    const data = validate(commentUpdateSchema, input);
    if (row.userId !== actor.id) throw forbidden("Only the author may edit a comment.");
    const author = await User.findByPk(actor.id, { transaction });
    const before = commentView(row, author);
    await row.update({ body: data.body }, { transaction });
    const after = commentView(row, author);
    await recordAudit({ transaction, actor, entity: "comment", entityId: row.id, action: "update", before, after });
    return after;
  });
}

/** The author or an admin removes a comment. */
export async function deleteComment(actor: Actor, scenarioId: number, commentId: number): Promise<{ id: number; outcome: "deleted" }> {
  assertCan(actor, "comment:write");
  return getSequelize().transaction(async (transaction) => {
    const row = await loadOwnComment(actor, scenarioId, commentId, transaction);
    if (row.userId !== actor.id && actor.role !== "admin") throw forbidden("Only the author or an administrator may remove a comment.");
    const before = commentView(row);
    await row.destroy({ transaction });
    await recordAudit({ transaction, actor, entity: "comment", entityId: commentId, action: "delete", before, after: null });
    return { id: commentId, outcome: "deleted" };
  });
}
