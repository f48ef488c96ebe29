"use client";
/**
 * The replay of one run inside the session builder, to find a moment and pin a caption there: the
 * workspace's replay panel, and a button that takes the replay's current time (its store) as the new
 * caption's time, kept within the run.
 */
import { useEffect, useState } from "react";
import { ReplayPanel } from "@/components/replay/ReplayPanel";
import { useReplayStore, useReplayTime } from "@/components/replay/store";
import { loadServerRun } from "@/components/run/serverRun";
import type { RunData } from "@/components/run/types";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import type { UnitSystem } from "@/lib/client/units";
import { pinnedAt } from "./types";

export function PinReplay({ runId, duration, units, index, onPin }: { runId: number; duration: number; units: UnitSystem; index: number; onPin: (at: number) => void }) {
  const [loaded, setLoaded] = useState<{ runId: number; data: RunData | null; error: string | null } | null>(null);
  const t = useReplayTime();

  useEffect(() => {
    let live = true;
    useReplayStore.getState().setPlaying(false);
    useReplayStore.getState().setT(0);
    loadServerRun(runId)
      .then((r) => live && setLoaded({ runId, data: r.data, error: r.data ? null : `Run ${runId} is ${r.run.status}.` }))
      .catch((e) => live && setLoaded({ runId, data: null, error: e instanceof Error ? e.message : String(e) }));
    return () => {
      live = false;
    };
  }, [runId]);

  const data = loaded?.runId === runId ? loaded.data : null;
  const error = loaded?.runId === runId ? loaded.error : null;
  if (error) return <Alert tone="error" title="The run's replay cannot be shown" testId={`pin-replay-error-${index}`}>{error}</Alert>;
  if (!data) return <p className="text-[13px] text-steel-500">{"Loading the run's replay…"}</p>;
  const pin = () => {
    const s = useReplayStore.getState();
    s.setPlaying(false);
    onPin(pinnedAt(s.t, duration));
  };
  return (
    <div className="space-y-2 rounded-md border border-steel-300/60 p-2" data-testid={`pin-replay-${index}`}>
      <ReplayPanel scenario={data.scenario} frames={data.frames} layout={data.layout} series={data.series} summary={data.summary} units={units} />
      <Button size="sm" onClick={pin} data-testid={`pin-caption-${index}`}>
        Pin a caption at {pinnedAt(t, duration).toFixed(2)} s
      </Button>
    </div>
  );
}
