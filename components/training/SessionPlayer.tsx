"use client";
/**
 * Read-only playback of a replay session: the workspace's replay panel for each run in order, with the
 * trainer's captions appearing at their moments; progress is reported so the trainer sees who watched what.
 */
import Link from "next/link";
import { useEffect, useRef, useState } from "react";
import { ReplayPanel } from "@/components/replay/ReplayPanel";
import { useReplayStore } from "@/components/replay/store";
import { loadServerRun } from "@/components/run/serverRun";
import type { RunData } from "@/components/run/types";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { cx } from "@/components/ui/cx";
import { sendJson } from "@/lib/client/fetch";
import type { UnitSystem } from "@/lib/client/units";
import { activeCaption, type SessionJson } from "./types";

export function SessionPlayer({ session, units }: { session: SessionJson; units: UnitSystem }) {
  const [index, setIndex] = useState(0);
  const [loaded, setLoaded] = useState<{ runId: number; data: RunData | null; error: string | null } | null>(null);
  const item = session.items[index];
  const data = loaded && item && loaded.runId === item.runId ? loaded.data : null;
  const error = loaded && item && loaded.runId === item.runId ? loaded.error : null;
  const t = useReplayStore((s) => s.t);
  const furthest = useRef(0);

  useEffect(() => {
    if (!item) return;
    let live = true;
    furthest.current = 0;
    useReplayStore.getState().setPlaying(false);
    useReplayStore.getState().setT(0);
    loadServerRun(item.runId)
      .then((r) => live && setLoaded({ runId: item.runId, data: r.data, error: r.data ? null : `Run ${item.runId} is ${r.run.status}.` }))
      .catch((e) => live && setLoaded({ runId: item.runId, data: null, error: e instanceof Error ? e.message : String(e) }));
    return () => {
      live = false;
    };
  }, [item]);

  // Report progress every 2 s of playback and at the end.
  useEffect(() => {
    if (!item || !data) return;
    const duration = data.frames.length ? data.frames[data.frames.length - 1].t : 0;
    if (t > furthest.current + 2 || (t >= duration - 0.05 && furthest.current < duration - 0.05)) {
      furthest.current = t;
      void sendJson(`/api/training/sessions/${session.id}/views`, "POST", { itemId: item.id, watchedTo: Math.min(600, t), completed: t >= duration - 0.05 }).catch(() => {});
    }
  }, [t, item, data, session.id]);

  if (!item) return <p className="text-[14px] text-steel-500">This session has no runs yet.</p>;
  const caption = activeCaption(item.captions, t);
  return (
    <div className="space-y-5" data-testid="session-player">
      <div className="flex flex-wrap items-center gap-2">
        {session.items.map((it, k) => (
          <button
            key={it.id}
            onClick={() => setIndex(k)}
            className={cx("rounded-md border px-3 py-1.5 text-[13px]", k === index ? "border-lamp-600 bg-lamp-50 font-semibold" : "border-steel-300 bg-white")}
            data-testid={`session-item-${k}`}
          >
            {k + 1}. {it.title || it.scenarioName || `Run ${it.runId}`}
          </button>
        ))}
        {session.canEdit && (
          <Link href={`/replays/${session.id}/edit`} className="ml-auto text-[13.5px] font-semibold text-lamp-600 hover:underline">
            Edit the session
          </Link>
        )}
      </div>
      <Card>
        <CardHeader title={item.title || item.scenarioName || `Run ${item.runId}`} description={`Run ${item.runId} · ${item.captions.length} caption(s)`} />
        <CardBody className="space-y-3">
          <div className={cx("min-h-12 rounded-md border px-4 py-3 text-[15px]", caption ? "border-lamp-500 bg-lamp-50 text-ink-900" : "border-dashed border-steel-300 text-steel-500")} data-testid="caption">
            {caption ? caption.text : "Captions appear here at their moments."}
          </div>
          {error && <Alert tone="error">{error}</Alert>}
          {data ? (
            <ReplayPanel scenario={data.scenario} frames={data.frames} layout={data.layout} series={data.series} summary={data.summary} units={units} />
          ) : (
            !error && <div className="h-[400px] animate-pulse rounded-md bg-steel-100" />
          )}
          <ol className="space-y-1 text-[13px]" data-testid="caption-list">
            {item.captions.map((c) => (
              <li key={c.id}>
                <Button size="sm" variant="ghost" onClick={() => useReplayStore.getState().setT(c.at)}>
                  {c.at.toFixed(1)} s
                </Button>{" "}
                {c.text}
              </li>
            ))}
          </ol>
          <div className="flex gap-2">
            <Button size="sm" variant="secondary" disabled={index === 0} onClick={() => setIndex(index - 1)}>
              Previous run
            </Button>
            <Button size="sm" variant="secondary" disabled={index >= session.items.length - 1} onClick={() => setIndex(index + 1)} data-testid="next-item">
              Next run
            </Button>
          </div>
        </CardBody>
      </Card>
      <SafetyNote />
    </div>
  );
}
