/**
 * Chain wear as elongation: the loop lengthens on the same sprocket path, so the 2:1 take-up starts lower by
 * half the extra length, the catch spacing grows with the pitch, and the chain's stiffness stays.
 */
import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { parseScenario } from "@/sim/schema";
import { scenario } from "./scenarios";

describe("chain.elongation", () => {
  const run = (elongation?: number) => {
    const s = scenario({ run: { duration: 0.2 } });
    if (elongation !== undefined) s.chain.elongation = elongation;
    return { s, r: simulate(s, { frameBudget: 0, series: false }) };
  };

  it("moves the take-up's start down by elongation·loop/2 and stretches the catch spacing", () => {
    const e = 0.005; // the example take-up has 1.3 m of travel left: room for 0.57 m
    const { s, r: fresh } = run();
    const { r: worn } = run(e);
    // Source: geometry of a 2:1 take-up (common practice, no source): a loop longer by e·L on the same sprocket
    // path hangs in the take-up's two legs, so the weight sits e·L/2 lower; L = both strands + the bottom run.
    const loop = 2 * (s.lift.chainTo - s.lift.chainFrom) + s.lift.bottomRun;
    expect(worn.layout.takeUpStart - fresh.layout.takeUpStart).toBeCloseTo((e * loop) / 2, 9);
    expect(worn.layout.catchSpacing).toBeCloseTo(s.chain.catchSpacing * (1 + e), 12);
    // Pitch growth, not lost stiffness: the wave speed √(E·A/μ) is the same.
    expect(worn.diagnostics.waveSpeed).toBe(fresh.diagnostics.waveSpeed);
  });

  it("is refused with its path when the take-up would start past its travel", () => {
    const s = scenario();
    const loop = 2 * (s.lift.chainTo - s.lift.chainFrom) + s.lift.bottomRun;
    const room = s.takeUp.travel - s.takeUp.position;
    const r = parseScenario({ ...s, chain: { ...s.chain, elongation: Math.min(0.1, (2 * room) / loop + 0.005) } });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const issue = r.issues.find((i) => i.path === "chain.elongation");
    expect(issue?.message).toMatch(/past takeUp\.travel .* m/);
    expect(parseScenario({ ...s, chain: { ...s.chain, elongation: -0.01 } }).ok).toBe(false);
  });
});

describe("chain.linksRemoved", () => {
  it("raises the take-up's start by links·worn pitch/2, so a worn, shortened chain fits its travel again", () => {
    const s = scenario({ run: { duration: 0.2 } });
    const loop = 2 * (s.lift.chainTo - s.lift.chainFrom) + s.lift.bottomRun;
    const room = s.takeUp.travel - s.takeUp.position;
    // An elongation that would take the weight 0.2 m past its bottom stop…
    const e = (2 * (room + 0.2)) / loop;
    const tooLong = parseScenario({ ...s, chain: { ...s.chain, elongation: e } });
    expect(tooLong.ok).toBe(false);
    // …fits once enough pitches are out: each removed pitch of the worn chain (p·(1 + e)) lifts the weight by half
    // of it. Source: geometry of a 2:1 take-up (common practice, no source), as for elongation above.
    const n = Math.ceil((2 * 0.3) / (s.chain.pitch * (1 + e)));
    const fresh = simulate(s, { frameBudget: 0, series: false });
    const worn = simulate({ ...s, chain: { ...s.chain, elongation: e, linksRemoved: n } }, { frameBudget: 0, series: false });
    const expected = (e * loop) / 2 - (n * s.chain.pitch * (1 + e)) / 2;
    expect(worn.layout.takeUpStart - fresh.layout.takeUpStart).toBeCloseTo(expected, 9);
    expect(worn.layout.takeUpStart).toBeLessThanOrEqual(s.takeUp.travel);
    // Too many out and the weight would have to start above its top stop: refused with the field's path.
    const tooShort = parseScenario({ ...s, chain: { ...s.chain, linksRemoved: Math.ceil((2 * s.takeUp.position) / s.chain.pitch) + 2 } });
    expect(tooShort.ok).toBe(false);
    if (tooShort.ok) return;
    expect(tooShort.issues.find((i) => i.path === "chain.linksRemoved")?.message).toMatch(/above its top stop/);
  });
});
