"use client";
/**
 * Live side elevation of a lift as its fields change: track to scale, chain routing (carrying and
 * return strands, bottom run with the 2:1 take-up), catch points, ARD ratchet, dog release, scale bar.
 * SVG: a few hundred elements, redrawn only when the geometry changes.
 */
import { useMemo } from "react";
import type { LiftSettings } from "@/sim/schema";
import { buildLiftDrawing, fitView, niceLength, type Pt } from "@/components/replay/geometry";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";

export interface PreviewInput {
  lift: LiftSettings;
  catchSpacing?: number;
  catchOffset?: number;
  ard?: { enabled: boolean; from: number; to: number };
  takeUp?: { travel: number; position: number };
  pitch?: number;
  teeth?: number;
}

const W = 720;
const H = 300;

export function LiftPreview({ input, units, stale }: { input: PreviewInput | null; units: UnitSystem; stale?: boolean }) {
  const drawing = useMemo(() => {
    if (!input) return null;
    try {
      const d = buildLiftDrawing(input.lift, input.takeUp, input.pitch, input.teeth);
      const v = fitView(d.bounds, W, H, 28);
      const path = (pts: Pt[]) => pts.map((p, i) => `${i ? "L" : "M"}${v.sx(p.x).toFixed(1)},${v.sy(p.z).toFixed(1)}`).join("");
      const l = input.lift;
      const Lc = l.chainTo - l.chainFrom;
      const catches: Pt[] = [];
      if (input.catchSpacing && input.catchSpacing > 0 && Lc > 0) {
        const off = ((((input.catchOffset ?? l.chainFrom) - l.chainFrom) % input.catchSpacing) + input.catchSpacing) % input.catchSpacing;
        for (let q = off; q < Lc && catches.length < 600; q += input.catchSpacing) catches.push(d.chainPoint(q));
      }
      const ard =
        input.ard?.enabled && input.ard.to > input.ard.from
          ? path(
              (() => {
                const pts: Pt[] = [];
                for (let s = input.ard.from; s <= input.ard.to; s += Math.max(0.5, (input.ard.to - input.ard.from) / 80)) {
                  const p = d.trackAt(s);
                  pts.push({ x: p.x - 0.9 * Math.sin(p.phi), z: p.z + 0.9 * Math.cos(p.phi) });
                }
                return pts;
              })(),
            )
          : null;
      const release = d.trackAt(l.dogRelease);
      const bar = niceLength((d.bounds.maxX - d.bounds.minX) / 6);
      return {
        track: path(d.trackPoints),
        carry: path(d.chainPath(0, Lc)),
        ret: path(d.chainPath(Lc, 2 * Lc)),
        bottom: path(d.chainPath(2 * Lc, d.loopLength)),
        catches: catches.map((p) => [v.sx(p.x), v.sy(p.z)] as const),
        ard,
        release: [v.sx(release.x), v.sy(release.z)] as const,
        drive: [v.sx(d.drive.x), v.sy(d.drive.z)] as const,
        top: [v.sx(d.topIdler.x), v.sy(d.topIdler.z)] as const,
        takeUp: [v.sx(d.takeUp.x), v.sy(d.takeUp.z)] as const,
        guide: [v.sy(d.guideTop), v.sy(d.guideBottom)] as const,
        bar: { px: bar * v.k, m: bar },
        height: d.track.highest.z,
        length: d.track.length,
      };
    } catch {
      return null;
    }
  }, [input]);

  return (
    <figure className="rounded-lg border border-steel-300/70 bg-white" data-testid="lift-preview">
      <figcaption className="flex items-center justify-between gap-3 border-b border-steel-100 px-4 py-2 text-[12.5px]">
        <span className="shrink-0 font-semibold text-ink-900">Side elevation</span>
        {drawing && (
          <span className="font-mono text-steel-500" data-testid="preview-figures">
            track {formatQuantity(drawing.length, "length", units, 1)} · height {formatQuantity(drawing.height, "length", units, 1)}
          </span>
        )}
      </figcaption>
      {drawing ? (
        <svg viewBox={`0 0 ${W} ${H}`} className={`block h-auto w-full ${stale ? "opacity-50" : ""}`} role="img" aria-label="Lift side elevation">
          <rect width={W} height={H} fill="#fbfaf7" />
          <path d={drawing.track} fill="none" stroke="#10202e" strokeWidth={2.5} strokeLinejoin="round" />
          {drawing.ard && <path d={drawing.ard} fill="none" stroke="#b86e00" strokeWidth={3} strokeDasharray="2 2" />}
          <path d={drawing.carry} fill="none" stroke="#2c718e" strokeWidth={1.6} />
          <path d={drawing.ret} fill="none" stroke="#2c718e" strokeWidth={1.2} strokeDasharray="4 3" />
          <path d={drawing.bottom} fill="none" stroke="#2c718e" strokeWidth={1.4} />
          {drawing.catches.map(([x, y], i) => (
            <circle key={i} cx={x} cy={y} r={1.6} fill="#10202e" />
          ))}
          <circle cx={drawing.drive[0]} cy={drawing.drive[1]} r={5} fill="none" stroke="#10202e" strokeWidth={1.5} />
          <circle cx={drawing.top[0]} cy={drawing.top[1]} r={4} fill="none" stroke="#10202e" strokeWidth={1.5} />
          <line x1={drawing.takeUp[0] + 7} x2={drawing.takeUp[0] + 7} y1={drawing.guide[0]} y2={drawing.guide[1]} stroke="#5f7386" strokeWidth={1.5} />
          <rect x={drawing.takeUp[0] - 5} y={drawing.takeUp[1] + 3} width={10} height={8} fill="#e08a00" />
          <line x1={drawing.release[0]} x2={drawing.release[0]} y1={drawing.release[1] - 12} y2={drawing.release[1] + 4} stroke="#c0392b" strokeWidth={1.5} />
          <text x={drawing.release[0] + 4} y={drawing.release[1] - 6} fontSize={10} fill="#c0392b">
            dog release
          </text>
          <text x={drawing.drive[0] + 8} y={drawing.drive[1] + 14} fontSize={10} fill="#10202e">
            drive + take-up
          </text>
          <g transform={`translate(${W - 28 - drawing.bar.px}, ${H - 14})`}>
            <line x1={0} x2={drawing.bar.px} y1={0} y2={0} stroke="#10202e" strokeWidth={2} />
            <line x1={0} x2={0} y1={-4} y2={4} stroke="#10202e" />
            <line x1={drawing.bar.px} x2={drawing.bar.px} y1={-4} y2={4} stroke="#10202e" />
            <text x={drawing.bar.px / 2} y={-6} fontSize={10} textAnchor="middle" fill="#10202e">
              {formatQuantity(drawing.bar.m, "length", units, 0)}
            </text>
          </g>
          <g fontSize={10} fill="#5f7386" transform={`translate(12, ${H - 12})`}>
            <line x1={0} x2={14} y1={-3} y2={-3} stroke="#2c718e" strokeWidth={1.6} />
            <text x={18} y={0}>chain</text>
            <line x1={54} x2={68} y1={-3} y2={-3} stroke="#b86e00" strokeWidth={3} strokeDasharray="2 2" />
            <text x={72} y={0}>ARD ratchet</text>
            <circle cx={136} cy={-3} r={2} fill="#10202e" />
            <text x={142} y={0}>catch points</text>
          </g>
        </svg>
      ) : (
        <div className="flex h-[200px] items-center justify-center text-[13px] text-steel-500">
          The preview appears when the geometry fields hold valid numbers.
        </div>
      )}
    </figure>
  );
}
