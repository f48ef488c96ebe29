import { z } from "zod";

/** Every update carries the version it edits (plain zod, safe for browser bundles). */
export const versionField = z
  .number({ error: "version is required: send the version you are editing" })
  .int({ error: "version must be a whole number" })
  .min(1, { error: "version must be at least 1" });
