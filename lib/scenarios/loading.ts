/** A scenario's loading case (plain values, safe for browser bundles). */
export const LOADINGS = ["empty", "full", "riders"] as const;
export type Loading = (typeof LOADINGS)[number];
