import { describe, expect, it } from "vitest";
import { headlineDefinitions, headlineFigures, summaryForReport } from "@/lib/reports/figures";

const stored = {
  peakTension: 123456.789,
  snatchFactor: 1.1234567,
  pickupDelay: 0,
  timeToChainSpeed: 1.23,
  steadyChainSpeed: 0.6096,
  surgeAmplitude: 0.3048,
  surgeDampingRatio: 0.034,
  wallTimeMs: 812,
  steps: 4000,
  trains: [
    { peakDogForce: 41234.56789, timeToChainSpeed: 1.23 },
    { peakDogForce: 38000.1, timeToChainSpeed: null },
  ],
  riderAccelExposure: { forward: [0.5, 0.2, 0], backward: [0.1, 0] },
};

describe("a run's summary in a report", () => {
  it("keeps structured figures whole and rounds only scalar figures", () => {
    const s = summaryForReport(stored);
    // Source: 123456.789 to 6 significant digits is 123457.
    expect(s.peakTension).toBe(123457);
    expect(s.snatchFactor).toBe(1.12346);
    expect(s.trains).toEqual(stored.trains);
    expect(s.riderAccelExposure).toEqual(stored.riderAccelExposure);
    expect("wallTimeMs" in s).toBe(false);
    expect("steps" in s).toBe(false);
  });

  it("prints both pick-up figures and the surge, in the report's units", () => {
    const si = new Map(headlineFigures({ units: "si", run: { id: 1, finishedAt: null, summary: summaryForReport(stored) } }));
    expect(si.get("Load pick-up delay")).toBe("0.00 s");
    expect(si.get("Time to chain speed")).toBe("1.23 s");
    expect(si.get("Surge amplitude (train speed, ±)")).toBe("0.305 m/s");
    expect(si.get("Surge damping ratio")).toBe("3.4 %");
    // Source: 1 ft = 0.3048 m exactly (NIST SP 811), so 0.3048 m/s is 1 ft/s and 0.6096 m/s is 2 ft/s.
    const us = new Map(headlineFigures({ units: "us", run: { id: 1, finishedAt: null, summary: summaryForReport(stored) } }));
    expect(us.get("Surge amplitude (train speed, ±)")).toBe("1.000 ft/s");
    expect(us.get("Steady chain speed")).toBe("2.000 ft/s");
  });

  it("says when the surge damping ratio could not be measured, and leaves out figures older runs lack", () => {
    const f = new Map(headlineFigures({ units: "si", run: { id: 1, finishedAt: null, summary: summaryForReport({ ...stored, surgeDampingRatio: null }) } }));
    expect(f.get("Surge damping ratio")).toMatch(/not measured/);
    const old = new Map(headlineFigures({ units: "si", run: { id: 1, finishedAt: null, summary: summaryForReport({ peakTension: 1000, pickupDelay: 0.4 }) } }));
    expect(old.has("Surge amplitude (train speed, ±)")).toBe(false);
    expect(old.get("Time to chain speed")).toBe("—");
  });

  it("defines each pick-up figure and the surge figures", () => {
    const d = new Map(headlineDefinitions());
    expect(d.get("Load pick-up delay")).toMatch(/first dog contact/);
    expect(d.get("Time to chain speed")).toMatch(/within 5 % of the chain speed/);
    expect(d.get("Surge damping ratio")).toMatch(/logarithmic decrement/);
    expect(d.get("Surge amplitude")).toMatch(/peak-to-peak/);
  });
});
