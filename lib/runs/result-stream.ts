/**
 * A finished run's result as JSON, streamed: the same bytes as `JSON.stringify(getRunResult(…))`, made a
 * slice at a time with a pause for other requests between slices, instead of one blocking build of a
 * 20 MB string. The blob is unzipped off the request thread, and each organisation streams at most
 * RESULT_STREAMS_PER_ORG results at once (default 2; the next waits its turn), so ten parallel downloads
 * neither hold the request thread nor hold ten decoded results in memory.
 */
import { promisify } from "node:util";
import { gunzip } from "node:zlib";
import { OrgLimiter } from "@/lib/jobs/org-limiter";
import type { Run } from "@/models/Run";
import { json } from "./serialize";
import { arrayRef, openContainer, ResultFormatError, roundF32, type ResultContainer } from "./result-format";

const gunzipAsync = promisify(gunzip);

/** Numbers per slice of an array, and bytes per chunk handed to the response (about). */
const NUMBERS_PER_SLICE = 4096;
const CHUNK_BYTES = 64 * 1024;

function streamsPerOrg(env: NodeJS.ProcessEnv = process.env): number {
  const n = Number(env.RESULT_STREAMS_PER_ORG);
  return Number.isInteger(n) && n >= 1 ? n : 2;
}

const state = globalThis as unknown as { tautlineResultStreams?: OrgLimiter };
function limiter(): OrgLimiter {
  state.tautlineResultStreams ??= new OrgLimiter(() => streamsPerOrg());
  return state.tautlineResultStreams;
}

/** JSON of a number as JSON.stringify writes it (non-finite numbers are null). */
const num = (x: number) => (Number.isFinite(x) ? String(x) : "null");

function* arrayJson(c: ResultContainer, i: number): Generator<string> {
  const arr = c.array(i);
  const f32 = c.dtype(i) === "f32";
  yield "[";
  for (let at = 0; at < arr.length; at += NUMBERS_PER_SLICE) {
    const end = Math.min(arr.length, at + NUMBERS_PER_SLICE);
    let s = at > 0 ? "," : "";
    for (let k = at; k < end; k++) s += (k > at ? "," : "") + num(f32 ? roundF32(arr[k]) : arr[k]);
    yield s;
  }
  yield "]";
}

/** The tree with its arrays in place, as JSON text in pieces (parsed JSON holds no undefined). */
function* valueJson(c: ResultContainer, v: unknown): Generator<string> {
  const ref = arrayRef(v);
  if (ref !== null) return yield* arrayJson(c, ref);
  if (Array.isArray(v)) {
    yield "[";
    for (let i = 0; i < v.length; i++) {
      if (i) yield ",";
      yield* valueJson(c, v[i]);
    }
    return yield "]";
  }
  if (v && typeof v === "object") {
    yield "{";
    let first = true;
    for (const [k, x] of Object.entries(v)) {
      yield `${first ? "" : ","}${JSON.stringify(k)}:`;
      first = false;
      yield* valueJson(c, x);
    }
    return yield "}";
  }
  yield JSON.stringify(v);
}

function* resultJson(run: Pick<Run, "id" | "resultFormat" | "summary">, c: ResultContainer): Generator<string> {
  const head = { runId: run.id, format: run.resultFormat ?? "", summary: json(run.summary ?? null) };
  yield JSON.stringify(head).slice(0, -1) + ',"result":';
  yield* valueJson(c, c.value);
  yield "}";
}

/**
 * The result of a finished run as a stream of JSON bytes. Waits for the organisation's turn and unzips
 * the blob before answering, so a broken blob is an error answer, not a broken stream.
 */
export async function resultJsonStream(run: Pick<Run, "id" | "organisationId" | "resultFormat" | "summary">, blob: Buffer): Promise<ReadableStream<Uint8Array>> {
  const release = await limiter().acquire(run.organisationId);
  let pieces: Generator<string>;
  try {
    const raw = await gunzipAsync(blob).catch(() => {
      throw new ResultFormatError("The stored result is not gzip data.");
    });
    pieces = resultJson(run, openContainer(raw));
  } catch (err) {
    release();
    throw err;
  }
  const enc = new TextEncoder();
  return new ReadableStream<Uint8Array>(
    {
      async pull(controller) {
        // Let other requests in between chunks.
        await new Promise((r) => setImmediate(r));
        try {
          let chunk = "";
          while (chunk.length < CHUNK_BYTES) {
            const next = pieces.next();
            if (next.done) {
              if (chunk) controller.enqueue(enc.encode(chunk));
              controller.close();
              return release();
            }
            chunk += next.value;
          }
          controller.enqueue(enc.encode(chunk));
        } catch (err) {
          release();
          controller.error(err);
        }
      },
      cancel() {
        release();
      },
    },
    { highWaterMark: 0 },
  );
}
