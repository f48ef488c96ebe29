import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { apiAs, signInUi } from "./support/auth";
import { linkIn, waitForMail } from "./support/mail";
import { finishedRun } from "./support/runs";

/**
 * The review flow in Chromium: the engineer creates a design-check report from the scenario page and
 * submits it; the reviewer is e-mailed a link to it, finds it in the queue, tries to return it without a
 * comment (told what is missing), returns it with one; the engineer reads the comment on the report and
 * resubmits; the reviewer reads the approval summary, confirms it and approves; the scenario shows it is
 * frozen, with a way to copy it.
 */
let engineerApi: APIRequestContext;

test.beforeAll(async () => {
  engineerApi = await apiAs("engineer@lanternfell.example");
});
test.afterAll(async () => {
  await engineerApi?.dispose();
});

/** Clicks a review button and waits for the server's answer to its POST (submit, return, approve). */
async function post(page: Page, testId: string, action: string): Promise<number> {
  const answered = page.waitForResponse((r) => r.request().method() === "POST" && new URL(r.url()).pathname.endsWith(`/${action}`), { timeout: 60_000 });
  await page.getByTestId(testId).click();
  return (await answered).status();
}

test("engineer creates and submits a report; reviewer returns it from the queue with a comment; engineer resubmits; reviewer approves after the summary", async ({ browser }) => {
  test.setTimeout(240_000);
  const name = `Review flow ${Date.now()}`;
  const { scenarioId } = await finishedRun(engineerApi, name);

  const engineerCtx = await browser.newContext();
  const reviewerCtx = await browser.newContext();
  const eng = await engineerCtx.newPage();
  const rev = await reviewerCtx.newPage();
  try {
    // Engineer: create the report from the scenario page, open it, submit it.
    await signInUi(eng, "engineer@lanternfell.example");
    await eng.goto(`/scenarios/${scenarioId}`);
    const created = eng.waitForResponse((r) => new URL(r.url()).pathname === "/api/reports" && r.request().method() === "POST");
    await eng.getByTestId("report-create").click();
    expect((await created).status()).toBe(201);
    const link = eng.getByTestId("report-link").filter({ hasText: name });
    await expect(link).toBeVisible({ timeout: 20_000 });
    await link.click();
    await eng.waitForURL(/\/reports\/\d+$/);
    const reportId = Number(/\/reports\/(\d+)$/.exec(eng.url())![1]);
    await expect(eng.getByTestId("report-detail")).toHaveAttribute("data-status", "draft", { timeout: 20_000 });
    expect(await post(eng, "report-submit", "submit")).toBe(200);
    await expect(eng.getByTestId("report-detail")).toHaveAttribute("data-status", "submitted", { timeout: 20_000 });

    // Reviewer: the e-mail links straight to the report.
    const mail = await waitForMail("reviewer@lanternfell.example", name);
    expect(mail.subject).toContain("awaits your review");
    expect(new URL(linkIn(mail)).pathname).toBe(`/reports/${reportId}`);

    // Reviewer: finds it in the queue (awaiting review is the default filter).
    await signInUi(rev, "reviewer@lanternfell.example");
    await rev.goto("/reports");
    await expect(rev.getByTestId("queue-status")).toHaveValue("submitted");
    await rev.getByTestId("queue-search").fill(name);
    const row = rev.getByTestId("queue-row").filter({ hasText: name });
    await expect(row).toHaveCount(1);
    await row.getByRole("link").click();
    await rev.waitForURL(`**/reports/${reportId}`);

    // A return needs a comment: the reviewer is told so in words.
    expect(await post(rev, "review-return", "return")).toBe(400);
    await expect(rev.getByTestId("report-action-error")).toContainText("Write what must change before returning the report");
    await rev.getByTestId("review-comment").fill("State the motor rating and rerun at the worn-chain take-up mass.");
    expect(await post(rev, "review-return", "return")).toBe(200);
    await expect(rev.getByTestId("report-detail")).toHaveAttribute("data-status", "returned", { timeout: 20_000 });

    // Engineer: reads the comment in the app, on the report, and resubmits.
    await eng.reload();
    await expect(eng.getByTestId("return-comment")).toContainText("State the motor rating and rerun at the worn-chain take-up mass.", { timeout: 20_000 });
    expect(await post(eng, "report-submit", "submit")).toBe(200);
    await expect(eng.getByTestId("report-detail")).toHaveAttribute("data-status", "submitted", { timeout: 20_000 });

    // Reviewer: reads the approval summary (figures, checks with states, open cautions), confirms, approves.
    await rev.reload();
    const summary = rev.getByTestId("approval-summary");
    await expect(summary).toContainText("Peak tension", { timeout: 20_000 });
    await expect(summary.getByTestId("summary-checks").locator("li").first()).toBeVisible();
    await expect(rev.getByTestId("review-approve")).toBeDisabled();
    await rev.getByTestId("confirm-summary").check();
    expect(await post(rev, "review-approve", "approve")).toBe(200);
    await expect(rev.getByTestId("report-detail")).toHaveAttribute("data-status", "approved", { timeout: 20_000 });
    await expect(rev.getByTestId("review-history")).toContainText("Returned to the author");
    await expect(rev.getByTestId("review-history")).toContainText("Approved");

    // The approved scenario says it is frozen and offers a copy.
    await eng.goto(`/scenarios/${scenarioId}`);
    await expect(eng.getByTestId("frozen-banner")).toContainText("Approved: this scenario is frozen");
    await expect(eng.getByTestId("copy-frozen-scenario")).toBeVisible();
  } finally {
    await engineerCtx.close();
    await reviewerCtx.close();
  }
});
