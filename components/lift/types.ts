/** Shapes of the lift API's answers as the browser sees them (dates arrive as ISO text). */
export interface LiftSections {
  lift: Record<string, unknown>;
  chain: Record<string, unknown>;
  drive: Record<string, unknown>;
  takeUp: Record<string, unknown>;
  antiRollback: Record<string, unknown>;
  limits: Record<string, unknown>;
}

export interface RevisionJson extends LiftSections {
  id: number;
  liftId: number;
  number: number;
  name: string;
  site: string | null;
  notes: string | null;
  chainSpecId: number | null;
  changeSummary: string | null;
  createdBy: number | null;
  createdAt: string;
}

export interface LiftJson {
  id: number;
  name: string;
  site: string | null;
  notes: string | null;
  version: number;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
  currentRevision: RevisionJson;
}

export interface LiftListItemJson {
  id: number;
  name: string;
  site: string | null;
  version: number;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
  currentRevisionId: number | null;
  currentRevisionNumber: number | null;
}

export interface RevisionListItemJson {
  id: number;
  number: number;
  name: string;
  changeSummary: string | null;
  chainSpecId: number | null;
  createdBy: number | null;
  createdAt: string;
  current: boolean;
}

export interface FieldChangeJson {
  path: string;
  before: unknown;
  after: unknown;
}

export interface RevisionDetailJson {
  revision: RevisionJson;
  current: boolean;
  comparedWith: number | null;
  changes: FieldChangeJson[];
}

export interface ChainSpecJson {
  id: number;
  designation: string;
  pitch: number;
  massPerLength: number;
  axialStiffness: number;
  breakingStrength: number;
  source: string;
  note: string | null;
  standard: boolean;
  version: number;
  archivedAt: string | null;
}

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
  limits: { requiredSafetyFactor: 5, maxSnatchFactor: 2, maxRiderAccel: 0.5, allowRollback: false, maxPickupDelay: 1.5, wearAllowance: 3, thermalDeltaT: 40, thermalExpansion: 11.7e-6 },
};
