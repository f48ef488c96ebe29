/** Calibration job states, the run states minus cancel. Kept free of server imports so screens can use them. */
export const CALIBRATION_STATUSES = ["queued", "running", "done", "failed"] as const;
export type CalibrationStatus = (typeof CALIBRATION_STATUSES)[number];

export const ACTIVE_CALIBRATION_STATUSES = ["queued", "running"] as const satisfies readonly CalibrationStatus[];

export function isCalibrationActive(status: CalibrationStatus): boolean {
  return (ACTIVE_CALIBRATION_STATUSES as readonly CalibrationStatus[]).includes(status);
}
