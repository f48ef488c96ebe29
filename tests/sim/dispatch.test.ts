/**
 * The dispatch study's cases (lib/studies/dispatch.ts builds them: the scenario's train again one interval later)
 * on the engine: with both trains carried up the incline the drive holds the slack side plus both trains' loads,
 * and a following train picked up long after the first has left the chain sees the first train's peak again.
 */
import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { dispatchScenario } from "@/lib/studies/dispatch";
import { scenario, standingTrain, G } from "./scenarios";

function dispatched(base: ReturnType<typeof scenario>, interval: number) {
  const d = dispatchScenario(base, interval);
  if (!d.ok) throw new Error(d.issues[0].message);
  return d.scenario;
}

describe("a dispatch case: two trains on the incline", () => {
  // The standing train of tests/sim/scenarios.ts (no guide friction, no drag) at 2 m/s; the second train
  // appears where the first stood, 20 s later, and is picked up there. Both then climb the 120 m incline.
  const base = standingTrain({ drive: { speed: 2 }, takeUp: { friction: 0 }, run: { duration: 12, segments: 60 } });
  const s = dispatched(base, 20);
  const r = simulate(s, { frameBudget: 0 });
  const t1 = s.trains[0];
  const th = (s.lift.angle! * Math.PI) / 180;
  const F = t1.cars * t1.carMass * G * (Math.sin(th) + t1.rollingResistance * Math.cos(th));

  it("has the second train one interval later and a run long enough for its crest", () => {
    expect(s.trains).toHaveLength(2);
    expect(s.trains[1].startTime).toBe(20);
    expect(s.trains[1].startPosition).toBe(t1.startPosition);
    // The second train's dog must reach the release point: 20 s + (distance to the release at 2 m/s).
    const toRelease = (s.lift.dogRelease + t1.dogOffset - t1.startPosition) / s.drive.speed;
    expect(s.run.duration).toBeGreaterThan(20 + toRelease);
    expect(r.summary.trains[1].engagementTime).not.toBeNull();
  });

  it("steady drive tension with both trains carried = slack tension + F₁ + F₂", () => {
    // Source: A train pulled up an incline needs m·g·(sin θ + C_rr·cos θ) (docs/references.md, statics entries;
    // Meriam & Kraige, a body on an incline); the chain's own weight up the carrying strand is returned down the
    // return strand, so the tight side at the drive carries the slack side plus both dog loads; a 2:1 take-up
    // holds the slack side at M·g/2 (common practice, no source).
    const series = r.series!;
    // Both trains carried at chain speed: from a few surge periods after the second pick-up until the first
    // train's front nears the crest (it started 20 m up the 120 m incline and climbs at 2 m/s).
    const from = r.summary.trains[1].engagementTime! + 6;
    const to = (100 - 10) / s.drive.speed;
    const window = series.t.map((t, i) => [t, series.driveTension[i]] as const).filter(([t]) => t >= from && t <= to);
    expect(window.length).toBeGreaterThan(50);
    const mean = window.reduce((a, [, T]) => a + T, 0) / window.length;
    const expected = (s.takeUp.mass * G) / 2 + 2 * F;
    expect(Math.abs(mean - expected) / expected).toBeLessThan(0.02);
  });
});

describe("a dispatch case with a long interval", () => {
  it("peaks at the single train's peak tension: the two pick-ups do not interact", () => {
    // The example lift with a motor that holds its speed exactly and a dashpot on the take-up, so the chain's own
    // ringing dies out between trains; the first train appears once the drive is at speed, as the second finds
    // it. In 80 s the chain moves 200 m, a whole number of catch spacings (2 m): the catch meets the second train
    // as it met the first.
    const base = scenario({ run: { duration: 50, segments: 40 } });
    base.drive.motor = { kind: "ideal" };
    base.takeUp.damping = 15000;
    base.trains[0].startTime = base.drive.rampTime;
    const interval = 80;
    expect((base.drive.speed * interval) % base.chain.catchSpacing).toBe(0);
    const single = simulate(base, { frameBudget: 0, series: false }).summary;
    const two = simulate(dispatched(base, interval), { frameBudget: 0 });
    expect(two.summary.trains).toHaveLength(2);
    expect(two.summary.trains[1].engagementTime).toBeGreaterThan(base.trains[0].startTime + interval);
    // Source: the equations of motion do not depend on the time (a time-invariant system, Rao, Mechanical
    // Vibrations) and the first train's release surge has died out before the second pick-up (viscously damped
    // free vibration, same source): the second pick-up repeats the first, so the case peaks at the single train's
    // peak tension.
    expect(Math.abs(two.summary.peakDriveTension - single.peakDriveTension) / single.peakDriveTension).toBeLessThan(0.01);
    expect(Math.abs(two.summary.peakTension - single.peakTension) / single.peakTension).toBeLessThan(0.01);
    const series = two.series!;
    const peakOf = (from: number, to: number) => Math.max(...series.driveTension.filter((_, i) => series.t[i] >= from && series.t[i] < to));
    const first = peakOf(0, base.trains[0].startTime + interval);
    const second = peakOf(base.trains[0].startTime + interval, Infinity);
    expect(Math.abs(second - first) / first).toBeLessThan(0.01);
  });
});

describe("a train that reaches the end of the track while another is still on the lift", () => {
  it("leaves the model and the run goes on until the following train has crested", () => {
    // The first train climbs from 20 m up the 120 m incline at 4 m/s and runs off the 20 m exit at about 35 s;
    // the second, sent 25 s later, is still on the chain then.
    const base = standingTrain({ drive: { speed: 4 }, takeUp: { friction: 0 }, run: { duration: 12, segments: 30 } });
    const s = dispatched(base, 25);
    const r = simulate(s, { frameBudget: 0, series: false });
    const [first, second] = r.summary.trains;
    expect(first.dogReleaseTime).not.toBeNull();
    expect(second.dogReleaseTime).not.toBeNull();
    expect(second.dogReleaseTime!).toBeGreaterThan(first.dogReleaseTime!);
    expect(r.notes.some((n) => /1 of 2 trains left the track/.test(n))).toBe(true);
    // Source: conservation of energy (Meriam & Kraige, work–energy): the train's kinetic and potential energy
    // leaves the model with it, so the balance still closes.
    expect(r.summary.energyResidual!).toBeLessThan(0.01);
  });
});
