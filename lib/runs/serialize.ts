import type { Run } from "@/models/Run";
import type { RunOverrideKey } from "./schema";
import type { RunStatus } from "./status";

/** What-if values by key (SI). */
export type OverrideValues = Partial<Record<RunOverrideKey, number>>;

/** A run as the API shows it (no result blob; the inputs only when asked for). */
export interface RunView {
  id: number;
  organisationId: number;
  scenarioId: number;
  liftRevisionId: number;
  status: RunStatus;
  progress: number;
  startedBy: number | null;
  solver: Record<string, unknown>;
  /** What-if values the server ran instead of the scenario's (SI); null for a plain run of the scenario. */
  overrides: OverrideValues | null;
  /** The scenario's values those overrides replaced, as they were when the run started (SI). */
  overridesFrom: OverrideValues | null;
  summary: Record<string, unknown> | null;
  diagnostics: Record<string, unknown> | null;
  resultFormat: string | null;
  resultBytes: number | null;
  wallTimeMs: number | null;
  error: string | null;
  errorCode: string | null;
  queuedAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  version: number;
  inputs?: Record<string, unknown>;
  links: { self: string; result: string; events: string; cancel: string };
}

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null);

/** MariaDB keeps JSON as text; the driver sometimes hands it back as a string. */
export function json<T>(v: unknown): T {
  return (typeof v === "string" ? JSON.parse(v) : v) as T;
}

export function toRunView(run: Run, opts: { inputs?: boolean } = {}): RunView {
  const base = `/api/runs/${run.id}`;
  return {
    id: run.id,
    organisationId: run.organisationId,
    scenarioId: run.scenarioId,
    liftRevisionId: run.liftRevisionId,
    status: run.status,
    progress: run.progress,
    startedBy: run.startedBy ?? null,
    solver: json(run.solver),
    overrides: json(run.overrides ?? null),
    overridesFrom: json(run.overridesFrom ?? null),
    summary: json(run.summary ?? null),
    diagnostics: json(run.diagnostics ?? null),
    resultFormat: run.resultFormat ?? null,
    resultBytes: run.resultBytes ?? null,
    wallTimeMs: run.wallTimeMs ?? null,
    error: run.error ?? null,
    errorCode: run.errorCode ?? null,
    queuedAt: iso(run.queuedAt)!,
    startedAt: iso(run.startedAt),
    finishedAt: iso(run.finishedAt),
    version: run.version,
    ...(opts.inputs ? { inputs: json(run.inputs) } : {}),
    links: { self: base, result: `${base}/result`, events: `${base}/events`, cancel: `${base}/cancel` },
  };
}
