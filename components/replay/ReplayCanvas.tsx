"use client";
/**
 * The replay canvas (react-konva): side elevation to scale, the chain coloured by tension band, catch
 * points moving with the chain, the cars and the dog, the ARD pawl and its catch mark, the drive sprocket
 * turning, and a take-up detail with its magnification. Two custom shapes draw everything; the moving
 * one repaints from the replay store outside React, one stroke per tension band per frame.
 */
import { memo, useCallback, useEffect, useMemo, useRef, useState } from "react";
import { Layer, Shape, Stage } from "react-konva";
import type Konva from "konva";
import type { Frame, Layout, Scenario } from "@/sim";
import { formatQuantity, fromDisplay, toDisplay, unitOf, type UnitSystem } from "@/lib/client/units";
import { buildLiftDrawing, fitView, labelBesideTrack, niceLength, zoomTransform, type LiftDrawing, type View } from "./geometry";
import { frameAt, type FrameView } from "./frames";
import { BAND_COLOURS, SLACK_COLOUR, TENSION_BANDS, bandOf } from "./palette";
import { useReplayStore } from "./store";

export interface ReplayCanvasProps {
  scenario: Scenario;
  frames: Frame[];
  layout: Layout;
  /** Colour scale top, N (the run's peak tension). */
  maxTension: number;
  /** The reader's unit system for the scale bar and the take-up label. */
  units?: UnitSystem;
  height?: number;
  /** Frames drawn in the last second and their mean draw time, ms (for the performance check). */
  onFps?: (fps: number, drawMs: number) => void;
}

interface Prepared {
  d: LiftDrawing;
  v: View;
  /** Screen polyline of every segment (x, y pairs), at take-up drop 0. */
  segs: Float32Array[];
  /** Segments whose path moves with the take-up (the bottom run). */
  bottomSegs: number[];
  stationsQ: number[];
  loop: number;
}

/** Paint timer (the shapes paint outside React's render, from Konva's draw loop). */
const clock = () => performance.now();

function nativeCtx(c: Konva.Context): CanvasRenderingContext2D {
  return (c as unknown as { _context: CanvasRenderingContext2D })._context;
}

function polyline(pts: { x: number; z: number }[], v: View): Float32Array {
  const a = new Float32Array(pts.length * 2);
  pts.forEach((p, i) => {
    a[2 * i] = v.sx(p.x);
    a[2 * i + 1] = v.sy(p.z);
  });
  return a;
}

function prepare(s: Scenario, layout: Layout, width: number, height: number): Prepared {
  const d = buildLiftDrawing(s.lift, s.takeUp, s.chain.pitch, s.drive.sprocketTeeth);
  const v = fitView(d.bounds, width, height, 26);
  const q = layout.stations;
  const loop = layout.loopLength;
  const segs: Float32Array[] = [];
  const bottomSegs: number[] = [];
  for (let i = 0; i < q.length; i++) {
    const q0 = q[i];
    const q1 = i + 1 < q.length ? q[i + 1] : loop;
    segs.push(polyline(d.chainPath(q0, q1), v));
    if (q1 > 2 * layout.strandLength + 1e-9) bottomSegs.push(i);
  }
  return { d, v, segs, bottomSegs, stationsQ: q, loop };
}

/** A label off the track with a thin leader line back to its point. */
function drawLabel(ctx: CanvasRenderingContext2D, l: ReturnType<typeof labelBesideTrack>, text: string, colour: string) {
  ctx.save();
  ctx.strokeStyle = colour;
  ctx.fillStyle = colour;
  ctx.lineWidth = 1;
  ctx.beginPath();
  ctx.moveTo(l.at.x, l.at.y);
  ctx.lineTo(l.x, l.y);
  ctx.stroke();
  ctx.textAlign = l.align;
  ctx.textBaseline = "top";
  ctx.fillText(text, l.x + (l.align === "left" ? 3 : -3), l.y + 2);
  ctx.restore();
}

function strokePoly(ctx: CanvasRenderingContext2D, a: Float32Array) {
  ctx.moveTo(a[0], a[1]);
  for (let i = 2; i < a.length; i += 2) ctx.lineTo(a[i], a[i + 1]);
}

function ReplayCanvasInner({ scenario, frames, layout, maxTension, height = 400, onFps, units = "si" }: ReplayCanvasProps) {
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(900);
  const dynLayer = useRef<Konva.Layer>(null);
  const view = useRef<FrameView | undefined>(undefined);
  const drawCount = useRef(0);
  const drawTime = useRef(0);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setWidth(Math.max(320, Math.floor(el.clientWidth))));
    ro.observe(el);
    setWidth(Math.max(320, Math.floor(el.clientWidth)));
    return () => ro.disconnect();
  }, []);

  const prep = useMemo(() => prepare(scenario, layout, width, height), [scenario, layout, width, height]);
  const bottomPaths = useRef<Map<number, Float32Array>>(new Map());

  // Zoom: the stage scales both layers about a centre; following the train moves the centre with it
  // every frame (then both layers repaint), otherwise the centre stays where the train was when zoomed.
  const stage = useRef<Konva.Stage>(null);
  const centre = useRef<{ x: number; y: number } | null>(null);
  const applyView = useCallback((s: { t: number; zoom: number; follow: boolean }, recentre: boolean): boolean => {
    const st = stage.current;
    if (!st) return false;
    if (s.zoom <= 1) {
      centre.current = null;
      if (st.scaleX() === 1 && st.x() === 0 && st.y() === 0) return false;
      st.scale({ x: 1, y: 1 });
      st.position({ x: 0, y: 0 });
      return true;
    }
    if (recentre || s.follow || !centre.current) {
      const p = prep.d.trackAt(frameAt(frames, s.t).trainPosition);
      centre.current = { x: prep.v.sx(p.x), y: prep.v.sy(p.z) };
    }
    const tr = zoomTransform(s.zoom, centre.current, width, height);
    if (st.scaleX() === tr.scale && st.x() === tr.x && st.y() === tr.y) return false;
    st.scale({ x: tr.scale, y: tr.scale });
    st.position({ x: tr.x, y: tr.y });
    return true;
  }, [prep, frames, width, height]);

  // Repaint the moving layer whenever the clock or the magnification changes (the whole stage when the
  // view moves); count paints per second.
  useEffect(() => {
    const unsub = useReplayStore.subscribe((s, prev) => {
      const moved = s.zoom !== prev.zoom || s.follow !== prev.follow || (s.follow && s.t !== prev.t) ? applyView(s, s.zoom !== prev.zoom || s.follow !== prev.follow) : false;
      if (moved) stage.current?.batchDraw();
      else if (s.t !== prev.t || s.magnify !== prev.magnify) dynLayer.current?.batchDraw();
    });
    if (applyView(useReplayStore.getState(), true)) stage.current?.batchDraw();
    dynLayer.current?.batchDraw();
    const timer = setInterval(() => {
      onFps?.(drawCount.current, drawCount.current ? drawTime.current / drawCount.current : 0);
      drawCount.current = 0;
      drawTime.current = 0;
    }, 1000);
    return () => {
      unsub();
      clearInterval(timer);
    };
  }, [prep, frames, onFps, applyView]);

  const drawStatic = (c: Konva.Context) => {
    const ctx = nativeCtx(c);
    const { d, v } = prep;
    ctx.fillStyle = "#fbfaf7";
    ctx.fillRect(0, 0, width, height);
    // Ground line and the track.
    ctx.strokeStyle = "#e3e8ec";
    ctx.lineWidth = 1;
    ctx.beginPath();
    ctx.moveTo(0, v.sy(d.bounds.minZ) + 10);
    ctx.lineTo(width, v.sy(d.bounds.minZ) + 10);
    ctx.stroke();
    ctx.strokeStyle = "#10202e";
    ctx.lineWidth = 3;
    ctx.lineJoin = "round";
    ctx.beginPath();
    d.trackPoints.forEach((p, i) => (i ? ctx.lineTo(v.sx(p.x), v.sy(p.z)) : ctx.moveTo(v.sx(p.x), v.sy(p.z))));
    ctx.stroke();
    // ARD ratchet: teeth drawn as ticks just above the track.
    const ar = scenario.antiRollback;
    if (ar.enabled) {
      ctx.strokeStyle = "#b86e00";
      ctx.lineWidth = 1;
      ctx.beginPath();
      const stepM = Math.max(ar.toothSpacing, 1 / v.k * 3);
      for (let s = ar.from; s <= ar.to; s += stepM) {
        const p = d.trackAt(s);
        const nx = -Math.sin(p.phi);
        const nz = Math.cos(p.phi);
        ctx.moveTo(v.sx(p.x + nx * 0.3), v.sy(p.z + nz * 0.3));
        ctx.lineTo(v.sx(p.x + nx * 0.9), v.sy(p.z + nz * 0.9));
      }
      ctx.stroke();
    }
    // Dog release mark.
    const rel = d.trackAt(scenario.lift.dogRelease);
    ctx.strokeStyle = "#c0392b";
    ctx.lineWidth = 1.5;
    ctx.beginPath();
    ctx.moveTo(v.sx(rel.x), v.sy(rel.z) - 14);
    ctx.lineTo(v.sx(rel.x), v.sy(rel.z) + 6);
    ctx.stroke();
    ctx.fillStyle = "#5f7386";
    ctx.font = "11px ui-sans-serif, system-ui";
    drawLabel(ctx, labelBesideTrack(d, scenario.lift.dogRelease, v, 24), "dog release", "#5f7386");
    // Top idler.
    ctx.strokeStyle = "#10202e";
    ctx.lineWidth = 1.5;
    ctx.beginPath();
    ctx.arc(v.sx(d.topIdler.x), v.sy(d.topIdler.z), Math.max(5, d.sprocketRadius * v.k), 0, Math.PI * 2);
    ctx.stroke();
    // Scale bar.
    // A round length in the reader's unit (20 m, or 50 ft), drawn at its SI size.
    const lengthUnit = unitOf("length", units);
    const barShown = niceLength(toDisplay(width / v.k / 8, "length", units));
    const bar = fromDisplay(barShown, "length", units);
    const bx = width - 26 - bar * v.k;
    const by = height - 14;
    ctx.strokeStyle = "#10202e";
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.moveTo(bx, by);
    ctx.lineTo(bx + bar * v.k, by);
    ctx.stroke();
    ctx.fillStyle = "#10202e";
    ctx.textAlign = "center";
    ctx.fillText(`${barShown} ${lengthUnit.label}`, bx + (bar * v.k) / 2, by - 5);
    ctx.textAlign = "left";
  };

  const drawMoving = (c: Konva.Context) => {
    const t0 = clock();
    drawCount.current++;
    paint(c);
    drawTime.current += clock() - t0;
  };

  const paint = (c: Konva.Context) => {
    const ctx = nativeCtx(c);
    const st = useReplayStore.getState();
    if (!frames.length) return;
    const f = (view.current = frameAt(frames, st.t, view.current));
    const { d, v, segs, bottomSegs } = prep;
    const mag = st.magnify;

    // Bottom-run segments follow the take-up (true scale on the main drawing).
    const y = f.takeUpPosition;
    for (const i of bottomSegs) {
      const q0 = prep.stationsQ[i];
      const q1 = i + 1 < prep.stationsQ.length ? prep.stationsQ[i + 1] : prep.loop;
      bottomPaths.current.set(i, polyline(d.chainPath(q0, q1, y), v));
    }
    // Chain: one path per tension band.
    ctx.lineCap = "round";
    ctx.lineJoin = "round";
    ctx.lineWidth = 3;
    const n = segs.length;
    for (let b = -1; b < TENSION_BANDS; b++) {
      ctx.beginPath();
      let any = false;
      for (let i = 0; i < n; i++) {
        const T = f.tensions[i];
        const band = T <= 0 ? -1 : bandOf(T, maxTension);
        if (band !== b) continue;
        strokePoly(ctx, bottomPaths.current.get(i) ?? segs[i]);
        any = true;
      }
      if (!any) continue;
      ctx.strokeStyle = b < 0 ? SLACK_COLOUR : BAND_COLOURS[b];
      ctx.setLineDash(b < 0 ? [3, 3] : []);
      ctx.stroke();
    }
    ctx.setLineDash([]);

    // Catch points on the carrying strand, moving with the chain.
    const cs = scenario.chain.catchSpacing;
    const Lc = layout.strandLength;
    const off = (((scenario.chain.catchOffset ?? scenario.lift.chainFrom) - scenario.lift.chainFrom + f.chainTravel) % cs + cs) % cs;
    ctx.fillStyle = "#10202e";
    ctx.beginPath();
    for (let q = off; q < Lc; q += cs) {
      const p = d.chainPoint(q);
      ctx.moveTo(v.sx(p.x) + 2, v.sy(p.z));
      ctx.arc(v.sx(p.x), v.sy(p.z), 2, 0, Math.PI * 2);
    }
    ctx.fill();

    // Cars of every train on the track (a frame saved before per-train frames existed holds train 1 only),
    // drawn from the front back.
    const carH = Math.max(6, 1.1 * v.k);
    const onTrack = f.trains ?? [{ position: f.trainPosition, present: true, dogEngaged: f.dogEngaged }];
    scenario.trains.forEach((tr, i) => {
      const ft = onTrack[i];
      if (!ft || !ft.present) return;
      const front = ft.position;
      for (let k = 0; k < tr.cars; k++) {
        const sFront = front - k * tr.carLength - 0.1;
        const sBack = front - (k + 1) * tr.carLength + 0.1;
        const a = d.trackAt(sBack);
        const b = d.trackAt(sFront);
        const nx0 = -Math.sin(a.phi);
        const nz0 = Math.cos(a.phi);
        const nx1 = -Math.sin(b.phi);
        const nz1 = Math.cos(b.phi);
        ctx.beginPath();
        ctx.moveTo(v.sx(a.x), v.sy(a.z) - 1);
        ctx.lineTo(v.sx(b.x), v.sy(b.z) - 1);
        ctx.lineTo(v.sx(b.x) + nx1 * carH, v.sy(b.z) - nz1 * carH);
        ctx.lineTo(v.sx(a.x) + nx0 * carH, v.sy(a.z) - nz0 * carH);
        ctx.closePath();
        ctx.fillStyle = k === 0 ? "#2a4258" : "#1a2f42";
        ctx.fill();
      }
      // Several trains on the chain: each one is labelled by its number in the scenario.
      if (scenario.trains.length > 1) {
        const nose = d.trackAt(front);
        ctx.fillStyle = "#2a4258";
        ctx.font = "bold 11px ui-sans-serif, system-ui";
        ctx.fillText(`Train ${i + 1}`, v.sx(nose.x) + 6, v.sy(nose.z) - carH - 4);
      }
      // The dog under the train: amber when it bears on a catch point.
      const dog = d.trackAt(front - tr.dogOffset);
      ctx.beginPath();
      ctx.moveTo(v.sx(dog.x) - 4, v.sy(dog.z));
      ctx.lineTo(v.sx(dog.x) + 4, v.sy(dog.z));
      ctx.lineTo(v.sx(dog.x), v.sy(dog.z) + 7);
      ctx.closePath();
      ctx.fillStyle = ft.dogEngaged ? "#e08a00" : "#a9b6c2";
      ctx.fill();
    });
    // ARD pawl at the tooth it would fall on; a ring and a label while it carries the train.
    if (f.ardTooth !== null) {
      const p = d.trackAt(f.ardTooth);
      ctx.fillStyle = f.ardForce > 0 ? "#c0392b" : "#5f7386";
      ctx.fillRect(v.sx(p.x) - 2, v.sy(p.z) - 8, 4, 8);
      if (f.ardForce > 0) {
        ctx.strokeStyle = "#c0392b";
        ctx.lineWidth = 2;
        ctx.beginPath();
        ctx.arc(v.sx(p.x), v.sy(p.z) - 4, 11, 0, Math.PI * 2);
        ctx.stroke();
        ctx.font = "bold 11px ui-sans-serif, system-ui";
        drawLabel(ctx, labelBesideTrack(d, f.ardTooth, v, 30), "ARD catch", "#c0392b");
      }
    }
    // Drive sprocket, turning with the chain.
    const r = Math.max(8, d.sprocketRadius * v.k);
    const cx = v.sx(d.drive.x);
    const cy = v.sy(d.drive.z) + r * 0.2;
    ctx.strokeStyle = "#10202e";
    ctx.lineWidth = 1.5;
    ctx.beginPath();
    ctx.arc(cx, cy, r, 0, Math.PI * 2);
    for (let k = 0; k < 4; k++) {
      const ang = f.sprocketAngle + (k * Math.PI) / 2;
      ctx.moveTo(cx, cy);
      ctx.lineTo(cx + Math.cos(ang) * r, cy - Math.sin(ang) * r);
    }
    ctx.stroke();

    // Take-up detail: guide, stops and counterweight at `mag` × the drawing's scale, true value beside.
    const tu = scenario.takeUp;
    const bw = 150;
    const bh = 150;
    const bx = 12;
    const by = 12;
    ctx.fillStyle = "rgba(255,255,255,0.94)";
    ctx.strokeStyle = "#a9b6c2";
    ctx.lineWidth = 1;
    ctx.fillRect(bx, by, bw, bh);
    ctx.strokeRect(bx + 0.5, by + 0.5, bw - 1, bh - 1);
    ctx.save();
    ctx.beginPath();
    ctx.rect(bx, by + 18, bw, bh - 18);
    ctx.clip();
    const kk = v.k * mag;
    const midY = by + 18 + (bh - 18) / 2;
    const gx = bx + 44;
    const zToY = (z: number) => midY + z * kk; // z = drop below the starting position (m)
    const topStop = -tu.position;
    const botStop = tu.travel - tu.position;
    ctx.strokeStyle = "#5f7386";
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.moveTo(gx - 14, zToY(topStop));
    ctx.lineTo(gx - 14, zToY(botStop));
    ctx.moveTo(gx + 14, zToY(topStop));
    ctx.lineTo(gx + 14, zToY(botStop));
    ctx.stroke();
    ctx.strokeStyle = "#c0392b";
    ctx.beginPath();
    ctx.moveTo(gx - 20, zToY(topStop));
    ctx.lineTo(gx + 20, zToY(topStop));
    ctx.moveTo(gx - 20, zToY(botStop));
    ctx.lineTo(gx + 20, zToY(botStop));
    ctx.stroke();
    // Rest mark and the weight.
    ctx.strokeStyle = "#a9b6c2";
    ctx.setLineDash([2, 2]);
    ctx.beginPath();
    ctx.moveTo(gx - 24, midY);
    ctx.lineTo(gx + 24, midY);
    ctx.stroke();
    ctx.setLineDash([]);
    const wy = zToY(y);
    ctx.fillStyle = "#e08a00";
    ctx.fillRect(gx - 11, wy - 6, 22, 12);
    ctx.restore();
    ctx.fillStyle = "#10202e";
    ctx.font = "bold 11px ui-sans-serif, system-ui";
    ctx.fillText(`Take-up ×${mag}`, bx + 8, by + 13);
    ctx.font = "11px ui-monospace, monospace";
    ctx.fillStyle = "#1a2f42";
    ctx.fillText(`${y >= 0 ? "down" : "up"}`, gx + 30, midY - 4);
    ctx.fillText(formatQuantity(Math.abs(y), "smallLength", units, units === "si" ? 1 : 2), gx + 30, midY + 10);
  };

  return (
    <div ref={box} className="relative w-full overflow-hidden rounded-md border border-steel-300/70 bg-[#fbfaf7]" style={{ height }} data-testid="replay-canvas">
      <Stage ref={stage} width={width} height={height} listening={false}>
        <Layer listening={false}>
          <Shape sceneFunc={drawStatic} listening={false} perfectDrawEnabled={false} />
        </Layer>
        <Layer ref={dynLayer} listening={false}>
          <Shape sceneFunc={drawMoving} listening={false} perfectDrawEnabled={false} />
        </Layer>
      </Stage>
    </div>
  );
}

/** Memoised: the panel around it re-renders with the clock; the canvas repaints itself from the store. */
export const ReplayCanvas = memo(ReplayCanvasInner);
