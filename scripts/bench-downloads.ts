// Large result downloads against other requests, on loopback: 10 parallel downloads of a run result whose
// JSON is about 21 MB, while one client keeps asking for a small signed-in read (the user row, like
// /api/me). Both ways of answering the download are measured in the same process and database:
//   whole    the JSON built in one piece (JSON.stringify of the decoded result: the earlier route)
//   streamed lib/runs/result-stream.ts (slices, unzip off-thread, 2 streams per organisation at once)
// Usage: DB_PORT=<port> npx tsx scripts/bench-downloads.ts   (a migrated database; adds one test organisation)
import http from "node:http";
import crypto from "node:crypto";
import type { AddressInfo } from "node:net";
import { Readable } from "node:stream";
import { getModels } from "../models";
import { getSequelize } from "../lib/db/sequelize";
import { encodeResult, RESULT_FORMAT } from "../lib/runs/result-format";
import { getRunResult, getRunResultStream } from "../lib/runs/service";

const DOWNLOADS = 10;

async function fixture() {
  const { Organisation, User, Scenario, Run } = getModels();
  const suffix = crypto.randomBytes(4).toString("hex");
  const org = await Organisation.create({ name: `Download bench ${suffix}`, kind: "engineering", slug: `download-bench-${suffix}` });
  const user = await User.create({ organisationId: org.id, email: `bench.${suffix}@design-test.example`, name: "bench", role: "viewer", passwordHash: null });
  const sc = await Scenario.findOne();
  if (!sc) throw new Error("The database needs one scenario (npm run db:seed) for the run row to point at.");
  // 2.1 million f32 samples in 6 series: about 21 MB of JSON.
  const n = 350_000;
  const series: Record<string, Float32Array> = {};
  for (let s = 0; s < 6; s++) series[`s${s}`] = Float32Array.from({ length: n }, (_, i) => Math.sin(i * 0.001 * (s + 1)) * 1e5);
  const blob = Buffer.from(encodeResult({ series }));
  const run = await Run.create({
    organisationId: org.id,
    scenarioId: sc.id,
    liftRevisionId: sc.liftRevisionId,
    startedBy: null,
    inputs: {},
    solver: {},
    status: "done",
    summary: {},
    queuedAt: new Date(),
  });
  await Run.update({ result: blob, resultFormat: RESULT_FORMAT, resultBytes: blob.byteLength }, { where: { id: run.id } });
  return { actor: { id: user.id, organisationId: org.id, role: "viewer" as const }, runId: run.id, blobBytes: blob.byteLength };
}

function percentile(sorted: number[], p: number) {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

async function main() {
  const f = await fixture();
  const { User } = getModels();
  const errors = new Map<string, number>();
  const server = http.createServer(async (req, res) => {
    try {
      if (req.url === "/me") {
        const u = await User.findByPk(f.actor.id);
        res.writeHead(200, { "content-type": "application/json" });
        return res.end(JSON.stringify({ id: u!.id, email: u!.email }));
      }
      if (req.url === "/result/whole") {
        const body = JSON.stringify(await getRunResult(f.actor, f.runId));
        res.writeHead(200, { "content-type": "application/json" });
        return res.end(body);
      }
      const stream = await getRunResultStream(f.actor, f.runId);
      res.writeHead(200, { "content-type": "application/json" });
      Readable.fromWeb(stream as never).pipe(res);
    } catch (err) {
      errors.set(String(err).slice(0, 80), (errors.get(String(err).slice(0, 80)) ?? 0) + 1);
      if (res.headersSent) return res.destroy();
      res.writeHead(500);
      res.end(String(err));
    }
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  console.log(`Result download bench: blob ${(f.blobBytes / 1e6).toFixed(1)} MB gzipped, ${DOWNLOADS} parallel downloads, one client reading /me in a loop`);
  for (const mode of ["whole", "streamed"]) {
    const t0 = performance.now();
    let bytes = 0;
    let failed = 0;
    let running = true;
    const downloads = Promise.all(
      Array.from({ length: DOWNLOADS }, async () => {
        const res = await fetch(`${base}/result/${mode}`);
        const body = await res.arrayBuffer();
        if (res.ok) bytes += body.byteLength;
        else failed += 1;
      }),
    ).finally(() => (running = false));
    const me: number[] = [];
    let meFailed = 0;
    while (running) {
      const s = performance.now();
      const res = await fetch(`${base}/me`);
      await res.text();
      me.push(performance.now() - s);
      if (!res.ok) meFailed += 1;
    }
    await downloads;
    const total = performance.now() - t0;
    me.sort((a, b) => a - b);
    console.log(
      `  ${mode.padEnd(8)}: downloads ${(total / 1000).toFixed(1)} s (${DOWNLOADS - failed} answered ${(bytes / Math.max(1, DOWNLOADS - failed) / 1e6).toFixed(1)} MB each, ${failed} failed); /me ${me.length} answers (${meFailed} failed), p50 ${percentile(me, 50).toFixed(0)} ms, p95 ${percentile(me, 95).toFixed(0)} ms, max ${me[me.length - 1].toFixed(0)} ms`,
    );
  }
  for (const [e, n] of errors) console.log(`  server errors: ${n} × ${e}`);
  server.close();
  await getSequelize().close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
