import { execFile } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";
import { evaluateChecks } from "@/sim/checks";
import { LIMIT_SOURCES, limitsSchema } from "@/sim/schema";
import { simulate } from "@/sim/simulate";
import { designStatics } from "@/sim/statics";
import { exampleInput, scenario } from "./scenarios";

const run = promisify(execFile);
const root = path.resolve(__dirname, "../..");
const cli = (args: string[]) =>
  run("npx", ["tsx", "sim/cli.ts", ...args], { cwd: root, timeout: 60_000 });

describe("command line", () => {
  it("prints one JSON object with the summary (and the series when asked)", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "tautline-sim-"));
    const file = path.join(dir, "short.json");
    const s = exampleInput() as unknown as { run: { duration: number } };
    s.run.duration = 4;
    writeFileSync(file, JSON.stringify(s));
    const { stdout } = await cli([file, "--segments", "20", "--series", "--sample-interval", "0.5"]);
    const out = JSON.parse(stdout);
    expect(Object.keys(out).sort()).toEqual(["series", "summary"]);
    expect(out.summary.segments).toBeGreaterThanOrEqual(20);
    expect(out.series.t).toEqual([0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5, 4]);
    for (const k of ["peakTension", "snatchFactor", "pickupDelay", "takeUpCreepRate", "energyResidual", "steps", "rhsEvaluations", "wallTimeMs"])
      expect(out.summary).toHaveProperty(k);
  });

  it("exits 2 with the field path on stderr for invalid input", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "tautline-sim-"));
    const file = path.join(dir, "bad.json");
    const s = exampleInput() as unknown as { takeUp: { position: number } };
    s.takeUp.position = 9;
    writeFileSync(file, JSON.stringify(s));
    const err = await cli([file]).then(
      () => null,
      (e: { code: number; stderr: string; stdout: string }) => e,
    );
    expect(err?.code).toBe(2);
    expect(err?.stderr).toContain("takeUp.position");
    expect(err?.stdout).toBe("");
  });
});

describe("design checks", () => {
  it("give every check a state, a value, a limit and a one-line reason", () => {
    const s = scenario({ run: { duration: 30, segments: 30 } });
    const r = simulate(s, { frameBudget: 0, series: false });
    const checks = evaluateChecks(r.summary, designStatics(s), { motorRating: 200e3 });
    expect(checks.map((c) => c.key)).toEqual(["snatch", "safetyFactor", "workingLoad", "breakingStrength", "rollback", "pickup", "takeUpTravel", "takeUpWear", "takeUpCreep", "drivePower", "riderAccel", "release"]);
    for (const c of checks) {
      expect(["pass", "caution", "fail"]).toContain(c.state);
      expect(c.reason).not.toContain("\n");
      expect(c.reason.length).toBeGreaterThan(10);
    }
    // The example's wear allowance (3 % of 228 m, halved) exceeds its 2.5 m travel: not a pass. (Wear is now
    // its own check, apart from the elastic travel budget.)
    expect(checks.find((c) => c.key === "takeUpWear")!.state).not.toBe("pass");
    // Safety factor: breaking 500 kN over the peak.
    const sf = checks.find((c) => c.key === "safetyFactor")!;
    expect(sf.value).toBeCloseTo(Math.min(5e5 / r.summary.peakTension, designStatics(s).safetyFactor), 9);
  });

  it("fail a safety factor below the required one and a motor that is too small", () => {
    const s = scenario({ run: { duration: 30, segments: 30 } });
    const r = simulate(s, { frameBudget: 0, series: false });
    const c = evaluateChecks(r.summary, designStatics(s), { requiredSafetyFactor: 8, motorRating: 50e3 });
    expect(c.find((x) => x.key === "safetyFactor")!.state).toBe("fail");
    expect(c.find((x) => x.key === "drivePower")!.state).toBe("fail");
  });

  it("name a source or an assumption for every default limit", () => {
    for (const k of Object.keys(limitsSchema.shape)) expect(LIMIT_SOURCES[k as keyof typeof LIMIT_SOURCES]).toBeTruthy();
  });
});

describe("command line, format 2", () => {
  it("answers a version 2 file with per-train series and converts a version 1 file with --upgrade", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "tautline-sim-"));
    const v1 = path.join(dir, "v1.json");
    const s = exampleInput() as unknown as { run: { duration: number } };
    s.run.duration = 3;
    writeFileSync(v1, JSON.stringify(s));
    const up = JSON.parse((await cli([v1, "--upgrade"])).stdout);
    expect(up.format).toBe("tautline-scenario/2");
    expect(up.trains).toHaveLength(1);
    expect(up.drive.motor).toEqual({ kind: "ideal" });
    const v2 = path.join(dir, "v2.json");
    up.drive.motor = { kind: "induction" };
    writeFileSync(v2, JSON.stringify(up));
    const out = JSON.parse((await cli([v2, "--segments", "20", "--series", "--sample-interval", "1"])).stdout);
    expect(out.series.t).toEqual([0, 1, 2, 3]);
    expect(out.series.trains[0].position).toHaveLength(4);
    // The induction drive's synchronous speed ramps over 2 s; the chain follows it with some slip.
    expect(out.series.driveSpeed[3]).toBeGreaterThan(0.9 * up.drive.speed);
    expect(out.series.driveSpeed[3]).toBeLessThan(up.drive.speed);
  });
});
