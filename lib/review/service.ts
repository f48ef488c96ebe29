/**
 * Sign-off of a design-check report: the author (an engineer) submits; a reviewer who is not the author
 * approves (after confirming the approval summary) or returns it with a comment. Submission e-mails the
 * reviewers. Approval keeps a snapshot of every input, draws and stores the stamped PDF, records the
 * content hash, freezes the scenario (and so its runs), and e-mails the author. Every step is a review row and
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
import { buildReportContent, contentHash } from "@/lib/reports/content";
import { takeSnapshot } from "@/lib/reports/snapshot";
import { reviewMail, submittedMail } from "./mail";

/** Approval names the content the reviewer read: the content hash of the approval summary. */
export const approveSchema = z
  .object({
    comment: z.string({ error: "comment must be text" }).trim().max(5000).optional(),
    confirmedHash: z
      .string({ error: "confirm the approval summary: confirmedHash (the content hash it shows) is required" })
      .regex(/^[0-9a-f]{64}$/, { error: "confirmedHash must be the 64-character content hash shown in the approval summary" }),
  })
  .strict();
export const returnSchema = z
  .object({
    comment: z
      .string({ error: "a return needs a comment: say what must change" })
      .trim()
      .min(1, { error: "a return needs a comment: say what must change" })
      .max(5000, { error: "the comment must be at most 5000 characters" }),
  })
  .strict();

export const MISSING_RETURN_COMMENT = "Write what must change before returning the report: the author reads your comment on the report.";
export const SUMMARY_CHANGED = "The report's content changed since you read the approval summary; read it again before approving.";

export const OWN_REPORT_MESSAGE = "You wrote this report: another reviewer must approve or return it.";

function parse<T>(schema: z.ZodType<T>, raw: unknown, message: string): T {
  const r = schema.safeParse(raw ?? {});
  if (!r.success) throw fromZod(r.error, message);
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
  await notifyReviewers(actor, id);
  return getReport(actor, id);
}

/** Order of refusals: role (403), another organisation's report (404), body (400), own report (403), state (409). */
async function assertReviewer<T>(actor: Actor, id: number, schema: z.ZodType<T>, raw: unknown, message: string) {
  assertCan(actor, "report:review");
  const report = await findOwnReport(actor, id);
  const body = parse(schema, raw, message);
  if (report.authorId === actor.id) throw forbidden(OWN_REPORT_MESSAGE);
  if (report.status !== "submitted") throw conflict(`The report is ${report.status}; only a submitted report can be reviewed.`);
  return { report, body };
}

function appBase(): string {
  return (process.env.APP_URL || process.env.NEXTAUTH_URL || "http://localhost:3000").replace(/\/+$/, "");
}

/** Tells the organisation's reviewers (not the author) that a report awaits them, linking straight to it. */
async function notifyReviewers(actor: Actor, reportId: number) {
  const { User, Report, Scenario } = getModels();
  const report = await Report.findByPk(reportId);
  if (!report) return;
  const [author, scenario, reviewers] = await Promise.all([
    User.findByPk(actor.id),
    Scenario.findByPk(report.scenarioId, { attributes: ["id", "name"] }),
    User.findAll({ where: { organisationId: actor.organisationId, role: ["reviewer", "admin"], active: true, id: { [Op.ne]: actor.id } } }),
  ]);
  for (const reviewer of reviewers) {
    try {
      await sendMail(
        reviewer.email,
        submittedMail({
          reviewerName: reviewer.name,
          authorName: author?.name ?? "An engineer",
          title: report.title,
          scenarioName: scenario?.name ?? "",
          link: `${appBase()}/reports/${report.id}`,
          queueLink: `${appBase()}/reports?status=submitted`,
        }),
      );
    } catch (err) {
      // The submission stands; the queue shows it whatever the mail did.
      console.error(`report ${reportId}: submission e-mail to reviewer ${reviewer.id} not sent:`, (err as Error).message);
    }
  }
}

async function notifyAuthor(actor: Actor, reportId: number, outcome: "approved" | "returned", comment: string | null, hash: string | null) {
  const { User, Report } = getModels();
  const report = await Report.findByPk(reportId);
  const [author, reviewer] = await Promise.all([User.findByPk(report?.authorId ?? 0), User.findByPk(actor.id)]);
  if (!report || !author) return;
  const base = appBase();
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
        link: `${base}/reports/${report.id}`,
      }),
    );
  } catch (err) {
    // The approval stands; the mail failure is logged for the operator.
    console.error(`report ${reportId}: review e-mail not sent:`, (err as Error).message);
  }
}

export async function approveReport(actor: Actor, id: number, raw: unknown): Promise<ReportView> {
  const { report, body } = await assertReviewer(actor, id, approveSchema, raw, "Confirm the approval summary before approving.");
  const comment = body.comment;
  const { Report, ReportReview, Scenario } = getModels();
  const approvedAt = new Date();
  const content = await buildReportContent(report);
  if (contentHash(content) !== body.confirmedHash) throw conflict(SUMMARY_CHANGED);
  const snapshot = await takeSnapshot(report, content);
  // The stamp names the reviewer and date, so draw with the approved state (from the snapshot's content).
  report.status = "approved";
  report.reviewerId = actor.id;
  report.approvedAt = approvedAt;
  report.snapshot = snapshot as unknown as Record<string, unknown>;
  const reviewerName = (await getModels().User.findByPk(actor.id, { attributes: ["id", "name"] }))?.name ?? null;
  const { pdf, hash } = await renderReport(report, { action: "approve", userName: reviewerName, at: approvedAt.toISOString(), comment: comment || null });
  await Report.sequelize!.transaction(async (transaction) => {
    const [n] = await Report.update(
      {
        status: "approved",
        reviewerId: actor.id,
        approvedAt,
        contentHash: hash,
        pdf,
        pdfBytes: pdf.byteLength,
        snapshot: snapshot as unknown as Record<string, unknown>,
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
  const { body } = await assertReviewer(actor, id, returnSchema, raw, MISSING_RETURN_COMMENT);
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
