/**
 * A calibration's progress as server-sent events (lib/http/job-events.ts). Every event carries what
 * GET /api/recordings/[id]/calibration?calibrationId= answers, `{ calibration }`: `progress` whenever its
 * status or progress changes, then `end` once it is done or failed (with the fit).
 */
import type { Actor } from "@/lib/http/actor";
import { badRequest } from "@/lib/http/errors";
import { jobEvents } from "@/lib/http/job-events";
import { getCalibration, latestCalibration, type CalibrationView } from "./service";
import { isCalibrationActive } from "./status";

/**
 * Follows one calibration of the recording: 404 for another organisation's recording or calibration, 403
 * without logbook:read, 400 when no calibration is named (a stream follows one job, not "the latest").
 */
export async function calibrationEvents(actor: Actor, recordingId: number, calibrationId: number | null, signal: AbortSignal): Promise<Response> {
  if (calibrationId === null) {
    await latestCalibration(actor, recordingId); // the recording's own checks come first
    throw badRequest("Name the calibration to follow.", [{ path: "calibrationId", message: "give the id of one of the recording's calibrations" }]);
  }
  return jobEvents<{ calibration: CalibrationView }>(
    {
      label: `calibration ${calibrationId}`,
      read: async () => ({ calibration: await getCalibration(actor, recordingId, calibrationId) }),
      finished: ({ calibration }) => !isCalibrationActive(calibration.status),
      key: ({ calibration: c }) => `${c.status}|${c.progress}`,
      gone: { calibration: null },
    },
    signal,
  );
}
