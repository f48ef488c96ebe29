/**
 * A calibration's progress as server-sent events (lib/http/job-events.ts). Every event carries what
 * GET /api/recordings/[id]/calibration answers, `{ calibration }`: `progress` whenever its status or
 * progress changes, then `end` once it is done or failed (with the fit), or at once when there is none.
 */
import type { Actor } from "@/lib/http/actor";
import { jobEvents } from "@/lib/http/job-events";
import { getCalibration, latestCalibration, type CalibrationView } from "./service";
import { isCalibrationActive } from "./status";

/**
 * Follows the recording's calibration `calibrationId`, or its latest one when undefined (404 for another
 * organisation's recording or calibration, 403 without logbook:read).
 */
export async function calibrationEvents(actor: Actor, recordingId: number, calibrationId: number | undefined, signal: AbortSignal): Promise<Response> {
  return jobEvents<{ calibration: CalibrationView | null }>(
    {
      label: `calibration ${calibrationId ?? "latest"} of recording ${recordingId}`,
      read: async () => ({
        calibration: calibrationId === undefined ? await latestCalibration(actor, recordingId) : await getCalibration(actor, recordingId, calibrationId),
      }),
      finished: ({ calibration }) => !calibration || !isCalibrationActive(calibration.status),
      key: ({ calibration: c }) => (c ? `${c.id}|${c.status}|${c.progress}` : "none"),
      gone: { calibration: null },
    },
    signal,
  );
}
