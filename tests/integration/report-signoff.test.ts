import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { cancelRun, deleteRun, getRun } from "@/lib/runs/service";
import { getScenario, updateScenario } from "@/lib/scenarios/service";
import { createReport, getReport, reportPdf } from "@/lib/reports/service";
import { fmtN, fmtQ } from "@/lib/reports/format";
import { approveReport, OWN_REPORT_MESSAGE, returnReport, submitReport } from "@/lib/review/service";
import { FROZEN_RUN_MESSAGE } from "@/lib/review/freeze";
import { expectHttpError, makeOrganisation } from "./design-fixtures";
import { finishedRunOf, mailTo, pdfText, startSignoff, stopSignoff, summaryHash as shownHash, type SignoffEnv } from "./signoff-fixtures";
import type { Actor } from "@/lib/http/actor";

let env: SignoffEnv;
let org: SignoffEnv["org"];
let engineer: Actor;
let reviewer: Actor;

const summaryHash = (reportId: number) => shownHash(reviewer, reportId);

beforeAll(async () => {
  env = await startSignoff("report");
  ({ org, engineer, reviewer } = env);
});

afterAll(() => stopSignoff(env));

describe("the design-check PDF", () => {
  it("contains the figures of the run it reports, in the chosen units, with page numbers and cautions", async () => {
    const { scenarioId, run } = await finishedRunOf(engineer, "Report: figures");
    const s = run.summary as Record<string, number>;
    for (const units of ["si", "us"] as const) {
      const report = await createReport(engineer, { scenarioId, runId: run.id, units });
      const { pdf } = await reportPdf(engineer, report.id);
      expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
      const text = await pdfText(pdf);
      // Plumbing, not physics: the PDF prints the figures stored with the run it reports (no outside source;
      // the engine's figures are checked against references in tests/sim), formatted as the report prints them.
      expect(text).toContain(fmtQ(s.peakTension, "force", units));
      expect(text).toContain(fmtN(s.snatchFactor));
      expect(text).toContain(fmtN(s.minSafetyFactor));
      expect(text).toContain(fmtQ(s.peakDrivePower, "power", units, 1));
      expect(text).toContain(units === "si" ? "kN" : "kip");
      expect(text).toMatch(/Page 1 of \d+/);
      expect(text).toContain("never replace, review by a qualified engineer");
      expect(text).toContain("manufacturer data and licensed practice govern");
      for (const heading of ["Inputs", "Assumptions and their sources", "Statics", "Dynamic results", "Checks", "Revision history"]) {
        expect(text).toContain(heading);
      }
      expect(text).toContain("Take-up travel budget");
      expect(text).toContain("Chordal speed variation");
      expect(text).toContain(`no. ${run.id}`);
    }
  });

  it("refuses a run of another scenario and roles that may not write reports", async () => {
    const a = await finishedRunOf(engineer, "Report: run A");
    const b = await finishedRunOf(engineer, "Report: run B");
    const err = await expectHttpError(() => createReport(engineer, { scenarioId: a.scenarioId, runId: b.run.id }), 400);
    expect(err.issues[0].path).toBe("runId");
    await expectHttpError(() => createReport(org.as.viewer, { scenarioId: a.scenarioId, runId: a.run.id }), 403);
    const other = await makeOrganisation("report-other");
    await expectHttpError(() => createReport(other.as.engineer, { scenarioId: a.scenarioId, runId: a.run.id }), 404);
  });
});

describe("sign-off", () => {
  it("is returned with comments, resubmitted, approved by a reviewer; the scenario and its runs freeze", async () => {
    const { scenarioId, run } = await finishedRunOf(engineer, "Report: sign-off");
    const report = await createReport(engineer, { scenarioId, runId: run.id, title: "Sign-off of the test lift" });
    // Only a submitted report is reviewed; only the author submits.
    await expectHttpError(() => approveReport(reviewer, report.id, { confirmedHash: "0".repeat(64) }), 409);
    await expectHttpError(() => submitReport(org.as.admin, report.id), 403);
    await expectHttpError(() => submitReport(reviewer, report.id), 403);
    expect((await submitReport(engineer, report.id)).status).toBe("submitted");
    // An engineer may not review at all.
    await expectHttpError(() => approveReport(engineer, report.id, { confirmedHash: "0".repeat(64) }), 403);

    const back = await returnReport(reviewer, report.id, { comment: "State the take-up travel assumption." });
    expect(back.status).toBe("returned");
    const noComment = await expectHttpError(() => returnReport(reviewer, report.id, { comment: "" }), 400);
    expect(noComment.issues[0].path).toBe("comment");
    await expectHttpError(() => returnReport(reviewer, report.id, { comment: "Again" }), 409); // already returned
    expect((await submitReport(engineer, report.id)).status).toBe("submitted");
    const approved = await approveReport(reviewer, report.id, { comment: "Checked.", confirmedHash: await summaryHash(report.id) });
    expect(approved.status).toBe("approved");
    expect(approved.reviewerId).toBe(reviewer.id);
    expect(approved.approvedAt).not.toBeNull();
    expect(approved.contentHash).toMatch(/^[0-9a-f]{64}$/);
    // A returned report keeps its comments.
    expect(approved.reviews!.map((r) => r.action)).toEqual(["submit", "return", "submit", "approve"]);
    expect(approved.reviews![1].comment).toBe("State the take-up travel assumption.");

    // The stored PDF carries the stamp.
    const { pdf } = await reportPdf(reviewer, report.id);
    const text = await pdfText(pdf);
    expect(text).toContain("APPROVED");
    expect(text).toContain(approved.contentHash!);
    expect(text).toContain(`reviewer report`); // the reviewer's name from makeOrganisation

    // Frozen: the scenario refuses edits, its runs refuse deletion and cancellation.
    const scenario = await getScenario(engineer, scenarioId);
    expect(scenario.frozenAt).not.toBeNull();
    const e1 = await expectHttpError(() => updateScenario(engineer, scenarioId, { version: scenario.version, name: "Renamed" }), 409);
    expect(e1.message).toMatch(/frozen/);
    const fresh = await getRun(engineer, run.id);
    const e2 = await expectHttpError(() => deleteRun(engineer, run.id, String(fresh.version)), 409);
    expect(e2.message).toBe(FROZEN_RUN_MESSAGE);
    await expectHttpError(() => cancelRun(engineer, run.id), 409);

    // The author is told, with the hash.
    const [msg] = await mailTo(env.mail, (m) => m.subject.includes("approved") && m.subject.includes("Sign-off of the test lift"));
    expect(msg, "approval e-mail").toBeTruthy();
    expect(msg!.to.join(",")).toContain("engineer.report.");
    expect(msg!.text).toContain(approved.contentHash!);

    // Every step is in the audit trail.
    const audit = await getModels().AuditEntry.findAll({ where: { organisationId: org.organisationId, entity: "report", entityId: String(report.id) } });
    expect(audit.length).toBe(5); // create, submit, return, submit, approve
    const freeze = await getModels().AuditEntry.findOne({ where: { organisationId: org.organisationId, entity: "scenario", entityId: String(scenarioId), action: "update" } });
    expect((freeze!.after as { reportId: number }).reportId).toBe(report.id);
  });

  it("never lets the author approve their own report", async () => {
    const admin = org.as.admin;
    const { scenarioId, run } = await finishedRunOf(admin, "Report: own approval");
    const report = await createReport(admin, { scenarioId, runId: run.id });
    await submitReport(admin, report.id);
    const hash = await summaryHash(report.id);
    const err = await expectHttpError(() => approveReport(admin, report.id, { confirmedHash: hash }), 403);
    expect(err.message).toBe(OWN_REPORT_MESSAGE);
    await expectHttpError(() => returnReport(admin, report.id, { comment: "Own" }), 403);
    expect((await getReport(admin, report.id)).status).toBe("submitted");
    expect((await approveReport(reviewer, report.id, { confirmedHash: await summaryHash(report.id) })).status).toBe("approved");
  });
});
