import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { build } from "esbuild";
import { describe, expect, it } from "vitest";
import { exampleInput } from "./scenarios";

const root = path.resolve(__dirname, "../..");

describe("the engine is portable", () => {
  it("bundles for the browser (no Node built-ins) and runs in a worker thread", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "tautline-bundle-"));
    const out = path.join(dir, "engine.mjs");
    // platform "browser": any import of a Node built-in (fs, path, …) would fail this build.
    await build({
      entryPoints: [path.join(root, "sim/index.ts")],
      bundle: true,
      platform: "browser",
      format: "esm",
      outfile: out,
      logLevel: "silent",
      alias: { "@": root },
      tsconfigRaw: { compilerOptions: { paths: {} } }, // load the odex package itself, not its declaration file
    });
    expect(readFileSync(out, "utf8").length).toBeGreaterThan(1000);
    const workerFile = path.join(dir, "worker.mjs");
    writeFileSync(
      workerFile,
      `import { parentPort, workerData } from "node:worker_threads";
       import { simulate } from ${JSON.stringify(out)};
       const r = simulate(workerData, { frameBudget: 10, series: false });
       parentPort.postMessage({ peak: r.summary.peakTension, frames: r.frames.length });`,
    );
    const s = exampleInput() as unknown as { run: { duration: number; segments: number } };
    s.run.duration = 6;
    s.run.segments = 20;
    const msg = await new Promise<{ peak: number; frames: number }>((resolve, reject) => {
      const w = new Worker(workerFile, { workerData: s });
      w.once("message", resolve);
      w.once("error", reject);
    });
    expect(msg.peak).toBeGreaterThan(20000);
    expect(msg.frames).toBeLessThanOrEqual(10);
  });
});
