import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { deleteRun, getRun, listRuns, startRun } from "@/lib/runs/service";
import { exportScenario, getScenario } from "@/lib/scenarios/service";
import { getTrain, updateTrain } from "@/lib/trains/service";
import { createLift, deleteLift, updateLift } from "@/lib/lifts/service";
import { createReport, getReport, listReports, reportPdf } from "@/lib/reports/service";
import { approveReport, MISSING_RETURN_COMMENT, returnReport, SUMMARY_CHANGED, submitReport } from "@/lib/review/service";
import { createComment } from "@/lib/comments/service";
import { createStudy } from "@/lib/studies/service";
import { listAudit } from "@/lib/audit/list";
import { expectHttpError, liftBody } from "./design-fixtures";
import { finished } from "./runs-fixtures";
import { approveAsShown, finishedRunOf, mailTo as mailIn, pdfText, startSignoff, stopSignoff, type Mail, type SignoffEnv } from "./signoff-fixtures";
import { finishedStudy, waitForStudy } from "./study-fixtures";
import type { Actor } from "@/lib/http/actor";

let env: SignoffEnv;
let org: SignoffEnv["org"];
let engineer: Actor;
let reviewer: Actor;

const mailTo = (pred: (m: Mail) => boolean) => mailIn(env.mail, pred);
const approve = (id: number) => approveAsShown(reviewer, id);

beforeAll(async () => {
  env = await startSignoff("holds");
  ({ org, engineer, reviewer } = env);
  process.env.APP_URL = "http://tautline.test";
});

afterAll(() => stopSignoff(env));

describe("an approved report holds", () => {
  it("editing the train of an approved scenario leaves the report, the scenario export and the PDF unchanged", async () => {
    const { scenarioId, trainId, liftId, run } = await finishedRunOf(engineer, "Holds: train edit");
    const report = await createReport(engineer, { scenarioId, runId: run.id, title: "Holds: train edit" });
    await submitReport(engineer, report.id);
    const approved = await approve(report.id);
    const pdfBefore = (await reportPdf(engineer, report.id)).pdf;
    const exportBefore = JSON.stringify((await exportScenario(engineer, scenarioId)).scenario);
    const summaryBefore = approved.approvalSummary;
    // The snapshot names every input: the engine scenario, the lift revision, the train, the limits, the formats.
    expect(approved.snapshot!.inputs).toEqual(run.inputs);
    expect((approved.snapshot!.train as { id: number }).id).toBe(trainId);
    expect(approved.snapshot!.liftRevision).not.toBeNull();
    expect(approved.snapshot!.engine.scenarioFormat).toBe("tautline-scenario/2");

    const train = await getTrain(engineer, trainId);
    await updateTrain(engineer, trainId, { version: train.version, cars: 2, carMassEmpty: 4300 });
    // The edit applies to the train for everything else…
    expect((await getTrain(engineer, trainId)).cars).toBe(2);
    // …but the approved scenario keeps what was approved.
    const frozen = await getScenario(engineer, scenarioId);
    expect(frozen.trainId).not.toBe(trainId);
    expect(JSON.stringify((await exportScenario(engineer, scenarioId)).scenario)).toBe(exportBefore);
    expect((await reportPdf(engineer, report.id)).pdf.equals(pdfBefore)).toBe(true);
    const after = await getReport(engineer, report.id);
    expect(after.approvalSummary).toEqual(summaryBefore);
    expect(after.contentHash).toBe(approved.contentHash);
    // A new run of the frozen scenario solves the approved train (6 cars as in the run it reports).
    const again = await startRun(engineer, scenarioId, {});
    await finished(again.id);
    expect(((await getRun(engineer, again.id)).inputs as { trains: { cars: number }[] }).trains[0]!.cars).toBe((run.inputs as { trains: { cars: number }[] }).trains[0]!.cars);

    // A lift edit is a new revision; the approved scenario stays pinned to the one it was approved on.
    const { Lift } = getModels();
    const lift = (await Lift.findByPk(liftId))!;
    await updateLift(engineer, liftId, { version: lift.version, takeUp: { mass: 6000, travel: 2.5, position: 1.2, friction: 0 } });
    expect((await getScenario(engineer, scenarioId)).liftRevisionId).toBe(frozen.liftRevisionId);
    expect((await reportPdf(engineer, report.id)).pdf.equals(pdfBefore)).toBe(true);
  });

  it("approval needs the summary's content hash; a stale one is refused", async () => {
    const { scenarioId, run } = await finishedRunOf(engineer, "Holds: summary");
    const report = await createReport(engineer, { scenarioId, runId: run.id });
    await submitReport(engineer, report.id);
    const missing = await expectHttpError(() => approveReport(reviewer, report.id, {}), 400);
    expect(missing.issues[0].path).toBe("confirmedHash");
    const stale = await expectHttpError(() => approveReport(reviewer, report.id, { confirmedHash: "a".repeat(64) }), 409);
    expect(stale.message).toBe(SUMMARY_CHANGED);
    const summary = (await getReport(reviewer, report.id)).approvalSummary!;
    // The summary lists every check with its state and the open cautions in words.
    expect(summary.checks.length).toBeGreaterThan(0);
    expect(summary.openCautions.length).toBe(summary.checks.filter((c) => c.state !== "pass").length);
    expect(summary.figures.map((f) => f.label)).toContain("Peak tension");
    expect((await getReport(reviewer, report.id)).status).toBe("submitted");
  });
});

describe("review flow", () => {
  it("submission e-mails the reviewers a link to the report; the queue filters; a return without comment is explained; the comment is on the report", async () => {
    const { scenarioId, liftId, run } = await finishedRunOf(engineer, "Holds: review flow");
    const report = await createReport(engineer, { scenarioId, runId: run.id, title: "Queue check of the east lift" });
    await submitReport(engineer, report.id);
    const mails = await mailTo((m) => m.subject.includes("Queue check of the east lift") && m.subject.includes("awaits your review"));
    const toReviewer = mails.find((m) => m.to.join(",").includes("reviewer.holds."));
    expect(toReviewer, "mail to the reviewer").toBeTruthy();
    expect(toReviewer!.text).toContain(`http://tautline.test/reports/${report.id}`);
    expect(mails.some((m) => m.to.join(",").includes("engineer.holds."))).toBe(false); // not the author

    const queue = await listReports(reviewer, { status: "submitted", liftId: String(liftId) });
    expect(queue.items.map((r) => r.id)).toEqual([report.id]);
    expect(queue.items[0].scenarioName).toBe("Holds: review flow");
    expect((await listReports(reviewer, { status: "submitted", q: "no such title" })).items).toEqual([]);

    const noComment = await expectHttpError(() => returnReport(reviewer, report.id, {}), 400);
    expect(noComment.message).toBe(MISSING_RETURN_COMMENT);
    expect(noComment.issues[0]).toEqual({ path: "comment", message: "a return needs a comment: say what must change" });
    await returnReport(reviewer, report.id, { comment: "Add the worn-chain case." });
    const seen = await getReport(engineer, report.id);
    expect(seen.status).toBe("returned");
    expect(seen.returnComment).toBe("Add the worn-chain case.");
    expect((await listReports(reviewer, { status: "submitted", liftId: String(liftId) })).items).toEqual([]);
  });
});

describe("deletes", () => {
  it("a run used by a draft report answers 409 with the reason; the PDF still renders and the report can be submitted", async () => {
    const { scenarioId, run } = await finishedRunOf(engineer, "Holds: run in report");
    const report = await createReport(engineer, { scenarioId, runId: run.id });
    const err = await expectHttpError(() => deleteRun(engineer, run.id, String(run.version)), 409);
    expect(err.message).toContain(`report no. ${report.id}`);
    expect((await reportPdf(engineer, report.id)).pdf.subarray(0, 5).toString()).toBe("%PDF-");
    expect((await submitReport(engineer, report.id)).status).toBe("submitted");
    expect(await getModels().Run.count({ where: { id: run.id } })).toBe(1);
  });

  it("a run in a replay session or with a review comment answers 409; an unused run is deleted", async () => {
    const { scenarioId, run } = await finishedRunOf(engineer, "Holds: run in session");
    const { TrainingSession, TrainingItem, Run } = getModels();
    const session = await TrainingSession.create({ organisationId: org.organisationId, title: "Pick-up basics", description: null, createdBy: null });
    await TrainingItem.create({ sessionId: session.id, runId: run.id, position: 0 } as never);
    const e1 = await expectHttpError(() => deleteRun(engineer, run.id, String(run.version)), 409);
    expect(e1.message).toContain(`replay session no. ${session.id}`);

    const second = await startRun(engineer, scenarioId, {});
    await finished(second.id);
    await createComment(reviewer, scenarioId, { body: "Why this entry speed?", runId: second.id });
    const fresh = await getRun(engineer, second.id);
    const e2 = await expectHttpError(() => deleteRun(engineer, second.id, String(fresh.version)), 409);
    expect(e2.message).toContain("1 review comment");

    const third = await startRun(engineer, scenarioId, {});
    await finished(third.id);
    const t = await getRun(engineer, third.id);
    await deleteRun(engineer, third.id, String(t.version));
    expect(await Run.count({ where: { id: third.id } })).toBe(0);
  });

  it("a lift with logbook entries, or with a photo not yet attached, is archived instead of failing or losing the file", async () => {
    const { LogbookEntry, Upload, Lift } = getModels();
    const withEntry = await createLift(engineer, liftBody({ name: "Holds: logbook lift" }));
    await LogbookEntry.create({
      organisationId: org.organisationId,
      liftId: withEntry.id,
      liftRevisionId: withEntry.currentRevision.id,
      kind: "inspection",
      measuredAt: new Date(),
      data: {},
    } as never);
    expect(await deleteLift(engineer, withEntry.id)).toEqual({ id: withEntry.id, outcome: "archived" });
    expect(await LogbookEntry.count({ where: { liftId: withEntry.id } })).toBe(1);

    const withPhoto = await createLift(engineer, liftBody({ name: "Holds: photo lift" }));
    await Upload.create({
      organisationId: org.organisationId,
      liftId: withPhoto.id,
      kind: "photo",
      storageKey: `test/holds-${withPhoto.id}.png`,
      originalName: "sprocket.png",
      contentType: "image/png",
      bytes: 10,
      sha256: "0".repeat(64),
    } as never);
    expect(await deleteLift(engineer, withPhoto.id)).toEqual({ id: withPhoto.id, outcome: "archived" });
    expect(await Upload.count({ where: { liftId: withPhoto.id } })).toBe(1);

    const unused = await createLift(engineer, liftBody({ name: "Holds: unused lift" }));
    expect(await deleteLift(engineer, unused.id)).toEqual({ id: unused.id, outcome: "deleted" });
    expect(await Lift.count({ where: { id: unused.id } })).toBe(0);
  });
});

describe("study cases stay with their study", () => {
  it("a scenario's own runs exclude its study's cases, which are labelled", async () => {
    const { scenarioId, run } = await finishedRunOf(engineer, "Holds: study cases");
    const study = await createStudy(engineer, { scenarioId, name: "Entry speeds", parameters: [{ key: "entrySpeed", values: [1.5, 3.5] }] });
    const done = await waitForStudy(engineer, study.id, finishedStudy);
    expect(done.status).toBe("done");
    const page = { page: 1, pageSize: 20, sort: "newest" as const };
    const own = await listRuns(engineer, scenarioId, { ...page, source: "own" });
    expect(own.items.map((r) => r.id)).toEqual([run.id]);
    const cases = await listRuns(engineer, scenarioId, { ...page, source: "study" });
    expect(cases.items).toHaveLength(2);
    expect(cases.items.every((r) => r.studyCase?.studyId === study.id && r.studyCase.studyName === "Entry speeds")).toBe(true);
    const all = await listRuns(engineer, scenarioId, page);
    expect(all.items.find((r) => r.id === run.id)!.studyCase).toBeNull();
  });
});

describe("the audit trail", () => {
  it("filters by lift (the lift, its scenarios, runs and reports), by person and by date, with each update as a diff", async () => {
    const a = await finishedRunOf(engineer, "Holds: audit A");
    const b = await finishedRunOf(engineer, "Holds: audit B");
    const report = await createReport(engineer, { scenarioId: a.scenarioId, runId: a.run.id });
    await submitReport(engineer, report.id);
    const byLift = await listAudit(reviewer, { liftId: String(a.liftId), pageSize: "100" });
    const keys = byLift.items.map((e) => `${e.entity}:${e.entityId}`);
    expect(keys).toContain(`scenario:${a.scenarioId}`);
    expect(keys).toContain(`run:${a.run.id}`);
    expect(keys).toContain(`report:${report.id}`);
    expect(keys).not.toContain(`scenario:${b.scenarioId}`);
    expect(keys).not.toContain(`run:${b.run.id}`);
    const submit = byLift.items.find((e) => e.entity === "report" && e.action === "update")!;
    expect(submit.changes).toContainEqual({ path: "status", before: "draft", after: "submitted" });
    // By person: the reviewer did nothing here yet.
    expect((await listAudit(reviewer, { liftId: String(a.liftId), userId: String(reviewer.id) })).items).toEqual([]);
    // By date: nothing before yesterday (the organisation was made in this test run).
    const yesterday = new Date(Date.now() - 86_400_000).toISOString();
    expect((await listAudit(reviewer, { liftId: String(a.liftId), to: yesterday })).items).toEqual([]);
    expect((await listAudit(reviewer, { liftId: String(a.liftId), from: yesterday })).total).toBe(byLift.total);
  });
});

describe("the PDF's glyphs, units and case inputs", () => {
  it("prints ≥ ≈ · ² √ as themselves, assumptions in words with US units, the case's own inputs, riders only when there are riders", async () => {
    const { scenarioId, run } = await finishedRunOf(engineer, "Holds: a design check with a title long enough to need a second line in the title block of the page");
    // A what-if case: entry speed 1.8 m/s instead of the scenario's own.
    const whatIf = await startRun(engineer, scenarioId, { overrides: { entrySpeed: 1.8 } });
    await finished(whatIf.id);
    const title = "Design check of the long-titled lift with a title long enough to wrap onto a second line in the title block";
    const report = await createReport(engineer, { scenarioId, runId: whatIf.id, units: "us", title });
    const text = await pdfText((await reportPdf(engineer, report.id)).pdf);
    // Source: the glyphs the report's own text uses (LIMIT_SOURCES quotes "≥ 5" and "≈1.5 %"; E·A; m/s²; √).
    for (const glyph of ["≥", "≈", "·", "²", "√"]) expect(text, glyph).toContain(glyph);
    expect(text).not.toMatch(/"e|"H/); // how the standard fonts misprinted ≥ and ≈
    expect(text).toContain(title); // whole, not cut
    expect(text).not.toContain("…");
    // Assumptions in words, no code identifiers, units in the reader's system.
    expect(text).toContain("Required safety factor on breaking strength: 5");
    expect(text).not.toMatch(/requiredSafetyFactor|motorRating|maxRiderAccel/);
    expect(text).toContain("72 °F"); // Source: 40 K temperature swing × 1.8 °F/K = 72 °F.
    expect(text).not.toMatch(/\d kg\b/);
    expect(text).toContain("lb");
    expect(text).toContain("kip");
    // The case's own inputs: 1.8 m/s = 5.91 ft/s (Source: 1 ft = 0.3048 m exactly, NIST SP 811).
    expect(text).toContain("Entry speed 5.91 ft/s");
    expect(text).toContain("What-if run");
    // The imported scenario is an empty train: no rider assumptions.
    expect(text).not.toMatch(/riders|Mass of one rider|seats per car/i);
    expect(text).toContain("Review history");
    expect(run.id).toBeGreaterThan(0);
  });
});
