import { Op } from "sequelize";
import { getModels, type Models } from "@/models";
import { ACTIVE_RUN_STATUSES } from "./status";
import { runnerMayBeAlive } from "@/lib/jobs/runner-id";

export const INTERRUPTED_MESSAGE = "The run was interrupted by a restart of the server; start it again.";

/**
 * Marks failed every queued or running run whose owning process is gone (a server restart or crash).
 * Runs are not re-queued: a restart may come from a run that brought the server down, and the person
 * who started it should decide. Runs of a live process (another test process, the server) stay as they are.
 * Called at server start (lib/engine/startup.ts).
 */
export async function recoverInterruptedRuns(models: Pick<Models, "Run"> = getModels()): Promise<number> {
  const { Run } = models;
  const rows = await Run.findAll({
    attributes: ["id", "runner"],
    where: { status: { [Op.in]: [...ACTIVE_RUN_STATUSES] } },
  });
  const dead = rows.filter((r) => !runnerMayBeAlive(r.runner ?? null)).map((r) => r.id);
  if (!dead.length) return 0;
  const [count] = await Run.update(
    {
      status: "failed",
      error: INTERRUPTED_MESSAGE,
      errorCode: "interrupted",
      finishedAt: new Date(),
      version: Run.sequelize!.literal("version + 1") as never,
    },
    { where: { id: { [Op.in]: dead }, status: { [Op.in]: [...ACTIVE_RUN_STATUSES] } } },
  );
  return count;
}
