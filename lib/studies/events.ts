/**
 * A study's progress as server-sent events (lib/http/job-events.ts). Every event carries what
 * GET /api/studies/[id] answers, `{ study }` with its cases and window: `progress` whenever anything in it
 * changes, then `end` once no case is left to run. Reading the study also settles cases whose runs have
 * finished (getStudy), as reading its status always did.
 */
import type { Actor } from "@/lib/http/actor";
import { jobEvents } from "@/lib/http/job-events";
import { isFinished, type RunStatus } from "@/lib/runs/status";
import type { UnitSystem } from "@/sim/units";
import { getStudy, type StudyView } from "./service";

/** How often the study is read: each read settles its open cases and builds the whole view. */
const STUDY_READ_MS = 1000;

/** Follows one study of the user's organisation (404 for another's, 403 without study:read). */
export async function studyEvents(actor: Actor, studyId: number, opts: { units?: UnitSystem }, signal: AbortSignal): Promise<Response> {
  return jobEvents<{ study: StudyView }>(
    {
      label: `study ${studyId}`,
      read: async () => ({ study: await getStudy(actor, studyId, opts) }),
      finished: ({ study }) => isFinished(study.status as RunStatus),
      gone: { study: null },
      intervalMs: STUDY_READ_MS,
    },
    signal,
  );
}
