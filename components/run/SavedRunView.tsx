"use client";
/**
 * A saved run: follows a queued or running run by its event stream, then opens the stored result. A what-if
 * run says so, with each value it ran beside the scenario's own.
 */
import Link from "next/link";
import { useEffect, useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Badge } from "@/components/ui/Badge";
import { Button } from "@/components/ui/Button";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { useJobEvents } from "@/lib/client/job-events";
import type { UnitSystem } from "@/lib/client/units";
import { ProgressBar } from "./ProgressBar";
import { RunResults } from "./RunResults";
import { loadServerRun, type RunJson } from "./serverRun";
import { overrideLines } from "./overridesText";
import type { RunData } from "./types";
import { formatDate } from "@/lib/client/dates";

const TONE = { queued: "neutral", running: "lamp", done: "pass", failed: "fail", cancelled: "neutral" } as const;

export function SavedRunView({ runId, units, canCancel, initialT, fileStem }: { runId: number; units: UnitSystem; canCancel: boolean; initialT?: number; fileStem: string }) {
  const [run, setRun] = useState<RunJson | null>(null);
  const [data, setData] = useState<RunData | null>(null);
  const [progress, setProgress] = useState(0);
  const [error, setError] = useState<string | null>(null);

  // Follows the run's event stream while it is queued or running; the end event reads the run again and
  // opens the stored result.
  const [follow, setFollow] = useState(false);
  const [reads, setReads] = useState(0);
  useEffect(() => {
    let live = true;
    const open = async () => {
      try {
        const r = await loadServerRun(runId);
        if (!live) return;
        setRun(r.run);
        setProgress(r.run.progress);
        if (r.data) setData(r.data);
        setFollow(!r.data && (r.run.status === "queued" || r.run.status === "running"));
      } catch (err) {
        if (live) setError(err instanceof Error ? err.message : String(err));
      }
    };
    void open();
    return () => {
      live = false;
    };
  }, [runId, reads]);
  const events = useJobEvents<{ status: RunJson["status"]; progress: number }, unknown>(follow ? `/api/runs/${runId}/events` : null, {
    onUpdate: (m) => {
      setProgress(m.progress);
      setRun((x) => (x ? { ...x, status: m.status, progress: m.progress } : x));
    },
    onEnd: () => {
      setFollow(false);
      setReads((n) => n + 1);
    },
  });
  const shownError = error ?? events.error;

  const cancel = async () => {
    try {
      await sendJson(`/api/runs/${runId}/cancel`, "POST", {});
    } catch (err) {
      setError(err instanceof ApiError ? err.message : String(err));
    }
  };

  return (
    <div className="space-y-4" data-testid="saved-run">
      {run && (
        <div className="flex flex-wrap items-center gap-3 rounded-lg border border-steel-300/70 bg-white px-4 py-3 text-[13px]">
          <Badge tone={TONE[run.status]}>
            <span data-testid="saved-run-status">{run.status}</span>
          </Badge>
          <Link className="font-semibold text-ink-900 hover:underline" href={`/scenarios/${run.scenarioId}`}>
            Open the scenario
          </Link>
          <span className="text-steel-500">queued {formatDate(run.queuedAt, "dayTime")}</span>
          {(run.status === "queued" || run.status === "running") && (
            <>
              <ProgressBar value={progress} label="Server run progress" />
              {canCancel && (
                <Button size="sm" variant="secondary" onClick={() => void cancel()} data-testid="cancel-server-run">
                  Cancel
                </Button>
              )}
            </>
          )}
        </div>
      )}
      {run?.overrides && (
        <Alert tone="caution" title="What-if variant: the server ran the scenario with these values instead of its own" testId="saved-run-whatif">
          <ul className="font-mono text-[12.5px] tabular-nums">
            {overrideLines(run.overrides, run.overridesFrom, units).map((line) => (
              <li key={line} data-testid="saved-run-override">
                {line}
              </li>
            ))}
          </ul>
          <p className="text-[12px] text-steel-500">The scenario itself is unchanged; its other runs use its own values.</p>
        </Alert>
      )}
      {shownError && <Alert tone="error" title={shownError} testId="saved-run-error" />}
      {run?.status === "failed" && (
        <Alert tone="error" title="The run failed" testId="saved-run-failed">
          {run.error}
        </Alert>
      )}
      {run?.status === "cancelled" && <Alert tone="info" title="The run was cancelled before it finished." />}
      {data && <RunResults data={data} units={units} initialT={initialT} fileStem={fileStem} />}
      {!run && !shownError && <div className="h-40 animate-pulse rounded-lg bg-steel-100" />}
    </div>
  );
}
