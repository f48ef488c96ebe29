/**
 * A study's progress as server-sent events (lib/http/job-events.ts). Every event carries what
 * GET /api/studies/[id] answers, `{ study }` with its cases and window: `progress` whenever anything in it
 * changes, then `end` once no case is left to run. Reading the study also settles cases whose runs have
 * finished (getStudy), as reading its status always did.
 */
import { getModels } from "@/models";
import { assertCan, type Actor } from "@/lib/http/actor";
import { jobEvents } from "@/lib/http/job-events";
import { isFinished, type RunStatus } from "@/lib/runs/status";
import type { UnitSystem } from "@/lib/units/display";
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

/** A study's line in a list: its status and case counts (as GET /api/studies lists them). */
export type StudyListLine = Pick<StudyView, "id" | "status" | "casesTotal" | "casesDone" | "casesFailed">;

/**
 * Follows the listed studies of the user's organisation (others' ids are left out, as a list filter would):
 * `{ items }` with each one's status and counts whenever one changes, then `end` once none is queued or
 * running. One stream for a whole list, so a page of studies holds one connection.
 */
export async function studyListEvents(actor: Actor, ids: number[], signal: AbortSignal): Promise<Response> {
  assertCan(actor, "study:read");
  const { Study } = getModels();
  return jobEvents<{ items: StudyListLine[] }>(
    {
      label: `studies ${ids.join(",")}`,
      read: async () => {
        const rows = await Study.findAll({
          where: { id: ids, organisationId: actor.organisationId },
          attributes: ["id", "status", "casesTotal", "casesDone", "casesFailed"],
          order: [["id", "DESC"]],
        });
        return { items: rows.map((s) => ({ id: s.id, status: s.status, casesTotal: s.casesTotal, casesDone: s.casesDone, casesFailed: s.casesFailed })) };
      },
      finished: ({ items }) => items.every((s) => isFinished(s.status as RunStatus)),
      gone: { items: [] },
      intervalMs: STUDY_READ_MS,
    },
    signal,
  );
}
