/**
 * Sign-off of a design-check report: the author (an engineer) submits; a reviewer who is not the author
 * approves or returns it with a comment. Approval draws and stores the stamped PDF, records the content
 * hash, freezes the scenario (and so its runs), and e-mails the author. Every step is a review row and
 * an audit entry, written in one transaction with the change.
 */
import { Op } from "sequelize";
import { z } from "zod";
import { getModels } from "@/models";
import { assertCan, type Actor } from "@/lib/http/actor";
import { recordAudit } from "@/lib/audit/record";
import { conflict, forbidden, fromZod } from "@/lib/http/errors";
import { sendMail } from "@/lib/mail/send";
import { findOwnReport, getReport, renderReport, type ReportView } from "@/lib/reports/service";
import { reviewMail } from "./mail";

export const reviewCommentSchema = z
  .object({ comment: z.string({ error: "comment must be text" }).trim().max(5000).optional() })
  .strict();
export const returnSchema = z
  .object({ comment: z.string({ error: "comment must be text" }).trim().min(1, { error: "say what must change (comment)" }).max(5000) })
  .strict();

export const OWN_REPORT_MESSAGE = "You wrote this report: another reviewer must approve or return it.";

function parse<T>(schema: z.ZodType<T>, raw: unknown): T {
  const r = schema.safeParse(raw ?? {});
  if (!r.success) throw fromZod(r.error, "The review has invalid fields.");
  return r.data;
}

export async function submitReport(actor: Actor, id: number): Promise<ReportView> {
  assertCan(actor, "report:write");
  const { Report, ReportReview } = getModels();
  const report = await findOwnReport(actor, id);
  if (report.authorId !== actor.id) throw forbidden("Only the report's author submits it for review.");
  if (report.status !== "draft" && report.status !== "returned") throw conflict(`The report is ${report.status}; only a draft or returned report can be submitted.`);
  const { hash } = await renderReport(report); // proves it draws, and records what was submitted
  await Report.sequelize!.transaction(async (transaction) => {
    const [n] = await Report.update(
      { status: "submitted", submittedAt: new Date(), version: Report.sequelize!.literal("version + 1") as never },
      { where: { id, status: { [Op.in]: ["draft", "returned"] } }, transaction },
    );
    if (!n) throw conflict("The report changed meanwhile; reload it.");
    await ReportReview.create({ reportId: id, organisationId: actor.organisationId, userId: actor.id, action: "submit", comment: null, contentHash: hash, at: new Date() }, { transaction });
    await recordAudit({ transaction, actor, entity: "report", entityId: id, action: "update", before: { status: report.status }, after: { status: "submitted", contentHash: hash } });
  });
  return getReport(actor, id);
}

/** Order of refusals: role (403), another organisation's report (404), body (400), own report (403), state (409). */
async function assertReviewer<T>(actor: Actor, id: number, schema: z.ZodType<T>, raw: unknown) {
  assertCan(actor, "report:review");
  const report = await findOwnReport(actor, id);
  const body = parse(schema, raw);
  if (report.authorId === actor.id) throw forbidden(OWN_REPORT_MESSAGE);
  if (report.status !== "submitted") throw conflict(`The report is ${report.status}; only a submitted report can be reviewed.`);
  return { report, body };
}

async function notifyAuthor(actor: Actor, reportId: number, outcome: "approved" | "returned", comment: string | null, hash: string | null) {
  const { User, Report } = getModels();
  const report = await Report.findByPk(reportId);
  const [author, reviewer] = await Promise.all([User.findByPk(report?.authorId ?? 0), User.findByPk(actor.id)]);
  if (!report || !author) return;
  const base = process.env.APP_URL || process.env.NEXTAUTH_URL || "http://localhost:3000";
  try {
    await sendMail(
      author.email,
      reviewMail({
        authorName: author.name,
        reviewerName: reviewer?.name ?? "A reviewer",
        title: report.title,
        outcome,
        comment,
        contentHash: hash,
        link: `${base}/studies?report=${report.id}`,
      }),
    );
  } catch (err) {
    // The approval stands; the mail failure is logged for the operator.
    console.error(`report ${reportId}: review e-mail not sent:`, (err as Error).message);
  }
}

export async function approveReport(actor: Actor, id: number, raw: unknown): Promise<ReportView> {
  const { report, body } = await assertReviewer(actor, id, reviewCommentSchema, raw);
  const comment = body.comment;
  const { Report, ReportReview, Scenario } = getModels();
  const approvedAt = new Date();
  // The stamp names the reviewer and date, so draw with the approved state.
  report.status = "approved";
  report.reviewerId = actor.id;
  report.approvedAt = approvedAt;
  const { pdf, hash } = await renderReport(report);
  await Report.sequelize!.transaction(async (transaction) => {
    const [n] = await Report.update(
      {
        status: "approved",
        reviewerId: actor.id,
        approvedAt,
        contentHash: hash,
        pdf,
        pdfBytes: pdf.byteLength,
        version: Report.sequelize!.literal("version + 1") as never,
      },
      { where: { id, status: "submitted" }, transaction },
    );
    if (!n) throw conflict("The report changed meanwhile; reload it.");
    await ReportReview.create({ reportId: id, organisationId: actor.organisationId, userId: actor.id, action: "approve", comment: comment || null, contentHash: hash, at: approvedAt }, { transaction });
    await recordAudit({ transaction, actor, entity: "report", entityId: id, action: "update", before: { status: "submitted" }, after: { status: "approved", reviewerId: actor.id, approvedAt, contentHash: hash } });
    const scenario = await Scenario.findByPk(report.scenarioId, { transaction });
    if (scenario && !scenario.frozenAt) {
      await Scenario.update({ frozenAt: approvedAt, version: Scenario.sequelize!.literal("version + 1") as never }, { where: { id: scenario.id }, transaction });
      await recordAudit({ transaction, actor, entity: "scenario", entityId: scenario.id, action: "update", before: { frozenAt: null }, after: { frozenAt: approvedAt, reportId: id, liftRevisionId: report.liftRevisionId } });
    }
  });
  await notifyAuthor(actor, id, "approved", comment || null, hash);
  return getReport(actor, id);
}

export async function returnReport(actor: Actor, id: number, raw: unknown): Promise<ReportView> {
  const { body } = await assertReviewer(actor, id, returnSchema, raw);
  const comment = body.comment;
  const { Report, ReportReview } = getModels();
  await Report.sequelize!.transaction(async (transaction) => {
    const [n] = await Report.update(
      { status: "returned", version: Report.sequelize!.literal("version + 1") as never },
      { where: { id, status: "submitted" }, transaction },
    );
    if (!n) throw conflict("The report changed meanwhile; reload it.");
    await ReportReview.create({ reportId: id, organisationId: actor.organisationId, userId: actor.id, action: "return", comment, contentHash: null, at: new Date() }, { transaction });
    await recordAudit({ transaction, actor, entity: "report", entityId: id, action: "update", before: { status: "submitted" }, after: { status: "returned", comment } });
  });
  await notifyAuthor(actor, id, "returned", comment, null);
  return getReport(actor, id);
}
