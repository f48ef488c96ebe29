import { expect, test, type APIRequestContext } from "@playwright/test";
import { PDFParse } from "pdf-parse";
import { apiAs } from "./support/auth";
import { waitForMail } from "./support/mail";
import { finishedRun } from "./support/runs";

/**
 * Sign-off over HTTP against next start: a design-check PDF of a fresh scenario's run, submitted by the
 * engineer, refused to the author and approved by the reviewer; the frozen scenario and run then refuse
 * changes with 409 and a clear message, and the author gets the e-mail.
 */
let engineer: APIRequestContext;
let reviewer: APIRequestContext;
let admin: APIRequestContext;

test.beforeAll(async () => {
  engineer = await apiAs("engineer@lanternfell.example");
  reviewer = await apiAs("reviewer@lanternfell.example");
  admin = await apiAs("admin@lanternfell.example");
});
test.afterAll(async () => {
  for (const c of [engineer, reviewer, admin]) await c?.dispose();
});

test("engineer submits, the author may not approve, the reviewer approves and the scenario freezes", async () => {
  const { scenarioId, runId, run } = await finishedRun(engineer, `Sign-off over HTTP ${Date.now()}`);
  const created = await engineer.post("/api/reports", { data: { scenarioId, runId, title: `HTTP sign-off ${Date.now()}` } });
  expect(created.status()).toBe(201);
  const report = (await created.json()).report;

  const pdf = await engineer.get(`/api/reports/${report.id}/pdf`);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  const parser = new PDFParse({ data: new Uint8Array(await pdf.body()) });
  const text = (await parser.getText()).text.replace(/\s+/g, " ");
  await parser.destroy();
  // Plumbing, not physics: the PDF prints the run's summary as the API returned it, in kN with 2 decimals.
  expect(text).toContain(`${(run.summary.peakTension / 1000).toFixed(2)} kN`);

  expect((await engineer.post(`/api/reports/${report.id}/submit`)).status()).toBe(200);
  const own = await engineer.post(`/api/reports/${report.id}/approve`, { data: {} });
  expect(own.status()).toBe(403);
  // Approval names the content the reviewer read: the approval summary's content hash.
  const confirmedHash = (await (await reviewer.get(`/api/reports/${report.id}`)).json()).report.approvalSummary.contentHash;
  const approved = await reviewer.post(`/api/reports/${report.id}/approve`, { data: { comment: "Checked over HTTP.", confirmedHash } });
  expect(approved.status()).toBe(200);
  const body = (await approved.json()).report;
  expect(body.status).toBe("approved");
  expect(body.contentHash).toMatch(/^[0-9a-f]{64}$/);

  const scenario = await (await engineer.get(`/api/scenarios/${scenarioId}`)).json(); // the scenario itself
  const edit = await engineer.patch(`/api/scenarios/${scenarioId}`, { data: { version: scenario.version, name: "Renamed after approval" } });
  expect(edit.status()).toBe(409);
  expect((await edit.json()).error).toMatch(/frozen/i);
  const fresh = await (await engineer.get(`/api/runs/${runId}`)).json();
  const del = await engineer.delete(`/api/runs/${runId}?version=${fresh.version}`);
  expect(del.status()).toBe(409);
  expect((await del.json()).error).toMatch(/frozen/);

  const mail = await waitForMail("engineer@lanternfell.example", "was approved");
  expect(mail.text).toContain(body.contentHash);
});

test("a reviewer returns a report with a comment; the comment stays", async () => {
  const { scenarioId, runId } = await finishedRun(admin, `Return over HTTP ${Date.now()}`);
  const report = (await (await admin.post("/api/reports", { data: { scenarioId, runId } })).json()).report;
  expect((await admin.post(`/api/reports/${report.id}/submit`)).status()).toBe(200);
  const confirmedHash = (await (await admin.get(`/api/reports/${report.id}`)).json()).report.approvalSummary.contentHash;
  expect((await admin.post(`/api/reports/${report.id}/approve`, { data: { confirmedHash } })).status()).toBe(403); // admin wrote it
  const noComment = await reviewer.post(`/api/reports/${report.id}/return`, { data: {} });
  expect(noComment.status()).toBe(400);
  const back = await reviewer.post(`/api/reports/${report.id}/return`, { data: { comment: "Add the motor rating." } });
  expect(back.status()).toBe(200);
  const got = (await (await admin.get(`/api/reports/${report.id}`)).json()).report;
  expect(got.status).toBe("returned");
  expect(got.reviews.map((r: { action: string }) => r.action)).toEqual(["submit", "return"]);
  expect(got.reviews[1].comment).toBe("Add the motor rating.");
});
