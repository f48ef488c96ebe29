/**
 * Reports: create a draft of a scenario (with one of its finished runs, optionally a study), list,
 * read, and draw the PDF. Approved reports keep the stamped PDF drawn at approval.
 */
import { getModels } from "@/models";
import type { Report } from "@/models/Report";
import { z } from "zod";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { recordAudit } from "@/lib/audit/record";
import { badRequest, conflict, fromZod } from "@/lib/http/errors";
import { Op, type WhereOptions } from "sequelize";
import { likePattern, listQuerySchema, pageOptions, queryId } from "@/lib/http/list-query";
import { validate } from "@/lib/http/validate";
import { REPORT_STATUSES } from "@/models/Report";
import { approvalSummary, type ApprovalSummary } from "@/lib/review/summary";
import { buildReportContent, contentHash } from "./content";
import { drawReportPdf, type ReportReviewLine, type ReportStamp } from "./pdf";
import { reportSnapshot, type ReportSnapshot } from "./snapshot";

export const createReportSchema = z
  .object({
    scenarioId: z.number({ error: "scenarioId must be a whole number" }).int().positive(),
    runId: z.number({ error: "runId must be a whole number" }).int().positive(),
    studyId: z.number({ error: "studyId must be a whole number" }).int().positive().optional(),
    title: z.string({ error: "title must be text" }).trim().min(1, { error: "title must not be empty" }).max(200).optional(),
    units: z.enum(["si", "us"], { error: "units must be si or us" }).optional(),
  })
  .strict();

export interface ReportView {
  id: number;
  scenarioId: number;
  liftRevisionId: number;
  runId: number | null;
  studyId: number | null;
  title: string;
  units: "si" | "us";
  status: string;
  authorId: number | null;
  reviewerId: number | null;
  submittedAt: string | null;
  approvedAt: string | null;
  contentHash: string | null;
  version: number;
  createdAt: string;
  /** For lists and the reviewer queue: what the report is about, by name. */
  scenarioName?: string | null;
  authorName?: string | null;
  reviews?: { id: number; action: string; userId: number | null; userName: string | null; comment: string | null; contentHash: string | null; at: string }[];
  /** The reviewer's latest return comment while the report is returned (detail only). */
  returnComment?: string | null;
  /** What approval signs (detail only; from the snapshot once approved). */
  approvalSummary?: ApprovalSummary | null;
  /** An approved report's frozen inputs (detail only). */
  snapshot?: Omit<ReportSnapshot, "content"> | null;
  links: { pdf: string; self: string };
}

/** What a new report has not yet: no reviewer, submission, approval, hash or stored PDF. */
export const DRAFT_REPORT = { reviewerId: null, submittedAt: null, approvedAt: null, contentHash: null, pdf: null, pdfBytes: null } as const;

export function toReportView(r: Report): ReportView {
  return {
    id: r.id,
    scenarioId: r.scenarioId,
    liftRevisionId: r.liftRevisionId,
    runId: r.runId,
    studyId: r.studyId,
    title: r.title,
    units: r.units,
    status: r.status,
    authorId: r.authorId,
    reviewerId: r.reviewerId,
    submittedAt: r.submittedAt?.toISOString() ?? null,
    approvedAt: r.approvedAt?.toISOString() ?? null,
    contentHash: r.contentHash,
    version: r.version,
    createdAt: r.createdAt.toISOString(),
    links: { pdf: `/api/reports/${r.id}/pdf`, self: `/reports/${r.id}` },
  };
}

export async function findOwnReport(actor: Actor, id: number, withPdf = false): Promise<Report> {
  const { Report } = getModels();
  return ownOr404(await (withPdf ? Report.scope("withPdf") : Report).findByPk(id), actor, "Report");
}

export async function createReport(actor: Actor, raw: unknown): Promise<ReportView> {
  assertCan(actor, "report:write");
  const parsed = createReportSchema.safeParse(raw);
  if (!parsed.success) throw fromZod(parsed.error, "The report has invalid fields.");
  const body = parsed.data;
  const { Scenario, Run, Study, Report, User } = getModels();
  const scenario = ownOr404(await Scenario.findByPk(body.scenarioId), actor, "Scenario");
  const run = await Run.findByPk(body.runId);
  if (!run || run.organisationId !== actor.organisationId || run.scenarioId !== scenario.id) {
    throw badRequest("The run must be a run of this scenario.", [{ path: "runId", message: "not a run of this scenario" }]);
  }
  if (run.status !== "done") throw badRequest("The run has not finished.", [{ path: "runId", message: `the run is ${run.status}` }]);
  if (body.studyId) {
    const st = await Study.findByPk(body.studyId);
    if (!st || st.organisationId !== actor.organisationId || st.scenarioId !== scenario.id) {
      throw badRequest("The study must be a study of this scenario.", [{ path: "studyId", message: "not a study of this scenario" }]);
    }
  }
  const author = await User.findByPk(actor.id);
  const report = await Report.sequelize!.transaction(async (transaction) => {
    const r = await Report.create(
      {
        organisationId: actor.organisationId,
        scenarioId: scenario.id,
        liftRevisionId: run.liftRevisionId,
        runId: run.id,
        studyId: body.studyId ?? null,
        title: body.title ?? `Design check: ${scenario.name}`,
        units: body.units ?? author?.units ?? "si",
        authorId: actor.id,
        ...DRAFT_REPORT,
      },
      { transaction },
    );
    await recordAudit({ transaction, actor, entity: "report", entityId: r.id, action: "create", before: null, after: toReportView(r) });
    return r;
  });
  return toReportView(report);
}

export const reportListQuery = listQuerySchema({
  sortFields: ["id", "submittedAt", "title"],
  defaultSort: "id",
  defaultOrder: "desc",
  filters: {
    scenarioId: queryId("scenarioId").optional(),
    liftId: queryId("liftId").optional(),
    authorId: queryId("authorId").optional(),
    status: z.enum(REPORT_STATUSES, { error: `status must be one of ${REPORT_STATUSES.join(", ")}` }).optional(),
  },
});
export type ReportListQuery = z.input<typeof reportListQuery>;

/** Reports of the organisation, newest first; filters make the reviewer queue (status=submitted, by lift, author, title). */
export async function listReports(actor: Actor, query: ReportListQuery = {}) {
  assertCan(actor, "report:read");
  const q = validate(reportListQuery, query);
  const { Report, Scenario, User } = getModels();
  let scenarioIds: number[] | undefined;
  if (q.liftId) {
    scenarioIds = (await Scenario.findAll({ where: { organisationId: actor.organisationId, liftId: q.liftId }, attributes: ["id"] })).map((x) => x.id);
  }
  const where: WhereOptions = {
    organisationId: actor.organisationId,
    ...(q.scenarioId ? { scenarioId: q.scenarioId } : {}),
    ...(scenarioIds ? { scenarioId: scenarioIds } : {}),
    ...(q.authorId ? { authorId: q.authorId } : {}),
    ...(q.status ? { status: q.status } : {}),
    ...(q.q ? { title: { [Op.like]: likePattern(q.q) } } : {}),
  };
  const { rows, count } = await Report.findAndCountAll({
    where,
    ...pageOptions(q),
  });
  const scenarios = new Map(
    (await Scenario.findAll({ where: { id: [...new Set(rows.map((r) => r.scenarioId))] }, attributes: ["id", "name"] })).map((x) => [x.id, x.name]),
  );
  const users = new Map((await User.findAll({ where: { organisationId: actor.organisationId }, attributes: ["id", "name"] })).map((u) => [u.id, u.name]));
  return {
    items: rows.map((r) => ({ ...toReportView(r), scenarioName: scenarios.get(r.scenarioId) ?? null, authorName: r.authorId ? users.get(r.authorId) ?? null : null })),
    total: count,
    page: q.page,
    pageSize: q.pageSize,
  };
}

function withoutContent(snap: ReportSnapshot): Omit<ReportSnapshot, "content"> {
  const rest: Partial<ReportSnapshot> = { ...snap };
  delete rest.content;
  return rest as Omit<ReportSnapshot, "content">;
}

export async function getReport(actor: Actor, id: number): Promise<ReportView> {
  assertCan(actor, "report:read");
  const { ReportReview, User, Report, Scenario } = getModels();
  const r = ownOr404(await Report.scope("withSnapshot").findByPk(id), actor, "Report");
  const reviews = await ReportReview.findAll({ where: { reportId: r.id }, order: [["id", "ASC"]] });
  const users = new Map((await User.findAll({ where: { organisationId: actor.organisationId }, attributes: ["id", "name"] })).map((u) => [u.id, u.name]));
  const snap = reportSnapshot(r);
  let summary: ApprovalSummary | null = null;
  try {
    const content = await buildReportContent(r);
    summary = approvalSummary(content, r.status === "approved" && r.contentHash ? r.contentHash : contentHash(content));
  } catch {
    summary = null; // a draft whose run is gone: the page says so through the PDF/submit answers
  }
  const lastReturn = [...reviews].reverse().find((v) => v.action === "return");
  const scenario = await Scenario.findByPk(r.scenarioId, { attributes: ["id", "name"] });
  return {
    ...toReportView(r),
    scenarioName: scenario?.name ?? null,
    authorName: r.authorId ? users.get(r.authorId) ?? null : null,
    returnComment: r.status === "returned" ? lastReturn?.comment ?? null : null,
    approvalSummary: summary,
    snapshot: snap ? withoutContent(snap) : null,
    reviews: reviews.map((v) => ({
      id: v.id,
      action: v.action,
      userId: v.userId,
      userName: v.userId ? users.get(v.userId) ?? null : null,
      comment: v.comment,
      contentHash: v.contentHash,
      at: v.at.toISOString(),
    })),
  };
}

async function userName(id: number | null): Promise<string | null> {
  if (!id) return null;
  const u = await getModels().User.findByPk(id, { attributes: ["id", "name"] });
  return u?.name ?? null;
}

/** The review trail as the PDF prints it, oldest first. */
async function reviewLines(report: Report): Promise<ReportReviewLine[]> {
  const { ReportReview, User } = getModels();
  const reviews = await ReportReview.findAll({ where: { reportId: report.id }, order: [["id", "ASC"]] });
  const ids = [...new Set(reviews.map((v) => v.userId).filter((x): x is number => x !== null))];
  const names = new Map((ids.length ? await User.findAll({ where: { id: ids }, attributes: ["id", "name"] }) : []).map((u) => [u.id, u.name]));
  return reviews.map((v) => ({ action: v.action, userName: v.userId ? names.get(v.userId) ?? null : null, at: v.at.toISOString(), comment: v.comment }));
}

/** Draws the report as it stands now (content hash of the current content); `pending` is a review step being written with it. */
export async function renderReport(report: Report, pending?: ReportReviewLine): Promise<{ pdf: Buffer; hash: string }> {
  const content = await buildReportContent(report);
  const hash = contentHash(content);
  const stamp: ReportStamp = {
    status: report.status,
    reportId: report.id,
    author: await userName(report.authorId),
    reviewer: report.status === "approved" ? await userName(report.reviewerId) : null,
    approvedAt: report.approvedAt?.toISOString() ?? null,
    contentHash: hash,
    reviews: [...(await reviewLines(report)), ...(pending ? [pending] : [])],
  };
  return { pdf: await drawReportPdf(content, stamp), hash };
}

/** The PDF: the stored stamped file of an approved report, else drawn now. */
export async function reportPdf(actor: Actor, id: number): Promise<{ pdf: Buffer; filename: string }> {
  assertCan(actor, "report:read");
  const r = await findOwnReport(actor, id, true);
  const filename = `tautline-design-check-${r.id}${r.status === "approved" ? "-approved" : ""}.pdf`;
  if (r.status === "approved") {
    if (!r.pdf) throw conflict("The approved report's PDF is missing.");
    return { pdf: r.pdf, filename };
  }
  return { pdf: (await renderReport(r)).pdf, filename };
}

/** The approved report that froze a scenario (the latest, if several), for the scenario page's banner. */
export async function approvingReport(actor: Actor, scenarioId: number): Promise<{ id: number; title: string } | null> {
  const { Report } = getModels();
  const r = await Report.findOne({
    where: { organisationId: actor.organisationId, scenarioId, status: "approved" },
    order: [["approvedAt", "DESC"]],
    attributes: ["id", "title"],
  });
  return r ? { id: r.id, title: r.title } : null;
}
