import { describe, expect, it } from "vitest";
import { buildLiftDrawing, fitView } from "@/components/replay/geometry";
import { frameAt, frameIndexAt } from "@/components/replay/frames";
import { ardCatchTimes, runEvents } from "@/components/replay/events";
import { bandOf, TENSION_BANDS, viridis } from "@/components/replay/palette";
import { chainSpeedSeries, nearestSample, seriesCsv } from "@/components/plot/plotData";
import { simulate } from "@/sim";
import example from "@/sim/examples/lift-hill-example.json";

const lift = { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40, chainFrom: 10, chainTo: 122, dogRelease: 120, bottomRun: 4 };

describe("replay geometry", () => {
  it("lays the chain loop along the track: carrying strand under the track, closed loop", () => {
    const d = buildLiftDrawing(lift, { travel: 2.5, position: 1.2 });
    expect(d.loopLength).toBeCloseTo(2 * 112 + 4, 9);
    // Start and end of the loop meet (q = 0 and q = loop length are the same station).
    const a = d.chainPoint(0);
    const b = d.chainPoint(d.loopLength - 1e-9);
    expect(Math.hypot(a.x - b.x, a.z - b.z)).toBeLessThan(1e-3);
    // The top of the carrying strand sits just under the track at chainTo (within the drawing offset).
    const top = d.chainPoint(111.999);
    const tp = d.trackAt(122);
    expect(Math.hypot(top.x - tp.x, top.z - tp.z)).toBeLessThan(1);
    // Lift height: sag and crest arcs plus the incline, common geometry, no source: R(1−cos θ) terms + L sin θ.
    const th = (40 * Math.PI) / 180;
    const h = 30 * (1 - Math.cos(th)) + 50 * Math.sin(th) + 25 * (1 - Math.cos(th));
    expect(d.trackAt(d.track.length).z).toBeCloseTo(h, 6);
  });

  it("fits the drawing to scale (same factor on both axes)", () => {
    const d = buildLiftDrawing(lift);
    const v = fitView(d.bounds, 1000, 400);
    const dx = v.sx(10) - v.sx(0);
    const dz = v.sy(0) - v.sy(10);
    expect(dx).toBeCloseTo(dz, 9);
  });
});

describe("frames, events, palette and plot data on a real run", () => {
  const r = simulate({ ...example, run: { ...example.run, duration: 12 } }, { segments: 16, frameBudget: 100, sampleInterval: 0.05 });

  it("finds and interpolates frames by time", () => {
    const mid = (r.frames[10].t + r.frames[11].t) / 2;
    expect(frameIndexAt(r.frames, mid)).toBe(10);
    const v = frameAt(r.frames, mid);
    expect(v.trainPosition).toBeCloseTo((r.frames[10].trainPosition + r.frames[11].trainPosition) / 2, 9);
    expect(v.tensions.length).toBe(r.frames[0].tensions.length);
    expect(frameAt(r.frames, -1).t).toBe(-1);
  });

  it("marks the peak tension and the engagement on the timeline", () => {
    const ev = runEvents(r.summary, r.series);
    expect(ev.find((e) => e.kind === "peak")?.t).toBe(r.summary.peakTensionTime);
    expect(ev.find((e) => e.kind === "engagement")?.t).toBe(r.summary.engagementTime);
    expect(ev.map((e) => e.t)).toEqual([...ev.map((e) => e.t)].sort((a, b) => a - b));
  });

  it("counts ARD catches from the series as the summary does", () => {
    expect(ardCatchTimes({ t: [0, 1, 2, 3, 4], ardForce: [0, 5, 0, 3, 3] })).toEqual([1, 3]);
  });

  it("bands tension into the viridis scale", () => {
    expect(bandOf(0, 100)).toBe(0);
    expect(bandOf(100, 100)).toBe(TENSION_BANDS - 1);
    expect(viridis(0)).toBe("rgb(68, 1, 84)");
    expect(viridis(1)).toBe("rgb(253, 231, 37)");
  });

  it("exports every series as CSV with units in the headings", () => {
    const chain = chainSpeedSeries(r.series.t, example.drive.speed, example.drive.rampTime);
    const csv = seriesCsv(r.series, chain, "si").trim().split("\n");
    expect(csv).toHaveLength(r.series.t.length + 1);
    expect(csv[0]).toContain("time (s)");
    expect(csv[0]).toContain("Chain tension: At the drive (kN)");
    expect(csv[1].split(",")).toHaveLength(csv[0].split(",").length);
    expect(nearestSample(r.series.t, r.summary.peakTensionTime)).toBeGreaterThan(0);
  });
});
