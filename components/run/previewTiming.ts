/**
 * Where the time of one what-if preview goes, from the slider's input event to the plots redrawn. Each step
 * stamps a wall-clock time (performance.timeOrigin + now(), so the worker's stamps line up with the page's);
 * when the plots have drawn the preview, the parts are written as performance measures named "whatif:<part>"
 * (read by scripts/bench-ui.ts) and kept in `lastBreakdown` for the latency read-out.
 */

/** Wall-clock milliseconds comparable between the page and its workers. */
export function wallNow(): number {
  return performance.timeOrigin + performance.now();
}

/** What the worker reports about its own part (wall-clock stamps, see wallNow). */
export interface WorkerTiming {
  /** The request was taken off the worker's message queue. */
  received: number;
  /** Scenario parsed, chain mesh and system built, first 1 % of the run integrated. */
  setupDone: number;
  /** Integration finished (the engine's last progress call). */
  integrated: number;
  /** Summary, frames and checks done. */
  computed: number;
  /** Series packed into one Float64Array, just before postMessage. */
  posted: number;
}

interface Stamps {
  id: number;
  input: number;
  sent?: number;
  worker?: WorkerTiming;
  arrived?: number;
  unpacked?: number;
  committed?: number;
  drawn?: number;
}

export const PREVIEW_PARTS = [
  ["queue", "input event → request posted to the worker"],
  ["workerWait", "posted → worker starts (message queue, a preview still running)"],
  ["setup", "scenario parse, mesh and system build (+1 % of the run)"],
  ["integration", "time integration"],
  ["finish", "summary, frames, checks"],
  ["pack", "series into Float64Array"],
  ["transfer", "postMessage → page's onmessage (transfer, clone of frames, page busy)"],
  ["unpack", "columns back to the run's series"],
  ["render", "store update → React commit"],
  ["plots", "React commit → uPlot redraw done"],
  ["total", "input event → plots redrawn"],
] as const;
export type PreviewPart = (typeof PREVIEW_PARTS)[number][0];
export type Breakdown = Record<PreviewPart, number>;

let current: Stamps | null = null;
let lastBreakdown: Breakdown | null = null;

/** A slider moved: the input event's time (event.timeStamp is on the page's performance clock). */
export function previewInput(id: number, eventTimeStamp: number): void {
  current = { id, input: performance.timeOrigin + eventTimeStamp };
}
export function previewSent(id: number): void {
  if (current?.id === id) current.sent = wallNow();
}
export function previewArrived(id: number, worker: WorkerTiming): void {
  if (current?.id !== id) return;
  current.worker = worker;
  current.arrived = wallNow();
}
export function previewUnpacked(id: number): void {
  if (current?.id === id) current.unpacked = wallNow();
}
/** React committed the run view showing preview `id`. */
export function previewCommitted(id: number | undefined): void {
  if (id !== undefined && current?.id === id && current.committed === undefined) current.committed = wallNow();
}

/** The plots drew preview `id`: close its record and publish the breakdown. */
export function previewDrawn(id: number | undefined): Breakdown | null {
  const c = current;
  if (id === undefined || !c || c.id !== id || c.drawn !== undefined || !c.worker || c.sent === undefined) return null;
  c.drawn = wallNow();
  const w = c.worker;
  const arrived = c.arrived ?? c.drawn;
  const unpacked = c.unpacked ?? arrived;
  const committed = c.committed ?? c.drawn;
  const b: Breakdown = {
    queue: c.sent - c.input,
    workerWait: w.received - c.sent,
    setup: w.setupDone - w.received,
    integration: w.integrated - w.setupDone,
    finish: w.computed - w.integrated,
    pack: w.posted - w.computed,
    transfer: arrived - w.posted,
    unpack: unpacked - arrived,
    render: committed - unpacked,
    plots: c.drawn - committed,
    total: c.drawn - c.input,
  };
  lastBreakdown = b;
  const origin = performance.timeOrigin;
  const starts: Record<PreviewPart, number> = {
    queue: c.input,
    workerWait: c.sent,
    setup: w.received,
    integration: w.setupDone,
    finish: w.integrated,
    pack: w.computed,
    transfer: w.posted,
    unpack: arrived,
    render: unpacked,
    plots: committed,
    total: c.input,
  };
  try {
    for (const [part] of PREVIEW_PARTS)
      performance.measure(`whatif:${part}`, { start: starts[part] - origin, duration: Math.max(0, b[part]), detail: { id } });
  } catch {
    // A browser without measure options: the breakdown is still returned.
  }
  return b;
}

export function lastPreviewBreakdown(): Breakdown | null {
  return lastBreakdown;
}
