/** Public API of the Tautline simulation engine (pure TypeScript: browser, worker thread, CLI). */
export { simulate, DEFAULT_FRAME_BUDGET, DEFAULT_SAMPLE_INTERVAL } from "./simulate";
export type { SimulateOptions, SimulationResult, Layout } from "./simulate";
export { SimulationError } from "./errors";
export type { SimulationErrorCode } from "./errors";
export * from "./schema";
export { designStatics, chordalRadiusVariation, chordalSpeedVariation } from "./statics";
export type { DesignStatics, StaticsOptions, TensionProfile, TrainPositionCase } from "./statics";
export { evaluateChecks, reasonText, siQuantityText } from "./checks";
export type { Check, CheckState, ReasonKind, ReasonPart } from "./checks";
export { chainTensionAtDog, dogSegments, dogTensionAt } from "./dog-tension";
export type { DogLayout, DogPlace } from "./dog-tension";
export type { Summary } from "./summary";
export type { Frame, Series } from "./frames";
export { SERIES_KEYS } from "./frames";
export { buildTrack } from "./track";
export type { Track, TrackPoint } from "./track";
export { pitchDiameter } from "./drive";
export * as units from "./units";
