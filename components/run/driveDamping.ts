/**
 * "Drive and damping" in plain words: which drive model a run used and where the lift loses energy, with
 * the numbers the run used and the surge figures the engine measured. Pure (tests/unit/ui-drive-damping.test.ts);
 * it quotes inputs and summary figures and computes nothing physical beyond unit conversions and the
 * slip's definition (1 − chain speed ÷ synchronous speed).
 */
import { formatQuantity, type UnitSystem } from "@/lib/client/units";

/** The parts of a format 2 scenario the account reads. */
export interface DriveDampingInput {
  drive: {
    speed: number;
    efficiency: number;
    location?: string;
    motor?: { kind: string; ratedPower?: number; ratedSlip?: number; breakdownRatio?: number; reflectedMass?: number; bandwidth?: number; forceLimit?: number };
    stop?: { time: number; kind: string; duration: number };
  };
  chain: { damping: number; lossFactor?: number; guideFriction: number };
  takeUp: { mass: number; friction: number; damping?: number };
  contacts?: { dogStiffness?: number; ardStiffness?: number; dampingRatio?: number };
  gravity: number;
  summary: { steadyChainSpeed?: number | null; surgeAmplitude?: number | null; surgeDampingRatio?: number | null };
}

export interface AccountLine {
  key: string;
  title: string;
  text: string;
}

const pct = (v: number, d = 1) => `${(v * 100).toFixed(d)} %`;

export function driveDampingAccount(x: DriveDampingInput, units: UnitSystem): AccountLine[] {
  const q = formatQuantity;
  const m = x.drive.motor ?? { kind: "ideal" };
  const lines: AccountLine[] = [];
  const where = x.drive.location === "top" ? "at the top of the lift (crest end of the carrying strand)" : "at the foot of the return strand";
  if (m.kind === "induction") {
    const steady = x.summary.steadyChainSpeed;
    const slip = typeof steady === "number" ? 1 - steady / x.drive.speed : null;
    lines.push({
      key: "drive",
      title: "Drive: induction motor",
      text:
        `A ${q(m.ratedPower ?? null, "power", units)} induction motor ${where}, synchronous chain speed ${q(x.drive.speed, "speed", units)}, ` +
        `rated slip ${pct(m.ratedSlip ?? 0)}, breakdown torque ${(m.breakdownRatio ?? 0).toFixed(2)} × rated, drive inertia ${q(m.reflectedMass ?? null, "mass", units)} at the chain, efficiency ${pct(x.drive.efficiency, 0)}. ` +
        `Under load the motor slips: the chain runs a little slower than synchronous speed and the slip gives way to the surge, which takes energy out of it.` +
        (slip !== null ? ` In this run the steady chain speed was ${q(steady ?? null, "speed", units)}, a slip of ${pct(slip, 2)}.` : ""),
    });
  } else if (m.kind === "speed-loop") {
    lines.push({
      key: "drive",
      title: "Drive: speed loop",
      text:
        `A speed-controlled drive ${where} holds ${q(x.drive.speed, "speed", units)} with a ${q(m.bandwidth ?? null, "frequency", units)} speed loop, ` +
        `up to ${q(m.forceLimit ?? null, "force", units)} of pull, drive inertia ${q(m.reflectedMass ?? null, "mass", units)} at the chain. ` +
        `The controller corrects speed errors slower than its bandwidth and lets faster ones through to the inertia.`,
    });
  } else {
    lines.push({
      key: "drive",
      title: "Drive: ideal",
      text:
        `The chain is driven ${where} at exactly ${q(x.drive.speed, "speed", units)} whatever the load. An ideal drive takes no energy out of the surge: ` +
        `every wave that reaches the sprocket is reflected. Choose an induction motor or a speed loop in the scenario for a drive that gives way under load.`,
    });
  }
  if (x.drive.stop)
    lines.push({
      key: "stop",
      title: x.drive.stop.kind === "brake" ? "Brake stop" : "Power loss",
      text:
        x.drive.stop.kind === "brake"
          ? `At ${q(x.drive.stop.time, "time", units)} the brake brings the chain to rest over ${q(x.drive.stop.duration, "time", units)} and holds it.`
          : `At ${q(x.drive.stop.time, "time", units)} the motor loses power; the brake holds the sprocket ${q(x.drive.stop.duration, "time", units)} later.`,
    });
  const weight = x.takeUp.mass * x.gravity;
  lines.push({
    key: "takeUp",
    title: "Take-up",
    text:
      `The counterweight's guides resist with ${q(x.takeUp.friction, "force", units)} of friction (${pct(weight > 0 ? x.takeUp.friction / weight : 0)} of its weight)` +
      ((x.takeUp.damping ?? 0) > 0 ? ` and a dashpot of ${q(x.takeUp.damping ?? 0, "linearDamping", units)}.` : "; no dashpot is fitted.") +
      (x.takeUp.friction === 0 && !(x.takeUp.damping ?? 0) ? " With neither, the take-up takes no energy out of the surge." : ""),
  });
  const eta = x.chain.lossFactor ?? 0;
  lines.push({
    key: "chain",
    title: "Chain",
    text:
      `Loss factor ${eta.toFixed(3)}: each stretch cycle loses 2π × ${eta.toFixed(3)} = ${pct(2 * Math.PI * eta)} of its strain energy, about a damping ratio of ${pct(eta / 2)} for a mode carried by the chain's stretch. ` +
      `Internal (Kelvin–Voigt) damping ${q(x.chain.damping, "damping", units)} acts mostly on the short waves. Guide friction coefficient ${x.chain.guideFriction.toFixed(3)} on the chain's weight.`,
  });
  if (x.contacts)
    lines.push({
      key: "contacts",
      title: "Contacts",
      text: `Dog on catch ${q(x.contacts.dogStiffness ?? null, "stiffness", units)}, pawl on ARD tooth ${q(x.contacts.ardStiffness ?? null, "stiffness", units)}, damping ratio ${pct(x.contacts.dampingRatio ?? 0, 0)} of critical.`,
    });
  const zeta = x.summary.surgeDampingRatio;
  const amp = x.summary.surgeAmplitude;
  lines.push({
    key: "surge",
    title: "Surge after the pick-up",
    text:
      (typeof zeta === "number"
        ? `The train's surge on the chain decayed with a damping ratio of ${pct(zeta)} (from the logarithmic decrement of the run).`
        : zeta === null
          ? "The surge's damping ratio could not be measured in this run (too few clean cycles after the pick-up)."
          : "This run's figures do not include the surge's damping ratio; the sources above are what damps it.") +
      (typeof amp === "number" ? ` Over the steady climb the train speed swung ±${q(amp, "speed", units)} about its mean.` : ""),
  });
  return lines;
}
