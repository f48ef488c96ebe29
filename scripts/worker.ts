// npm run worker: a BullMQ worker for runs, study cases and calibration fits. Start it on any machine
// that reaches the database (DB_*) and Redis (REDIS_URL); it runs JOB_WORKERS engine threads. Ctrl-C /
// SIGTERM stops taking jobs, lets the jobs in hand finish, then exits (a killed worker's jobs go back to the queue as stalled).
import { startEngineWorker } from "../lib/engine/queue-worker";
import { closeJobPool, getJobPool } from "../lib/jobs/pool";
import { getSequelize } from "../lib/db/sequelize";
import { RUNNER_ID } from "../lib/jobs/runner-id";

async function main(): Promise<void> {
  if (!process.env.REDIS_URL) {
    console.error("[tautline worker] REDIS_URL is not set: workers take jobs from Redis (e.g. REDIS_URL=redis://127.0.0.1:6379).");
    process.exit(2);
  }
  await getSequelize().authenticate();
  const threads = getJobPool().config.workers;
  const w = startEngineWorker({ concurrency: threads });
  const redisHost = new URL(process.env.REDIS_URL).host;
  console.log(`[tautline worker] ${RUNNER_ID}: ${threads} engine thread(s), Redis ${redisHost}, database ${process.env.DB_HOST ?? "127.0.0.1"}:${process.env.DB_PORT ?? 3306}`);
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    console.log("[tautline worker] stopping");
    await w.close();
    await closeJobPool();
    await getSequelize().close();
    process.exit(0);
  };
  process.on("SIGINT", () => void stop());
  process.on("SIGTERM", () => void stop());
}

main().catch((err) => {
  console.error("[tautline worker]", err instanceof Error ? err.message : err);
  process.exit(1);
});
