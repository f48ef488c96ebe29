/**
 * Several trains on one chain: two trains climbing the incline together, against the statics of the loop and
 * the take-up's creep; overlapping trains refused by the format.
 */
import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { parseScenario } from "@/sim/schema";
import { exampleInput, G, standingTrain } from "./scenarios";

describe("two trains on the incline", () => {
  // Train 2 stands 42 m further up: a whole number of catch spacings (2 m) and of ARD teeth (0.15 m), so it
  // stands like train 1, its catch 5 mm behind its dog and its pawl on a tooth. No friction anywhere but rolling.
  const s = standingTrain({ drive: { speed: 2 }, takeUp: { friction: 0 }, run: { duration: 24, segments: 60 } });
  const t1 = s.trains[0];
  s.trains = [t1, { ...t1, startPosition: t1.startPosition + 42 }];
  const r = simulate(s, { frameBudget: 0, series: false });
  const th = (s.lift.angle! * Math.PI) / 180;
  const F = t1.cars * t1.carMass * G * (Math.sin(th) + t1.rollingResistance * Math.cos(th));
  const v = s.drive.speed;
  const EA = s.chain.axialStiffness;

  it("both are picked up and climb", () => {
    expect(r.summary.trains).toHaveLength(2);
    for (const t of r.summary.trains) expect(t.engagementTime).not.toBeNull();
    expect(r.summary.steadyTension).not.toBeNull();
  });

  it("steady drive tension = slack tension + F₁ + F₂", () => {
    // Source: statics of the loop (Gere & Goodno, equilibrium of the chain): the chain's own weight up the carrying
    // strand is returned down the return strand, so the tight side at the drive carries the slack side plus both
    // dog loads; a 2:1 take-up holds the slack side at M·g/2 (common practice, no source).
    const slack = (s.takeUp.mass * G) / 2;
    const expected = slack + 2 * F;
    expect(Math.abs(r.summary.steadyTension! - expected) / expected).toBeLessThan(0.02);
  });

  it("creep: the counterweight rises at (F₁ + F₂)·v/(2·E·A)", () => {
    // Source: δ = F·L/(E·A) (Gere & Goodno) for each load, its loaded length shrinking at v; the 2:1 take-up moves
    // half of the change (common practice, no source): d(drop)/dt = −(F₁ + F₂)·v/(2·E·A).
    const expected = -(2 * F * v) / (2 * EA);
    expect(Math.abs(r.summary.takeUpCreepRate! - expected) / Math.abs(expected)).toBeLessThan(0.05);
  });
});

describe("overlapping trains", () => {
  it("are refused with the path of the later train", () => {
    const { train: t, ...doc } = JSON.parse(JSON.stringify(exampleInput())) as Record<string, unknown> & { train: Record<string, unknown> };
    doc.format = "tautline-scenario/2";
    const length = (t.cars as number) * (t.carLength as number);
    doc.trains = [t, { ...t, startPosition: (t.startPosition as number) + length - 1 }];
    const r = parseScenario(doc);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues.map((i) => i.path)).toContain("trains.1.startPosition");
    const msg = r.issues.find((i) => i.path === "trains.1.startPosition")!.message;
    expect(msg).toMatch(/overlaps trains\.0/);
    expect(msg).toMatch(/m\b/);
    // One train length apart they stand nose to tail: accepted.
    (doc.trains as Record<string, unknown>[])[1].startPosition = (t.startPosition as number) + length;
    expect(parseScenario(doc).ok).toBe(true);
  });
});
