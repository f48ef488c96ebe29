import { describe, expect, it } from "vitest";
import { runEvents, PICKUP_AFTER_RESTART } from "@/components/replay/events";
import type { StopFigures, Summary, TrainSummary } from "@/sim";

// Hand-made summaries with known times: every expected time is plain arithmetic on these numbers
// (engagement + pick-up delay, restart + restart-to-pick-up), never the output of the engine.
const stopFigures = (time: number, restartTime: number | null, restartToPickup: number | null) => ({ time, kind: "brake", restartTime, restartToPickup }) as StopFigures;
const trainSummary = (x: Partial<TrainSummary>): TrainSummary =>
  ({ engagementTime: null, pickupDelay: null, dogReleaseTime: null, stop: null, release: null, ...x }) as TrainSummary;
const release = (time: number, reengagedAt: number | null) => ({ time, position: 120, speed: 2, kineticEnergy: 1, rise: 1, energyNeeded: 1, margin: 1, reengagedAt });

describe("replay timeline events", () => {
  it("marks each train's engagement, pick-up, catches, release and re-engagement, the drive's stop and restart, and the peak, saying which train", () => {
    const t1 = trainSummary({ engagementTime: 2, pickupDelay: 0.5, stop: stopFigures(10, 14, 1.25), release: release(30, 31.5), dogReleaseTime: 30 });
    const t2 = trainSummary({ engagementTime: 12, pickupDelay: 0, stop: stopFigures(10, 14, 2), release: release(40, null) });
    const summary = { ...t1, peakTensionTime: 3.2, simulatedTime: 50, stop: t1.stop, trains: [t1, t2] } as unknown as Summary;
    // Train 1 lands on the ARD at 11 s (after the stop), train 2 at 4 s and again at 10.5 s.
    const series = {
      t: [0, 4, 5, 10.5, 11, 12],
      ardForce: [0, 0, 0, 0, 9, 9],
      trains: [{ ardForce: [0, 0, 0, 0, 9, 9] }, { ardForce: [0, 3, 0, 4, 4, 0] }],
    };
    const ev = runEvents(summary, series);
    expect(ev.map((e) => [e.t, e.kind, e.label, e.train])).toEqual([
      [2, "engagement", "Train 1: Dog engages", 0],
      [2.5, "pickup", "Train 1: Pick-up", 0],
      [3.2, "peak", "Peak tension", null],
      [4, "ard", "Train 2: ARD catch", 1],
      [10, "stop", "Drive stops", null],
      [10.5, "ard", "Train 2: ARD catch", 1],
      [11, "ard", "Train 1: ARD catch", 0],
      [12, "engagement", "Train 2: Dog engages", 1],
      [12, "pickup", "Train 2: Pick-up", 1],
      [14, "restart", "Drive restarts", null],
      [15.25, "pickup", `Train 1: ${PICKUP_AFTER_RESTART}`, 0],
      [16, "pickup", `Train 2: ${PICKUP_AFTER_RESTART}`, 1],
      [30, "release", "Train 1: Dog release", 0],
      [31.5, "reengage", "Train 1: Dog re-engages after release", 0],
      [40, "release", "Train 2: Dog release", 1],
    ]);
  });

  it("with one train, labels need no train number; the first catch is where 'Go to the catch' goes", () => {
    const t1 = trainSummary({ engagementTime: 1.1, pickupDelay: 0.4, dogReleaseTime: 9 });
    const summary = { ...t1, peakTensionTime: 3.2, simulatedTime: 20, stop: null, trains: [t1] } as unknown as Summary;
    const ev = runEvents(summary, { t: [0, 1, 2, 3, 4], ardForce: [0, 0, 0, 0, 7], trains: [{ ardForce: [0, 0, 0, 0, 7] }] });
    expect(ev.map((e) => [e.kind, e.t, e.label])).toEqual([
      ["engagement", 1.1, "Dog engages"],
      ["pickup", 1.5, "Pick-up"],
      ["peak", 3.2, "Peak tension"],
      ["ard", 4, "ARD catch"],
      ["release", 9, "Dog release"],
    ]);
  });

  it("marks a stop and restart no train lived from the scenario's drive, within the simulated time", () => {
    const t1 = trainSummary({});
    const summary = { ...t1, peakTensionTime: 1, simulatedTime: 20, stop: null, trains: [t1] } as unknown as Summary;
    const ev = runEvents(summary, { t: [0], ardForce: [0] }, { stop: { time: 5 }, restart: { time: 25 } });
    expect(ev.map((e) => [e.kind, e.t])).toEqual([
      ["peak", 1],
      ["stop", 5],
    ]);
  });

  it("reads a summary stored before per-train figures (flat keys only)", () => {
    const summary = { engagementTime: 1, pickupDelay: 0.25, peakTensionTime: 2, dogReleaseTime: 8, stop: null, release: null } as unknown as Summary;
    const ev = runEvents(summary, { t: [0, 3], ardForce: [0, 5] });
    expect(ev.map((e) => [e.kind, e.t, e.train])).toEqual([
      ["engagement", 1, 0],
      ["pickup", 1.25, 0],
      ["peak", 2, null],
      ["ard", 3, 0],
      ["release", 8, 0],
    ]);
  });
});
