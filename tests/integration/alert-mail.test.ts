import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createEntry, getTrend } from "@/lib/logbook/service";
import { getModels } from "@/models";
import { closeDb, expectHttpError } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;
let other: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("alert");
  other = await opsWorld("alert-other");
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

const DAY = 86_400_000;

describe("logbook alerts", () => {
  it("e-mails the lift's organisation's engineers once when a take-up reading crosses the limit", async () => {
    const { User, Alert } = getModels();
    const engineer = await User.findByPk(w.as.engineer.id);
    const trend = await getTrend(w.as.operator, w.liftId);
    // Example lift hill: travel 2.5 m; the limit keeps the statics' hot-day reserve at the bottom.
    expect(trend.takeUp.limit).toBeLessThan(2.5);
    expect(trend.takeUp.thermalReserve).toBeGreaterThan(0);
    const before = (await fakes.messages()).length;
    const now = Date.now();
    await createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position: 1.2, measuredAt: new Date(now - 20 * DAY).toISOString() });
    const first = await createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position: trend.takeUp.limit + 0.01, measuredAt: new Date(now - DAY).toISOString() });
    expect(first.alerts.map((a) => a.kind)).toContain("take-up-limit");
    const again = await createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position: trend.takeUp.limit + 0.02 });
    expect(again.alerts.map((a) => a.kind)).not.toContain("take-up-limit");
    const mine = (await fakes.messages()).slice(0, (await fakes.messages()).length - before).filter((m) => m.subject.includes("Limit reached"));
    expect(mine).toHaveLength(1);
    // Source: README "Alerts" — the organisation's ride engineers get one e-mail per alert, nobody else.
    expect(mine[0].to).toEqual([engineer!.email]);
    expect(mine[0].text).toContain("below the top stop");
    const row = await Alert.findOne({ where: { liftId: w.liftId, kind: "take-up-limit" } });
    expect(row!.emailedAt).not.toBeNull();
    expect(row!.recipients).toEqual([engineer!.email]);
  });

  it("clears the take-up alerts when links are removed and shows the expected reset", async () => {
    const r = await createEntry(w.as.operator, { kind: "links-removed", liftId: w.liftId, links: 4 });
    // 4 links × 0.1016 m pitch, halved by the 2:1 take-up.
    expect(r.computed.rise).toBeCloseTo(0.2032, 9);
    const trend = await getTrend(w.as.viewer, w.liftId);
    expect(trend.alerts.filter((a) => a.kind.startsWith("take-up"))).toEqual([]);
  });

  it("refuses a reading beyond the travel with its field path and stores nothing; a viewer may not log", async () => {
    const { LogbookEntry } = getModels();
    const n = await LogbookEntry.count({ where: { liftId: w.liftId } });
    const err = await expectHttpError(() => createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position: 3 }), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["position"]);
    await expectHttpError(() => createEntry(w.as.viewer, { kind: "take-up", liftId: w.liftId, position: 1 }), 403);
    await expectHttpError(() => createEntry(other.as.operator, { kind: "take-up", liftId: w.liftId, position: 1 }), 404);
    expect(await LogbookEntry.count({ where: { liftId: w.liftId } })).toBe(n);
  });

  it("computes elongation from the measured length and raises the forecast alert inside the horizon", async () => {
    const now = Date.now();
    // 20 pitches of 0.1016 m: 1 % + 0.02 %/day → 3 % about 100 days after the first reading. Five
    // readings: the logbook dates nothing from fewer (MIN_FORECAST_READINGS).
    for (const k of [0, 15, 30, 45, 60]) {
      const e = 1 + 0.02 * k;
      await createEntry(other.as.operator, { kind: "elongation", liftId: other.liftId, pitches: 20, measuredLength: 20 * 0.1016 * (1 + e / 100), measuredAt: new Date(now - (60 - k) * DAY).toISOString() });
    }
    const trend = await getTrend(other.as.operator, other.liftId);
    expect(trend.elongation.latest).toBeCloseTo(2.2, 9);
    const crossing = new Date(trend.elongation.forecast!.crossing!).getTime();
    expect(Math.abs(crossing - (now + 40 * DAY))).toBeLessThan(DAY);
    expect(trend.alerts.map((a) => a.kind)).toContain("elongation-forecast");
  });
});
