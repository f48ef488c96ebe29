/**
 * Design statics without integration: steady tension round the loop with the train anywhere on the lift,
 * static stretch, the take-up travel budget, safety factor, drive power and torque, chordal action.
 * Steady running: chain at `drive.speed`, take-up at rest carrying m·g/2 in each leg, tension growing in the
 * direction of travel by own weight, guide friction (coefficient × normal load, incl. tension × curvature)
 * and the train's load at the dog. Sources: δ = T·L/(E·A) (Gere & Goodno); 2:1 take-up moves half the
 * chain's elongation (common practice): a loaded chain is longer, so the counterweight DROPS when the train is
 * picked up, and rises again as the loaded length shrinks on the climb; D = p/sin(180°/N), Δr/R = 1 − cos(180°/N),
 * Δv/v = (π/N)[1/sin(180°/N) − 1/tan(180°/N)] (Juvinall & Marshek).
 */
import { withElongation } from "./wear";
import { trackPositionOf } from "./loop";
import { limitsSchema, parseScenario, type Limits, type Scenario } from "./schema";
import { buildTrack } from "./track";
import { buildTrain } from "./train";

export interface TensionProfile {
  /** Loop positions (m from the bottom idler in the direction of travel). */
  q: number[];
  /** Steady tension at each position, N. */
  tension: number[];
}

export interface TrainPositionCase {
  /** Train front position on the track, m. */
  trainPosition: number;
  /** Load at the dog (weight component + rolling resistance + drag at chain speed), N. */
  dogLoad: number;
  /** Tight-side tension at the drive, N. */
  driveTension: number;
  maxTension: number;
  /** Added stretch of the whole loop with the train here vs empty, m (the counterweight drops by half of it). */
  loadStretch: number;
}

export interface DesignStatics {
  takeUpTension: number;
  /** Worst train position on the lift (highest drive tension) and its figures. */
  worst: TrainPositionCase;
  /** Drive tension etc. for train positions along the lift. */
  cases: TrainPositionCase[];
  /** Steady tension round the loop with the train at the worst position. */
  profile: TensionProfile;
  emptyProfile: TensionProfile;
  /** Length from the dog over the top to the drive at the worst position, m. */
  loadedLength: number;
  /** Static stretch of the loaded chain, Σ T·L / (E·A) over the loaded length, m. */
  loadedStretch: number;
  /** Added stretch of the whole loop with the train on vs empty, m: the largest over train positions (the
   * longest loaded length, usually the train low on the lift), which sets the counterweight's drop. */
  loadStretch: number;
  /** Train front position at which the added stretch is largest, m. */
  loadStretchPosition: number;
  /** Take-up travel budget, m. */
  takeUp: {
    elasticExcursion: number; // half the largest load stretch: the counterweight drops this far when loaded
    wearAllowance: number; // half the wear elongation of the loop (reported apart from the elastic budget)
    thermal: number; // half of α·ΔT·loop length
    /** Elastic + wear allowance + thermal: the travel to run to the wear limit without shortening the chain. */
    required: number;
    travel: number;
    margin: number; // travel − required
    /** Elastic + thermal: the travel the running lift needs (wear is taken up by shortening the chain). */
    runningRequired: number;
    runningMargin: number; // travel − runningRequired
    /** Wear elongation of the loop that the travel left after elastic + thermal can take up, % (≤ 0: none). */
    wearCapacity: number;
    /** Room above the weight and below it: it drops when loaded, and as the chain wears or warms. */
    roomAbove: number;
    roomBelow: number;
  };
  /** Chain data the checks compare: breaking strength, N, and pitch, m. */
  breakingStrength: number;
  pitch: number;
  safetyFactor: number;
  requiredSafetyFactor: number;
  /** Drive pull (tight − slack side), N; motor power P = pull·v/η, W; sprocket torque = pull·D/2, N·m. */
  drivePull: number;
  motorPower: number;
  torque: number;
  pitchDiameter: number;
  sprocketSpeed: number; // rev/s
  /** Chordal action of the drive sprocket. */
  chordalRadiusVariation: number; // 1 − cos(180°/N)
  chordalSpeedVariation: number; // (π/N)[1/sin(180°/N) − 1/tan(180°/N)]
  /** Longitudinal wave speed √(E·A/μ) and impedance √(E·A·μ). */
  waveSpeed: number;
  impedance: number;
  loopLength: number;
  ardToothSpacing: number;
}

export interface StaticsOptions {
  /** Number of train positions evaluated along the lift (default 60). */
  positions?: number;
  /** Integration resolution along the loop, m (default 0.25). */
  resolution?: number;
  limits?: Partial<Limits>;
}

/** Chordal radius variation 1 − cos(180°/N). */
export function chordalRadiusVariation(teeth: number): number {
  return 1 - Math.cos(Math.PI / teeth);
}

/** Chordal speed variation (π/N)[1/sin(180°/N) − 1/tan(180°/N)]. */
export function chordalSpeedVariation(teeth: number): number {
  const a = Math.PI / teeth;
  return (Math.PI / teeth) * (1 / Math.sin(a) - 1 / Math.tan(a));
}

export function designStatics(input: Scenario | unknown, opts: StaticsOptions = {}): DesignStatics {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(`${parsed.issues[0].path}: ${parsed.issues[0].message}`);
  const s = withElongation(parsed.scenario);
  const limits = limitsSchema.parse({ ...s.limits, ...opts.limits });
  const track = buildTrack(s.lift);
  const train = buildTrain(s, track);
  const g = s.run.gravity;
  const mu = s.chain.massPerLength;
  const EA = s.chain.axialStiffness;
  const f = s.chain.guideFriction;
  const V = s.drive.speed;
  const Lc = s.lift.chainTo - s.lift.chainFrom;
  const B = s.lift.bottomRun;
  const Ltot = 2 * Lc + B;
  const T0 = (s.takeUp.mass * g) / 2;
  const from = s.lift.chainFrom;
  const dz = opts.resolution ?? 0.25;
  const nq = Math.max(40, Math.ceil((2 * Lc) / dz));
  const h = (2 * Lc) / nq;

  /** Steady tension along both strands from the bottom idler (q = 0) to the drive (q = 2Lc). */
  function profile(dogQ: number | null, dogLoad: number): TensionProfile {
    const q: number[] = [0];
    const tension: number[] = [T0];
    let T = T0;
    let added = dogQ === null;
    for (let k = 0; k < nq; k++) {
      const qm = (k + 0.5) * h;
      const sp = trackPositionOf(Lc, from, qm);
      const phi = track.slope(sp);
      const kap = track.curvature(sp);
      const up = qm < Lc ? 1 : -1; // carrying strand climbs, return strand descends
      // Own weight along the path plus guide friction on |weight normal − tension × curvature|.
      const N = Math.abs(mu * g * Math.cos(phi) - T * kap);
      T += (up * mu * g * Math.sin(phi) + f * N) * h;
      if (!added && dogQ !== null && (k + 1) * h >= dogQ) {
        T += dogLoad;
        added = true;
      }
      q.push((k + 1) * h);
      tension.push(T);
    }
    // Bottom run: from the drive the slack side carries the take-up tension.
    q.push(2 * Lc, 2 * Lc + B);
    tension.push(T0, T0);
    return { q, tension };
  }

  const dogOffset = s.trains[0].dogOffset;
  const nPos = Math.max(4, opts.positions ?? 60);
  const cases: TrainPositionCase[] = [];
  const xLo = from + dogOffset;
  const xHi = s.lift.dogRelease + dogOffset;
  const empty = profile(null, 0);
  let worst: TrainPositionCase | null = null;
  let worstProfile: TensionProfile | null = null;
  for (let i = 0; i < nPos; i++) {
    const x = xLo + ((xHi - xLo) * i) / (nPos - 1);
    const load = Math.max(0, train.resistingLoad(x, V));
    const p = profile(x - dogOffset - from, load);
    const driveT = p.tension[nq];
    let added = 0;
    for (let k = 0; k < nq; k++) added += ((0.5 * (p.tension[k] + p.tension[k + 1] - empty.tension[k] - empty.tension[k + 1])) * h) / EA;
    const c: TrainPositionCase = { trainPosition: x, dogLoad: load, driveTension: driveT, maxTension: Math.max(...p.tension), loadStretch: added };
    cases.push(c);
    if (!worst || driveT > worst.driveTension) {
      worst = c;
      worstProfile = p;
    }
  }
  const w = worst!;
  const wp = worstProfile!;
  const dogQ = w.trainPosition - dogOffset - from;
  let loadedStretch = 0;
  for (let k = 0; k < nq; k++) {
    const Tm = 0.5 * (wp.tension[k] + wp.tension[k + 1]);
    if ((k + 0.5) * h >= dogQ) loadedStretch += (Tm * h) / EA;
  }
  // The counterweight's drop is set by the largest added stretch over train positions (the longest loaded
  // length), not by the worst drive tension (the train at the top, the shortest loaded length).
  let longest = cases[0];
  for (const c of cases) if (c.loadStretch > longest.loadStretch) longest = c;
  const loadStretch = longest.loadStretch;
  const elastic = loadStretch / 2;
  const wear = ((limits.wearAllowance / 100) * Ltot) / 2;
  const thermal = (limits.thermalExpansion * limits.thermalDeltaT * Ltot) / 2;
  const running = elastic + thermal;
  const required = running + wear;
  const D = s.chain.pitch / Math.sin(Math.PI / s.drive.sprocketTeeth);
  const pull = w.driveTension - T0;
  const eta = s.drive.efficiency;
  return {
    takeUpTension: T0,
    worst: w,
    cases,
    profile: wp,
    emptyProfile: empty,
    loadedLength: 2 * Lc - dogQ,
    loadedStretch,
    loadStretch,
    loadStretchPosition: longest.trainPosition,
    takeUp: {
      elasticExcursion: elastic,
      wearAllowance: wear,
      thermal,
      required,
      travel: s.takeUp.travel,
      margin: s.takeUp.travel - required,
      runningRequired: running,
      runningMargin: s.takeUp.travel - running,
      wearCapacity: (200 * (s.takeUp.travel - running)) / Ltot,
      roomAbove: s.takeUp.position,
      roomBelow: s.takeUp.travel - s.takeUp.position,
    },
    safetyFactor: s.chain.breakingStrength / Math.max(...wp.tension),
    requiredSafetyFactor: limits.requiredSafetyFactor,
    drivePull: pull,
    motorPower: (pull * V) / eta,
    torque: (pull * D) / 2,
    pitchDiameter: D,
    sprocketSpeed: V / (Math.PI * D),
    chordalRadiusVariation: chordalRadiusVariation(s.drive.sprocketTeeth),
    chordalSpeedVariation: chordalSpeedVariation(s.drive.sprocketTeeth),
    waveSpeed: Math.sqrt(EA / mu),
    impedance: Math.sqrt(EA * mu),
    loopLength: Ltot,
    ardToothSpacing: s.antiRollback.toothSpacing,
    breakingStrength: s.chain.breakingStrength,
    pitch: s.chain.pitch,
  };
}
