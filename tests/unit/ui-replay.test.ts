import { describe, expect, it } from "vitest";
import { buildLiftDrawing, fitView, labelBesideTrack, zoomTransform } from "@/components/replay/geometry";
import { frameAt, frameIndexAt } from "@/components/replay/frames";
import { ardCatchTimes, runEvents } from "@/components/replay/events";
import { bandOf, TENSION_BANDS, viridis } from "@/components/replay/palette";
import { chainSpeedSeries, nearestSample, seriesCsv } from "@/components/plot/plotData";
import { SERIES_KEYS, type Frame, type Series } from "@/sim/frames";
import type { Summary } from "@/sim";

const lift = { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40, chainFrom: 10, chainTo: 122, dogRelease: 120, bottomRun: 4 };

describe("replay geometry", () => {
  it("puts a label beside the track on the ground side, clear of the track line", () => {
    const d = buildLiftDrawing(lift);
    const v = fitView(d.bounds, 1000, 400);
    // Mid-incline (40°): the label sits 26 px from the track along its normal, below it (larger screen y).
    const s = 15 + 30 * ((40 * Math.PI) / 180) + 25;
    const l = labelBesideTrack(d, s, v, 26);
    const th = (40 * Math.PI) / 180;
    // Distance from the track line through `at` with screen direction (cos θ, −sin θ).
    const dist = Math.abs((l.x - l.at.x) * Math.sin(th) + (l.y - l.at.y) * Math.cos(th));
    expect(dist).toBeCloseTo(26, 6);
    expect(l.y).toBeGreaterThan(l.at.y);
    expect(l.align).toBe("left");
  });

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

// Hand-made frames, summary and series with known values: the expectations come from arithmetic on
// these numbers, never from the output of the code under test.
const frame = (t: number, trainPosition: number, tensions: number[]): Frame => ({
  t,
  tensions,
  trainPosition,
  trainSpeed: 2,
  takeUpPosition: 0,
  sprocketAngle: 0,
  chainTravel: 0,
  dogEngaged: false,
  dogForce: 0,
  ardForce: 0,
  ardTooth: null,
  slackSegments: 0,
  driveSpeed: 2,
  trains: [{ position: trainPosition, speed: 2, present: true, dogEngaged: false, dogForce: 0, ardForce: 0, ardTeeth: [null], ardPawl: null }],
});
const frames = [frame(0, 0, [100, 200]), frame(1, 10, [300, 400]), frame(2, 30, [500, 600])];

describe("frames, events, palette and plot data", () => {
  it("finds and interpolates frames by time", () => {
    // t = 1.5 lies halfway between the frames at 1 s and 2 s: position (10 + 30) / 2 = 20 m, tensions halfway.
    expect(frameIndexAt(frames, 1.5)).toBe(1);
    const v = frameAt(frames, 1.5);
    expect(v.trainPosition).toBeCloseTo(20, 12);
    expect([...v.tensions]).toEqual([400, 500]);
    expect(frameAt(frames, -1).t).toBe(-1);
    expect(frameAt(frames, -1).trainPosition).toBe(0);
  });

  it("marks engagement, pick-up (engagement + delay), ARD catches, peak and release in time order", () => {
    const summary = { engagementTime: 1.1, pickupDelay: 0.4, peakTensionTime: 3.2, dogReleaseTime: 9 } as Summary;
    const ev = runEvents(summary, { t: [0, 1, 2, 3, 4], ardForce: [0, 0, 0, 0, 7] });
    expect(ev.map((e) => [e.kind, e.t])).toEqual([
      ["engagement", 1.1],
      ["pickup", 1.5],
      ["peak", 3.2],
      ["ard", 4],
      ["release", 9],
    ]);
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
    const t = [0, 0.5, 1];
    const series = { t, ...Object.fromEntries(SERIES_KEYS.map((k) => [k, [0, 0, 0]])), driveTension: [1000, 2500, 4000] } as Series;
    // Chain speed ramps linearly to 2 m/s over 1 s: 0, 1, 2 m/s.
    const chain = chainSpeedSeries(t, 2, 1);
    expect(chain).toEqual([0, 1, 2]);
    const csv = seriesCsv(series, chain, "si").trim().split("\n");
    expect(csv).toHaveLength(4);
    const head = csv[0].split(",");
    expect(head[0]).toBe("time (s)");
    const drive = head.indexOf("Chain tension: At the drive (kN)");
    expect(drive).toBeGreaterThan(0);
    // 2500 N = 2.5 kN.
    expect(Number(csv[2].split(",")[drive])).toBeCloseTo(2.5, 12);
    expect(csv[1].split(",")).toHaveLength(head.length);
    expect(nearestSample(t, 0.7)).toBe(1);
    expect(nearestSample(t, 0.8)).toBe(2);
  });
});

describe("replay zoom", () => {
  it("centres the zoomed view on the point and stops at the drawing's edges", () => {
    // ×4 on a 1000 × 400 canvas centred on (500, 200): the point stays mid-canvas, shift −1500, −600.
    expect(zoomTransform(4, { x: 500, y: 200 }, 1000, 400)).toEqual({ scale: 4, x: -1500, y: -600 });
    // Near the left/top corner the view stops at the edge instead of showing beyond the drawing.
    expect(zoomTransform(4, { x: 10, y: 10 }, 1000, 400)).toEqual({ scale: 4, x: 0, y: 0 });
    // … and at the right/bottom edge: shift at most width − 4 × width.
    expect(zoomTransform(4, { x: 995, y: 399 }, 1000, 400)).toEqual({ scale: 4, x: -3000, y: -1200 });
    expect(zoomTransform(1, { x: 995, y: 399 }, 1000, 400)).toEqual({ scale: 1, x: 0, y: 0 });
  });
});
