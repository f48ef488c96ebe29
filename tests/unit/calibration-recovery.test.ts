import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseScenario, simulate, type Scenario } from "@/sim";
import { calibrate } from "@/lib/calibration/fit";

// A synthetic recording made by the engine itself: the example lift hill with known E·A and damping,
// coarse (12 segments), 7 s, its take-up trace every 0.04 s with Gaussian noise of 1 mm added.
const file = JSON.parse(readFileSync(path.join(process.cwd(), "sim", "examples", "lift-hill-example.json"), "utf8"));
const TRUE_EA = 1.5e7;
const TRUE_DAMPING = 2e5;

function scenario(ea: number, damping: number): Scenario {
  const s = structuredClone(file);
  s.chain.axialStiffness = ea;
  s.chain.damping = damping;
  s.run = { ...s.run, duration: 7, segments: 12 };
  const p = parseScenario(s);
  if (!p.ok) throw new Error(JSON.stringify(p.issues));
  return p.scenario;
}

function seededGauss(seed: number) {
  let s = seed;
  const u = () => (s = (s * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

describe("calibration", () => {
  it("recovers known axial stiffness and damping within 5 % from a noisy engine recording", () => {
    const truth = simulate(scenario(TRUE_EA, TRUE_DAMPING), { frameBudget: 0, sampleInterval: 0.02 });
    const gauss = seededGauss(7);
    const t = truth.series.t.filter((_, i) => i % 2 === 0);
    const y = truth.series.takeUpPosition.filter((_, i) => i % 2 === 0).map((v) => v + 0.001 * gauss());
    const engagementTime = truth.summary.engagementTime!;
    // Start 13 % stiff-low and 30 % damping-low: the fit has to move both.
    const started = Date.now();
    const r = calibrate(scenario(1.3e7, 1.4e5), { t, takeUp: y, engagementTime }, { duration: 7, maxEvaluations: 60 });
    const seconds = (Date.now() - started) / 1000;
    // A round trip, not physics: the recording was made with these values, set by this test; the 5 % band is Tautline's acceptance criterion (assumption).
    expect(Math.abs(r.fitted.axialStiffness / TRUE_EA - 1)).toBeLessThan(0.05);
    expect(Math.abs(r.fitted.damping / TRUE_DAMPING - 1)).toBeLessThan(0.05);
    // The fitted trace matches to about the added noise (1 mm RMS) and far better than the start.
    expect(r.quality.fitted.rms).toBeLessThan(0.0015);
    expect(r.quality.fitted.rms).toBeLessThan(r.quality.initial.rms / 5);
    expect(r.quality.fitted.rSquared).toBeGreaterThan(0.99);
    expect(r.headline.fitted.peakTension).toBeGreaterThan(0);
    expect(seconds).toBeLessThan(45);
  }, 90_000);
});
