/**
 * The lift as one mechanical system over one flat state vector (layout in integrators/types.ts): chain
 * stations, the drive (a degree of freedom with its motor, or prescribed), the take-up weight and any number of
 * trains, each with its dog and its ARD pawls.
 *
 * Chain state is kept relative to the drive's displacement u_d: w_i = u_i − u_d, so values stay small (the
 * stretch, not the 100 m the chain travels) and the drive station is simply w = 0.
 * Segment i (station i → i+1): ε_i = ε0_i + (w_{i+1} − w_i [+ y on the take-up legs]) / L_i; while ε_i > 0
 * T_i = max(0, E·A·ε_i + E₂·(ε_i − εv_i) + D·dε_i/dt), else 0 (slack). E₂, εv: the Zener arm of the loss
 * factor (dεv/dt = (ε − εv)/τ). D: Kelvin–Voigt `chain.damping`.
 * Drive: (M_r + m_d)·a_d = F_motor + (T_d − T_{d−1} + weight_d), i.e. M_d·v̇_d = F_motor − (T_tight − T_slack).
 * Take-up: M·ÿ = M·g − Σ leg tensions − friction − c·ẏ − end stops.
 * Stations are fixed in space; the chain's transport speed (≤ 10 m/s) is tiny next to its wave speed
 * √(E·A/μ), so the convective terms of the moving chain are neglected.
 */
import { catchLattice, contactDampingCoefficient, contactEnergy, contactForce, ratchet, type CatchLattice, type Ratchet } from "./contacts";
import { DriveControl, type DriveMotion } from "./drive";
import { stateLayout, type StateLayout } from "./integrators/types";
import { buildLoop, staticStrain, type ChainLoop } from "./loop";
import { catchOffsetOf, pawlsOf, type Scenario, type TrainSettings } from "./schema";
import { buildTakeUp, type TakeUpModel } from "./takeup";
import { buildTrack, type Track } from "./track";
import { buildTrain, FRICTION_SMOOTHING_SPEED, type TrainModel } from "./train";

export const EVENT_ENGAGE = 1;
export const EVENT_CLICK = 2;
export const EVENT_SEPARATE = 4;
export const EVENT_RELEASE = 8;
/** A train appeared (its startTime) or left the model at the end of the track while others run on. */
export const EVENT_APPEAR = 16;
export const EVENT_DRIVE = 32;
/** Events after which the forces must be evaluated again before the next step. */
export const EVENTS_REEVALUATE = EVENT_ENGAGE | EVENT_RELEASE | EVENT_APPEAR | EVENT_DRIVE;

/**
 * Centre frequency of the chain's loss factor, Hz: the Zener element gives exactly `chain.lossFactor` here and
 * at least 0.69 of it from 0.2 to 1.25 Hz, where the train-on-chain surge modes of lift hills lie (assumption).
 */
export const LOSS_FACTOR_FREQUENCY = 0.5;

/** Mode and output of one train (index j of `trains`). */
export interface TrainState {
  settings: TrainSettings;
  model: TrainModel;
  dogOffset: number;
  /** ARD pawls, m behind the front. */
  pawls: number[];
  /** Contact damping coefficients, N·s/m (see LiftSystem.dogDamping). */
  dogDamping: number;
  ardDamping: number;
  active: boolean;
  /** Left the model at the end of the track (with other trains still to run): never appears again. */
  gone: boolean;
  // Contact modes, changed only between steps.
  engaged: number; // catch index in contact with the dog, NaN for none
  engageOffset: number; // penetration found at detection (the contact starts without a force jump)
  lastCatchIndex: number;
  pawlMax: Float64Array; // furthest position of each pawl
  tooth: Float64Array; // tooth each pawl would fall on, NaN for none
  // Results of the last evaluation.
  dogForce: number;
  dogDelta: number;
  dogDeltaRate: number;
  ardForce: number;
  ardDelta: Float64Array;
  /** Pawl carrying the most ARD force, −1 for none. */
  ardPawl: number;
  ax: number;
  /** Events of this train at the last updateModes. */
  events: number;
}

export interface SystemOptions {
  segments?: number;
}

export class LiftSystem {
  readonly s: Scenario;
  readonly track: Track;
  readonly loop: ChainLoop;
  readonly takeUp: TakeUpModel;
  readonly driveControl: DriveControl;
  readonly lattice: CatchLattice;
  /** Leftover of the loop that is not a whole number of catch spacings, m (the gap half a loop from the catch placed). */
  readonly latticeGap: number;
  readonly ratchet: Ratchet;
  readonly layout: StateLayout;
  readonly trains: TrainState[];
  readonly n: number;
  readonly driveNode: number;
  readonly EA: number;
  readonly damping: number;
  /** Zener arm stiffness (per unit strain) and relaxation time. */
  readonly zenerStiffness: number;
  readonly zenerTau: number;
  readonly eps0: Float64Array;
  readonly invL: Float64Array;
  readonly invM: Float64Array;
  readonly legY: Float64Array; // weight of y in each segment (take-up legs)
  readonly frictionCoef: number;
  readonly dogStiffness: number;
  readonly ardStiffness: number;
  readonly chainFrom: number;
  readonly dogRelease: number;
  readonly g: number;
  readonly halfPitchDiameter: number;

  // Results of the last evaluation.
  readonly T: Float64Array;
  private readonly aw: Float64Array;
  ay = 0;
  maxT = 0;
  maxTSeg = 0;
  slack = 0;
  stopForce = 0;
  /** Pull of the motor (or brake, or ideal drive) on the drive DOF, N at the chain (incl. accelerating its inertia). */
  driveForce = 0;
  driveTension = 0; // tight-side tension arriving at the drive, N
  driveSlackTension = 0; // slack-side tension leaving the drive, N
  drivePower = 0; // mechanical power of the motor/brake into the system, W
  driveSpeed = 0; // chain speed at the drive, m/s
  driveAccel = 0;
  dissipation = 0; // W
  evaluations = 0;

  constructor(s: Scenario, opts: SystemOptions = {}) {
    this.s = s;
    this.track = buildTrack(s.lift);
    this.loop = buildLoop(s, this.track, opts.segments);
    this.takeUp = buildTakeUp(s, this.loop.length);
    const loop = this.loop;
    this.n = loop.nodes;
    this.driveNode = s.drive.location === "top" ? loop.topNode : loop.driveNode;
    this.EA = s.chain.axialStiffness;
    this.damping = s.chain.damping;
    const eta = s.chain.lossFactor;
    // Complex stiffness E·A + E₂·iωτ/(1 + iωτ): at ωτ = 1 its loss factor is (E₂/2)/(E·A + E₂/2) = η.
    this.zenerStiffness = eta > 0 ? (2 * eta * this.EA) / (1 - eta) : 0;
    this.zenerTau = 1 / (2 * Math.PI * LOSS_FACTOR_FREQUENCY);
    this.g = s.run.gravity;
    this.eps0 = staticStrain(loop, s.takeUp.mass, s.chain.massPerLength, this.g, this.EA);
    this.invL = loop.L.map((l) => 1 / l);
    this.invM = loop.mass.map((m) => 1 / m);
    this.legY = new Float64Array(this.n);
    for (const leg of loop.legs) this.legY[leg.seg] = leg.weight;
    this.frictionCoef = s.chain.guideFriction;
    // The leftover of a loop that is not a whole number of spacings sits half a loop from the catch placed.
    const spacing = s.chain.catchSpacing;
    const count = Math.max(1, Math.floor(loop.length / spacing + 1e-9));
    const behind = Math.floor(count / 2);
    this.latticeGap = loop.length - count * spacing;
    this.lattice = catchLattice(catchOffsetOf(s) - s.lift.chainFrom - behind * spacing, spacing, loop.length);
    const ar = s.antiRollback;
    this.ratchet = ratchet(ar.enabled, ar.from, ar.to, ar.toothSpacing);
    this.dogStiffness = s.contacts.dogStiffness;
    this.ardStiffness = s.contacts.ardStiffness;
    this.chainFrom = s.lift.chainFrom;
    this.dogRelease = s.lift.dogRelease;
    this.T = new Float64Array(this.n);
    this.aw = new Float64Array(this.n);
    this.halfPitchDiameter = s.chain.pitch / Math.sin(Math.PI / s.drive.sprocketTeeth) / 2;
    this.trains = s.trains.map((ts, j) => {
      const model = buildTrain(s, this.track, j);
      const pawls = pawlsOf(ts);
      const M = model.mass;
      const mc = s.chain.massPerLength * s.chain.catchSpacing;
      const zeta = s.contacts.dampingRatio;
      const st: TrainState = {
        settings: ts,
        dogDamping: contactDampingCoefficient(zeta, s.contacts.dogStiffness, (M * mc) / (M + mc)),
        ardDamping: contactDampingCoefficient(zeta, s.contacts.ardStiffness, M),
        model,
        dogOffset: ts.dogOffset,
        pawls,
        active: false,
        gone: false,
        engaged: NaN,
        engageOffset: 0,
        lastCatchIndex: NaN,
        pawlMax: new Float64Array(pawls.length),
        tooth: new Float64Array(pawls.length).fill(NaN),
        dogForce: 0,
        dogDelta: 0,
        dogDeltaRate: 0,
        ardForce: 0,
        ardDelta: new Float64Array(pawls.length),
        ardPawl: -1,
        ax: 0,
        events: 0,
      };
      this.placePawls(st, ts.startPosition, true);
      return st;
    });
    let loaded = s.chain.massPerLength * loop.length;
    for (const t of this.trains) loaded += t.model.mass;
    this.driveControl = new DriveControl(s, loaded);
    const dc = this.driveControl;
    this.driveReference = { velocity: (t) => dc.refSpeed(t), acceleration: (t) => dc.refAccel(t), displacement: (t) => dc.reference.displacement(t) };
    this.layout = stateLayout(this.n, this.trains.length, this.zenerStiffness > 0, s.drive.motor.kind === "speed-loop");
  }

  /**
   * Contact damping from the damping ratio, independent of the mesh. Dog: on the reduced mass of the train and
   * one catch spacing of chain (the chain a catch carries; the train alone would make the dashpot's jump at
   * first touch, c·Δv, far larger than the chain can pass on). ARD: on the train's mass (the tooth is fixed).
   */
  dogDamping(j: number): number {
    return this.trains[j].dogDamping;
  }
  ardDamping(j: number): number {
    return this.trains[j].ardDamping;
  }

  /** Pawls' furthest positions set to the train at front position x (reset: forget earlier ones). */
  placePawls(tr: TrainState, x: number, reset: boolean): void {
    for (let k = 0; k < tr.pawls.length; k++) {
      const p = x - tr.pawls[k];
      if (reset || p > tr.pawlMax[k]) {
        tr.pawlMax[k] = p;
        tr.tooth[k] = this.ratchet.toothBehind(p);
      }
    }
  }

  // Train 0's figures under the names the version 1 summary reads.
  get train(): TrainModel {
    return this.trains[0].model;
  }
  get dogOffset(): number {
    return this.trains[0].dogOffset;
  }
  get dogForce(): number {
    return this.trains[0].dogForce;
  }
  get dogDeltaRate(): number {
    return this.trains[0].dogDeltaRate;
  }
  get ardForce(): number {
    return this.trains[0].ardForce;
  }
  get ax(): number {
    return this.trains[0].ax;
  }
  /** Tooth under train 0's loaded (or first) pawl, NaN for none. */
  get tooth(): number {
    const t = this.trains[0];
    return t.tooth[t.ardPawl >= 0 ? t.ardPawl : 0];
  }
  /** The reference speed profile (ramp, 0 while stopped): what the drive is asked for. */
  get drive(): DriveMotion {
    return this.driveReference;
  }
  private readonly driveReference: DriveMotion;

  /** Chain displacement relative to the drive at a carrying-strand position q (linear between stations). */
  wAt(Y: ArrayLike<number>, q: number): number {
    const h = this.loop.hStrand;
    let j = Math.floor(q / h);
    if (j < 0) j = 0;
    else if (j >= this.loop.nsStrand) j = this.loop.nsStrand - 1;
    const f = q / h - j;
    return Y[j] * (1 - f) + Y[j + 1] * f;
  }

  /** Material coordinate of the chain at the dog of a train at x (dog on the carrying strand). */
  materialAtDog(Y: ArrayLike<number>, x: number, dogOffset: number): number {
    const q = x - dogOffset - this.chainFrom;
    return q - Y[this.layout.iD] - this.wAt(Y, q);
  }

  /** Is the dog of a train at x over the chained, engaging part of the lift? */
  dogInZone(x: number, dogOffset: number): boolean {
    const xd = x - dogOffset;
    return xd >= this.chainFrom && xd < this.dogRelease;
  }

  /** Current loop position of catch K (solving q = ξ_K + u(q) by two fixed-point passes). */
  catchPosition(Y: ArrayLike<number>, K: number, qGuess: number): number {
    const base = this.lattice.at(K) + Y[this.layout.iD];
    let q = base + this.wAt(Y, qGuess);
    q = base + this.wAt(Y, q);
    return q;
  }

  /**
   * The right-hand side dY = f(t, Y) over the flat state. `prescribedAccelInRhs`: whether a prescribed
   * drive's acceleration goes into the chain's relative accelerations (true for RK4 and odex). The
   * velocity-Verlet path passes false and applies the prescribed speed change per half step exactly
   * instead (so a ramp shorter than a step is still right). Fills the diagnostics fields above.
   */
  rhs(t: number, Y: Float64Array, dY: Float64Array, prescribedAccelInRhs: boolean): void {
    this.evaluations++;
    const L = this.layout;
    const n = this.n;
    const loop = this.loop;
    const T = this.T;
    const aw = this.aw;
    const EA = this.EA;
    const D = this.damping;
    const E2 = this.zenerStiffness;
    const tau = this.zenerTau;
    const eps0 = this.eps0;
    const invL = this.invL;
    const legY = this.legY;
    const iV = L.iV;
    const y = Y[L.iY];
    const vy = Y[iV + L.iY];
    const vd = Y[iV + L.iD];
    let diss = 0;
    let maxT = 0;
    let maxTSeg = 0;
    let slack = 0;
    for (let i = 0; i < n; i++) {
      const k = i + 1 < n ? i + 1 : 0;
      const ly = legY[i];
      const eps = eps0[i] + (Y[k] - Y[i] + ly * y) * invL[i];
      let zen = 0;
      if (E2 > 0) {
        const arm = eps - Y[L.iZ + i];
        dY[L.iZ + i] = arm / tau;
        zen = E2 * arm;
        diss += (zen * arm * loop.L[i]) / tau;
      }
      let Ti = 0;
      if (eps > 0) {
        const te = EA * eps + zen;
        Ti = te;
        if (D > 0) {
          const rate = (Y[iV + k] - Y[iV + i] + ly * vy) * invL[i];
          Ti = te + D * rate;
          if (Ti < 0) Ti = 0;
          diss += (Ti - te) * rate * loop.L[i];
        } else if (Ti < 0) Ti = 0;
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
    for (let i = 0; i < n; i++) {
      const p = i > 0 ? i - 1 : n - 1;
      let F = T[i] - T[p] + weight[i];
      if (fc > 0 && loop.guided[i]) {
        const v = Y[iV + i] + vd;
        const len = mass[i] / mu;
        const N = Math.abs(mu * this.g * loop.cosPhi[i] * len - 0.5 * (T[i] + T[p]) * loop.kappa[i] * len);
        const ff = (fc * N * v) / Math.sqrt(v * v + vs * vs);
        F -= ff;
        diss += ff * v;
      }
      aw[i] = F;
    }
    // Trains: dog on a catch point, pawls on the ARD, gravity, rolling resistance, drag.
    const h = loop.hStrand;
    for (let j = 0; j < this.trains.length; j++) {
      const tr = this.trains[j];
      const ix = L.iX + j;
      if (!tr.active) {
        tr.dogForce = tr.ardForce = tr.dogDelta = tr.dogDeltaRate = tr.ax = 0;
        tr.ardDelta.fill(0);
        tr.ardPawl = -1;
        dY[ix] = 0;
        dY[iV + ix] = 0;
        continue;
      }
      const x = Y[ix];
      const vx = Y[iV + ix];
      let dogF = 0;
      tr.dogDelta = 0;
      tr.dogDeltaRate = 0;
      if (tr.engaged === tr.engaged && this.dogInZone(x, tr.dogOffset)) {
        const qd = x - tr.dogOffset - this.chainFrom;
        const qk = this.catchPosition(Y, tr.engaged, qd);
        const delta = qk - qd - tr.engageOffset;
        let js = Math.floor(qk / h);
        if (js < 0) js = 0;
        else if (js >= loop.nsStrand) js = loop.nsStrand - 1;
        const f = qk / h - js;
        const vChain = vd + Y[iV + js] * (1 - f) + Y[iV + js + 1] * f;
        const rate = vChain - vx;
        const c = this.dogDamping(j);
        dogF = contactForce(this.dogStiffness, c, delta, rate);
        if (dogF > 0) {
          aw[js] -= dogF * (1 - f);
          aw[js + 1] -= dogF * f;
          diss += (dogF - this.dogStiffness * delta) * rate;
        }
        tr.dogDelta = delta;
        tr.dogDeltaRate = rate;
      }
      let ardF = 0;
      let best = 0;
      tr.ardPawl = -1;
      const ca = this.ardDamping(j);
      for (let k = 0; k < tr.pawls.length; k++) {
        tr.ardDelta[k] = 0;
        const tooth = tr.tooth[k];
        if (tooth !== tooth) continue;
        const delta = tooth - (x - tr.pawls[k]);
        const fk = contactForce(this.ardStiffness, ca, delta, -vx);
        if (fk > 0) diss += (fk - this.ardStiffness * delta) * -vx;
        tr.ardDelta[k] = delta;
        ardF += fk;
        if (fk > best) {
          best = fk;
          tr.ardPawl = k;
        }
      }
      const ext = tr.model.force(x, vx);
      diss += tr.model.lastDissipation;
      tr.ax = (ext + dogF + ardF) / tr.model.mass;
      tr.dogForce = dogF;
      tr.ardForce = ardF;
      dY[ix] = vx;
      dY[iV + ix] = tr.ax;
    }
    // Take-up weight.
    const tu = this.takeUp;
    const stop = tu.stopForce(y, vy);
    const fr = tu.frictionForce(vy) - tu.damping * vy;
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
    dY[L.iY] = vy;
    dY[iV + L.iY] = this.ay;
    // Drive: prescribed (ideal drive running, or braking) or a degree of freedom with its motor.
    const dc = this.driveControl;
    const d = this.driveNode;
    const Md = dc.reflectedMass + mass[d];
    let ad: number;
    let Fdrive: number;
    if (dc.prescribed) {
      ad = dc.prescribedAccel(t);
      Fdrive = Md * ad - aw[d];
    } else {
      const integral = L.iPI >= 0 ? Y[L.iPI] : 0;
      Fdrive = dc.motorForce(t, vd, integral);
      ad = (Fdrive + aw[d]) / Md;
      if (L.iPI >= 0) dY[L.iPI] = dc.integralRate(t, vd, integral);
    }
    const frameAccel = dc.prescribed && !prescribedAccelInRhs ? 0 : ad;
    const invM = this.invM;
    for (let i = 0; i < n; i++) {
      dY[i] = Y[iV + i];
      dY[iV + i] = aw[i] * invM[i] - frameAccel;
    }
    dY[d] = 0;
    dY[iV + d] = 0;
    dY[L.iD] = vd;
    dY[iV + L.iD] = frameAccel;
    this.driveAccel = ad;
    this.driveSpeed = vd;
    this.driveForce = Fdrive;
    this.driveTension = T[d > 0 ? d - 1 : n - 1];
    this.driveSlackTension = T[d];
    this.drivePower = Fdrive * vd;
    this.dissipation = diss;
    dY[L.iWork] = this.drivePower;
    dY[L.iDiss] = diss;
    this.maxT = maxT;
    this.maxTSeg = maxTSeg;
    this.slack = slack;
    this.stopForce = stop;
  }

  /**
   * Contact and drive modes after an accepted step (may change Y: a train appearing at its startTime).
   * Per train: the pawls' furthest positions (ratchet), a catch point that reached the dog from behind
   * (engages), a dog that overtook a catch (rides over it: a click), a dog that separated from its catch or
   * left the chained zone (lets go). Returns the events of all trains and the drive, OR-ed.
   */
  updateModes(t: number, Y: Float64Array): number {
    const L = this.layout;
    let all = 0;
    for (let j = 0; j < this.trains.length; j++) {
      const tr = this.trains[j];
      let ev = 0;
      const ix = L.iX + j;
      if (tr.gone) {
        tr.events = 0;
        continue;
      }
      if (!tr.active) {
        if (t + 1e-12 < tr.settings.startTime) {
          tr.events = 0;
          continue;
        }
        this.appear(j, Y, t);
        ev |= EVENT_APPEAR;
      }
      const x = Y[ix];
      if (x >= this.track.length && this.othersToRun(j, t)) {
        this.leave(j, Y);
        tr.events = EVENT_APPEAR;
        all |= EVENT_APPEAR;
        continue;
      }
      this.placePawls(tr, x, false);
      if (this.dogInZone(x, tr.dogOffset)) {
        const K = this.lattice.indexAtOrBehind(this.materialAtDog(Y, x, tr.dogOffset));
        const last = tr.lastCatchIndex;
        if (last === last) {
          if (K < last) {
            tr.engaged = K + 1;
            const qd = x - tr.dogOffset - this.chainFrom;
            tr.engageOffset = Math.max(0, this.catchPosition(Y, K + 1, qd) - qd);
            ev |= EVENT_ENGAGE;
          } else if (K > last) ev |= EVENT_CLICK;
        }
        tr.lastCatchIndex = K;
        // A catch stays the dog's partner while it is the next one ahead (the contact law gives no force
        // while they are apart); once the dog has passed it, it is behind and the dog rides free.
        if (tr.engaged === tr.engaged && K >= tr.engaged) {
          tr.engaged = NaN;
          ev |= EVENT_SEPARATE;
        }
      } else {
        if (tr.engaged === tr.engaged) ev |= EVENT_RELEASE;
        tr.engaged = NaN;
        tr.lastCatchIndex = NaN;
      }
      tr.events = ev;
      all |= ev;
    }
    const change = this.driveControl.update(t, Y[L.iV + L.iD]);
    if (change) {
      all |= EVENT_DRIVE;
      if (change === "restart" && L.iPI >= 0) Y[L.iPI] = 0;
    }
    return all;
  }

  /**
   * A train appears at its start position and entry speed (version 2 `startTime`). Its energy enters as
   * work done on the system, so the energy balance still closes.
   */
  appear(j: number, Y: Float64Array, t: number): void {
    const L = this.layout;
    const tr = this.trains[j];
    const ts = tr.settings;
    tr.active = true;
    Y[L.iX + j] = ts.startPosition;
    Y[L.iV + L.iX + j] = ts.entrySpeed;
    this.placePawls(tr, ts.startPosition, true);
    tr.engaged = NaN;
    tr.lastCatchIndex = NaN;
    if (t > 0) Y[L.iWork] += 0.5 * tr.model.mass * ts.entrySpeed ** 2 + tr.model.potential(ts.startPosition);
  }

  /** True while another train is on the track or still to appear (the run goes on without train j). */
  othersToRun(j: number, t: number): boolean {
    return this.trains.some((o, k) => k !== j && !o.gone && (o.active || t + 1e-12 < o.settings.startTime));
  }

  /**
   * A train leaves the model at the end of the track while other trains run on: its energy leaves as work
   * taken out of the system (the mirror of appear), so the energy balance still closes.
   */
  leave(j: number, Y: Float64Array): void {
    const L = this.layout;
    const tr = this.trains[j];
    const x = Y[L.iX + j];
    const v = Y[L.iV + L.iX + j];
    Y[L.iWork] -= 0.5 * tr.model.mass * v * v + tr.model.potential(x);
    tr.active = false;
    tr.gone = true;
    tr.engaged = NaN;
    tr.lastCatchIndex = NaN;
    tr.dogForce = tr.ardForce = tr.dogDelta = tr.dogDeltaRate = tr.ax = 0;
    tr.ardDelta.fill(0);
    tr.ardPawl = -1;
    Y[L.iV + L.iX + j] = 0;
  }

  /** Kinetic + potential + elastic energy (valid after rhs() at the same state, for the contacts). */
  energy(Y: Float64Array): number {
    const L = this.layout;
    const loop = this.loop;
    const vd = Y[L.iV + L.iD];
    const y = Y[L.iY];
    const vy = Y[L.iV + L.iY];
    let e = 0;
    for (let i = 0; i < this.n; i++) {
      const v = Y[L.iV + i] + vd;
      e += 0.5 * loop.mass[i] * v * v;
      e -= loop.weight[i] * Y[i]; // own weight (Σ weight = 0, so the drive's displacement adds nothing)
      const k = i + 1 < this.n ? i + 1 : 0;
      const eps = this.eps0[i] + (Y[k] - Y[i] + this.legY[i] * y) * this.invL[i];
      if (eps > 0) e += 0.5 * this.EA * loop.L[i] * eps * eps;
      if (L.nZ > 0) {
        const arm = eps - Y[L.iZ + i];
        e += 0.5 * this.zenerStiffness * loop.L[i] * arm * arm;
      }
    }
    e += 0.5 * this.driveControl.reflectedMass * vd * vd;
    e += 0.5 * this.takeUp.mass * vy * vy - this.takeUp.mass * this.g * y + this.takeUp.stopEnergy(y);
    for (let j = 0; j < this.trains.length; j++) {
      const tr = this.trains[j];
      if (!tr.active) continue;
      const vx = Y[L.iV + L.iX + j];
      e += 0.5 * tr.model.mass * vx * vx + tr.model.potential(Y[L.iX + j]);
      if (tr.dogForce > 0 || tr.dogDelta > 0) e += contactEnergy(this.dogStiffness, tr.dogDelta);
      for (let k = 0; k < tr.pawls.length; k++) e += contactEnergy(this.ardStiffness, tr.ardDelta[k]);
    }
    return e;
  }

  /**
   * Stable explicit step, from a Gershgorin bound per degree of freedom: stiffness rows
   * 2·(k_left + k_right)/m (plus contacts and take-up coupling) and damping rows (chain damping, contact
   * damping, motor slope, and the smoothed friction laws, which act as dashpots of rate friction/(v_s·m) near
   * rest). Each gives the damped central-difference limit 2(√(1+ζ²) − ζ)/ω; the step is their minimum.
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
    // The Zener arm adds its stiffness at frequencies above 1/τ (the step's scale).
    const EAi = this.EA + this.zenerStiffness;
    // Gershgorin rows of the mass-symmetrised matrices M^-½·K·M^-½ and M^-½·C·M^-½ (same eigenvalues as
    // M^-1·K): a light station coupled to the heavy train or take-up gets almost nothing from that coupling.
    const m = Float64Array.from(loop.mass);
    const dc = this.driveControl;
    const d = this.driveNode;
    m[d] += dc.reflectedMass;
    const Mtu = this.takeUp.mass;
    let Mt = Infinity;
    let kDog = 0;
    let cDog = 0;
    let kArd = 0;
    let cArd = 0;
    let rolling = 0;
    for (let j = 0; j < this.trains.length; j++) {
      const tr = this.trains[j];
      Mt = Math.min(Mt, tr.model.mass);
      kDog = this.dogStiffness;
      cDog = Math.max(cDog, this.dogDamping(j));
      kArd = Math.max(kArd, this.ardStiffness * tr.pawls.length);
      cArd = Math.max(cArd, this.ardDamping(j) * tr.pawls.length);
      rolling = Math.max(rolling, (tr.settings.rollingResistance * tr.model.mass * g * 1.5) / vs); // 1.5: curves
    }
    const legK = new Float64Array(n);
    const legC = new Float64Array(n);
    for (const leg of loop.legs) {
      legK[leg.seg] = EAi * leg.weight * this.invL[leg.seg];
      legC[leg.seg] = this.damping * leg.weight * this.invL[leg.seg];
    }
    let minStrandMass = Infinity;
    for (let i = 0; i <= loop.nsStrand; i++) minStrandMass = Math.min(minStrandMass, m[i]);
    // A prescribed drive station does not move on its own; a driven one may (any phase can be dynamic
    // except the ideal drive before a stop, whose station is always prescribed).
    const driveCanMove = dc.kind !== "ideal" || this.s.drive.stop?.kind === "power-loss";
    for (let i = 0; i < n; i++) {
      if (i === d && !driveCanMove) continue;
      const p = i > 0 ? i - 1 : n - 1;
      const q = i + 1 < n ? i + 1 : 0;
      const ka = EAi * this.invL[p];
      const kb = EAi * this.invL[i];
      const ca = this.damping * this.invL[p];
      const cb = this.damping * this.invL[i];
      const mi = m[i];
      let w2 = (ka + kb) / mi + ka / Math.sqrt(mi * m[p]) + kb / Math.sqrt(mi * m[q]);
      let beta = (ca + cb) / mi + ca / Math.sqrt(mi * m[p]) + cb / Math.sqrt(mi * m[q]);
      if (i <= loop.nsStrand) {
        w2 += kDog * (1 / mi + 1 / Math.sqrt(mi * Mt));
        beta += cDog * (1 / mi + 1 / Math.sqrt(mi * Mt));
      }
      w2 += (legK[i] + legK[p]) / Math.sqrt(mi * Mtu);
      beta += (legC[i] + legC[p]) / Math.sqrt(mi * Mtu);
      const len = loop.mass[i] / mu;
      const N = loop.guided[i] ? mu * g * loop.cosPhi[i] * len + tScale * Math.abs(loop.kappa[i]) * len : 0;
      beta += (this.frictionCoef * N) / vs / mi;
      if (i === d) beta += dc.maxSlope() / mi;
      consider(w2, beta);
    }
    const tu = this.takeUp;
    let w2tu = tu.stopStiffness / Mtu;
    let btu = (tu.stopDamping + tu.friction / vs + tu.damping) / Mtu;
    for (const leg of loop.legs) {
      const a = leg.seg;
      const b = a + 1 < n ? a + 1 : 0;
      w2tu += (leg.weight * legK[a]) / Mtu + legK[a] * (1 / Math.sqrt(Mtu * m[a]) + 1 / Math.sqrt(Mtu * m[b]));
      btu += (leg.weight * legC[a]) / Mtu + legC[a] * (1 / Math.sqrt(Mtu * m[a]) + 1 / Math.sqrt(Mtu * m[b]));
    }
    consider(w2tu, btu);
    consider(
      (kDog + kArd) / Mt + kDog / Math.sqrt(Mt * minStrandMass),
      (cDog + cArd + rolling) / Mt + cDog / Math.sqrt(Mt * minStrandMass),
    );
    return { omega: omegaMax, zeta: zetaAt, dt };
  }
}
