import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MIN_FORECAST_READINGS } from "@/lib/logbook/forecast";
import { createEntry, getTrend } from "@/lib/logbook/service";
import { getModels } from "@/models";
import { closeDb } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("trend");
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

const DAY = 86_400_000;

describe("logbook trend", () => {
  it("takes seven identical elongation readings at uneven times and keeps answering the trend", async () => {
    // Constant readings used to give a slope of rounding noise, a crossing date past the Date range, a
    // stored entry answered 500, and a trend that answered 500 from then on.
    // Fixed dates in the past: with these the old slope came out +1.4e-34 %/day.
    const base = Date.UTC(2026, 9, 1);
    const ago = [59.3, 41.05, 30.4, 12.9, 11.2, 3.7, 0.2];
    // 0.21 % over 20 pitches of the lift's 0.1016 m pitch.
    const measuredLength = 20 * 0.1016 * 1.0021;
    for (const d of ago) {
      const r = await createEntry(w.as.operator, { kind: "elongation", liftId: w.liftId, pitches: 20, measuredLength, measuredAt: new Date(base - d * DAY).toISOString() });
      expect(r.alerts.filter((a) => a.kind === "elongation-forecast")).toEqual([]);
    }
    const trend = await getTrend(w.as.viewer, w.liftId);
    expect(trend.elongation.points).toHaveLength(7);
    expect(trend.elongation.forecast!.status).toBe("no-trend");
    expect(trend.elongation.forecast!.crossing).toBeNull();
    // An eighth entry after the flat history is answered and stored once.
    await createEntry(w.as.operator, { kind: "elongation", liftId: w.liftId, pitches: 20, measuredLength });
    expect(await getModels().LogbookEntry.count({ where: { liftId: w.liftId, kind: "elongation" } })).toBe(8);
  });

  it(`raises no forecast alert from fewer than ${MIN_FORECAST_READINGS} take-up readings, however steep`, async () => {
    const now = Date.now();
    const trend0 = await getTrend(w.as.viewer, w.liftId);
    // Three readings climbing fast towards the limit (no warning level reached yet).
    const levels = [0.2, 0.35, 0.5].map((f) => f * trend0.takeUp.warning);
    for (const [k, position] of levels.entries()) {
      const r = await createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position, measuredAt: new Date(now - (3 - k) * DAY).toISOString() });
      expect(r.alerts).toEqual([]);
    }
    const trend = await getTrend(w.as.viewer, w.liftId);
    expect(trend.takeUpSeries.forecast!.status).toBe("too-few");
    expect(trend.takeUpSeries.forecast!.minimumReadings).toBe(MIN_FORECAST_READINGS);
  });
});
