/** Why a run stopped without a result. */
export type SimulationErrorCode =
  | "budget-steps"
  | "budget-time"
  | "aborted"
  | "tolerance"
  | "non-finite"
  | "invalid-scenario";

/** A run that cannot give a trustworthy result stops with this, never with NaN or garbage. */
export class SimulationError extends Error {
  constructor(
    readonly code: SimulationErrorCode,
    message: string,
    /** Simulated time reached, s. */
    readonly simulatedTime = 0,
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = "SimulationError";
  }
}
