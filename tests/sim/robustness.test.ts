import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { SimulationError } from "@/sim/errors";
import { exampleInput, scenario } from "./scenarios";

function codeOf(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    if (e instanceof SimulationError) return e.code;
    throw e;
  }
  return "none";
}

function allFinite(v: unknown): boolean {
  if (typeof v === "number") return Number.isFinite(v);
  if (v === null || typeof v === "boolean" || typeof v === "string") return true;
  if (Array.isArray(v)) return v.every(allFinite);
  if (typeof v === "object") return Object.values(v as object).every(allFinite);
  return true;
}

describe("runs end with a result or a diagnostic", () => {
  it("a hostile but valid scenario is refused up front with its step count", () => {
    const s = scenario({ chain: { axialStiffness: 1e10, massPerLength: 0.5 }, run: { segments: 2000, duration: 600 } });
    const t0 = Date.now();
    expect(codeOf(() => simulate(s))).toBe("budget-steps");
    expect(Date.now() - t0).toBeLessThan(2000);
  });

  it("wall-time budget, abort signal and step budget", () => {
    const s = scenario({ run: { duration: 50, segments: 60 } });
    expect(codeOf(() => simulate(s, { budget: { wallTimeMs: 1 } }))).toBe("budget-time");
    expect(codeOf(() => simulate(s, { signal: { aborted: true } }))).toBe("aborted");
    expect(codeOf(() => simulate(s, { budget: { maxSteps: 1000 } }))).toBe("budget-steps");
  });

  it("invalid input is refused with the field path", () => {
    const bad = exampleInput() as unknown as { lift: Record<string, unknown> };
    bad.lift.angle = -3;
    try {
      simulate(bad);
      expect.unreachable();
    } catch (e) {
      expect((e as SimulationError).code).toBe("invalid-scenario");
      expect((e as Error).message).toContain("lift.angle");
    }
  });

  it("an unstable step fraction gives a diagnostic, never NaN", () => {
    const s = scenario({ chain: { damping: 0 }, run: { duration: 3, segments: 30, stepFraction: 0.95, contactDamping: 0 } });
    // 0.95 of a Gershgorin bound is still stable: the result must be finite.
    const r = simulate(s, { frameBudget: 20 });
    expect(allFinite(r.summary)).toBe(true);
    expect(allFinite(r.frames)).toBe(true);
  });

  it("a train that reaches the end of the track ends the run with a note", () => {
    const s = scenario({ train: { startPosition: 130, entrySpeed: 8 }, run: { duration: 20, segments: 20 } });
    const r = simulate(s, { frameBudget: 0 });
    expect(r.summary.trainReachedEnd).toBe(true);
    expect(r.summary.simulatedTime).toBeLessThan(20);
    expect(r.notes[0]).toMatch(/end of the track/);
  });

  it("is deterministic and reports progress", () => {
    const s = scenario({ run: { duration: 5, segments: 20 } });
    const seen: number[] = [];
    const a = simulate(s, { onProgress: (f) => seen.push(f), frameBudget: 50 });
    const b = simulate(s, { frameBudget: 50 });
    expect(a.summary.peakTension).toBe(b.summary.peakTension);
    expect(a.series.dogForce).toEqual(b.series.dogForce);
    expect(seen.length).toBeGreaterThan(10);
    expect(seen.at(-1)).toBe(1);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
  });
});

describe("frames and series", () => {
  const s = scenario({ run: { duration: 25, segments: 30 } });
  const r = simulate(s, { frameBudget: 120, sampleInterval: 0.02 });

  it("keep the exact peak frame within the budget", () => {
    expect(r.frames.length).toBeLessThanOrEqual(120);
    expect(r.frames.length).toBeGreaterThan(100);
    const peak = r.frames.filter((f) => f.peak);
    expect(peak).toHaveLength(1);
    expect(Math.max(...peak[0].tensions)).toBe(r.summary.peakTension);
    expect(peak[0].t).toBe(r.summary.peakTensionTime);
    for (const f of r.frames) expect(f.tensions).toHaveLength(r.layout.stations.length);
    for (let i = 1; i < r.frames.length; i++) expect(r.frames[i].t).toBeGreaterThan(r.frames[i - 1].t);
  });

  it("sample the series on the requested grid with every key", () => {
    const keys = ["t", "trainPosition", "trainSpeed", "dogForce", "driveTension", "takeUpPosition", "ardForce"];
    for (const k of keys) expect((r.series as unknown as Record<string, number[]>)[k]).toHaveLength(r.series.t.length);
    expect(r.series.t.length).toBe(Math.round(25 / 0.02) + 1);
    expect(r.series.t[50]).toBeCloseTo(1.0, 9);
  });

  it("a coarse live preview stays cheap", () => {
    // The < 100 ms target is measured by `npm run bench` (wall clock depends on the machine's load, so it
    // is not asserted here). Asserted instead, deterministically: the work, steps × segments, stays below
    // 1e6 station updates, which this engine does in well under 100 ms of CPU on this machine.
    const p = scenario({ run: { segments: 24 } });
    const r = simulate(p, { frameBudget: 60, series: false });
    expect(r.summary.simulatedTime).toBeCloseTo(50, 9);
    expect(r.summary.steps * r.summary.segments).toBeLessThan(1e6);
  });
});
