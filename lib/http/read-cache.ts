import { NextResponse } from "next/server";
import { cachesUsable, currentTick, noteDatabaseAnswered, stampOf, withReadTracking, writtenSince } from "@/lib/db/change-tracker";

/**
 * Answers to GET routes kept in this process until a table they read is written.
 *
 * Under load most requests read the same lists and rows again; building them costs several queries and
 * model instances each time. An entry is keyed by the user and the URL (so it never crosses users or
 * organisations; the caller has already checked the session and permission), remembers which tables its
 * queries read (lib/db/change-tracker.ts) and is served only while none of them has been written since.
 * A time limit backs that up for writes the hooks cannot see (another process on the same database).
 */
interface Entry {
  tables: string[];
  stamp: string;
  body: string;
  storedAt: number;
}

const MAX_ENTRIES = 2_000;
const MAX_BODY_CHARS = 512 * 1024;
const entries = new Map<string, Entry>();

/** How long an answer may be kept at most (READ_CACHE_MS, default 10 s; 0 keeps nothing). */
export function readCacheMaxAgeMs(env: Readonly<Record<string, string | undefined>> = process.env): number {
  const ms = Number(env.READ_CACHE_MS ?? 10_000);
  return Number.isFinite(ms) ? Math.max(0, ms) : 10_000;
}

/** Tables that another process writes: with REDIS_URL the engine's worker processes write runs and studies. */
function tablesWrittenElsewhere(): readonly string[] {
  return process.env.REDIS_URL ? ["runs", "studies", "study_cases", "calibrations"] : [];
}

/** The JSON answer for `key` from the cache, or computed by `compute` (and kept when it may be). */
export async function cachedJson(key: string, compute: () => Promise<unknown>): Promise<NextResponse> {
  const maxAgeMs = readCacheMaxAgeMs();
  const now = Date.now();
  const hit = entries.get(key);
  if (hit && cachesUsable() && now - hit.storedAt < maxAgeMs && stampOf(hit.tables) === hit.stamp) {
    // Refresh its place so the least recently used entry is the one dropped.
    entries.delete(key);
    entries.set(key, hit);
    return jsonResponse(hit.body);
  }
  if (maxAgeMs <= 0) return jsonResponse(JSON.stringify(await compute()));
  return jsonResponse(await computeOnce(key, compute, tablesWrittenElsewhere()));
}

// One computation per key at a time: when an entry expires or goes stale under load, the requests that
// arrive meanwhile share it instead of all querying at once.
const computing = new Map<string, { since: number; body: Promise<string> }>();

function computeOnce(key: string, compute: () => Promise<unknown>, writtenElsewhere: readonly string[]): Promise<string> {
  const inFlight = computing.get(key);
  // Joined only if nothing it reads was written since it started, so nobody gets an answer older than their
  // request. What it reads is known from the previous answer for the key (the same code reads the same
  // tables); without one, any write at all since it started means a computation of one's own.
  const reads = entries.get(key)?.tables;
  if (inFlight && (reads ? !writtenSince(reads, inFlight.since) : inFlight.since === currentTick())) return inFlight.body;
  const since = currentTick();
  const body = (async () => {
    const { value, tables } = await withReadTracking(compute);
    noteDatabaseAnswered();
    const text = JSON.stringify(value);
    const list = [...tables];
    // Not kept when a table it read was written while it was computed (the answer may mix old and new),
    // when it read nothing through the models, when it is large, or when another process writes its tables.
    const keep =
      list.length > 0 && !writtenSince(list, since) && text.length <= MAX_BODY_CHARS && !list.some((t) => writtenElsewhere.includes(t));
    if (keep) {
      entries.delete(key);
      if (entries.size >= MAX_ENTRIES) entries.delete(entries.keys().next().value!);
      entries.set(key, { tables: list, stamp: stampOf(list), body: text, storedAt: Date.now() });
    }
    return text;
  })().finally(() => {
    if (computing.get(key)?.body === body) computing.delete(key);
  });
  computing.set(key, { since, body });
  return body;
}

function jsonResponse(body: string): NextResponse {
  return new NextResponse(body, { status: 200, headers: { "content-type": "application/json" } });
}

/** `cachedJson` for a GET route: one entry per user and URL (path and query). */
export function cachedRead(req: Request, user: { id: number }, compute: () => Promise<unknown>): Promise<NextResponse> {
  const url = new URL(req.url);
  return cachedJson(`${user.id} ${url.pathname}${url.search}`, compute);
}
