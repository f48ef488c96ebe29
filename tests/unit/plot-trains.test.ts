import { describe, expect, it } from "vitest";
import type { Series } from "@/sim";
import { SERIES_KEYS } from "@/sim/frames";
import { chainSpeedOf, panelData, panelsFor, seriesCsv } from "@/components/plot/plotData";

/** A three-sample run with two trains (values chosen so the unit conversions are exact). */
function twoTrains(): Series {
  const s = { t: [0, 1, 2], trains: [] } as unknown as Series;
  for (const k of SERIES_KEYS) s[k] = [0, 0, 0];
  s.driveSpeed = [0, 0.6096, 0.59];
  s.trains = [
    { position: [0, 1, 2], speed: [0.3048, 0.6096, 0.6], dogForce: [0, 1000, 2000], ardForce: [0, 0, 0] },
    { position: [-20, -19, -18], speed: [0, 0.3048, 0.6], dogForce: [0, 0, 4448.2216152605], ardForce: [500, 0, 0] },
  ];
  return s;
}

describe("plots of a run", () => {
  it("draw the chain speed the engine computed at the drive, not the set ramp", () => {
    const s = twoTrains();
    // The set ramp would give 2.5 m/s at t = 2 s; the drive's own speed there is 0.59 m/s (slip, surge).
    expect(chainSpeedOf(s, 2.5, 2)).toEqual([0, 0.6096, 0.59]);
    // A run stored without the drive's speed falls back to the ramp: 2.5 × t / 2 (linear ramp).
    const old = { ...s, driveSpeed: [] as number[] };
    expect(chainSpeedOf(old, 2.5, 2)).toEqual([0, 1.25, 2.5]);
  });

  it("draw one speed and one dog-force line per train on the shared time axis, named in the legend", () => {
    const s = twoTrains();
    const panels = panelsFor(s);
    const speed = panels.find((p) => p.id === "speed")!;
    expect(speed.lines.map((l) => l.label)).toEqual(["Train, train 1", "Train, train 2", "Chain (drive)"]);
    // Source: 1 ft = 0.3048 m exactly (NIST SP 811): 0.3048 m/s = 1 ft/s.
    const us = panelData(speed, s, { chainSpeed: chainSpeedOf(s, 2.5, 2) }, "us");
    expect(us[0]).toEqual([0, 1, 2]);
    expect(us[2][1]).toBeCloseTo(1, 9);
    expect(us[3][1]).toBeCloseTo(2, 9);
    const forces = panels.find((p) => p.id === "forces")!;
    expect(forces.lines.map((l) => l.label)).toEqual(["Dog, train 1", "Dog, train 2", "ARD, train 1", "ARD, train 2"]);
    // Source: 1 lbf = 4.4482216152605 N exactly (NIST SP 811), so 4448.2216152605 N is 1 kip.
    const f = panelData(forces, s, { chainSpeed: [] }, "us");
    expect(f[2][2]).toBeCloseTo(1, 9);
    const csv = seriesCsv(s, chainSpeedOf(s, 2.5, 2), "si").split("\n")[0];
    expect(csv).toContain("Train speed: Train, train 2 (m/s)");
    expect(csv).toContain("Dog and ARD forces: Dog, train 2 (kN)");
  });

  it("keep the single-train panels for one train", () => {
    const s = twoTrains();
    s.trains = s.trains.slice(0, 1);
    expect(panelsFor(s).find((p) => p.id === "speed")!.lines.map((l) => l.key)).toEqual(["trainSpeed", "chainSpeed"]);
  });
});
