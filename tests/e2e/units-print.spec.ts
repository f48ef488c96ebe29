import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { apiAs, signInUi } from "./support/auth";

/*
 * Every screen in the reader's unit system: a US-customary reader sees no SI unit symbol after a number
 * (and an SI reader no US one), on every page a trainer can open, and the run view prints without the
 * navigation and with no plot wider than the page.
 * Source: NIST SP 811 (2008) §7 and appendix B for the unit symbols (m, mm, kN, kg, kW; ft, in, lb, lbf,
 * kip, hp); the seconds, degrees, per cent and g are the same in both systems.
 */
const ACCOUNT = "trainer@lanternfell.example";
// A number, then an SI symbol of a quantity the US system shows in another unit.
const SI_AFTER_NUMBER = /\d(?:[.,]\d+)?\s?(?:mm|m|kN|MN|N|kg|kW|kg\/m|m\/s|N·m|kN·m|m²|kN\/m)(?![\p{L}\d/²·])/u;
// A number, then a US symbol ("in" only where it cannot be the English word).
const US_AFTER_NUMBER = /\d(?:[.,]\d+)?\s?(?:ft|lbf?|kip|hp|mph|ft\/s|lb\/ft|lbf·ft|ft²|in(?= |$|\)|,|\.|·)(?! (?:the|a|an|its|which|each|this|that|one|all)\b))(?![\p{L}\d/²·])/mu;

async function setUnits(api: APIRequestContext, units: "si" | "us") {
  const res = await api.patch("/api/me", { data: { units } });
  expect(res.status()).toBe(200);
}

/**
 * The visible lines of the page once its data has arrived (no request in flight), less what users wrote
 * themselves (notes, change summaries: marked data-user-text), which keeps the units its author typed.
 */
async function pageLines(page: Page, path: string): Promise<string[]> {
  await page.goto(path);
  await page.waitForLoadState("networkidle");
  await expect(page.getByTestId("page-title").first()).toBeVisible();
  const { text, user } = await page.evaluate(() => ({
    text: document.querySelector("main")?.innerText ?? "",
    user: [...document.querySelectorAll<HTMLElement>("main [data-user-text]")].map((e) => e.innerText.trim()),
  }));
  return text
    .split("\n")
    .map((l) => l.trim())
    .filter((l) => l && !user.some((u) => u && (l === u || (l.length > 20 && u.includes(l)))));
}

/** The first link on `listPath` whose address matches `pattern` (a detail page), or null. */
async function firstDetail(page: Page, listPath: string, pattern: RegExp): Promise<string | null> {
  await page.goto(listPath);
  await page.waitForLoadState("networkidle");
  const hrefs = await page.locator("main a[href]").evaluateAll((as) => as.map((a) => a.getAttribute("href") ?? ""));
  return hrefs.find((h) => pattern.test(h)) ?? null;
}

async function screens(page: Page): Promise<string[]> {
  const list = ["/dashboard", "/lifts", "/trains", "/scenarios", "/studies", "/logbook", "/replays", "/settings"];
  for (const [listPath, pattern] of [
    ["/lifts", /^\/lifts\/\d+$/],
    ["/trains", /^\/trains\/\d+$/],
    ["/scenarios", /^\/scenarios\/\d+$/],
    ["/studies", /^\/studies\/\d+$/],
    ["/logbook", /^\/logbook\/recordings\/\d+/],
    ["/replays", /^\/replays\/\d+$/],
  ] as const) {
    const href = await firstDetail(page, listPath, pattern);
    if (href) list.push(href);
  }
  return list;
}

/** The settle-back demo scenario, where the "Why the train settled back" account is shown. */
async function settleBackScenario(page: Page): Promise<string> {
  return scenarioBySearch(page, "settles back onto the ARD");
}

/** The one demo scenario whose name contains `text`. */
async function scenarioBySearch(page: Page, text: string): Promise<string> {
  await page.goto("/scenarios");
  await page.getByTestId("scenario-table-search").fill(text);
  await expect(page.getByTestId("scenario-table-row")).toHaveCount(1);
  const href = await page.getByTestId("scenario-table").getByRole("link").first().getAttribute("href");
  expect(href).toMatch(/^\/scenarios\/\d+/);
  return href!;
}

test.describe("units everywhere", () => {
  test.describe.configure({ mode: "serial" });
  let api: APIRequestContext;

  test.beforeAll(async () => {
    api = await apiAs(ACCOUNT);
  });
  test.afterAll(async () => {
    await setUnits(api, "si");
    await api.dispose();
  });

  test("a US-customary reader sees no SI unit on any screen, and an SI reader no US unit", async ({ page }) => {
    test.setTimeout(180_000);
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInUi(page, ACCOUNT);
    // The demos with the stop account and with two trains on the lift, besides the first row of every list.
    const stop = await scenarioBySearch(page, "emergency stop");
    const paths = [...(await screens(page)), await settleBackScenario(page), stop, await scenarioBySearch(page, "two-train dispatch")];
    expect(paths.length).toBeGreaterThanOrEqual(12);

    for (const [units, forbidden] of [
      ["us", SI_AFTER_NUMBER],
      ["si", US_AFTER_NUMBER],
    ] as const) {
      await setUnits(api, units);
      const found: string[] = [];
      for (const path of paths) {
        for (const line of await pageLines(page, path)) if (forbidden.test(line)) found.push(`${path}: ${line.slice(0, 160)}`);
      }
      // The stop account is on the stop demo's page: check it was there to be read.
      await page.goto(stop);
      await expect(page.getByTestId("stop-account-text").first()).toContainText(units === "us" ? "ft/s" : "m/s");
      // The settle-back account is on the settle-back demo's page.
      await page.goto(await settleBackScenario(page));
      await expect(page.getByTestId("settle-back-text")).toContainText(units === "us" ? "ft/s" : "m/s");
      expect(found, `${units === "us" ? "SI" : "US"} units left on ${units.toUpperCase()} screens`).toEqual([]);
    }
  });

  test("a study export speaks the unit system asked for", async ({ page }) => {
    await signInUi(page, ACCOUNT);
    const study = await firstDetail(page, "/studies", /^\/studies\/\d+$/);
    expect(study).not.toBeNull();
    for (const [units, forbidden, expected] of [
      ["us", /\((?:m|mm|kN|kg|kW|m\/s)\)/, "(kip)"],
      ["si", /\((?:ft|in|lb|kip|hp|ft\/s)\)/, "(kN)"],
    ] as const) {
      const res = await api.get(`/api/${study!.slice(1)}/export?format=csv&units=${units}`);
      expect(res.status()).toBe(200);
      const header = (await res.text()).split(/\r?\n/)[0];
      expect(header).toContain(expected);
      expect(header).not.toMatch(forbidden);
    }
  });

  test("the run view prints without navigation and with every plot inside the page", async ({ page }) => {
    test.setTimeout(90_000);
    await setUnits(api, "si");
    await signInUi(page, ACCOUNT);
    const path = await settleBackScenario(page);
    await page.goto(path);
    await expect(page.getByTestId("run-results")).toBeVisible();
    await expect(page.getByTestId("plot-tension")).toBeVisible();

    // A4 less 12 mm margins each side is 186 mm = 703 CSS px at 96 px per inch (CSS 2.1 §4.3.2).
    await page.setViewportSize({ width: 703, height: 1000 });
    await page.emulateMedia({ media: "print" });
    await expect(page.getByTestId("app-sidebar")).toBeHidden();
    for (const nav of await page.locator("nav").all()) await expect(nav).toBeHidden();
    const pageWidth = await page.evaluate(() => document.documentElement.clientWidth);
    const plots = await page.locator("main canvas, main svg, main .uplot").evaluateAll((els) =>
      els
        .map((e) => e.getBoundingClientRect())
        .filter((r) => r.width > 40 && r.height > 20)
        .map((r) => ({ left: r.left, right: r.right })),
    );
    expect(plots.length).toBeGreaterThan(0);
    for (const r of plots) {
      expect(r.left).toBeGreaterThanOrEqual(-1);
      expect(r.right).toBeLessThanOrEqual(pageWidth + 1);
    }
    // And Chromium's own print-to-PDF of the page.
    const pdf = await page.pdf({ format: "A4", printBackground: true });
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    expect(pdf.length).toBeGreaterThan(20_000);
  });
});
