/**
 * The queue worker of Tautline's jobs: the generic BullMQ worker (lib/jobs/bullmq.ts) with the handler of
 * each kind of job, and the study hook that copies a finished case run's figures into its case.
 */
import { startQueueWorker, type QueueWorker } from "@/lib/jobs/bullmq";
import { RUN_JOB, runQueueJob, type RunJobData } from "@/lib/runs/queue";
import { CALIBRATION_JOB, calibrationQueueJob } from "@/lib/calibration/queue";
import { settleCaseOfJob } from "@/lib/studies/progress";

export type { QueueWorker } from "@/lib/jobs/bullmq";

export function startEngineWorker(opts: { concurrency?: number } = {}): QueueWorker {
  return startQueueWorker({
    concurrency: opts.concurrency,
    handlers: { [RUN_JOB]: runQueueJob, [CALIBRATION_JOB]: calibrationQueueJob },
    onFinished: async (name, data) => {
      if (name === RUN_JOB) await settleCaseOfJob(data as RunJobData);
    },
  });
}
