"use client";
/**
 * The run view of a scenario: opens the latest saved run at once, runs the scenario in this browser
 * (Web Worker, progress, cancel), what-if sliders, and "save" = start the same scenario on the server, with
 * the sliders' values as overrides when they are moved (the server computes the run itself).
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useRef, useState } from "react";
import { useShallow } from "zustand/react/shallow";
import type { Scenario } from "@/sim";
import { Alert } from "@/components/ui/Alert";
import { Badge } from "@/components/ui/Badge";
import { Button } from "@/components/ui/Button";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { useResource } from "@/lib/client/hooks";
import type { UnitSystem } from "@/lib/client/units";
import { ProgressBar } from "./ProgressBar";
import { RunResults } from "./RunResults";
import { loadServerRun, runItems, type RunJson } from "./serverRun";
import { shownData, useRunStore } from "./store";
import { useWorkerRun } from "./useWorkerRun";
import { WhatIfPanel } from "./WhatIfPanel";
import { withWhatIf } from "./compute";
import { changedOverrides } from "@/lib/runs/overrides";
import { overrideLines } from "./overridesText";
import { formatDate } from "@/lib/client/dates";

function withSegments(s: Scenario, n: number | null): Scenario {
  return n ? { ...s, run: { ...s.run, segments: n } } : s;
}

const STATUS_TONE = { queued: "neutral", running: "lamp", done: "pass", failed: "fail", cancelled: "neutral" } as const;

export function ScenarioRunView({
  scenarioId,
  scenario,
  units,
  canStart,
  initialT,
  fileStem,
}: {
  scenarioId: number;
  scenario: Scenario | null;
  units: UnitSystem;
  canStart: boolean;
  initialT?: number;
  fileStem: string;
}) {
  const router = useRouter();
  // Only what this view shows: the preview's busy flag and latency re-render the what-if panel alone.
  const { status, progress, error, whatIf, progressEvents } = useRunStore(
    useShallow((s) => ({ status: s.status, progress: s.progress, error: s.error, whatIf: s.whatIf, progressEvents: s.progressEvents })),
  );
  const data = useRunStore((s) => shownData(s));
  const reset = useRunStore((s) => s.reset);
  const set = useRunStore((s) => s.set);
  // The workers start with the view and compile the engine on this scenario before the first slider move.
  const { runFull, cancel, runPreview } = useWorkerRun(canStart ? scenario : null);
  // The scenario's own runs only: a study's cases are other inputs and live with their study.
  const runs = useResource<{ items?: RunJson[]; runs?: RunJson[]; total: number }>(`/api/scenarios/${scenarioId}/runs?pageSize=8&source=own`);
  const [openFailed, setOpenFailed] = useState(false);
  const [saveMsg, setSaveMsg] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  const [saving, setSaving] = useState(false);
  const [segments, setSegments] = useState<number | null>(null);

  useEffect(() => {
    reset();
    return () => reset();
  }, [reset, scenarioId]);

  // A saved run opens at once from its stored result; a what-if run is not the scenario's own result.
  const runList = runItems(runs.data);
  const latestDone = runList?.find((r) => r.status === "done" && !r.overrides);
  useEffect(() => {
    if (!latestDone || useRunStore.getState().data) return;
    let live = true;
    loadServerRun(latestDone.id)
      .then(({ data: d }) => {
        if (live && d && !useRunStore.getState().data) set({ data: d, status: "idle" });
      })
      .catch(() => live && setOpenFailed(true));
    return () => {
      live = false;
    };
  }, [latestDone, set]);

  // Only the values the sliders actually changed travel as overrides; the server applies them itself.
  const overrides = scenario && whatIf ? changedOverrides(scenario, whatIf) : null;

  // One save at a time: a second click before the page moves to the new run must not start a second run.
  const saveInFlight = useRef(false);
  async function saveOnServer() {
    if (saveInFlight.current) return;
    saveInFlight.current = true;
    setSaving(true);
    setSaveMsg(null);
    try {
      const res = await sendJson<{ run: RunJson }>(`/api/scenarios/${scenarioId}/runs`, "POST", {
        ...(overrides ? { overrides } : {}),
        // The chain mesh picked for the browser run is a run setting the API takes as it is.
        ...(segments ? { segments } : {}),
      });
      router.push(`/runs/${res.run.id}`);
    } catch (err) {
      setSaveMsg({ tone: "error", text: err instanceof ApiError ? err.message : String(err) });
      saveInFlight.current = false;
      setSaving(false);
    }
  }

  if (!scenario)
    return (
      <Alert tone="error" title="This scenario cannot be run as it stands" testId="scenario-invalid">
        Its lift revision or train no longer makes a valid engine scenario. Edit the scenario or pin another revision.
      </Alert>
    );

  return (
    <div className="space-y-4" data-testid="run-view" data-status={status} data-progress-events={progressEvents}>
      <div className="flex flex-wrap items-center gap-3 rounded-lg border border-steel-300/70 bg-white px-4 py-3">
        {canStart ? (
          <>
            <Button onClick={() => void runFull(withSegments(whatIf ? withWhatIf(scenario, whatIf) : scenario, segments))} disabled={status === "running"} data-testid="run-in-browser">
              Run in this browser
            </Button>
            <label className="flex items-center gap-1.5 text-[12.5px] text-steel-500">
              Chain segments
              <select
                className="h-8 rounded-md border border-steel-300 bg-white px-1.5 text-[13px] text-ink-900"
                value={segments ?? ""}
                onChange={(e) => setSegments(e.target.value ? Number(e.target.value) : null)}
                data-testid="run-segments"
              >
                <option value="">as the scenario ({scenario.run.segments})</option>
                {[120, 240].map((n) => (
                  <option key={n} value={n}>
                    {n} (finer, slower)
                  </option>
                ))}
              </select>
            </label>
            {status === "running" && (
              <Button variant="secondary" onClick={cancel} data-testid="cancel-run">
                Cancel
              </Button>
            )}
            {status === "running" ? (
              <ProgressBar value={progress} label="Browser run progress" />
            ) : (
              <span className="text-[12.5px] text-steel-500" data-testid="run-status">
                {status === "done" ? `Browser run done (${data && data.origin === "browser" ? (data.wallTimeMs / 1000).toFixed(2) : "—"} s).` : status === "cancelled" ? "Cancelled." : status === "failed" ? "The run failed." : "Runs here stay in this browser until you save."}
              </span>
            )}
            <div className="ml-auto flex items-center gap-2">
              <Button
                variant="secondary"
                onClick={() => void saveOnServer()}
                busy={saving}
                data-testid="save-run"
                data-overrides={overrides ? Object.keys(overrides).join(",") : ""}
                title={overrides ? "Starts the scenario on the server with the what-if values; the server keeps the run and its result" : "Starts the same scenario on the server, which keeps the run and its result"}
              >
                {overrides ? "Save what-if run on the server" : "Save run on the server"}
              </Button>
            </div>
          </>
        ) : (
          <span className="text-[12.5px] text-steel-500" data-testid="read-only-note">
            Read only: your role may open saved runs but not start them.
          </span>
        )}
      </div>
      {canStart && (
        <p className="-mt-2 text-[11.5px] text-steel-500">
          Saving starts this scenario on the server (the server computes and keeps its own copy; the runs API does not take results from browsers) and opens it when it is done.
          {overrides ? ` The what-if values (${overrideLines(overrides, null, units).join(", ")}) go with it: the saved run is marked as a what-if variant and the scenario itself is not changed.` : ""}
        </p>
      )}
      {error && (
        <Alert tone="error" title="The run stopped" testId="run-error">
          {error}
        </Alert>
      )}
      {saveMsg && <Alert tone={saveMsg.tone === "error" ? "error" : "info"} title={saveMsg.text} testId="save-run-message" />}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_300px]">
        <div className="min-w-0">{canStart && <WhatIfPanel base={scenario} units={units} runPreview={runPreview} runFull={runFull} />}</div>
        <section className="rounded-lg border border-steel-300/70 bg-white" data-testid="saved-runs">
          <h3 className="border-b border-steel-100 px-4 py-2 text-[13px] font-bold text-ink-900">Saved runs</h3>
          <ul className="max-h-48 divide-y divide-steel-100 overflow-y-auto">
            {runList?.map((r) => (
              <li key={r.id} className="flex items-center gap-2 px-4 py-1.5 text-[12.5px]">
                <Link href={`/runs/${r.id}`} className="font-mono font-semibold text-ink-900 hover:text-lamp-600 hover:underline">
                  Run {r.id}
                </Link>
                <Badge tone={STATUS_TONE[r.status]}>{r.status}</Badge>
                {r.overrides && (
                  <span title={`What-if variant: ${overrideLines(r.overrides, r.overridesFrom, units).join(", ")}`} data-testid="saved-run-whatif">
                    <Badge tone="caution">what-if</Badge>
                  </span>
                )}
                <span className="ml-auto text-[11.5px] text-steel-500">{formatDate(r.queuedAt, "shortDayTime")}</span>
              </li>
            ))}
            {runList && runList.length === 0 && <li className="px-4 py-2 text-[12.5px] text-steel-500">No saved runs yet.</li>}
          </ul>
          <p className="border-t border-steel-100 px-4 py-1.5 text-[11.5px] text-steel-500" data-testid="study-cases-note">
            Cases of studies are not listed here: open them from their{" "}
            <Link href="/studies" className="font-semibold text-ink-800 hover:underline">
              study
            </Link>
            .
          </p>
        </section>
      </div>

      {data ? (
        <RunResults data={data} units={units} initialT={initialT} fileStem={fileStem} />
      ) : (
        <div className="rounded-lg border border-dashed border-steel-300 px-6 py-12 text-center text-[13.5px] text-steel-500" data-testid="no-result">
          {latestDone && !openFailed ? "Opening the latest saved run…" : canStart ? "No result yet: run the scenario in this browser, or save a run on the server." : "No saved run of this scenario yet."}
        </div>
      )}
    </div>
  );
}
