import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { scenario } from "./scenarios";

describe("energy balance", () => {
  it("closes with damping and friction set to zero", () => {
    // Source: conservation of energy: drive work = Δ(kinetic + potential + elastic) when nothing dissipates.
    const s = scenario({
      chain: { damping: 0, guideFriction: 0 },
      train: { rollingResistance: 0, dragArea: 0 },
      takeUp: { friction: 0 },
      run: { duration: 25, segments: 30, contactDamping: 0 },
    });
    const r = simulate(s, { frameBudget: 0, series: false });
    expect(r.diagnostics.dissipated).toBe(0);
    // Tolerance 1 %: velocity Verlet's bounded energy error and penalty contacts closing within one step.
    expect(r.summary.energyResidual!).toBeLessThan(0.01);
  });

  it("closes with the default damping and friction counted as dissipated", () => {
    const r = simulate(scenario({ run: { duration: 25, segments: 30 } }), { frameBudget: 0, series: false });
    expect(r.diagnostics.dissipated as number).toBeGreaterThan(0);
    expect(r.summary.energyResidual!).toBeLessThan(0.01);
  });
});

describe("convergence", () => {
  it("doubling the segments changes peak tension and take-up excursion by less than 2 %", () => {
    // Source: a correctly built lumped mass–spring model converges to the continuum (Harrison 1992;
    // Nordell & Ciozda 1984); the 2 % criterion is an assumption (sim/README.md, validation).
    const s = scenario({ run: { duration: 22 } });
    const a = simulate(s, { segments: 60, frameBudget: 0, series: false }).summary;
    const b = simulate(s, { segments: 120, frameBudget: 0, series: false }).summary;
    expect(Math.abs(a.peakTension - b.peakTension) / b.peakTension).toBeLessThan(0.02);
    expect(Math.abs(a.takeUpMaxDrop - b.takeUpMaxDrop) / b.takeUpMaxDrop).toBeLessThan(0.02);
  });
});
