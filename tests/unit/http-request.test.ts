import { describe, expect, it } from "vitest";
import { z } from "zod";
import { HttpError } from "@/lib/http/errors";
import { parseJsonBody, readBodyBytes } from "@/lib/http/request";
import { clipText } from "@/lib/http/text";

/** A request whose body arrives in chunks without a Content-Length (as with Transfer-Encoding: chunked). */
function chunkedRequest(totalBytes: number, chunkBytes = 64 * 1024) {
  let pulled = 0;
  let cancelled = false;
  const stream = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (pulled >= totalBytes) return controller.close();
      const n = Math.min(chunkBytes, totalBytes - pulled);
      pulled += n;
      controller.enqueue(new Uint8Array(n).fill(0x20));
    },
    cancel() {
      cancelled = true;
    },
  });
  const req = new Request("http://localhost/api/x", {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: stream,
    duplex: "half",
  } as RequestInit);
  return { req, pulled: () => pulled, cancelled: () => cancelled };
}

const status = (p: Promise<unknown>) => p.then(() => 200, (e: unknown) => (e instanceof HttpError ? e.status : 500));

const json = (body: string) => new Request("http://localhost/api/x", { method: "POST", headers: { "content-type": "application/json" }, body });

describe("request bodies are read within a limit", () => {
  it("stops reading a body without Content-Length at the first chunk past the limit", async () => {
    const big = chunkedRequest(50 * 1024 * 1024);
    expect(await status(parseJsonBody(big.req, z.unknown(), 1_000_000))).toBe(413);
    // Read no further than one chunk past 1 MB, and the stream was told to stop.
    expect(big.pulled()).toBeLessThan(1_000_000 + 2 * 64 * 1024);
    expect(big.cancelled()).toBe(true);
  });

  it("refuses a declared Content-Length over the limit before reading anything", async () => {
    const big = chunkedRequest(2_000_000);
    const req = new Request(big.req, { headers: { "content-type": "application/json", "content-length": "2000000" } });
    expect(await status(readBodyBytes(req, 1_000_000))).toBe(413);
    // Only what the stream buffers ahead of any reader (its high-water mark) was produced.
    expect(big.pulled()).toBeLessThanOrEqual(2 * 64 * 1024);
  });

  it("reads a body under the limit whole", async () => {
    const small = chunkedRequest(1000, 100);
    expect((await readBodyBytes(small.req, 1_000_000)).byteLength).toBe(1000);
  });
});

describe("text that cannot be stored is refused with its field path", () => {
  it("a lone UTF-16 surrogate answers 400 naming the field", async () => {
    const err = await parseJsonBody(json('{"name":"ok","lift":{"site":"a\\ud800b"}}'), z.unknown()).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect((err as HttpError).status).toBe(400);
    expect((err as HttpError).issues.map((i) => i.path)).toEqual(["lift.site"]);
    const low = await parseJsonBody(json('["\\udc00"]'), z.unknown()).catch((e: unknown) => e);
    expect((low as HttpError).issues[0].path).toBe("0");
  });

  it("a whole surrogate pair (an emoji) passes", async () => {
    expect(await parseJsonBody(json('{"name":"\\ud83c\\udfa2 lift"}'), z.unknown())).toEqual({ name: "🎢 lift" });
  });

  it("NUL and ESC are refused in any field; line breaks and tabs in free text pass", async () => {
    const err = await parseJsonBody(json('{"notes":"a\\u0000b","title":"x\\u001b[31m"}'), z.unknown()).catch((e: unknown) => e);
    expect((err as HttpError).issues.map((i) => i.path).sort()).toEqual(["notes", "title"]);
    expect(await parseJsonBody(json('{"notes":"line 1\\r\\nline 2\\tend"}'), z.unknown())).toEqual({ notes: "line 1\r\nline 2\tend" });
  });
});

describe("clipText cuts whole characters", () => {
  it("never splits a surrogate pair or an emoji sequence", () => {
    const name = "🎢".repeat(60) + " – train";
    const clipped = clipText(name, 120);
    expect(clipped.length).toBeLessThanOrEqual(120);
    expect(clipped.endsWith("…")).toBe(true);
    expect(/[\ud800-\udbff](?![\udc00-\udfff])/.test(clipped)).toBe(false);
    const family = "👨‍👩‍👧".repeat(10); // 8 units each
    expect(clipText(family, 20)).toBe("👨‍👩‍👧👨‍👩‍👧…");
  });

  it("leaves text within the limit alone", () => {
    expect(clipText("Emberline", 120)).toBe("Emberline");
  });
});
