"use client";
/**
 * The replay canvas (react-konva): renders the painters' shapes (./painters) in three layers: the still
 * drawing, what moves with the frame (both magnified by the zoom), and the overlay fixed to the screen
 * (take-up detail, scale bar). The moving layers repaint from the replay store outside React.
 */
import { memo, useCallback, useEffect, useMemo, useRef, useState } from "react";
import { Layer, Shape, Stage } from "react-konva";
import type Konva from "konva";
import type { Frame, Layout, Scenario } from "@/sim";
import type { UnitSystem } from "@/lib/client/units";
import { drawShapes } from "./draw";
import { frameAt, type FrameView } from "./frames";
import { paintMoving, paintOverlay, paintStatic, prepareScene } from "./painters";
import { viewTransform, type ViewTransform } from "./painters/view";
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

/** Paint timer (the shapes paint outside React's render, from Konva's draw loop). */
const clock = () => performance.now();

function nativeCtx(c: Konva.Context): CanvasRenderingContext2D {
  return (c as unknown as { _context: CanvasRenderingContext2D })._context;
}

function ReplayCanvasInner({ scenario, frames, layout, maxTension, height = 400, onFps, units = "si" }: ReplayCanvasProps) {
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(900);
  const stillLayer = useRef<Konva.Layer>(null);
  const dynLayer = useRef<Konva.Layer>(null);
  const overlayLayer = useRef<Konva.Layer>(null);
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

  const scene = useMemo(() => prepareScene(scenario, layout, width, height, units), [scenario, layout, width, height, units]);

  // Zoom: the two drawing layers scale about a centre; following the train moves the centre with it.
  const centre = useRef<{ x: number; y: number } | null>(null);
  const applyView = useCallback(
    (s: { t: number; zoom: number; follow: boolean }, recentre: boolean): boolean => {
      const layers = [stillLayer.current, dynLayer.current];
      if (!layers[0] || !layers[1]) return false;
      const next = viewTransform(scene, s, frames.length ? frameAt(frames, s.t).trainPosition : 0, centre.current, recentre);
      centre.current = next.centre;
      const tr: ViewTransform = next.transform;
      const l = layers[0];
      if (l.scaleX() === tr.scale && l.x() === tr.x && l.y() === tr.y) return false;
      for (const layer of layers) {
        layer!.scale({ x: tr.scale, y: tr.scale });
        layer!.position({ x: tr.x, y: tr.y });
      }
      return true;
    },
    [scene, frames],
  );

  // Repaint the moving layers whenever the clock, the magnification or the zoom changes (the still layer
  // too when the view moves); count paints per second.
  useEffect(() => {
    const unsub = useReplayStore.subscribe((s, prev) => {
      const zoomed = s.zoom !== prev.zoom || s.follow !== prev.follow;
      const moved = zoomed || (s.follow && s.t !== prev.t) ? applyView(s, zoomed) : false;
      if (moved) stillLayer.current?.batchDraw();
      if (moved || s.t !== prev.t || s.magnify !== prev.magnify || s.zoom !== prev.zoom) {
        dynLayer.current?.batchDraw();
        overlayLayer.current?.batchDraw();
      }
    });
    if (applyView(useReplayStore.getState(), true)) stillLayer.current?.batchDraw();
    dynLayer.current?.batchDraw();
    overlayLayer.current?.batchDraw();
    const timer = setInterval(() => {
      onFps?.(drawCount.current, drawCount.current ? drawTime.current / drawCount.current : 0);
      drawCount.current = 0;
      drawTime.current = 0;
    }, 1000);
    return () => {
      unsub();
      clearInterval(timer);
    };
  }, [scene, frames, onFps, applyView]);

  const current = (): FrameView | null => {
    if (!frames.length) return null;
    return (view.current = frameAt(frames, useReplayStore.getState().t, view.current));
  };

  const still = useMemo(() => paintStatic(scene), [scene]);
  const drawStill = (c: Konva.Context) => drawShapes(nativeCtx(c), still);

  const drawMoving = (c: Konva.Context) => {
    const t0 = clock();
    drawCount.current++;
    const f = current();
    if (f) drawShapes(nativeCtx(c), paintMoving(scene, f, maxTension));
    drawTime.current += clock() - t0;
  };

  const drawOverlay = (c: Konva.Context) => {
    const f = current();
    const st = useReplayStore.getState();
    if (f) drawShapes(nativeCtx(c), paintOverlay(scene, f, { magnify: st.magnify, zoom: st.zoom }));
  };

  return (
    <div ref={box} className="relative w-full overflow-hidden rounded-md border border-steel-300/70 bg-[#fbfaf7]" style={{ height }} data-testid="replay-canvas">
      <Stage width={width} height={height} listening={false}>
        <Layer ref={stillLayer} listening={false}>
          <Shape sceneFunc={drawStill} listening={false} perfectDrawEnabled={false} />
        </Layer>
        <Layer ref={dynLayer} listening={false}>
          <Shape sceneFunc={drawMoving} listening={false} perfectDrawEnabled={false} />
        </Layer>
        <Layer ref={overlayLayer} listening={false}>
          <Shape sceneFunc={drawOverlay} listening={false} perfectDrawEnabled={false} />
        </Layer>
      </Stage>
    </div>
  );
}

/** Memoised: the panel around it re-renders with the clock; the canvas repaints itself from the store. */
export const ReplayCanvas = memo(ReplayCanvasInner);
