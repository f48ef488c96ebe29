import http from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ApiError, getJson, sendJson, submitJson } from "@/lib/client/fetch";

let server: http.Server;
let base = "";
const seen: { method?: string; key?: string }[] = [];

beforeAll(async () => {
  server = http.createServer((req, res) => {
    seen.push({ method: req.method, key: req.headers["idempotency-key"] as string | undefined });
    if (req.url === "/forbidden") {
      res.writeHead(403, { "content-type": "application/json" });
      return res.end(JSON.stringify({ error: "Your role may not do this." }));
    }
    if (req.url === "/invalid") {
      res.writeHead(400, { "content-type": "application/json" });
      return res.end(JSON.stringify({ error: "The request has invalid fields.", issues: [{ path: "name", message: "name must not be empty" }] }));
    }
    res.writeHead(200, { "content-type": "application/json" });
    res.end(JSON.stringify({ items: [1, 2] }));
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
});
afterAll(() => new Promise((r) => server.close(r)));

describe("the one client fetch helper", () => {
  it("throws on a refusal instead of handing its body over as data", async () => {
    const err = await getJson(`${base}/forbidden`).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).status).toBe(403);
    expect((err as ApiError).message).toBe("Your role may not do this.");
    expect(await getJson(`${base}/ok`)).toEqual({ items: [1, 2] });
  });

  it("gives forms the field messages, and sends the Idempotency-Key it is given", async () => {
    const r = await submitJson(`${base}/invalid`, "POST", { name: "" });
    expect(r).toMatchObject({ ok: false, status: 400, errors: { name: "name must not be empty" } });
    await sendJson(`${base}/ok`, "POST", { a: 1 }, { idempotencyKey: "k-1" });
    expect(seen.at(-1)).toEqual({ method: "POST", key: "k-1" });
  });
});
