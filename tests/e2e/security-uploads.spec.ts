import fs from "node:fs";
import path from "node:path";
import { expect, test } from "@playwright/test";
import { apiAs } from "./support/auth";
import { query } from "./support/db";

/**
 * Uploads: checked by content (not by name or declared type), size-limited, stored under generated keys in
 * object storage (never under public/), served with the detected type, nosniff and a Content-Disposition.
 * Source: OWASP File Upload Cheat Sheet (validate content, generate names, store outside the web root,
 * serve with safe headers) — from memory.
 */

// A valid 1×1 PNG (signature, IHDR, IDAT that inflates to one row, IEND; every CRC right).
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==", "base64");

async function uploadCount(): Promise<number> {
  const [r] = await query<{ n: number }>("SELECT COUNT(*) AS n FROM uploads");
  return Number(r.n);
}

test.describe("photo uploads", () => {
  test("files that are not images, oversized files and broken forms are refused; nothing is stored", async () => {
    const api = await apiAs("engineer@lanternfell.example");
    const [lift] = await query<{ id: number }>("SELECT l.id FROM lifts l JOIN organisations o ON o.id = l.organisation_id WHERE o.slug = 'lanternfell' ORDER BY l.id LIMIT 1");
    const before = await uploadCount();
    const bad: [string, { name: string; mimeType: string; buffer: Buffer }][] = [
      ["text named .jpg", { name: "photo.jpg", mimeType: "image/jpeg", buffer: Buffer.from("just some text") }],
      ["HTML named .png", { name: "take-up.png", mimeType: "image/png", buffer: Buffer.from("<html><script>alert(1)</script></html>") }],
      ["SVG with script", { name: "x.svg", mimeType: "image/svg+xml", buffer: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>') }],
      ["truncated PNG signature", { name: "a.png", mimeType: "image/png", buffer: PNG.subarray(0, 5) }],
      ["bare PNG signature", { name: "b.png", mimeType: "image/png", buffer: PNG.subarray(0, 8) }],
      ["PNG signature followed by HTML", { name: "c.png", mimeType: "image/png", buffer: Buffer.concat([PNG.subarray(0, 8), Buffer.from("<html><script>alert(1)</script></html>")]) }],
      ["empty file", { name: "empty.jpg", mimeType: "image/jpeg", buffer: Buffer.alloc(0) }],
      ["executable", { name: "tool.exe", mimeType: "application/octet-stream", buffer: Buffer.from("MZ\x90\x00") }],
    ];
    for (const [what, file] of bad) {
      const res = await api.post("/api/uploads", { multipart: { liftId: String(lift.id), file } });
      expect(res.status(), what).toBe(400);
      const body = (await res.json()) as { issues?: { path: string }[] };
      expect(body.issues?.map((i) => i.path), what).toContain("file");
    }
    const noFile = await api.post("/api/uploads", { multipart: { liftId: String(lift.id) } });
    expect(noFile.status()).toBe(400);
    const noLift = await api.post("/api/uploads", { multipart: { file: { name: "p.png", mimeType: "image/png", buffer: PNG } } });
    expect(noLift.status()).toBe(400);
    expect(((await noLift.json()) as { issues: { path: string }[] }).issues.map((i) => i.path)).toContain("liftId");
    const json = await api.post("/api/uploads", { data: { liftId: lift.id } });
    expect(json.status()).toBe(400);
    const huge = await api.post("/api/uploads", {
      multipart: { liftId: String(lift.id), file: { name: "big.png", mimeType: "image/png", buffer: Buffer.concat([PNG, Buffer.alloc(6 * 1024 * 1024)]) } },
    });
    expect(huge.status()).toBe(413);
    expect(await uploadCount()).toBe(before);
    await api.dispose();
  });

  test("an image is stored under a generated key outside the web root and served with safe headers", async () => {
    const api = await apiAs("engineer@lanternfell.example");
    const [lift] = await query<{ id: number }>("SELECT l.id FROM lifts l JOIN organisations o ON o.id = l.organisation_id WHERE o.slug = 'lanternfell' ORDER BY l.id LIMIT 1");
    const evilName = "../../public/evil<script>.html";
    const res = await api.post("/api/uploads", { multipart: { liftId: String(lift.id), file: { name: evilName, mimeType: "text/html", buffer: PNG } } });
    expect(res.status()).toBe(201);
    const created = (await res.json()) as { id: number };
    const [row] = await query<{ storage_key: string }>("SELECT * FROM uploads WHERE id = ?", [created.id]);
    expect(row.storage_key).toMatch(/^photos\/\d+\/[0-9a-f-]{36}$/);
    expect(row.storage_key).not.toContain("evil");
    expect(fs.existsSync(path.join(process.cwd(), "public", "evil<script>.html"))).toBe(false);
    const got = await api.get(`/api/uploads/${created.id}`);
    expect(got.status()).toBe(200);
    const h = got.headers();
    expect(h["content-type"]).toBe("image/png"); // detected from the bytes, not the declared text/html
    expect(h["content-disposition"]).toMatch(/^(inline|attachment); filename="photo-\d+\.png"$/);
    expect(h["x-content-type-options"]).toBe("nosniff");
    expect(h["content-security-policy"]).toContain("sandbox");
    expect(Buffer.compare(await got.body(), PNG)).toBe(0);
    // Another organisation's user gets 404 for it.
    const other = await apiAs("admin@cardlevane.example");
    expect((await other.get(`/api/uploads/${created.id}`)).status()).toBe(404);
    await other.dispose();
    await api.dispose();
  });
});

test.describe("logger CSV uploads", () => {
  test("bad rows are refused with the problem named and nothing stored", async () => {
    const api = await apiAs("engineer@lanternfell.example");
    const [lift] = await query<{ id: number }>("SELECT l.id FROM lifts l JOIN organisations o ON o.id = l.organisation_id WHERE o.slug = 'lanternfell' ORDER BY l.id LIMIT 1");
    const [{ n: before }] = await query<{ n: number }>("SELECT COUNT(*) AS n FROM recordings");
    const mapping = { time: "t", chainTension: "tension" };
    const csvs: [string, string][] = [
      ["text in a number column", "t,tension\n0,100\n0.1,abc\n0.2,120\n"],
      ["missing mapped column", "t,force\n0,100\n0.1,110\n"],
      ["NaN and Infinity", "t,tension\n0,NaN\n0.1,Infinity\n"],
      ["ragged rows", "t,tension\n0,100,7,8\n0.1\n"],
      ["control characters", "t,tension\n0,1\u0000\n\u001b[2J,5\n"],
      ["header only", "t,tension\n"],
      ["time running backwards", "t,tension\n1,100\n0.5,110\n0.2,120\n"],
    ];
    for (const [what, csv] of csvs) {
      const res = await api.post("/api/recordings", { data: { liftId: lift.id, name: `Bad CSV ${what}`, csv, mapping } });
      expect(res.status(), what).toBeGreaterThanOrEqual(400);
      expect(res.status(), what).toBeLessThan(500);
      const body = (await res.json()) as { error?: string; issues?: { path: string }[] };
      expect(body.error, what).toBeTruthy();
      expect(body.issues?.length ?? 0, `${what}: names the problem`).toBeGreaterThan(0);
    }
    const [{ n: after }] = await query<{ n: number }>("SELECT COUNT(*) AS n FROM recordings");
    expect(Number(after)).toBe(Number(before));
    await api.dispose();
  });
});
