/** The lift form's fields, grouped as the revision stores them (SI inside, units per quantity). */
import { LIMIT_SOURCES } from "@/sim/schema";
import type { FieldDef } from "@/components/ui/form-draft";
import type { FieldLabel } from "@/lib/client/field-messages";

export const GEOMETRY_FIELDS: FieldDef[] = [
  { path: "lift.approachLength", label: "Approach length", q: "length", hint: "Level track before the sag" },
  { path: "lift.sagRadius", label: "Sag radius", q: "length" },
  { path: "lift.angle", label: "Lift angle", q: "angle" },
  { path: "lift.inclineLength", label: "Incline length", q: "length", hint: "Straight part of the hill" },
  { path: "lift.crestRadius", label: "Crest radius", q: "length" },
  { path: "lift.exitLength", label: "Exit length", q: "length" },
];

/** Chain extent along the track (with either profile). */
export const EXTENT_FIELDS: FieldDef[] = [
  { path: "lift.chainFrom", label: "Chain starts at", q: "length", hint: "Track position (bottom idler)" },
  { path: "lift.chainTo", label: "Chain ends at", q: "length", hint: "Track position (top idler)" },
  { path: "lift.dogRelease", label: "Dog release at", q: "length" },
  { path: "lift.bottomRun", label: "Bottom run", q: "length", hint: "Drive → take-up → idler" },
];

/** Values the catalogue entry fills in (read-only while a catalogue chain is picked). */
export const CHAIN_VALUE_FIELDS: FieldDef[] = [
  { path: "chain.pitch", label: "Pitch", q: "smallLength" },
  { path: "chain.massPerLength", label: "Mass per length", q: "massPerLength" },
  { path: "chain.axialStiffness", label: "Axial stiffness E·A", q: "axialStiffness" },
  { path: "chain.breakingStrength", label: "Breaking strength", q: "force" },
];

export const CHAIN_ROUTING_FIELDS: FieldDef[] = [
  { path: "chain.catchSpacing", label: "Catch spacing", q: "length", hint: "Distance between catch points" },
  { path: "chain.catchOffset", label: "First catch point at", q: "length", optional: true, hint: "Empty: where the chain starts" },
  { path: "chain.guideFriction", label: "Guide friction", q: "ratio" },
  { path: "chain.damping", label: "Internal damping", q: "damping" },
];

export const DRIVE_FIELDS: FieldDef[] = [
  { path: "drive.speed", label: "Chain speed", q: "speed" },
  { path: "drive.rampTime", label: "Ramp-up time", q: "time" },
  { path: "drive.sprocketTeeth", label: "Sprocket teeth", q: "count", int: true },
  { path: "drive.efficiency", label: "Drive efficiency", q: "ratio" },
];

export const TAKEUP_FIELDS: FieldDef[] = [
  { path: "takeUp.mass", label: "Counterweight mass", q: "mass", hint: "2:1: each leg carries half its weight" },
  { path: "takeUp.travel", label: "Guide travel", q: "length" },
  { path: "takeUp.position", label: "Below top stop", q: "length", hint: "Starting position" },
  { path: "takeUp.friction", label: "Guide friction force", q: "force" },
];

export const ARD_FIELDS: FieldDef[] = [
  { path: "antiRollback.from", label: "Ratchet from", q: "length" },
  { path: "antiRollback.to", label: "Ratchet to", q: "length" },
  { path: "antiRollback.toothSpacing", label: "Tooth spacing", q: "smallLength" },
];

const src = (k: keyof typeof LIMIT_SOURCES) => LIMIT_SOURCES[k];

export const LIMIT_FIELDS: FieldDef[] = [
  { path: "limits.requiredSafetyFactor", label: "Required safety factor", q: "ratio", hint: src("requiredSafetyFactor") },
  { path: "limits.maxSnatchFactor", label: "Largest snatch factor", q: "ratio", hint: src("maxSnatchFactor") },
  { path: "limits.motorRating", label: "Motor rating", q: "power", optional: true, hint: src("motorRating") },
  { path: "limits.maxRiderAccel", label: "Brief rider acceleration", q: "accelG", hint: src("maxRiderAccel") },
  { path: "limits.riderAccelBriefDuration", label: "Longest time above it", q: "time", hint: src("riderAccelBriefDuration") },
  { path: "limits.riderAccelSustained", label: "Sustained rider acceleration", q: "accelG", hint: src("riderAccelSustained") },
  { path: "limits.riderAccelSustainedDuration", label: "Longest time above the sustained level", q: "time", hint: src("riderAccelSustainedDuration") },
  { path: "limits.riderAccelCeiling", label: "Rider acceleration never exceeded", q: "accelG", hint: src("riderAccelCeiling") },
  { path: "limits.riderAccelBackwardScale", label: "Envelope scale when slowing", q: "ratio", hint: src("riderAccelBackwardScale") },
  { path: "limits.maxPickupDelay", label: "Longest pick-up delay", q: "time", hint: src("maxPickupDelay") },
  { path: "limits.maxTimeToChainSpeed", label: "Longest time to chain speed", q: "time", hint: src("maxTimeToChainSpeed") },
  { path: "limits.allowableWorkingLoad", label: "Allowable working load (maker's data)", q: "force", optional: true, hint: src("allowableWorkingLoad") },
  { path: "limits.workingLoadFraction", label: "Working load, fraction of breaking strength", q: "ratio", hint: src("workingLoadFraction") },
  { path: "limits.minBreakingRatio", label: "Lowest breaking strength / ASME B29.1 minimum", q: "ratio", hint: src("minBreakingRatio") },
  { path: "limits.maxBreakingRatio", label: "Highest breaking strength / ASME B29.1 minimum", q: "ratio", hint: src("maxBreakingRatio") },
  { path: "limits.releaseEnergyMargin", label: "Energy margin to clear the crest after release", q: "ratio", hint: src("releaseEnergyMargin") },
  { path: "limits.wearAllowance", label: "Wear allowance", q: "percent", hint: src("wearAllowance") },
  { path: "limits.thermalDeltaT", label: "Temperature swing", q: "tempDelta", hint: src("thermalDeltaT") },
  { path: "limits.thermalExpansion", label: "Thermal expansion", q: "perKelvin", hint: src("thermalExpansion") },
];

/** Number fields of piece i of `lift.profile` (a straight: length and slope; an arc: radius and end slope). */
export function profileFieldDefs(i: number, kind: "straight" | "arc"): FieldDef[] {
  const p = `lift.profile.${i}`;
  return kind === "arc"
    ? [
        { path: `${p}.radius`, label: `Piece ${i + 1} radius`, q: "length" },
        { path: `${p}.toAngle`, label: `Piece ${i + 1} turns to`, q: "angle" },
      ]
    : [
        { path: `${p}.length`, label: `Piece ${i + 1} length`, q: "length" },
        { path: `${p}.angle`, label: `Piece ${i + 1} slope`, q: "angle" },
      ];
}

/** Labels of the pieces' fields for messages in words ("Piece 3 slope must be at most 80 (degrees)"). */
export function profileLabels(count: number): FieldLabel[] {
  const out: FieldLabel[] = [];
  for (let i = 0; i < count; i++)
    out.push({ path: `lift.profile.${i}`, label: `Piece ${i + 1}` }, { path: `lift.profile.${i}.kind`, label: `Piece ${i + 1} kind` }, ...profileFieldDefs(i, "straight"), ...profileFieldDefs(i, "arc"));
  return out;
}

export const ALL_NUMBER_FIELDS = [
  ...GEOMETRY_FIELDS,
  ...EXTENT_FIELDS,
  ...CHAIN_VALUE_FIELDS,
  ...CHAIN_ROUTING_FIELDS,
  ...DRIVE_FIELDS,
  ...TAKEUP_FIELDS,
  ...ARD_FIELDS,
  ...LIMIT_FIELDS,
];

const OTHER_LABELS: Record<string, string> = {
  name: "Name",
  site: "Site",
  notes: "Notes",
  chainSpecId: "Catalogue chain",
  "chain.chainSpecId": "Catalogue chain",
  "antiRollback.enabled": "ARD fitted",
  "limits.allowRollback": "Settling back onto the ARD allowed",
  "lift.profile": "Profile (pieces)",
};

/** Every field of the lift form with its label (and quantity), for messages in words. */
export const LIFT_FORM_LABELS: FieldLabel[] = [...ALL_NUMBER_FIELDS, ...Object.entries(OTHER_LABELS).map(([path, label]) => ({ path, label }))];

/** Human label of a dotted path (for the diff view and messages). */
export function labelOf(path: string): string {
  return ALL_NUMBER_FIELDS.find((d) => d.path === path)?.label ?? OTHER_LABELS[path] ?? path;
}
