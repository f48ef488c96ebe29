import { describe, expect, it } from "vitest";
import { carMassFor, loadedCarMass, ridersFor } from "@/lib/trains/mass";
import { engineScenarioInput } from "@/lib/scenarios/resolve";
import { parseScenario } from "@/sim/schema";

const train = { cars: 6, carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75, carLength: 2.6, dogOffset: 1.3, rollingResistance: 0.015, dragArea: 1 };

describe("train loading", () => {
  it("loaded car mass = empty + seats × rider mass; riders spread evenly over the cars", () => {
    // Arithmetic of the definitions (lib/trains/mass.ts), no outside source needed.
    expect(loadedCarMass(train)).toBe(1300);
    expect(ridersFor(train, "empty", null)).toBe(0);
    expect(ridersFor(train, "full", null)).toBe(24);
    expect(ridersFor(train, "riders", 9)).toBe(9);
    expect(carMassFor(train, 9)).toBeCloseTo(1000 + (9 * 75) / 6, 12);
  });

  it("builds an engine scenario the format accepts, with the loading's car mass", () => {
    const raw = engineScenarioInput(
      { name: "Unit", notes: null, loading: "full", riderCount: null, entrySpeed: 2.2, startPosition: 14, runSettings: { duration: 50, segments: 60 } },
      {
        geometry: { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40, chainFrom: 10, chainTo: 122, dogRelease: 120 },
        chain: { massPerLength: 15, axialStiffness: 1.5e7, breakingStrength: 5e5, pitch: 0.1016, catchSpacing: 2, catchOffset: 10 },
        drive: { speed: 2.5, sprocketTeeth: 11 },
        takeUp: { mass: 5000, travel: 2.5, position: 1.2 },
        antiRollback: { from: 12, to: 118, toothSpacing: 0.15 },
        limits: null,
      },
      train,
    );
    const r = parseScenario(raw);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.scenario.trains[0]!.carMass).toBe(1300);
      expect(r.scenario.trains[0]!.startPosition).toBe(14);
      expect(r.scenario.limits.requiredSafetyFactor).toBe(5);
    }
  });
});
