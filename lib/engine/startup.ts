/**
 * Start-up recovery of interrupted jobs, called once by instrumentation.ts when the server starts (never
 * on the request path): runs and calibration fits whose process is gone are failed with a clear message,
 * and pool-mode studies whose driver is gone continue in this process, keeping every finished case.
 */
import { isDbConnectionError } from "@/lib/db/health";
import { recoverInterruptedCalibrations } from "@/lib/calibration/recover";
import { recoverStudies } from "@/lib/studies/service";

const RETRY_MS = 2_000;
const GIVE_UP_MS = 5 * 60_000;

export async function recoverInterruptedJobs(): Promise<{ studies: number; calibrations: number }> {
  // recoverStudies fails the interrupted runs first (their cases are then queued again).
  const studies = await recoverStudies();
  const calibrations = await recoverInterruptedCalibrations();
  return { studies, calibrations };
}

/** Recovery in the background: a database that is not up yet is waited for (up to 5 minutes). */
export async function recoverAtStartup(log: (message: string) => void = console.log): Promise<void> {
  const until = Date.now() + GIVE_UP_MS;
  for (;;) {
    try {
      const n = await recoverInterruptedJobs();
      if (n.studies || n.calibrations) log(`[tautline] resumed ${n.studies} interrupted stud(ies); failed ${n.calibrations} interrupted calibration(s)`);
      return;
    } catch (err) {
      if (!isDbConnectionError(err) || Date.now() > until) {
        console.error("[tautline] could not recover interrupted jobs", err);
        return;
      }
      await new Promise((r) => setTimeout(r, RETRY_MS));
    }
  }
}
