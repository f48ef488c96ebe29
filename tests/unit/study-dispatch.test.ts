/** The dispatch study's parameter, its cases' trains and run, and the mark of a pick-up in the release surge. */
import { describe, expect, it } from "vitest";
import { createStudySchema, PARAMETER_LABELS } from "@/lib/studies/schema";
import { clearingTime, crestTime, dispatchScenario, dispatchTimes, pickupMeetsReleaseSurge } from "@/lib/studies/dispatch";
import { caseScenario } from "@/lib/studies/cases";
import { headlineOf } from "@/lib/studies/headline";
import { scenario } from "../sim/scenarios";

const body = (parameter: Record<string, unknown>) => ({ scenarioId: 1, name: "Dispatch", parameters: [parameter] });

describe("the dispatch interval parameter", () => {
  it("is a time in seconds", () => {
    expect(PARAMETER_LABELS.dispatchInterval).toEqual({ label: "Dispatch interval", quantity: "time" });
  });

  it("refuses intervals outside its bounds in words with the unit", () => {
    const low = createStudySchema.safeParse(body({ key: "dispatchInterval", range: { from: 2, to: 30, step: 10 } }));
    expect(low.success).toBe(false);
    expect(low.error!.issues.map((i) => i.message)).toContain("Dispatch interval must be at least 5 s");
    expect(low.error!.issues.find((i) => i.message.startsWith("Dispatch"))!.path).toEqual(["parameters", 0, "range", "from"]);
    const high = createStudySchema.safeParse(body({ key: "dispatchInterval", values: [20, 400] }));
    expect(high.success).toBe(false);
    expect(high.error!.issues.map((i) => i.message)).toContain("Dispatch interval must be at most 300 s");
    expect(createStudySchema.safeParse(body({ key: "dispatchInterval", range: { from: 20, to: 40, step: 10 } })).success).toBe(true);
  });
});

describe("a dispatch case", () => {
  const base = scenario({ run: { duration: 50, segments: 30 } });

  it("adds the scenario's train again one interval later, the same in every other way", () => {
    const r = dispatchScenario(base, 30);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const [a, b] = r.scenario.trains;
    expect(b).toEqual({ ...a, startTime: a.startTime + 30 });
    expect(base.trains).toHaveLength(1); // the base is left alone
  });

  it("puts train i of a several-train scenario at the first train's start + i·interval", () => {
    const three = structuredClone(base);
    three.trains = [0, 1, 2].map((i) => ({ ...base.trains[0], startTime: 3 + i * 50 }));
    const r = dispatchScenario(three, 20);
    if (!r.ok) throw new Error(r.issues[0].message);
    expect(r.scenario.trains.map((t) => t.startTime)).toEqual([3, 23, 43]);
  });

  it("runs long enough to carry the last train over the crest", () => {
    const r = dispatchScenario(base, 40);
    if (!r.ok) throw new Error(r.issues[0].message);
    // Source: kinematics, time = distance / speed (from memory): the dog's way from the train's start to the
    // release point at chain speed, after the drive's ramp.
    const t = base.trains[0];
    const toRelease = (base.lift.dogRelease + t.dogOffset - t.startPosition) / base.drive.speed + base.drive.rampTime;
    expect(crestTime(base)).toBeCloseTo(toRelease, 9);
    expect(r.scenario.run.duration).toBeGreaterThanOrEqual(40 + toRelease);
    expect(r.scenario.run.duration).toBeLessThanOrEqual(40 + toRelease + 11);
  });

  it("refuses an interval shorter than the time the train needs to clear its length, and a run past 600 s", () => {
    // Source: kinematics (from memory): a train of n cars of length l carried at chain speed v clears its length in n·l/v.
    const t = base.trains[0];
    expect(clearingTime(base)).toBeCloseTo((t.cars * t.carLength) / base.drive.speed, 9);
    const short = dispatchScenario(base, 5);
    expect(short.ok).toBe(false);
    if (!short.ok) expect(short.issues[0].message).toMatch(/^Dispatch interval 5 s is shorter than the \d+\.\d s .* at least \d+(\.\d)? s$/);
    const long = caseScenario(base, { dispatchInterval: 590 }, { chains: new Map(), train: { carMassEmpty: 1000, seatsPerCar: 4, riderMass: 80 } });
    expect(long.ok).toBe(false);
    if (!long.ok) expect(long.issues[0].message).toMatch(/needs a run of \d+ s .* at most 600 s$/);
  });

  it("copies the case's other values into the following train (entry speed applied first)", () => {
    const r = caseScenario(base, { dispatchInterval: 30, entrySpeed: 1.5 }, { chains: new Map(), train: { carMassEmpty: 1000, seatsPerCar: 4, riderMass: 80 } });
    if (!r.ok) throw new Error(r.issues[0].message);
    expect(r.scenario.trains.map((t) => t.entrySpeed)).toEqual([1.5, 1.5]);
  });
});

describe("the pick-up in the release surge", () => {
  const trainFigures = (o: Record<string, unknown>) => ({ engagementTime: null, pickupDelay: null, release: null, dogReleaseTime: null, surgePeriod: null, ...o });

  it("reads the second pick-up, the first release and the surge period from the per-train figures", () => {
    const summary = {
      trains: [
        trainFigures({ engagementTime: 2, pickupDelay: 0.3, release: { time: 44 }, surgePeriod: 2 }),
        trainFigures({ engagementTime: 43, pickupDelay: 0.5, release: null }),
      ],
    } as never;
    expect(dispatchTimes(summary)).toEqual({ secondPickupTime: 43.5, firstReleaseTime: 44, surgePeriod: 2, lastTrainCrested: false });
    const h = headlineOf({ peakTension: 1, trains: (summary as { trains: unknown[] }).trains });
    expect(h.secondPickupTime).toBe(43.5);
    expect(h.lastTrainCrested).toBe(0);
  });

  it("marks a pick-up within one surge period of the release, either side, and nothing when a time is missing", () => {
    expect(pickupMeetsReleaseSurge({ secondPickupTime: 45.9, firstReleaseTime: 44, surgePeriod: 2 })).toBe(true);
    expect(pickupMeetsReleaseSurge({ secondPickupTime: 42.1, firstReleaseTime: 44, surgePeriod: 2 })).toBe(true);
    expect(pickupMeetsReleaseSurge({ secondPickupTime: 46.5, firstReleaseTime: 44, surgePeriod: 2 })).toBe(false);
    expect(pickupMeetsReleaseSurge({ secondPickupTime: 30, firstReleaseTime: 44, surgePeriod: 2 })).toBe(false);
    expect(pickupMeetsReleaseSurge({ secondPickupTime: 45, firstReleaseTime: null, surgePeriod: 2 })).toBeNull();
    expect(pickupMeetsReleaseSurge({ secondPickupTime: 45, firstReleaseTime: 44, surgePeriod: null })).toBeNull();
  });

  it("is empty for a one-train case", () => {
    expect(dispatchTimes({ trains: [trainFigures({ engagementTime: 2 })] } as never).secondPickupTime).toBeNull();
  });
});
