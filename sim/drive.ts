/**
 * The drive: a reference speed (the soft-start ramp, stops and restarts) and the motor that follows it.
 *
 * - `ideal`: the chain speed at the sprocket is prescribed (version 1): the sprocket supplies whatever pull
 *   keeps it on the ramp.
 * - `induction`: the Kloss curve F = 2·λ·F_r·u / (1 + u²) with u = (v_s − v) / (s_b·speed), i.e.
 *   F = 2·λ·F_r / (s/s_b + s_b/s) with slip s = 1 − v/speed at full speed. The soft start ramps the synchronous
 *   speed v_s over rampTime at constant V/f, so the curve keeps its shape in slip speed (Fitzgerald, Kingsley &
 *   Umans; Chapman). F_r = ratedPower·efficiency / (speed·(1 − ratedSlip)); s_b = ratedSlip·(λ + √(λ² − 1)).
 * - `speed-loop`: a PI controller on the reference speed, F = K_p·e + K_i·∫e, saturating at ±forceLimit (the
 *   integral stops while saturated). K_p = 2π·f_bw·M, K_i = K_p·2π·f_bw / 4 with M the reflected mass plus the
 *   chain's and the trains' (tuned for the loaded lift; assumption).
 * - Stops: "brake" prescribes the chain speed from its value at the stop down to 0 over `duration` and holds it;
 *   "power-loss" lets the drive coast with no pull for `duration`, then the holding brake sets (stops the
 *   sprocket over BRAKE_SET_TIME) and holds. A restart ramps the reference up again from 0 over rampTime.
 */
import type { Scenario } from "./schema";

/** Reference motion of the drive (ramp from 0, then constant). */
export interface DriveMotion {
  displacement(t: number): number;
  velocity(t: number): number;
  acceleration(t: number): number;
}

export function driveMotion(speed: number, rampTime: number): DriveMotion {
  // A ramp shorter than a microsecond is a sudden start (its acceleration would be meaningless).
  if (rampTime < 1e-6) {
    // A sudden start: full speed from t = 0 on (the chain stations keep their absolute rest at t = 0).
    return {
      displacement: (t) => (t > 0 ? speed * t : 0),
      velocity: (t) => (t >= 0 ? speed : 0),
      acceleration: () => 0,
    };
  }
  return {
    displacement: (t) =>
      t <= 0 ? 0 : t < rampTime ? (0.5 * speed * t * t) / rampTime : speed * (t - rampTime / 2),
    velocity: (t) => (t <= 0 ? 0 : t < rampTime ? (speed * t) / rampTime : speed),
    acceleration: (t) => (t >= 0 && t < rampTime ? speed / rampTime : 0),
  };
}

/** Sprocket pitch diameter D = p / sin(180°/N). */
export function pitchDiameter(pitch: number, teeth: number): number {
  return pitch / Math.sin(Math.PI / teeth);
}

/** Time the holding brake takes to stop the sprocket after a power loss, s (assumption). */
export const BRAKE_SET_TIME = 0.1;

/** Kloss pull at slip speed Δv = v_s − v: F = 2·λ·F_r·u / (1 + u²), u = Δv / Δv_b. */
export function klossPull(ratedPull: number, breakdownRatio: number, breakdownSlipSpeed: number, slipSpeed: number): number {
  const u = slipSpeed / breakdownSlipSpeed;
  return (2 * breakdownRatio * ratedPull * u) / (1 + u * u);
}

/** Breakdown slip s_b = s_r·(λ + √(λ² − 1)), so that the Kloss curve gives F_r at the rated slip s_r. */
export function breakdownSlip(ratedSlip: number, breakdownRatio: number): number {
  return ratedSlip * (breakdownRatio + Math.sqrt(breakdownRatio * breakdownRatio - 1));
}

export type DrivePhase = "run" | "brake" | "coast";

export class DriveControl {
  readonly kind: "ideal" | "induction" | "speed-loop";
  readonly speed: number;
  readonly rampTime: number;
  /** Rotating inertia seen at the chain, kg (0 for the ideal drive). */
  readonly reflectedMass: number;
  readonly ratedPull: number;
  readonly breakdownRatio: number;
  readonly breakdownSlipSpeed: number;
  readonly kp: number;
  readonly ki: number;
  readonly forceLimit: number;
  readonly reference: DriveMotion;
  private readonly stop: Scenario["drive"]["stop"];
  private readonly restart: Scenario["drive"]["restart"];

  phase: DrivePhase = "run";
  runStart = 0; // start of the current run phase's ramp
  private stopped = false;
  private t0 = 0; // start of the current brake phase
  private v0 = 0; // speed then
  private brakeTime = 0;

  constructor(s: Scenario, loadedMass: number) {
    const d = s.drive;
    const m = d.motor;
    this.kind = m.kind;
    this.speed = d.speed;
    this.rampTime = d.rampTime;
    this.reference = driveMotion(d.speed, d.rampTime);
    this.stop = d.stop;
    this.restart = d.restart;
    this.reflectedMass = m.kind === "ideal" ? 0 : m.reflectedMass;
    if (m.kind === "induction") {
      this.ratedPull = (m.ratedPower * d.efficiency) / (d.speed * (1 - m.ratedSlip));
      this.breakdownRatio = m.breakdownRatio;
      this.breakdownSlipSpeed = breakdownSlip(m.ratedSlip, m.breakdownRatio) * d.speed;
    } else {
      this.ratedPull = 0;
      this.breakdownRatio = 1;
      this.breakdownSlipSpeed = 1;
    }
    if (m.kind === "speed-loop") {
      const wb = 2 * Math.PI * m.bandwidth;
      this.kp = wb * (m.reflectedMass + loadedMass);
      this.ki = (this.kp * wb) / 4;
      this.forceLimit = m.forceLimit;
    } else {
      this.kp = 0;
      this.ki = 0;
      this.forceLimit = Infinity;
    }
  }

  /** Reference (synchronous) chain speed: the ramp of the current run phase, 0 while stopped. */
  refSpeed(t: number): number {
    return this.phase === "run" ? this.reference.velocity(t - this.runStart) : 0;
  }
  refAccel(t: number): number {
    return this.phase === "run" ? this.reference.acceleration(t - this.runStart) : 0;
  }

  /** Is the drive speed prescribed in the current phase (ideal drive running, or a brake)? */
  get prescribed(): boolean {
    return this.phase === "brake" || (this.phase === "run" && this.kind === "ideal");
  }

  /** Prescribed drive speed at t (valid while `prescribed`). */
  prescribedVelocity(t: number): number {
    if (this.phase === "run") return this.refSpeed(t);
    if (this.brakeTime <= 0) return 0;
    const f = 1 - (t - this.t0) / this.brakeTime;
    return f > 0 ? this.v0 * Math.min(1, f) : 0;
  }
  prescribedAccel(t: number): number {
    if (this.phase === "run") return this.refAccel(t);
    if (this.brakeTime <= 0) return 0;
    const dt = t - this.t0;
    return dt >= 0 && dt < this.brakeTime ? -this.v0 / this.brakeTime : 0;
  }

  /** Motor pull at the chain in a dynamic phase, N; `integral` is the speed loop's ∫e dt. */
  motorForce(t: number, v: number, integral: number): number {
    if (this.phase !== "run") return 0;
    if (this.kind === "induction") return klossPull(this.ratedPull, this.breakdownRatio, this.breakdownSlipSpeed, this.refSpeed(t) - v);
    if (this.kind === "speed-loop") {
      const f = this.kp * (this.refSpeed(t) - v) + this.ki * integral;
      return f > this.forceLimit ? this.forceLimit : f < -this.forceLimit ? -this.forceLimit : f;
    }
    return 0;
  }

  /** Rate of the speed loop's integral (held while the pull is saturated in the error's direction). */
  integralRate(t: number, v: number, integral: number): number {
    if (this.kind !== "speed-loop" || this.phase !== "run") return 0;
    const e = this.refSpeed(t) - v;
    const f = this.kp * e + this.ki * integral;
    if ((f >= this.forceLimit && e > 0) || (f <= -this.forceLimit && e < 0)) return 0;
    return e;
  }

  /** Largest |dF/dv| of the motor law (its damping of the drive DOF), N·s/m. */
  maxSlope(): number {
    if (this.kind === "induction") return (2 * this.breakdownRatio * this.ratedPull) / this.breakdownSlipSpeed;
    if (this.kind === "speed-loop") return this.kp;
    return 0;
  }

  /**
   * Phase changes after an accepted step at time t with drive speed v. Returns "restart" when a run phase
   * began again (the speed loop's integral is reset), "changed" on any other change, or "".
   */
  update(t: number, v: number): "" | "changed" | "restart" {
    const st = this.stop;
    if (this.phase === "run" && st && !this.stopped && t >= st.time) {
      this.stopped = true;
      if (st.kind === "brake") this.brake(t, v, st.duration);
      else this.phase = "coast";
      return "changed";
    }
    if (this.phase === "coast" && st && t >= st.time + st.duration) {
      this.brake(t, v, BRAKE_SET_TIME);
      return "changed";
    }
    if (this.phase !== "run" && this.restart && t >= this.restart.time) {
      this.phase = "run";
      this.runStart = this.restart.time;
      return "restart";
    }
    return "";
  }

  private brake(t: number, v: number, duration: number) {
    this.phase = "brake";
    this.t0 = t;
    this.v0 = v;
    this.brakeTime = duration;
  }

  /** Times where the drive's law has a kink or changes phase (the adaptive integrator restarts there). */
  breakpoints(): number[] {
    const out = [this.rampTime];
    const st = this.stop;
    if (st) {
      out.push(st.time, st.time + st.duration);
      if (st.kind === "power-loss") out.push(st.time + st.duration + BRAKE_SET_TIME);
    }
    if (this.restart) out.push(this.restart.time, this.restart.time + this.rampTime);
    return out.filter((t) => t > 0);
  }
}
