import fs from "node:fs";
import path from "node:path";
import { expect, request as playwrightRequest, test, type APIRequestContext, type APIResponse } from "@playwright/test";
import { DEMO_ACCOUNTS, DEMO_ORGANISATIONS, type DemoAccount } from "@/lib/auth/demo-accounts";
import { can } from "@/lib/auth/permissions";
import {
  API_ROUTES,
  PAGE_ROUTES,
  patternFromFile,
  type Access,
  type Method,
  type RowSource,
} from "@/lib/auth/route-access";
import { apiAs, baseURL } from "./support/auth";
import { query } from "./support/db";
import { exportedMethods } from "../fuzz/routes";

/**
 * Every route handler and page under app/, called anonymously, as every role of the demo park and as
 * users of another organisation, must answer what lib/auth/route-access.ts and the permission table say.
 */

const APP = path.join(process.cwd(), "app");

function discover(fileName: "route.ts" | "page.tsx"): Map<string, string> {
  const found = new Map<string, string>();
  for (const rel of fs.readdirSync(APP, { recursive: true }) as string[]) {
    if (path.basename(rel) === fileName) found.set(patternFromFile(rel), path.join(APP, rel));
  }
  return found;
}

const routeFiles = discover("route.ts");
const pageFiles = discover("page.tsx");

test.describe("route-access table", () => {
  test("has an entry for every route handler and page, and no entry without a file", () => {
    expect([...routeFiles.keys()].filter((p) => !API_ROUTES[p]), "route handlers missing from API_ROUTES").toEqual([]);
    expect([...pageFiles.keys()].filter((p) => !PAGE_ROUTES[p]), "pages missing from PAGE_ROUTES").toEqual([]);
    expect(Object.keys(API_ROUTES).filter((p) => !routeFiles.has(p)), "API_ROUTES entries without a file").toEqual([]);
    expect(Object.keys(PAGE_ROUTES).filter((p) => !pageFiles.has(p)), "PAGE_ROUTES entries without a file").toEqual([]);
  });

  test("sends visitors without a session to sign-in from every workspace folder (proxy.ts matcher)", () => {
    const matcher = fs.readFileSync(path.join(process.cwd(), "proxy.ts"), "utf8");
    const folders = fs
      .readdirSync(path.join(APP, "(workspace)"), { withFileTypes: true })
      .filter((d) => d.isDirectory())
      .map((d) => d.name);
    expect(folders.filter((f) => !matcher.includes(`"/${f}/:path*"`)), "folders missing from proxy.ts matcher").toEqual([]);
  });

  test("lists exactly the methods each route handler exports", () => {
    for (const [pattern, file] of routeFiles) {
      const listed = Object.keys(API_ROUTES[pattern]?.methods ?? {}).sort();
      expect(exportedMethods(file).sort(), pattern).toEqual(listed);
    }
  });
});

// ── callers ──────────────────────────────────────────────────────────────────────────────────────
interface Caller {
  label: string;
  account: DemoAccount | null;
  ctx: APIRequestContext;
}

const park = DEMO_ORGANISATIONS.park.slug;
let callers: Caller[] = [];
let parkOrgId = 0;
const rowIds = new Map<string, number>();

test.beforeAll(async () => {
  test.setTimeout(120_000);
  const anon = await playwrightRequest.newContext({ baseURL });
  callers = [{ label: "anonymous", account: null, ctx: anon }];
  for (const a of DEMO_ACCOUNTS) {
    callers.push({ label: `${a.role}@${a.organisation}`, account: a, ctx: await apiAs(a.email) });
  }
  const [org] = await query<{ id: number }>("SELECT id FROM organisations WHERE slug = ?", [park]);
  parkOrgId = Number(org.id);
});

test.afterAll(async () => {
  for (const c of callers) await c.ctx.dispose();
});

async function rowId(source: RowSource): Promise<number> {
  const sql =
    typeof source === "string" ? `SELECT id FROM \`${source}\` WHERE organisation_id = ? ORDER BY id LIMIT 1` : source.sql;
  const key = sql;
  if (!rowIds.has(key)) {
    const rows = await query<{ id: number }>(sql, [parkOrgId]);
    if (!rows.length) throw new Error(`No row of the demo park for ${JSON.stringify(source)}: seed one so access can be checked.`);
    rowIds.set(key, Number(rows[0].id));
  }
  return rowIds.get(key)!;
}

/** Fills the dynamic segments of `pattern` with rows of the demo park. */
async function concrete(pattern: string, rows: Record<string, RowSource> | undefined): Promise<string> {
  let url = pattern;
  for (const m of pattern.matchAll(/\[([^\]]+)\]/g)) {
    const source = rows?.[m[1]];
    if (!source) throw new Error(`${pattern}: say in route-access.ts which rows fill [${m[1]}] (rows: { ${m[1]}: "table" }).`);
    url = url.replace(m[0], String(await rowId(source)));
  }
  return url;
}

type Expected = "allowed" | 401 | 403 | 404;

function expected(access: Access, caller: Caller, otherOrgRow: boolean): Expected {
  if (access === "public") return "allowed";
  if (!caller.account) return 401;
  if (typeof access === "object" && !can(caller.account.role, access.action)) return 403;
  return otherOrgRow ? 404 : "allowed";
}

function describeAnswer(res: APIResponse): string {
  return `${res.status()}${res.headers().location ? ` → ${res.headers().location}` : ""}`;
}

// ── route handlers ───────────────────────────────────────────────────────────────────────────────
test.describe("route handlers", () => {
  for (const [pattern, entry] of Object.entries(API_ROUTES)) {
    if (entry.skipProbe) continue;
    test(`${pattern}`, async () => {
      const url = await concrete(pattern, entry.rows);
      const hasRow = !!entry.rows && Object.keys(entry.rows).length > 0;
      for (const [method, access] of Object.entries(entry.methods) as [Method, Access][]) {
        for (const caller of callers) {
          const otherOrg = hasRow && !!caller.account && caller.account.organisation !== park;
          const want = expected(access, caller, otherOrg);
          if (want === "allowed" && entry.refusalsOnly?.includes(method)) continue;
          const withBody = method === "POST" || method === "PUT" || method === "PATCH";
          const res = await caller.ctx.fetch(url, {
            method,
            maxRedirects: 0,
            ...(withBody ? { data: entry.probeBody ?? {} } : {}),
          });
          const what = `${method} ${url} as ${caller.label}: got ${describeAnswer(res)}`;
          if (want === "allowed") {
            expect([401, 403, 404], `${what}, expected to be let through`).not.toContain(res.status());
            expect(res.status(), `${what}, expected no server error`).toBeLessThan(500);
          } else {
            expect(res.status(), `${what}, expected ${want}`).toBe(want);
          }
        }
      }
    });
  }
});

// ── pages ────────────────────────────────────────────────────────────────────────────────────────
test.describe("pages", () => {
  for (const [pattern, entry] of Object.entries(PAGE_ROUTES)) {
    test(`${pattern}`, async () => {
      const url = await concrete(pattern, entry.rows);
      const hasRow = !!entry.rows && Object.keys(entry.rows).length > 0;
      for (const caller of callers) {
        const otherOrg = hasRow && !!caller.account && caller.account.organisation !== park;
        const want = expected(entry.access, caller, otherOrg);
        const res = await caller.ctx.get(url, { maxRedirects: 0 });
        const what = `GET ${url} as ${caller.label}: got ${describeAnswer(res)}`;
        const location = res.headers().location ?? "";
        if (want === "allowed") {
          expect(res.status(), `${what}, expected the page`).toBeLessThan(400);
          expect(location, `${what}, expected no trip to sign-in`).not.toContain("/sign-in");
        } else if (want === 401) {
          // Pages answer a missing session with a redirect to the sign-in page.
          expect([302, 303, 307], `${what}, expected a redirect to sign-in`).toContain(res.status());
          expect(location, what).toContain("/sign-in");
        } else {
          // A page the role may not open answers like a page that does not exist.
          expect(res.status(), `${what}, expected 404`).toBe(404);
        }
      }
    });
  }
});
