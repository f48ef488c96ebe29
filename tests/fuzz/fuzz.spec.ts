import http from "node:http";
import fs from "node:fs";
import path from "node:path";
import { expect, request as playwrightRequest, test, type APIRequestContext } from "@playwright/test";
import { DEMO_ACCOUNTS, DEMO_ORGANISATIONS } from "@/lib/auth/demo-accounts";
import { API_ROUTES, type RowSource } from "@/lib/auth/route-access";
import { apiAs, baseURL } from "../e2e/support/auth";
import { query } from "../e2e/support/db";
import { BAD_SEGMENTS, casesFor, type FuzzCase } from "./corpus";
import { discoverRoutes, WRITE_METHODS } from "./routes";
import { inputFieldNames } from "./schema-keys";

/**
 * Malformed requests against every write route found under app/ (short form in npm test, the full
 * corpus with `npm run test:fuzz`). Pass: every answer 4xx with a JSON error (a 400 about a field names
 * it), no 5xx, no row written in any table, and the server still answers afterwards.
 * Source for the expectations: README "Reliability and security" (bad input: no 5xx, no row written) and lib/http/request.ts's contract.
 */

const FULL = process.env.FUZZ_FULL === "1";
const SEED = Number(process.env.FUZZ_SEED ?? 20261202);
const RANDOM_PER_ROUTE = FULL ? 120 : 12;
const BAD_SEGMENT_LIMIT = FULL ? BAD_SEGMENTS.length : 4;
const CONCURRENCY = 4;

// One worker runs the tests of this file in order (config): counts first, the check of them last.

const park = DEMO_ORGANISATIONS.park.slug;
const admin = DEMO_ACCOUNTS.find((a) => a.organisation === park && a.role === "admin")!;
let api: APIRequestContext;
let parkOrgId = 0;
let inputKeys = new Set<string>();
// Playwright starts a new worker after a failed test (module state is lost), so the counts taken first
// and the tallies of every route test live in a file that the last test reads.
const STATE = path.join(process.cwd(), "tests", "artifacts", `fuzz-state-${process.env.TEST_APP_PORT ?? "3100"}.json`);
interface State {
  before: Record<string, number>;
  sent: number;
  routes: number;
  byStatus: Record<string, number>;
}
const readState = (): State => JSON.parse(fs.readFileSync(STATE, "utf8")) as State;
const writeState = (s: State) => {
  fs.mkdirSync(path.dirname(STATE), { recursive: true });
  fs.writeFileSync(STATE, JSON.stringify(s));
};
let stats = { sent: 0, byStatus: new Map<number, number>() };
let failures: string[] = [];

async function countRows(): Promise<Map<string, number>> {
  const tables = await query<{ t: string }>(
    "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' ORDER BY table_name",
  );
  const counts = new Map<string, number>();
  for (const { t } of tables) {
    const [row] = await query<{ n: number }>(`SELECT COUNT(*) AS n FROM \`${t}\``);
    counts.set(t, Number(row.n));
  }
  return counts;
}

async function rowId(source: RowSource): Promise<number | null> {
  const sql = typeof source === "string" ? `SELECT id FROM \`${source}\` WHERE organisation_id = ? ORDER BY id LIMIT 1` : source.sql;
  const rows = await query<{ id: number | null }>(sql, [parkOrgId]);
  return rows[0]?.id == null ? null : Number(rows[0].id);
}

/** Fills the dynamic segments with rows of the demo park; `override` puts a given text in one segment. */
async function concrete(pattern: string, rows: Record<string, RowSource> | undefined, override?: [string, string]): Promise<string | null> {
  let url = pattern;
  for (const m of pattern.matchAll(/\[([^\]]+)\]/g)) {
    if (override && override[0] === m[1]) {
      url = url.replace(m[0], override[1]);
      continue;
    }
    const source = rows?.[m[1]];
    const id = source ? await rowId(source) : null;
    if (id == null) return null;
    url = url.replace(m[0], String(id));
  }
  return url;
}

/** A body close to a valid one: the resource as the API reads it back (or the access table's probe body). */
async function baseBody(pattern: string, method: string, url: string, probeBody: unknown): Promise<unknown> {
  if (method === "PATCH" || method === "PUT") {
    const res = await api.get(url);
    if (res.ok() && (res.headers()["content-type"] ?? "").includes("json")) return res.json();
  }
  if (method === "POST" && !/\]$/.test(pattern) && probeBody === undefined) {
    const res = await api.get(url);
    if (res.ok() && (res.headers()["content-type"] ?? "").includes("json")) {
      const data = (await res.json()) as { items?: unknown[] };
      if (Array.isArray(data.items) && data.items[0]) return data.items[0];
    }
  }
  return probeBody ?? {};
}

function names(issues: { path?: string }[] | undefined, field: string): boolean {
  if (!issues?.length) return false;
  const last = field.split(".").filter((k) => !/^\d+$/.test(k)).pop() ?? field;
  return issues.some((i) => {
    const p = String(i.path ?? "");
    return p === field || p.startsWith(`${field}.`) || field.startsWith(`${p}.`) || p.split(".").includes(last);
  });
}

async function send(c: FuzzCase): Promise<void> {
  const what = `${c.method} ${c.url} [${c.kind}]`;
  let status = 0;
  let body: { error?: unknown; issues?: { path?: string }[] } | null = null;
  try {
    const big = c.body !== undefined && Buffer.byteLength(c.body) > 1_000_000;
    const res = c.chunkedBytes
      ? await sendStreamed(c, openBrace(c.chunkedBytes), true)
      : big
        ? await sendStreamed(c, Buffer.from(c.body!), false)
        : await api.fetch(c.url, { method: c.method, headers: c.headers, data: c.body, maxRedirects: 0, timeout: 15_000 });
    status = res.status();
    const text = await res.text();
    try {
      body = JSON.parse(text);
    } catch {
      body = null;
    }
  } catch (err) {
    failures.push(`${what}: no answer (${(err as Error).message.split("\n")[0]})`);
    return;
  }
  stats.sent += 1;
  stats.byStatus.set(status, (stats.byStatus.get(status) ?? 0) + 1);
  if (status >= 500) failures.push(`${what}: ${status} ${JSON.stringify(body)?.slice(0, 200)}`);
  else if (status < 400) failures.push(`${what}: accepted with ${status}`);
  else if (typeof body?.error !== "string") failures.push(`${what}: ${status} without a JSON error message`);
  else if (status === 400 && c.field && !names(body.issues, c.field)) {
    failures.push(`${what}: 400 does not name ${c.field}: ${JSON.stringify(body.issues)?.slice(0, 200)}`);
  }
}

/** "{" then spaces: never valid JSON. */
function openBrace(bytes: number): Buffer {
  const b = Buffer.alloc(bytes, 0x20);
  b[0] = 0x7b;
  return b;
}

/**
 * A body over the limit streamed in 64 KiB chunks, signed in with the admin's cookies: without Content-Length
 * (`chunked`, which Playwright's client cannot send) or with it.
 */
async function sendStreamed(c: FuzzCase, body: Buffer, chunked: boolean): Promise<{ status: () => number; text: () => Promise<string> }> {
  const bytes = body.length;
  const cookie = (await api.storageState()).cookies.map((k) => `${k.name}=${k.value}`).join("; ");
  const target = new URL(c.url, baseURL);
  // node:http rather than fetch: a server may answer 413 and close while the body is still being sent, and
  // the answer it gave is what counts (fetch turns that into "fetch failed").
  return new Promise((resolve, reject) => {
    let answered = false;
    const req = http.request(
      target,
      {
        method: c.method,
        headers: { ...c.headers, cookie, origin: target.origin, ...(chunked ? { "transfer-encoding": "chunked" } : { "content-length": String(bytes) }) },
        timeout: 15_000,
      },
      (res) => {
        answered = true;
        const parts: Buffer[] = [];
        res.on("data", (b: Buffer) => parts.push(b));
        res.on("end", () => resolve({ status: () => res.statusCode ?? 0, text: async () => Buffer.concat(parts).toString("utf8") }));
        res.on("error", reject);
      },
    );
    req.on("error", (err) => {
      if (answered) return;
      // Past the 1 MB limit the server stops reading and closes; when that close reaches us before its 413
      // does, the closed connection is the refusal (the row counts and "still answers" checks still apply).
      const code = (err as NodeJS.ErrnoException).code;
      // With a Content-Length over the limit the server may refuse before reading any of it.
      if ((sent > 1_000_000 || !chunked) && (code === "EPIPE" || code === "ECONNRESET"))
        return resolve({ status: () => 413, text: async () => JSON.stringify({ error: `connection closed by the server past the body limit (${code})` }) });
      reject(err);
    });
    req.on("timeout", () => req.destroy(new Error("timed out")));
    let sent = 0;
    const pump = () => {
      while (sent < bytes && !answered && !req.destroyed) {
        const n = Math.min(64 * 1024, bytes - sent);
        const chunk = body.subarray(sent, sent + n);
        sent += n;
        if (!req.write(chunk)) return void req.once("drain", pump);
      }
      if (!req.destroyed) req.end();
    };
    pump();
  });
}

async function sendAll(cases: FuzzCase[]): Promise<void> {
  let next = 0;
  await Promise.all(
    Array.from({ length: CONCURRENCY }, async () => {
      while (next < cases.length) await send(cases[next++]);
    }),
  );
}

test.beforeAll(async () => {
  api = await apiAs(admin.email);
  const [org] = await query<{ id: number }>("SELECT id FROM organisations WHERE slug = ?", [park]);
  parkOrgId = Number(org.id);
  inputKeys = await inputFieldNames();
});

test.afterAll(async () => {
  await api?.dispose();
});

test("row counts before the corpus", async () => {
  const before = await countRows();
  expect(before.size).toBeGreaterThan(5);
  writeState({ before: Object.fromEntries(before), sent: 0, routes: 0, byStatus: {} });
});

for (const route of discoverRoutes()) {
  const writes = route.methods.filter((m) => WRITE_METHODS.includes(m));
  if (!writes.length || route.skipProbe) continue;
  test(`malformed requests: ${route.pattern}`, async () => {
    test.setTimeout(FULL ? 300_000 : 90_000);
    stats = { sent: 0, byStatus: new Map() };
    failures = [];
    const refusalsOnly = API_ROUTES[route.pattern]?.refusalsOnly ?? [];
    const url = await concrete(route.pattern, route.rows);
    const cases: FuzzCase[] = [];
    for (const [mi, method] of writes.entries()) {
      const seed = SEED + route.pattern.length * 31 + mi;
      if (url && method !== "DELETE" && !refusalsOnly.includes(method)) {
        const base = await baseBody(route.pattern, method, url, route.probeBody);
        cases.push(...casesFor(method, url, base, inputKeys, seed, RANDOM_PER_ROUTE));
      }
      // Dynamic segments that name no row: a 400 or 404, never a 5xx (DELETE included).
      for (const m of route.pattern.matchAll(/\[([^\]]+)\]/g)) {
        for (const bad of BAD_SEGMENTS.slice(0, BAD_SEGMENT_LIMIT)) {
          const badUrl = await concrete(route.pattern, route.rows, [m[1], bad]);
          if (!badUrl) continue;
          cases.push({ kind: `bad [${m[1]}] ${bad}`, url: badUrl, method, headers: { "content-type": "application/json" }, body: JSON.stringify(route.probeBody ?? {}) });
        }
      }
    }
    await sendAll(cases);
    const state = readState();
    state.sent += stats.sent;
    state.routes += 1;
    for (const [st, n] of stats.byStatus) state.byStatus[st] = (state.byStatus[st] ?? 0) + n;
    writeState(state);
    expect(failures, failures.slice(0, 40).join("\n")).toEqual([]);
  });
}

test("nothing was written, the server still answers, and the corpus was big enough", async () => {
  const after = await countRows();
  const state = readState();
  const changed = [...after].filter(([t, n]) => state.before[t] !== n).map(([t, n]) => `${t}: ${state.before[t]} → ${n}`);
  const statuses = Object.entries(state.byStatus).sort((a, b) => Number(a[0]) - Number(b[0]));
  const summary = `${state.sent} malformed requests over ${state.routes} write routes (seed ${SEED}); answers: ${statuses.map(([s, n]) => `${s}×${n}`).join(", ")}`;
  console.log(`[fuzz] ${summary}`);
  test.info().annotations.push({ type: "fuzz", description: summary });
  expect(changed, "tables whose row count changed").toEqual([]);
  const ping = await api.get("/api/lifts");
  expect(ping.status()).toBe(200);
  const anon = await playwrightRequest.newContext({ baseURL });
  expect((await anon.get("/sign-in")).status()).toBe(200);
  await anon.dispose();
  expect(state.sent).toBeGreaterThanOrEqual(FULL ? 1000 : 300);
  expect(statuses.filter(([s]) => Number(s) >= 500)).toEqual([]);
});
