/**
 * Lift profiles (`lift.profile`): the track as a list of pieces from the station (s = 0, level), each a
 * straight at a slope or a circular arc that turns the slope to a new angle. The checks every profile must
 * pass (slopes within ±80°, joins without kinks, positive lengths and radii) and the 5-piece profile the
 * parametric fields of `lift` stand for. Angles in degrees, lengths in metres.
 */

export type ProfilePiece =
  | { kind: "straight"; length: number; angle: number }
  | { kind: "arc"; radius: number; toAngle: number };

/** The parametric lift fields (version 2's shortcut for one fixed shape). */
export interface ParametricLift {
  approachLength: number;
  sagRadius: number;
  angle: number;
  inclineLength: number;
  crestRadius: number;
  exitLength: number;
}

export const PARAMETRIC_FIELDS = ["approachLength", "sagRadius", "angle", "inclineLength", "crestRadius", "exitLength"] as const;

/** Steepest slope a piece may have, degrees (the bound of `lift.angle`). */
export const MAX_SLOPE = 80;
export const MAX_PIECES = 200;
export const MAX_PIECE_LENGTH = 5000;
export const MAX_ARC_RADIUS = 10000;
/** Two slopes closer than this (degrees) are the same slope. */
export const ANGLE_TOLERANCE = 1e-6;

/** The parametric lift as pieces: straight 0° (approach), arc to the angle (sag), straight (incline), arc to 0° (crest), straight 0° (exit). */
export function parametricProfile(l: ParametricLift): ProfilePiece[] {
  return [
    { kind: "straight", length: l.approachLength, angle: 0 },
    { kind: "arc", radius: l.sagRadius, toAngle: l.angle },
    { kind: "straight", length: l.inclineLength, angle: l.angle },
    { kind: "arc", radius: l.crestRadius, toAngle: 0 },
    { kind: "straight", length: l.exitLength, angle: 0 },
  ];
}

/** Track length of a (valid) profile, m: straights by their length, arcs by radius × turned angle. */
export function profileLength(pieces: readonly ProfilePiece[]): number {
  let a = 0;
  let L = 0;
  for (const p of pieces) {
    if (p.kind === "straight") {
      L += p.length;
      a = p.angle;
    } else {
      L += (p.radius * Math.abs(p.toAngle - a) * Math.PI) / 180;
      a = p.toAngle;
    }
  }
  return L;
}

export interface ProfileIssue {
  path: string;
  message: string;
}

const isNum = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
const deg = (a: number) => `${+a.toFixed(6)}°`;

const FIELDS = { straight: ["length", "angle"], arc: ["radius", "toAngle"] } as const;

/**
 * Every problem of a profile as given (raw JSON), each with its field path under `prefix`: the list itself,
 * each piece's kind and numbers (with their units), and each join (a straight must start at the slope the piece
 * before ends at; an arc must turn the slope). An empty list means the profile is valid.
 */
export function profileIssues(raw: unknown, prefix = "lift.profile"): ProfileIssue[] {
  const out: ProfileIssue[] = [];
  if (!Array.isArray(raw)) return [{ path: prefix, message: `${prefix} must be a list of pieces ({ kind: "straight", length, angle } or { kind: "arc", radius, toAngle })` }];
  if (raw.length < 1) return [{ path: prefix, message: `${prefix} must list at least one piece` }];
  if (raw.length > MAX_PIECES) return [{ path: prefix, message: `${prefix} must list at most ${MAX_PIECES} pieces` }];
  let current: number | null = 0; // slope where the piece before ends, degrees (null: unknown after a bad piece)
  raw.forEach((p, i) => {
    const at = `${prefix}.${i}`;
    if (!p || typeof p !== "object" || Array.isArray(p)) {
      out.push({ path: at, message: `${at} must be a piece ({ kind: "straight", length, angle } or { kind: "arc", radius, toAngle })` });
      current = null;
      return;
    }
    const piece = p as Record<string, unknown>;
    const kind = piece.kind;
    if (kind !== "straight" && kind !== "arc") {
      out.push({ path: `${at}.kind`, message: `${at}.kind must be "straight" or "arc"` });
      current = null;
      return;
    }
    for (const k of Object.keys(piece))
      if (k !== "kind" && !(FIELDS[kind] as readonly string[]).includes(k))
        out.push({ path: `${at}.${k}`, message: `${at} is ${kind === "arc" ? "an arc" : "a straight"}: it takes ${FIELDS[kind].join(" and ")}, not ${k}` });
    const number = (key: string, unit: string, check: (v: number) => string | null): number | undefined => {
      const v = piece[key];
      const path = `${at}.${key}`;
      if (v === undefined) out.push({ path, message: `${path} is required (${unit})` });
      else if (!isNum(v)) out.push({ path, message: `${path} must be a finite number (${unit})` });
      else {
        const bad = check(v);
        if (bad) out.push({ path, message: `${path} ${bad} (${unit})` });
        else return v;
      }
      return undefined;
    };
    const slope = (v: number) => (v > MAX_SLOPE ? `must be at most ${MAX_SLOPE}` : v < -MAX_SLOPE ? `must be at least -${MAX_SLOPE}` : null);
    if (kind === "straight") {
      number("length", "m", (v) => (v <= 0 ? "must be greater than 0" : v > MAX_PIECE_LENGTH ? `must be at most ${MAX_PIECE_LENGTH}` : null));
      const angle = number("angle", "degrees", slope);
      if (angle !== undefined && current !== null && Math.abs(angle - current) > ANGLE_TOLERANCE)
        out.push({
          path: `${at}.angle`,
          message:
            i === 0
              ? `${at} starts at ${deg(angle)} but the station is level (0°): start with a level straight or an arc to ${deg(angle)}`
              : `${at} starts at ${deg(angle)} but the piece before ends at ${deg(current)}: put an arc between them`,
        });
      current = angle ?? null;
    } else {
      number("radius", "m", (v) => (v <= 0 ? "must be greater than 0" : v > MAX_ARC_RADIUS ? `must be at most ${MAX_ARC_RADIUS}` : null));
      const to = number("toAngle", "degrees", slope);
      if (to !== undefined && current !== null && Math.abs(to - current) <= ANGLE_TOLERANCE)
        out.push({
          path: `${at}.toAngle`,
          message: `${at}.toAngle must differ from the slope where the piece before ends (${deg(current)}): an arc turns the slope (degrees)`,
        });
      current = to ?? null;
    }
  });
  return out;
}
