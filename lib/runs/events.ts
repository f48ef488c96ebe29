/**
 * A run's progress as server-sent events (lib/http/job-events.ts): `progress` ({ id, status, progress })
 * whenever either changes, then one `end` with the whole run (RunView), or `{ id, status: "deleted" }`.
 */
import type { Actor } from "@/lib/http/actor";
import { jobEvents } from "@/lib/http/job-events";
import { findOwnRun } from "./service";
import { isFinished } from "./status";
import { toRunView } from "./serialize";

/** Checks the run is this user's (404 otherwise), then answers its event stream. */
export async function runEvents(user: Actor, runId: number, signal: AbortSignal): Promise<Response> {
  return jobEvents(
    {
      label: `run ${runId}`,
      // 404 for another organisation's run: before the stream it is the answer, during it the run is gone.
      read: () => findOwnRun(user, runId),
      finished: (run) => isFinished(run.status),
      progress: (run) => ({ id: run.id, status: run.status, progress: run.progress }),
      end: (run) => toRunView(run),
      gone: { id: runId, status: "deleted" },
    },
    signal,
  );
}
