import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { SimulationError } from "@/sim/errors";
import { parseScenario } from "@/sim/schema";
import { simulate } from "@/sim/simulate";
import { designStatics } from "@/sim/statics";
import { exampleInput } from "./scenarios";

const finite = (v: unknown): boolean =>
  typeof v === "number" ? Number.isFinite(v) : v && typeof v === "object" ? Object.values(v).every(finite) : true;

describe("hostile but valid scenarios", () => {
  it("end with a finite result or a budget diagnostic, never NaN or an instability", () => {
    const outcomes: Record<string, number> = {};
    fc.assert(
      fc.property(
        fc.record({
          angle: fc.double({ min: 2, max: 80, noNaN: true }),
          EA: fc.double({ min: 1e5, max: 1e10, noNaN: true }),
          mu: fc.double({ min: 0.5, max: 300, noNaN: true }),
          mass: fc.double({ min: 10, max: 200000, noNaN: true }),
          cars: fc.integer({ min: 1, max: 40 }),
          carMass: fc.double({ min: 10, max: 50000, noNaN: true }),
          speed: fc.double({ min: 0.01, max: 10, noNaN: true }),
          ramp: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 5, noNaN: true })),
          segments: fc.integer({ min: 4, max: 30 }),
          damping: fc.double({ min: 0, max: 1e7, noNaN: true }),
          friction: fc.double({ min: 0, max: 0.5, noNaN: true }),
          entry: fc.double({ min: 0, max: 30, noNaN: true }),
          start: fc.double({ min: 0, max: 140, noNaN: true }),
          position: fc.double({ min: 0, max: 1, noNaN: true }),
          takeUpFriction: fc.double({ min: 0, max: 1e5, noNaN: true }),
          ard: fc.boolean(),
          odex: fc.boolean(),
        }),
        (p) => {
          const s = exampleInput() as unknown as Record<string, Record<string, unknown>>;
          Object.assign(s.lift, { angle: p.angle });
          Object.assign(s.chain, { axialStiffness: p.EA, massPerLength: p.mu, damping: p.damping, guideFriction: p.friction });
          Object.assign(s.takeUp, { mass: p.mass, position: p.position * 2.5, friction: p.takeUpFriction });
          Object.assign(s.train, { cars: p.cars, carMass: p.carMass, entrySpeed: p.entry, startPosition: p.start });
          Object.assign(s.drive, { speed: p.speed, rampTime: p.ramp });
          s.antiRollback.enabled = p.ard;
          s.run = { duration: 0.5, segments: p.segments, integrator: p.odex ? "odex" : "verlet" };
          const parsed = parseScenario(s);
          if (!parsed.ok) return true;
          expect(finite(designStatics(parsed.scenario).worst)).toBe(true);
          try {
            const r = simulate(parsed.scenario, { frameBudget: 10, budget: { wallTimeMs: 1500, maxSteps: 100_000 } });
            outcomes.done = (outcomes.done ?? 0) + 1;
            return finite(r.summary) && finite(r.frames) && finite(r.series);
          } catch (e) {
            if (!(e instanceof SimulationError)) throw e;
            outcomes[e.code] = (outcomes[e.code] ?? 0) + 1;
            // Budgets are acceptable endings; instabilities are not.
            return e.code === "budget-steps" || e.code === "budget-time";
          }
        },
      ),
      { numRuns: 40, seed: 20261201 },
    );
    expect(outcomes.done ?? 0).toBeGreaterThan(5);
  });
});
