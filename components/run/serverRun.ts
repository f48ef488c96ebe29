/** A saved server run as RunData: the run (with its input scenario) and its stored result. */
import type { Frame, Layout, Scenario, Series, Summary } from "@/sim";
import { getJson } from "@/lib/client/fetch";
import type { Jsonify } from "@/lib/client/jsonify";
import type { RunView } from "@/lib/runs/serialize";
import { meshConfidenceOf } from "@/lib/runs/mesh";
import { checksFor } from "./compute";
import type { RunData } from "./types";

/** A run as the API answers it (the inputs only when asked for). */
export type RunJson = Jsonify<RunView>;

interface ResultJson {
  runId: number;
  format: string;
  summary: Record<string, unknown> | null;
  result: { series: Series; frames: Frame[]; notes?: string[]; layout: Layout };
}

export function toRunData(run: RunJson, res: ResultJson): RunData {
  const scenario = run.inputs as unknown as Scenario;
  const summary = (res.summary ?? run.summary) as unknown as Summary;
  const r = res.result;
  return {
    scenario,
    summary,
    series: r.series,
    frames: r.frames.map((f) => ({ ...f, tensions: Array.from(f.tensions) })),
    layout: { ...r.layout, stations: Array.from(r.layout.stations) },
    notes: r.notes ?? [],
    checks: checksFor(scenario, summary),
    origin: "server",
    runId: run.id,
    wallTimeMs: run.wallTimeMs ?? 0,
    meshConfidence: meshConfidenceOf(run.diagnostics),
    meshError: typeof run.diagnostics?.meshError === "string" ? run.diagnostics.meshError : null,
  };
}

export async function loadServerRun(runId: number): Promise<{ run: RunJson; data: RunData | null }> {
  const got = await getJson<RunJson | { run: RunJson }>(`/api/runs/${runId}`);
  // GET /api/runs/[id] answers { run }; accept a bare run as well.
  const run = "run" in got ? got.run : got;
  if (run.status !== "done") return { run, data: null };
  const res = await getJson<ResultJson>(`/api/runs/${runId}/result`);
  return { run, data: toRunData(run, res) };
}

/** The runs of a scenario from GET /api/scenarios/[id]/runs (list shape `items`; older answers said `runs`). */
export function runItems(page: { items?: RunJson[]; runs?: RunJson[] } | undefined): RunJson[] | undefined {
  return page ? (page.items ?? page.runs ?? []) : undefined;
}
