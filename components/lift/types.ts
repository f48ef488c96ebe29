/** The lift API's answers as the browser sees them: the lib/ view types after JSON (dates as ISO text). */
import type { Jsonify } from "@/lib/client/jsonify";
import type { ChainSpecView } from "@/lib/chains/service";
import type { FieldChange } from "@/lib/diff/values";
import type { LiftListItem, LiftView, RevisionDetail, RevisionListItem, RevisionView } from "@/lib/lifts/service";

export type RevisionJson = Jsonify<RevisionView>;
export type LiftJson = Jsonify<LiftView>;
export type LiftListItemJson = Jsonify<LiftListItem>;
export type RevisionListItemJson = Jsonify<RevisionListItem>;
export type FieldChangeJson = Jsonify<FieldChange>;
export type RevisionDetailJson = Jsonify<RevisionDetail>;
export type ChainSpecJson = Jsonify<ChainSpecView>;

/** The values a new lift starts from (an example lift hill; every value can be changed). */
export const NEW_LIFT: Record<string, unknown> = {
  name: "",
  site: "",
  notes: "",
  chainSpecId: null,
  lift: { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40, chainFrom: 10, chainTo: 122, dogRelease: 120, bottomRun: 4 },
  chain: { massPerLength: 15, axialStiffness: 1.5e7, breakingStrength: 5e5, pitch: 0.1016, catchSpacing: 2, catchOffset: 10, guideFriction: 0.02, damping: 2000 },
  drive: { speed: 2.5, rampTime: 2, sprocketTeeth: 11, efficiency: 0.9 },
  takeUp: { mass: 5000, travel: 2.5, position: 1.2, friction: 0 },
  antiRollback: { enabled: true, from: 12, to: 118, toothSpacing: 0.15 },
  limits: {
    requiredSafetyFactor: 5,
    maxSnatchFactor: 2,
    maxRiderAccel: 0.5,
    riderAccelBriefDuration: 0.5,
    riderAccelSustained: 0.3,
    riderAccelSustainedDuration: 2,
    riderAccelCeiling: 1,
    riderAccelBackwardScale: 1,
    allowRollback: false,
    maxPickupDelay: 1.5,
    maxTimeToChainSpeed: 3,
    workingLoadFraction: 1 / 7,
    minBreakingRatio: 1,
    maxBreakingRatio: 4,
    wearAllowance: 3,
    thermalDeltaT: 40,
    thermalExpansion: 11.7e-6,
    releaseEnergyMargin: 1.25,
  },
};
