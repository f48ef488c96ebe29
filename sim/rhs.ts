/**
 * The lift as one mechanical system: chain stations, the train (1 DOF) and the take-up weight (1 DOF).
 *
 * Chain state is kept relative to rigid transport by the drive: w_i = u_i − u_d(t), so values stay small
 * (the stretch, not the 100 m the chain travels) and the drive station is simply w = 0.
 * Segment i (station i → i+1): ε_i = ε0_i + (w_{i+1} − w_i [+ y on the take-up legs]) / L_i,
 * T_i = max(0, E·A·ε_i + D·dε_i/dt) while ε_i > 0, else 0 (slack).
 * Stations are fixed in space; the chain's transport speed (≤ 10 m/s) is tiny next to its wave speed
 * √(E·A/μ) (hundreds to thousands of m/s), so the convective terms of the moving chain are neglected.
 */
import { catchLattice, contactDampingCoefficient, contactEnergy, contactForce, ratchet, type CatchLattice, type Ratchet } from "./contacts";
import { driveMotion, type DriveMotion } from "./drive";
import { buildLoop, staticStrain, type ChainLoop } from "./loop";
import { catchOffsetOf, type Scenario } from "./schema";
import { buildTakeUp, type TakeUpModel } from "./takeup";
import { buildTrack, type Track } from "./track";
import { buildTrain, FRICTION_SMOOTHING_SPEED, type TrainModel } from "./train";

export const EVENT_ENGAGE = 1;
export const EVENT_CLICK = 2;
export const EVENT_SEPARATE = 4;
export const EVENT_RELEASE = 8;

export interface SystemOptions {
  segments?: number;
}

export class LiftSystem {
  readonly s: Scenario;
  readonly track: Track;
  readonly loop: ChainLoop;
  readonly train: TrainModel;
  readonly takeUp: TakeUpModel;
  readonly drive: DriveMotion;
  readonly lattice: CatchLattice;
  readonly ratchet: Ratchet;
  readonly n: number;
  readonly EA: number;
  readonly damping: number;
  readonly eps0: Float64Array;
  readonly invL: Float64Array;
  readonly invM: Float64Array;
  readonly legY: Float64Array; // 1 on the two take-up legs
  readonly frictionCoef: number;
  readonly dogStiffness: number;
  readonly dogDamping: number;
  readonly ardStiffness: number;
  readonly ardDamping: number;
  readonly dogOffset: number;
  readonly chainFrom: number;
  readonly dogRelease: number;
  readonly g: number;

  // Contact modes, changed only between steps.
  engaged = NaN; // index of the catch point in contact with the dog, NaN for none
  // Penetration found when a contact was detected at a step end; the contact is measured from it so it
  // starts without a force jump (no energy injected by the step's late detection).
  engageOffset = 0;
  pawlMax: number;
  tooth = NaN; // position of the tooth the pawl would fall on
  lastCatchIndex = NaN; // catch at or behind the dog at the last step end

  // Results of the last evaluation.
  readonly T: Float64Array;
  ax = 0;
  ay = 0;
  maxT = 0;
  maxTSeg = 0;
  slack = 0;
  dogForce = 0;
  dogDelta = 0;
  dogDeltaRate = 0;
  ardForce = 0;
  ardDelta = 0;
  stopForce = 0;
  driveForce = 0; // force of the sprocket on the chain, N
  driveTension = 0; // tight-side tension arriving at the drive, N
  drivePower = 0; // mechanical power into the chain, W
  dissipation = 0; // W
  evaluations = 0;
  driveAccelInRhs = true;

  constructor(s: Scenario, opts: SystemOptions = {}) {
    this.s = s;
    this.track = buildTrack(s.lift);
    this.loop = buildLoop(s, this.track, opts.segments);
    this.train = buildTrain(s, this.track);
    this.takeUp = buildTakeUp(s, this.loop.length);
    this.drive = driveMotion(s.drive.speed, s.drive.rampTime);
    const loop = this.loop;
    this.n = loop.nodes;
    this.EA = s.chain.axialStiffness;
    this.damping = s.chain.damping;
    this.g = s.run.gravity;
    this.eps0 = staticStrain(loop, s.takeUp.mass, s.chain.massPerLength, this.g, this.EA);
    this.invL = loop.L.map((l) => 1 / l);
    this.invM = loop.mass.map((m) => 1 / m);
    this.legY = new Float64Array(this.n);
    for (const leg of loop.legs) this.legY[leg.seg] = leg.weight;
    this.frictionCoef = s.chain.guideFriction;
    this.lattice = catchLattice(catchOffsetOf(s) - s.lift.chainFrom, s.chain.catchSpacing, loop.length);
    const ar = s.antiRollback;
    this.ratchet = ratchet(ar.enabled, ar.from, ar.to, ar.toothSpacing);
    // As stiff as one metre of chain, but on coarse meshes no stiffer than four strand segments (stiff next
    // to the loaded chain either way, without letting the contact alone set the stable step).
    this.dogStiffness = s.contacts.dogStiffness;
    this.dogDamping = contactDampingCoefficient(s.contacts.dampingRatio, this.dogStiffness, loop.mass[1]);
    this.ardStiffness = s.contacts.ardStiffness;
    this.ardDamping = contactDampingCoefficient(s.contacts.dampingRatio, this.ardStiffness, this.train.mass);
    this.dogOffset = s.trains[0].dogOffset;
    this.chainFrom = s.lift.chainFrom;
    this.dogRelease = s.lift.dogRelease;
    this.T = new Float64Array(this.n);
    this.pawlMax = s.trains[0].startPosition - s.trains[0].dogOffset;
    this.tooth = this.ratchet.toothBehind(this.pawlMax);
  }

  /** Chain displacement relative to transport at a carrying-strand position q (linear between stations). */
  wAt(w: ArrayLike<number>, q: number): number {
    const h = this.loop.hStrand;
    let j = Math.floor(q / h);
    if (j < 0) j = 0;
    else if (j >= this.loop.nsStrand) j = this.loop.nsStrand - 1;
    const f = q / h - j;
    return w[j] * (1 - f) + w[j + 1] * f;
  }

  /** Material coordinate of the chain at the dog's track position (dog on the carrying strand). */
  materialAtDog(t: number, x: number, w: ArrayLike<number>): number {
    const q = x - this.dogOffset - this.chainFrom;
    return q - this.drive.displacement(t) - this.wAt(w, q);
  }

  /** Is the dog over the chained, engaging part of the lift? */
  dogInZone(x: number): boolean {
    const xd = x - this.dogOffset;
    return xd >= this.chainFrom && xd < this.dogRelease;
  }

  /** Current loop position of catch K (solving q = ξ_K + u(q) by two fixed-point passes). */
  catchPosition(t: number, K: number, w: ArrayLike<number>, qGuess: number): number {
    const base = this.lattice.at(K) + this.drive.displacement(t);
    let q = base + this.wAt(w, qGuess);
    q = base + this.wAt(w, q);
    return q;
  }

  /**
   * Accelerations of all degrees of freedom (aw for the chain relative to transport), filling the
   * diagnostics fields above. w/vw: chain, x/vx: train front, y/vy: take-up drop.
   */
  accel(
    t: number,
    w: ArrayLike<number>,
    vw: ArrayLike<number>,
    x: number,
    vx: number,
    y: number,
    vy: number,
    aw: Float64Array | number[],
  ): void {
    this.evaluations++;
    const n = this.n;
    const loop = this.loop;
    const T = this.T;
    const EA = this.EA;
    const D = this.damping;
    const eps0 = this.eps0;
    const invL = this.invL;
    const legY = this.legY;
    const vd = this.drive.velocity(t);
    const ad = this.drive.acceleration(t);
    let diss = 0;
    let maxT = 0;
    let maxTSeg = 0;
    let slack = 0;
    for (let i = 0; i < n; i++) {
      const k = i + 1 < n ? i + 1 : 0;
      const ly = legY[i];
      const eps = eps0[i] + (w[k] - w[i] + ly * y) * invL[i];
      let Ti = 0;
      if (eps > 0) {
        const te = EA * eps;
        Ti = te;
        if (D > 0) {
          const rate = (vw[k] - vw[i] + ly * vy) * invL[i];
          Ti = te + D * rate;
          if (Ti < 0) Ti = 0;
          diss += (Ti - te) * rate * loop.L[i];
        }
      } else slack++;
      T[i] = Ti;
      if (Ti > maxT) {
        maxT = Ti;
        maxTSeg = i;
      }
    }
    // Station forces: tension difference, own weight, guide friction.
    const mu = this.s.chain.massPerLength;
    const fc = this.frictionCoef;
    const vs = FRICTION_SMOOTHING_SPEED;
    const weight = loop.weight;
    const mass = loop.mass;
    const invM = this.invM;
    for (let i = 0; i < n; i++) {
      const p = i > 0 ? i - 1 : n - 1;
      let F = T[i] - T[p] + weight[i];
      if (fc > 0 && loop.guided[i]) {
        const v = vw[i] + vd;
        const len = mass[i] / mu;
        const N = Math.abs(mu * this.g * loop.cosPhi[i] * len - 0.5 * (T[i] + T[p]) * loop.kappa[i] * len);
        const ff = (fc * N * v) / Math.sqrt(v * v + vs * vs);
        F -= ff;
        diss += ff * v;
      }
      aw[i] = F;
    }
    // Dog on a catch point.
    let dogF = 0;
    this.dogDelta = 0;
    this.dogDeltaRate = 0;
    if (this.engaged === this.engaged && this.dogInZone(x)) {
      const qd = x - this.dogOffset - this.chainFrom;
      const qk = this.catchPosition(t, this.engaged, w, qd);
      const delta = qk - qd - this.engageOffset;
      const h = loop.hStrand;
      let j = Math.floor(qk / h);
      if (j < 0) j = 0;
      else if (j >= loop.nsStrand) j = loop.nsStrand - 1;
      const f = qk / h - j;
      const vChain = vd + vw[j] * (1 - f) + vw[j + 1] * f;
      const rate = vChain - vx;
      dogF = contactForce(this.dogStiffness, this.dogDamping, delta, rate);
      if (dogF > 0) {
        aw[j] -= dogF * (1 - f);
        aw[j + 1] -= dogF * f;
        diss += (dogF - this.dogStiffness * delta) * rate;
      }
      this.dogDelta = delta;
      this.dogDeltaRate = rate;
    }
    // ARD pawl on the last tooth passed.
    let ardF = 0;
    this.ardDelta = 0;
    if (this.tooth === this.tooth) {
      const delta = this.tooth - (x - this.dogOffset);
      ardF = contactForce(this.ardStiffness, this.ardDamping, delta, -vx);
      if (ardF > 0) diss += (ardF - this.ardStiffness * delta) * -vx;
      this.ardDelta = delta;
    }
    // Take-up weight.
    const tu = this.takeUp;
    const stop = tu.stopForce(y, vy);
    const fr = tu.frictionForce(vy);
    if (stop !== 0) {
      const dTop = tu.yTop - y;
      const dBot = y - tu.yBottom;
      // Elastic part of the stop force; the rest is its damping.
      const el = (dTop > 0 ? tu.stopStiffness * dTop : 0) - (dBot > 0 ? tu.stopStiffness * dBot : 0);
      diss -= (stop - el) * vy;
    }
    diss -= fr * vy;
    let legPull = 0;
    for (const leg of loop.legs) legPull += leg.weight * T[leg.seg];
    this.ay = (tu.mass * this.g - legPull + stop + fr) / tu.mass;
    // Train.
    const ext = this.train.force(x, vx);
    diss += this.train.lastDissipation;
    this.ax = (ext + dogF + ardF) / this.train.mass;
    // Prescribed drive station: the sprocket supplies whatever force keeps it on its motion.
    const d = loop.driveNode;
    const Fd = mass[d] * ad - aw[d];
    // Relative to transport, each station feels −a_d; the fixed-step path applies the drive's exact velocity
    // change per half step instead (so a ramp shorter than a step is still right) and sets driveAccelInRhs off.
    const adRel = this.driveAccelInRhs ? ad : 0;
    for (let i = 0; i < n; i++) aw[i] = aw[i] * invM[i] - adRel;
    aw[d] = 0;
    this.driveForce = Fd;
    this.driveTension = T[d - 1];
    this.drivePower = Fd * vd;
    this.dissipation = diss;
    this.maxT = maxT;
    this.maxTSeg = maxTSeg;
    this.slack = slack;
    this.dogForce = dogF;
    this.ardForce = ardF;
    this.stopForce = stop;
  }

  /**
   * Contact modes after an accepted step: the pawl's furthest position (ratchet), a catch point that
   * reached the dog from behind (engages), a dog that overtook a catch (rides over it: a click), a dog
   * that separated from its catch or left the chained zone (lets go). Returns event flags.
   */
  updateModes(t: number, w: ArrayLike<number>, x: number): number {
    const xp = x - this.dogOffset;
    if (xp > this.pawlMax) {
      this.pawlMax = xp;
      this.tooth = this.ratchet.toothBehind(xp);
    }
    let ev = 0;
    if (this.dogInZone(x)) {
      const K = this.lattice.indexAtOrBehind(this.materialAtDog(t, x, w));
      const last = this.lastCatchIndex;
      if (last === last) {
        if (K < last) {
          this.engaged = K + 1;
          const qd = xp - this.chainFrom;
          this.engageOffset = Math.max(0, this.catchPosition(t, K + 1, w, qd) - qd);
          ev |= EVENT_ENGAGE;
        } else if (K > last) ev |= EVENT_CLICK;
      }
      this.lastCatchIndex = K;
      // A catch stays the dog's partner while it is the next one ahead (the contact law gives no force
      // while they are apart); once the dog has passed it, it is behind and the dog rides free.
      if (this.engaged === this.engaged && K >= this.engaged) {
        this.engaged = NaN;
        ev |= EVENT_SEPARATE;
      }
    } else {
      if (this.engaged === this.engaged) ev |= EVENT_RELEASE;
      this.engaged = NaN;
      this.lastCatchIndex = NaN;
    }
    return ev;
  }

  /** Kinetic + potential + elastic energy (valid after accel() at the same state, for the contacts). */
  energy(t: number, w: ArrayLike<number>, vw: ArrayLike<number>, x: number, vx: number, y: number, vy: number): number {
    const loop = this.loop;
    const vd = this.drive.velocity(t);
    let e = 0;
    for (let i = 0; i < this.n; i++) {
      const v = vw[i] + vd;
      e += 0.5 * loop.mass[i] * v * v;
      e -= loop.weight[i] * w[i]; // own weight (Σ weight = 0, so rigid transport adds nothing)
      const k = i + 1 < this.n ? i + 1 : 0;
      const eps = this.eps0[i] + (w[k] - w[i] + this.legY[i] * y) * this.invL[i];
      if (eps > 0) e += 0.5 * this.EA * loop.L[i] * eps * eps;
    }
    e += 0.5 * this.takeUp.mass * vy * vy - this.takeUp.mass * this.g * y + this.takeUp.stopEnergy(y);
    e += 0.5 * this.train.mass * vx * vx + this.train.potential(x);
    if (this.dogForce > 0 || this.dogDelta > 0) e += contactEnergy(this.dogStiffness, this.dogDelta);
    e += contactEnergy(this.ardStiffness, this.ardDelta);
    return e;
  }

  /**
   * Stable explicit step, from a Gershgorin bound per degree of freedom: stiffness rows
   * 2·(k_left + k_right)/m (plus contacts and take-up coupling) and damping rows (chain damping, contact
   * damping, and the smoothed friction laws, which act as dashpots of rate friction/(v_s·m) near rest).
   * Each gives the damped central-difference limit 2(√(1+ζ²) − ζ)/ω; the step is their minimum.
   */
  stabilityLimit(): { omega: number; zeta: number; dt: number } {
    const loop = this.loop;
    const n = this.n;
    const vs = FRICTION_SMOOTHING_SPEED;
    const g = this.g;
    const mu = this.s.chain.massPerLength;
    let omegaMax = 0;
    let zetaAt = 0;
    let dt = Infinity;
    const consider = (w2: number, beta: number) => {
      const w = Math.sqrt(Math.max(0, w2));
      const d = w > 0 ? (2 * (Math.sqrt(1 + (beta / (2 * w)) ** 2) - beta / (2 * w))) / w : beta > 0 ? 2 / beta : Infinity;
      if (w > omegaMax) omegaMax = w;
      if (d < dt) {
        dt = d;
        zetaAt = w > 0 ? beta / (2 * w) : Infinity;
      }
    };
    // Tension scale for the friction normal load on curves: the static tension. Friction matters for the
    // step only near rest (start-up), before the train's load is on the chain; it is bounded, so a larger
    // load later at speed cannot make it unstable.
    let zMax = 0;
    for (let i = 0; i < n; i++) zMax = Math.max(zMax, loop.z[i] - loop.zBottom);
    const tScale = this.takeUp.mass * g * 0.5 + mu * g * zMax;
    // Gershgorin rows of the mass-symmetrised matrices M^-½·K·M^-½ and M^-½·C·M^-½ (same eigenvalues as
    // M^-1·K): a light station coupled to the heavy train or take-up gets almost nothing from that coupling.
    const m = loop.mass;
    const Mt = this.train.mass;
    const Mtu = this.takeUp.mass;
    const legK = new Float64Array(n);
    const legC = new Float64Array(n);
    for (const leg of loop.legs) {
      legK[leg.seg] = this.EA * leg.weight * this.invL[leg.seg];
      legC[leg.seg] = this.damping * leg.weight * this.invL[leg.seg];
    }
    let minStrandMass = Infinity;
    for (let i = 0; i <= loop.nsStrand; i++) minStrandMass = Math.min(minStrandMass, m[i]);
    for (let i = 0; i < n; i++) {
      if (i === loop.driveNode) continue;
      const p = i > 0 ? i - 1 : n - 1;
      const q = i + 1 < n ? i + 1 : 0;
      const ka = this.EA * this.invL[p];
      const kb = this.EA * this.invL[i];
      const ca = this.damping * this.invL[p];
      const cb = this.damping * this.invL[i];
      const mi = m[i];
      let w2 = (ka + kb) / mi + ka / Math.sqrt(mi * m[p]) + kb / Math.sqrt(mi * m[q]);
      let beta = (ca + cb) / mi + ca / Math.sqrt(mi * m[p]) + cb / Math.sqrt(mi * m[q]);
      if (i <= loop.nsStrand) {
        w2 += this.dogStiffness * (1 / mi + 1 / Math.sqrt(mi * Mt));
        beta += this.dogDamping * (1 / mi + 1 / Math.sqrt(mi * Mt));
      }
      w2 += (legK[i] + legK[p]) / Math.sqrt(mi * Mtu);
      beta += (legC[i] + legC[p]) / Math.sqrt(mi * Mtu);
      const len = mi / mu;
      const N = loop.guided[i] ? mu * g * loop.cosPhi[i] * len + tScale * Math.abs(loop.kappa[i]) * len : 0;
      beta += (this.frictionCoef * N) / vs / mi;
      consider(w2, beta);
    }
    const tu = this.takeUp;
    let w2tu = tu.stopStiffness / Mtu;
    let btu = (tu.stopDamping + tu.friction / vs) / Mtu;
    for (const leg of loop.legs) {
      const a = leg.seg;
      const b = a + 1 < n ? a + 1 : 0;
      w2tu += (leg.weight * legK[a]) / Mtu + legK[a] * (1 / Math.sqrt(Mtu * m[a]) + 1 / Math.sqrt(Mtu * m[b]));
      btu += (leg.weight * legC[a]) / Mtu + legC[a] * (1 / Math.sqrt(Mtu * m[a]) + 1 / Math.sqrt(Mtu * m[b]));
    }
    consider(w2tu, btu);
    const rolling = (this.s.trains[0].rollingResistance * Mt * g * 1.5) / vs; // 1.5: centripetal part on curves
    consider(
      (this.dogStiffness + this.ardStiffness) / Mt + this.dogStiffness / Math.sqrt(Mt * minStrandMass),
      (this.dogDamping + this.ardDamping + rolling) / Mt + this.dogDamping / Math.sqrt(Mt * minStrandMass),
    );
    return { omega: omegaMax, zeta: zetaAt, dt };
  }
}
