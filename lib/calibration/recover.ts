import { Op } from "sequelize";
import { getModels, type Models } from "@/models";
import { runnerMayBeAlive } from "@/lib/jobs/runner-id";
import { ACTIVE_CALIBRATION_STATUSES } from "./status";

export const INTERRUPTED_CALIBRATION_MESSAGE = "The calibration was interrupted by a restart of the server; start it again.";

/**
 * Marks failed every queued or running calibration whose owning process is gone (a server restart or
 * crash), as lib/runs/recover.ts does for runs. Not re-queued: the person who started it decides.
 * Calibrations of a live process, or waiting in the Redis queue (another host name), stay as they are.
 */
export async function recoverInterruptedCalibrations(models: Pick<Models, "Calibration"> = getModels()): Promise<number> {
  const { Calibration } = models;
  const rows = await Calibration.findAll({ attributes: ["id", "runner"], where: { status: { [Op.in]: [...ACTIVE_CALIBRATION_STATUSES] } } });
  const dead = rows.filter((r) => !runnerMayBeAlive(r.runner ?? null)).map((r) => r.id);
  if (!dead.length) return 0;
  const [count] = await Calibration.update(
    { status: "failed", error: INTERRUPTED_CALIBRATION_MESSAGE, errorCode: "interrupted", finishedAt: new Date() },
    { where: { id: { [Op.in]: dead }, status: { [Op.in]: [...ACTIVE_CALIBRATION_STATUSES] } } },
  );
  return count;
}
