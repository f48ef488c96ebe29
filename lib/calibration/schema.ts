/** The start-calibration body, shared by the route, the service and the panel. */
import { z } from "zod";

export const calibrateInputSchema = z.object({
  scenarioId: z.number().int().positive(),
  fitFriction: z.boolean().optional(),
});
export type CalibrateInput = z.infer<typeof calibrateInputSchema>;
