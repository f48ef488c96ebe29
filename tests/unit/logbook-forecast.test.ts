import { describe, expect, it } from "vitest";
import { MIN_FORECAST_READINGS, forecastCrossing, t975 } from "@/lib/logbook/forecast";
import { elongationPercent, takeUpLimits, takeUpReset } from "@/lib/logbook/measure";
import { evaluateAlerts } from "@/lib/alerts/evaluate";

const DAY = 86_400_000;
const start = Date.UTC(2026, 0, 1);

describe("logbook arithmetic", () => {
  it("computes elongation against the nominal pitch", () => {
    // 20 pitches of 101.6 mm (No. 80 roller chain, ASME B29.1) = 2032 mm nominal; 2062.48 mm is 1.5 % long.
    expect(elongationPercent(2.06248, 20, 0.1016)).toBeCloseTo(1.5, 9);
  });

  it("raises the take-up by half the chain removed (2:1 take-up)", () => {
    // Source: a 2:1 take-up moves half the chain's length change (common practice, as in sim/statics.ts).
    const r = takeUpReset(4, 0.1016, 1.6);
    expect(r.chainRemoved).toBeCloseTo(0.4064, 12);
    expect(r.rise).toBeCloseTo(0.2032, 12);
    expect(r.expectedPosition).toBeCloseTo(1.3968, 12);
  });

  it("keeps the hot-day reserve at the bottom of the travel", () => {
    expect(takeUpLimits(2.5, 0.1, 0.8)).toEqual({ limit: 2.4, warning: 2.4 * 0.8 });
  });
});

describe("trend forecast", () => {
  it("puts the crossing of an exact linear wear history on the expected date", () => {
    // 1.0 % + 0.01 %/day reaches 3 % after (3 − 1) / 0.01 = 200 days.
    const history = Array.from({ length: 8 }, (_, k) => ({ at: new Date(start + k * 20 * DAY), value: 1 + 0.01 * k * 20 }));
    const f = forecastCrossing(history, 3)!;
    expect(f.crossing!.getTime()).toBeCloseTo(start + 200 * DAY, -4); // within 10 s
    expect(f.slopePerDay).toBeCloseTo(0.01, 12);
    expect(f.residualSd!).toBeLessThan(1e-9);
    expect(Math.abs(f.crossingEarliest!.getTime() - f.crossingLatest!.getTime())).toBeLessThan(DAY);
  });

  it("brackets the expected date with a 95 % interval when the readings scatter", () => {
    const wobble = [0.03, -0.02, 0.01, -0.03, 0.02, 0, -0.01, 0.02, -0.02, 0.01];
    const history = wobble.map((w, k) => ({ at: new Date(start + k * 15 * DAY), value: 1 + 0.01 * k * 15 + w }));
    const f = forecastCrossing(history, 3)!;
    const expected = start + 200 * DAY;
    expect(f.crossingEarliest!.getTime()).toBeLessThan(f.crossing!.getTime());
    expect(f.crossingLatest!.getTime()).toBeGreaterThan(f.crossing!.getTime());
    expect(f.crossingEarliest!.getTime()).toBeLessThanOrEqual(expected);
    expect(f.crossingLatest!.getTime()).toBeGreaterThanOrEqual(expected);
    expect(Math.abs(f.crossing!.getTime() - expected)).toBeLessThan(10 * DAY);
  });

  it("gives no crossing for a flat or falling trend, and nothing from one reading", () => {
    expect(forecastCrossing([{ at: new Date(start), value: 1 }, { at: new Date(start + DAY), value: 0.9 }], 3)!.crossing).toBeNull();
    expect(forecastCrossing([{ at: new Date(start), value: 1 }], 3)).toBeNull();
  });

  it("uses Student's t for few points", () => {
    // Source: standard t table, t(0.975, 1) = 12.706, t(0.975, 10) = 2.228.
    expect(t975(1)).toBe(12.706);
    expect(t975(10)).toBe(2.228);
  });
});

describe("trend forecast on awkward histories", () => {
  // Seven identical readings at uneven times: the least-squares slope is rounding noise (~1e-34/day).
  const uneven = [0, 3.7, 11.2, 12.9, 30.4, 41.05, 59.3];
  const valid = (d: Date | null) => d === null || Number.isFinite(d.getTime());

  it("gives no date (and no invalid date) from constant readings at uneven times", () => {
    for (const v of [0.37, 1.2, 1.6, 2.2]) {
      const f = forecastCrossing(uneven.map((o) => ({ at: new Date(start + o * DAY), value: v })), 2.4)!;
      expect(f.slopePerDay).toBe(0);
      expect(f.status).toBe("no-trend");
      expect(f.crossing).toBeNull();
      expect([f.crossingEarliest, f.crossingLatest, ...f.line.map((p) => p.at)].every(valid)).toBe(true);
      expect(() => f.line.map((p) => p.at.toISOString())).not.toThrow();
    }
  });

  it("gives no date when the crossing lies beyond the search window or the Date range", () => {
    // 0.001 %/day from 1 % reaches 3 % after 2000 days (5.5 years): dated in 20 years, not in 2.
    const slow = Array.from({ length: 6 }, (_, k) => ({ at: new Date(start + k * 30 * DAY), value: 1 + 0.001 * k * 30 }));
    expect(forecastCrossing(slow, 3)!.status).toBe("dated");
    const short = forecastCrossing(slow, 3, { searchYears: 2 })!;
    expect(short.status).toBe("beyond-window");
    expect(short.crossing).toBeNull();
    // A rise of 1e-12 per day over a 1e4 scale would cross ~2.7e13 years ahead: far past any Date.
    const tiny = Array.from({ length: 6 }, (_, k) => ({ at: new Date(start + k * 30 * DAY), value: 1e4 + 1e-7 * k }));
    const t = forecastCrossing(tiny, 2e4)!;
    expect(t.crossing).toBeNull();
    expect([t.crossingEarliest, t.crossingLatest, ...t.line.map((p) => p.at)].every(valid)).toBe(true);
  });

  it(`dates nothing from fewer than ${MIN_FORECAST_READINGS} readings, however steep`, () => {
    // Two readings used to give a zero-width 95 % interval: there is no scatter estimate from two points.
    const steep = (n: number) => Array.from({ length: n }, (_, k) => ({ at: new Date(start + k * 10 * DAY), value: 1 + 0.1 * k }));
    const few = forecastCrossing(steep(MIN_FORECAST_READINGS - 1), 3)!;
    expect(few.status).toBe("too-few");
    expect(few.crossing).toBeNull();
    expect(few.line).toEqual([]);
    expect(forecastCrossing(steep(MIN_FORECAST_READINGS), 3)!.status).toBe("dated");
  });

  it("widens the interval by the readings' own scatter (prediction band of one reading)", () => {
    // Source: Draper & Smith, Applied Regression Analysis, ch. 3 — the band for a single new reading has
    // the factor √(1 + 1/n + (x − x̄)²/Sxx), the band of the line only √(1/n + (x − x̄)²/Sxx).
    const wobble = [0.03, -0.03, 0.03, -0.03, 0.03, -0.03];
    const h = wobble.map((w, k) => ({ at: new Date(start + k * 10 * DAY), value: 1 + 0.01 * k * 10 + w }));
    const f = forecastCrossing(h, 1.5)!;
    const first = f.line[0];
    const xs = h.map((_, k) => k * 10);
    const mean = xs.reduce((a, c) => a + c, 0) / xs.length;
    const sxx = xs.reduce((a, c) => a + (c - mean) ** 2, 0);
    const expected = t975(4) * f.residualSd! * Math.sqrt(1 + 1 / 6 + mean ** 2 / sxx);
    expect((first.upper - first.lower) / 2).toBeCloseTo(expected, 9);
  });
});

describe("alert levels", () => {
  const base = { liftName: "Test lift", now: new Date(start), horizonDays: 90 };
  it("raises a limit (not a warning) when the limit is reached, and a forecast inside the horizon", () => {
    const a = evaluateAlerts({
      ...base,
      elongation: { latest: 3.1, warning: 2.5, limit: 3, forecast: null },
      takeUp: { latest: 1.0, warning: 1.9, limit: 2.4, forecast: new Date(start + 30 * DAY) },
    });
    expect(a.map((x) => x.kind)).toEqual(["elongation-limit", "take-up-forecast"]);
  });
  it("raises nothing below the levels with the forecast beyond the horizon", () => {
    const a = evaluateAlerts({
      ...base,
      elongation: { latest: 1, warning: 2.5, limit: 3, forecast: new Date(start + 400 * DAY) },
      takeUp: { latest: 1, warning: 1.9, limit: 2.4, forecast: null },
    });
    expect(a).toEqual([]);
  });
});
