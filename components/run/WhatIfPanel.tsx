"use client";
/**
 * What-if sliders: entry speed, chain speed, take-up mass. While a slider moves, a coarse preview runs in
 * the worker and redraws the figures and plots; when it rests, the full run follows. The values live in the
 * run store, where Save picks the moved ones up as the run's overrides.
 */
import { useEffect, useRef, useState } from "react";
import type { Scenario } from "@/sim";
import { Button } from "@/components/ui/Button";
import { formatQuantity, type Quantity, type UnitSystem } from "@/lib/client/units";
import { withWhatIf } from "./compute";
import { useRunStore } from "./store";
import type { WhatIf } from "./types";
import { overridableValues } from "@/lib/runs/overrides";

const SETTLE_MS = 450;

export function WhatIfPanel({
  base,
  units,
  runPreview,
  runFull,
}: {
  base: Scenario;
  units: UnitSystem;
  /** `input`: the input event's timeStamp, where the preview's latency is counted from. */
  runPreview: (s: Scenario, input?: number) => void;
  runFull: (s: Scenario) => Promise<unknown>;
}) {
  // The entry speed shown is the first train's; a what-if entry speed applies to every train.
  const original: WhatIf = overridableValues(base);
  const [w, setW] = useState<WhatIf>(original);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const latency = useRunStore((s) => s.previewLatencyMs);
  const busy = useRunStore((s) => s.previewBusy);
  const set = useRunStore((s) => s.set);
  useEffect(() => () => {
    if (timer.current) clearTimeout(timer.current);
  }, []);

  const changed = w.entrySpeed !== original.entrySpeed || w.chainSpeed !== original.chainSpeed || w.takeUpMass !== original.takeUpMass;
  const move = (p: Partial<WhatIf>, input: number) => {
    const next = { ...w, ...p };
    setW(next);
    set({ whatIf: next });
    runPreview(withWhatIf(base, next), input);
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void runFull(withWhatIf(base, next)), SETTLE_MS);
  };
  const reset = () => {
    if (timer.current) clearTimeout(timer.current);
    setW(original);
    set({ whatIf: null });
    void runFull(base);
  };

  const slider = (key: keyof WhatIf, label: string, q: Quantity, min: number, max: number, step: number) => (
    <label className="block" key={key}>
      <span className="flex items-baseline justify-between text-[12.5px]">
        <span className="font-semibold text-ink-800">{label}</span>
        <span className="font-mono tabular-nums text-ink-900" data-testid={`whatif-${key}-value`}>
          {formatQuantity(w[key], q, units)}
          {w[key] !== original[key] && <span className="ml-1 text-steel-500">(was {formatQuantity(original[key], q, units)})</span>}
        </span>
      </span>
      <input
        type="range"
        className="mt-1 w-full accent-lamp-600"
        min={min}
        max={max}
        step={step}
        value={w[key]}
        onChange={(e) => move({ [key]: Number(e.target.value) }, e.timeStamp)}
        data-testid={`whatif-${key}`}
        aria-label={label}
      />
    </label>
  );

  const v = base.drive.speed;
  return (
    <section className="rounded-lg border border-steel-300/70 bg-white px-4 py-3" data-testid="what-if">
      <div className="mb-2 flex items-center justify-between gap-2">
        <div>
          <h3 className="text-[13.5px] font-bold text-ink-900">What if</h3>
          <p className="text-[11.5px] text-steel-500">A coarse preview follows the slider; the full run follows when it rests. The scenario itself is not changed; saving keeps the values with the run as a what-if variant.</p>
        </div>
        <Button size="sm" variant="ghost" onClick={reset} disabled={!changed} data-testid="whatif-reset">
          Reset
        </Button>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        {slider("entrySpeed", "Entry speed", "speed", 0, Math.max(2 * v, 1.5 * original.entrySpeed, 1), 0.05)}
        {slider("chainSpeed", "Chain speed", "speed", Math.max(0.2, 0.4 * v), Math.min(10, 2 * v), 0.05)}
        {slider("takeUpMass", "Take-up mass", "mass", Math.max(10, Math.round(original.takeUpMass * 0.3)), Math.round(original.takeUpMass * 2), Math.max(1, Math.round(original.takeUpMass / 200)))}
      </div>
      <p className="mt-2 font-mono text-[11px] text-steel-500" data-testid="whatif-latency">
        {busy ? "preview running…" : latency !== null ? `last preview ${latency.toFixed(0)} ms` : "move a slider to preview"}
      </p>
    </section>
  );
}
