import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import type { Layout, Scenario } from "@/sim";
import { parseScenario } from "@/sim/schema";
import { frameAt, type FrameTrainView, type FrameView } from "@/components/replay/frames";
import type { Frame } from "@/sim";
import { paintMoving, paintOverlay, paintStatic, prepareScene } from "@/components/replay/painters";
import { catchLabel, paintPawls, CATCH_RING_LIFT, PAWL_HEIGHT } from "@/components/replay/painters/ard";
import { paintCatches } from "@/components/replay/painters/catches";
import { paintTakeUp, TAKE_UP_BOX } from "@/components/replay/painters/drive";
import { paintScaleBar } from "@/components/replay/painters/labels";
import type { CircleShape, LinesShape, Shape, TextShape } from "@/components/replay/painters/shapes";
import { ALERT } from "@/components/replay/painters/shapes";
import { paintChain } from "@/components/replay/painters/track";
import { CAR_GAP, carHeightPx, paintTrains, TRAIN_LABEL_GAP } from "@/components/replay/painters/trains";
import { viewTransform } from "@/components/replay/painters/view";
import { BAND_COLOURS, SLACK_COLOUR, TENSION_BANDS } from "@/components/replay/palette";

// The example lift: flat approach 15 m, sag R = 30 m up to 40°, incline 50 m, crest R = 25 m, exit 40 m.
const example = JSON.parse(readFileSync("sim/examples/lift-hill-example-v2.json", "utf8"));

function scenarioWith(trains: { startPosition: number; pawls: number[]; cars?: number }[]): Scenario {
  const base = example.trains[0];
  const r = parseScenario({ ...example, trains: trains.map((t) => ({ ...base, ...t })) });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.scenario;
}

// A hand-made layout of the example's loop: strands 112 m (chainFrom 10 → chainTo 122), bottom run 4 m.
const layout: Layout = {
  trackLength: 15 + 30 * ((40 * Math.PI) / 180) + 50 + 25 * ((40 * Math.PI) / 180) + 40,
  chainFrom: 10,
  chainTo: 122,
  loopLength: 228,
  strandLength: 112,
  stations: [0, 28, 56, 84, 112, 140, 168, 196, 224],
  driveStation: 4,
  takeUpStation: 8,
  topStation: 4,
  catchSpacing: 2,
  catchPoints: 114,
  takeUpStart: 1.2,
};

// Track geometry by hand (Source: plane geometry of the track profile, see docs/references.md "Replay drawing").
const TH = (40 * Math.PI) / 180;
const S_INCLINE = 15 + 30 * TH;
const X_INCLINE = 15 + 30 * Math.sin(TH);
const Z_INCLINE = 30 * (1 - Math.cos(TH));
/** World point of arc position s on the straight incline. */
const onIncline = (s: number) => ({ x: X_INCLINE + (s - S_INCLINE) * Math.cos(TH), z: Z_INCLINE + (s - S_INCLINE) * Math.sin(TH) });
const MID = S_INCLINE + 25; // mid-incline

const view = (trains: FrameTrainView[], extra: Partial<FrameView> = {}): FrameView => ({
  t: 1,
  index: 0,
  tensions: new Float64Array(layout.stations.length).fill(1000),
  trainPosition: trains[0].position,
  trainSpeed: 0,
  takeUpPosition: 0,
  sprocketAngle: 0,
  chainTravel: 0,
  dogEngaged: false,
  dogForce: 0,
  ardForce: 0,
  ardTooth: null,
  trains,
  ...extra,
});
const train = (position: number, pawls: number, carrying: number | null = null, tooth: number | null = null): FrameTrainView => ({
  position,
  present: true,
  dogEngaged: false,
  ardForce: carrying === null ? 0 : 12000,
  ardTeeth: Array.from({ length: pawls }, (_, k) => (k === carrying ? tooth : null)),
  ardPawl: carrying,
});

const of = <K extends Shape["kind"]>(shapes: Shape[], kind: K, part: string) => shapes.filter((s) => s.kind === kind && s.part === part) as Extract<Shape, { kind: K }>[];
const pts = (s: LinesShape) => {
  const a = s.paths[0];
  const out: { x: number; y: number }[] = [];
  for (let i = 0; i < a.length; i += 2) out.push({ x: a[i], y: a[i + 1] });
  return out;
};

describe("replay painters: trains and pawls", () => {
  const scenario = scenarioWith([{ startPosition: 20, pawls: [1.3] }]);
  const scene = prepareScene(scenario, layout, 1000, 400);
  const { v } = scene;

  it("draws a train whose front is at arc position s at the track's point for s, to scale, its cars standing off the track", () => {
    const shapes = paintTrains(scene, view([train(MID, 1)]));
    const cars = of(shapes, "lines", "car");
    expect(cars).toHaveLength(6);
    // Front car: its nose corner on the track at s − gap, the top corners a car height along the normal.
    const [rear, nose, noseTop] = pts(cars[0]);
    const p = onIncline(MID - CAR_GAP);
    expect(nose.x).toBeCloseTo(v.sx(p.x), 6);
    expect(nose.y).toBeCloseTo(v.sy(p.z) - 1, 6);
    // Along the track: car length − 2 gaps at the drawing's scale, in the direction (cos 40°, −sin 40°) on screen.
    const len = (2.6 - 2 * CAR_GAP) * v.k;
    expect(nose.x - rear.x).toBeCloseTo(len * Math.cos(TH), 6);
    expect(nose.y - rear.y).toBeCloseTo(-len * Math.sin(TH), 6);
    // Up off the track: the normal (−sin 40°, −cos 40°) on screen (y down), away from the ground.
    const h = carHeightPx(scene);
    expect(noseTop.x - nose.x).toBeCloseTo(-h * Math.sin(TH), 6);
    expect(noseTop.y - (nose.y + 1)).toBeCloseTo(-h * Math.cos(TH), 6);
  });

  it("draws every train of a two-train frame, each with its number, and every pawl of each at its own offset", () => {
    const two = scenarioWith([
      { startPosition: 20, pawls: [1.3, 8] },
      { startPosition: 60, pawls: [1.3, 5, 10], cars: 4 },
    ]);
    const sc = prepareScene(two, layout, 1000, 400);
    const f = view([train(MID + 20, 2), train(MID - 2, 3, 2, MID - 2 - 10 - 0.05)]);
    const shapes = paintMoving(sc, f, 5000);
    const cars = of(shapes, "lines", "car");
    expect(cars.filter((c) => c.train === 0)).toHaveLength(6);
    expect(cars.filter((c) => c.train === 1)).toHaveLength(4);
    const names = of(shapes, "text", "train-label");
    expect(names.map((t) => t.text)).toEqual(["Train 1", "Train 2"]);
    // Each number stands above its nose, a car height and more off the track, along the normal (−sin 40°, −cos 40°).
    const h = carHeightPx(sc) + TRAIN_LABEL_GAP;
    const nose2 = onIncline(MID - 2);
    expect(names[1].x).toBeCloseTo(sc.v.sx(nose2.x) - h * Math.sin(TH), 6);
    expect(names[1].y).toBeCloseTo(sc.v.sy(nose2.z) - h * Math.cos(TH), 6);
    const pawls = of(shapes, "lines", "pawl");
    expect(pawls.map((p) => [p.train, p.index])).toEqual([
      [0, 0],
      [0, 1],
      [1, 0],
      [1, 1],
      [1, 2],
    ]);
    // Each pawl's tip sits on the track at front − offset, pulled PAWL_TIP_BACK px back along it; its pivot
    // PAWL_HEIGHT px up the normal.
    const check = (p: LinesShape, s: number) => {
      const w = onIncline(s);
      const [l, r, tip] = pts(p);
      const pivot = { x: (l.x + r.x) / 2, y: (l.y + r.y) / 2 };
      expect(pivot.x).toBeCloseTo(sc.v.sx(w.x) - PAWL_HEIGHT * Math.sin(TH), 6);
      expect(pivot.y).toBeCloseTo(sc.v.sy(w.z) - PAWL_HEIGHT * Math.cos(TH), 6);
      // The tip trails behind the pivot, down the slope.
      expect(tip.x).toBeLessThan(sc.v.sx(w.x));
      expect(tip.y).toBeGreaterThan(sc.v.sy(w.z));
    };
    check(pawls[0], MID + 20 - 1.3);
    check(pawls[1], MID + 20 - 8);
    check(pawls[4], MID - 2 - 10);
    // Only train 2's third pawl carries the train: it alone is marked.
    expect(pawls.map((p) => !!p.active)).toEqual([false, false, false, false, true]);
    expect(pawls[4].fill).toBe(ALERT);
    const labels = of(shapes, "text", "catch-label");
    expect(labels.map((t) => t.text)).toEqual(["ARD catch · Train 2, pawl 3"]);
  });

  it("rings the carrying pawl's tooth, just off the track", () => {
    const tooth = MID - 1.3 - 0.05;
    const shapes = paintPawls(scene, view([train(MID, 1, 0, tooth)]));
    const [ring] = of(shapes, "circle", "catch-ring") as CircleShape[];
    const w = onIncline(tooth);
    expect(ring.x).toBeCloseTo(v.sx(w.x) - CATCH_RING_LIFT * Math.sin(TH), 6);
    expect(ring.y).toBeCloseTo(v.sy(w.z) - CATCH_RING_LIFT * Math.cos(TH), 6);
    expect(of(shapes, "text", "catch-label")[0].text).toBe("ARD catch");
    // No force: no mark, the pawl drawn plain.
    const idle = paintPawls(scene, view([train(MID, 1)]));
    expect(of(idle, "circle", "catch-ring")).toHaveLength(0);
    expect(of(idle, "lines", "pawl")[0].active).toBe(false);
  });

  it("names the train and pawl of a catch only when there is a choice", () => {
    expect(catchLabel(0, 1, 0, 1)).toBe("ARD catch");
    expect(catchLabel(1, 2, 0, 1)).toBe("ARD catch · Train 2");
    expect(catchLabel(0, 1, 1, 2)).toBe("ARD catch · pawl 2");
  });

  it("puts the catch label off the track, on the ground side, at its gap from the track line", () => {
    const tooth = MID;
    const shapes = paintPawls(scene, view([train(MID + 1.3, 1, 0, tooth)]));
    const [label] = of(shapes, "text", "catch-label") as TextShape[];
    const w = onIncline(tooth);
    const at = { x: v.sx(w.x), y: v.sy(w.z) };
    // Leader from the tooth to the label point: 30 px along the normal (sin 40°, cos 40°) toward the ground.
    const [leader] = of(shapes, "lines", "catch-label-leader");
    const [a, b] = pts(leader);
    expect(a.x).toBeCloseTo(at.x, 6);
    expect(a.y).toBeCloseTo(at.y, 6);
    expect(b.x - a.x).toBeCloseTo(30 * Math.sin(TH), 6);
    expect(b.y - a.y).toBeCloseTo(30 * Math.cos(TH), 6);
    // Clear of the whole track line drawn: no point of it within 25 px of the text's anchor.
    const [track] = of(paintStatic(scene), "lines", "track");
    const tp = track.paths[0];
    let nearest = Infinity;
    for (let i = 0; i < tp.length; i += 2) nearest = Math.min(nearest, Math.hypot(tp[i] - label.x, tp[i + 1] - label.y));
    expect(nearest).toBeGreaterThan(25);
    expect(label.align).toBe("left");
  });

  it("draws train 1 and its one pawl from a frame saved before per-train frames existed", () => {
    const tooth = MID - 1.3 - 0.05;
    const old = view([train(MID, 1)], { trains: undefined, trainPosition: MID, ardForce: 9000, ardTooth: tooth });
    const shapes = paintMoving(scene, old, 5000);
    expect(of(shapes, "lines", "car")).toHaveLength(6);
    expect(of(shapes, "lines", "pawl").map((p) => p.active)).toEqual([true]);
    expect(of(shapes, "circle", "catch-ring")).toHaveLength(1);
  });
});

describe("replay painters: chain, catch points, take-up, scale bar, view", () => {
  const scenario = scenarioWith([{ startPosition: 20, pawls: [1.3] }]);
  const scene = prepareScene(scenario, layout, 1000, 400);
  const { v } = scene;

  it("strokes each segment in its tension band, slack dashed grey", () => {
    const T = new Float64Array([0, 100, 5000, 2500, 0, 100, 100, 100, 100]);
    const shapes = paintChain(scene, { tensions: T, takeUpPosition: 0 }, 5000);
    const slack = of(shapes, "lines", "chain-slack");
    expect(slack).toHaveLength(1);
    expect(slack[0].paths).toHaveLength(2);
    expect(slack[0].stroke).toBe(SLACK_COLOUR);
    expect(slack[0].dash).toEqual([3, 3]);
    const bands = of(shapes, "lines", "chain");
    // Every segment drawn once.
    expect(bands.reduce((n, b) => n + b.paths.length, 0) + 2).toBe(9);
    // The peak (5000 of 5000 N) falls in the top band; half of it (2500 N) in band 6 of 12 (⌊0.5 × 12⌋).
    expect(bands.find((b) => b.index === TENSION_BANDS - 1)?.stroke).toBe(BAND_COLOURS[TENSION_BANDS - 1]);
    expect(bands.find((b) => b.index === 6)?.paths).toHaveLength(1);
  });

  it("moves the catch points with the chain: first one chain travel past the catch offset", () => {
    // catchOffset 10 = chainFrom: a catch at the strand's start; 0.5 m of travel puts it 0.5 m up the strand,
    // on the flat approach (track position 10.5 m), 0.45 m under the track.
    const [dots] = paintCatches(scene, { chainTravel: 0.5 }) as Extract<Shape, { kind: "dots" }>[];
    expect(dots.points[0]).toBeCloseTo(v.sx(10.5), 3);
    expect(dots.points[1]).toBeCloseTo(v.sy(-0.45), 3);
    // 112 m of strand at 2 m: 56 catch points (0.5, 2.5, … 110.5).
    expect(dots.points.length / 2).toBe(56);
  });

  it("drops the take-up weight by the true drop × the drawing's scale × the magnification", () => {
    const rest = paintTakeUp(scene, { takeUpPosition: 0 }, 20);
    const down = paintTakeUp(scene, { takeUpPosition: 0.01 }, 20);
    const weight = (s: Shape[]) => (s.find((x) => x.kind === "clip") as Extract<Shape, { kind: "clip" }>).shapes.find((x) => x.part === "takeup-weight") as Extract<Shape, { kind: "rect" }>;
    expect(weight(down).y - weight(rest).y).toBeCloseTo(0.01 * v.k * 20, 9);
    expect(weight(rest).y + 6).toBeCloseTo(TAKE_UP_BOX.y + TAKE_UP_BOX.title + (TAKE_UP_BOX.h - TAKE_UP_BOX.title) / 2, 9);
    expect(down.find((s) => s.part === "takeup-direction")).toMatchObject({ text: "down" });
  });

  it("draws the scale bar at its true length for the zoom, a round number of metres or feet", () => {
    for (const zoom of [1, 4]) {
      const [bar, label] = paintScaleBar(scene, zoom) as [LinesShape, TextShape];
      const [a, b] = pts(bar);
      const metres = (b.x - a.x) / (v.k * zoom);
      // 1, 2 or 5 × 10^n m, about an eighth of the visible width or more.
      const mant = metres / Math.pow(10, Math.floor(Math.log10(metres) + 1e-9));
      expect([1, 2, 5].some((m) => Math.abs(mant - m) < 1e-9)).toBe(true);
      expect(label.text).toBe(`${Number(metres.toPrecision(6))} m`);
      expect(b.x - a.x).toBeGreaterThanOrEqual(1000 / 8 - 1e-9);
    }
    // US customary: 1 ft = 0.3048 m (Source: NIST SP 811).
    const us = prepareScene(scenario, layout, 1000, 400, "us");
    const [bar, label] = paintScaleBar(us, 1) as [LinesShape, TextShape];
    const [a, b] = pts(bar);
    const feet = (b.x - a.x) / v.k / 0.3048;
    expect(label.text).toBe(`${Math.round(feet)} ft`);
  });

  it("centres the zoomed view on the train when following it, and keeps the centre otherwise", () => {
    const w = onIncline(MID);
    const first = viewTransform(scene, { zoom: 2, follow: true }, MID, null, true);
    expect(first.centre!.x).toBeCloseTo(v.sx(w.x), 6);
    expect(first.centre!.y).toBeCloseTo(v.sy(w.z), 6);
    // ×2 about that point: it lands mid-canvas unless an edge would show.
    expect(first.transform.scale).toBe(2);
    const kept = viewTransform(scene, { zoom: 2, follow: false }, MID + 10, first.centre, false);
    expect(kept.centre).toEqual(first.centre);
    expect(viewTransform(scene, { zoom: 1, follow: true }, MID, first.centre, false)).toEqual({ transform: { scale: 1, x: 0, y: 0 }, centre: null });
  });

  it("puts the take-up detail and scale bar in the overlay, fixed to the screen", () => {
    const f = view([train(MID, 1)]);
    const parts = paintOverlay(scene, f, { magnify: 20, zoom: 2 }).map((s) => s.part);
    expect(parts).toContain("takeup-detail");
    expect(parts).toContain("scale-bar");
    expect(paintStatic(scene).map((s) => s.part)).toEqual(expect.arrayContaining(["track", "ratchet", "release-mark", "release-label"]));
  });
});

describe("replay frames: pawls per train", () => {
  const base = (t: number, trains: Frame["trains"], flat: Partial<Frame> = {}): Frame => ({
    t,
    tensions: [0],
    trainPosition: trains[0]?.position ?? 0,
    trainSpeed: 0,
    takeUpPosition: 0,
    sprocketAngle: 0,
    chainTravel: 0,
    driveSpeed: 0,
    dogEngaged: false,
    dogForce: 0,
    ardForce: 0,
    ardTooth: null,
    slackSegments: 0,
    trains,
    ...flat,
  });
  const ft = (position: number, ardPawl: number | null, teeth: (number | null)[]) => ({ position, speed: 0, present: true, dogEngaged: false, dogForce: 0, ardForce: ardPawl === null ? 0 : 100, ardTeeth: teeth, ardPawl });

  it("takes each train's pawl teeth and carrying pawl from the nearer frame, positions interpolated", () => {
    const frames = [base(0, [ft(50, null, [null, null]), ft(80, null, [null])]), base(1, [ft(49, 1, [48.9, 43.95]), ft(82, null, [78.6])])];
    // 0.75 s: nearer the second frame; positions three quarters of the way (50 → 49, 80 → 82).
    const v = frameAt(frames, 0.75);
    expect(v.trains!.map((t) => t.position)).toEqual([49.25, 81.5]);
    expect(v.trains![0]).toMatchObject({ ardPawl: 1, ardForce: 100, ardTeeth: [48.9, 43.95] });
    expect(v.trains![1]).toMatchObject({ ardPawl: null, ardTeeth: [78.6] });
  });

  it("reads train 1's tooth from the flat keys of frames stored before pawls were listed per train", () => {
    const old = { position: 30, speed: 0, present: true, dogEngaged: false } as Frame["trains"][number];
    const frames = [base(0, [old], { ardForce: 50, ardTooth: 28.55 })];
    expect(frameAt(frames, 0).trains![0]).toMatchObject({ ardForce: 50, ardTeeth: [28.55], ardPawl: 0 });
  });
});
