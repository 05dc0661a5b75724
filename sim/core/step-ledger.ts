// Energy accounting and force recording for the step, optional and off unless a Simulator is
// given a ledger. It books every force term's work over each sub-step so that the discrete
// work–kinetic-energy identity of semi-implicit Euler holds to rounding:
//
//   v* = v + dt·F/m  ⇒  ½m|v*|² − ½m|v|² = ½m(v* − v)·(v* + v) = F·(v + v*)/2·dt   (exact),
//
// so a free node's displacement for work is Δx = (v + v*)/2·dt, with v* the velocity after
// the force update and before contact. Contact then changes v* to v′; its kinetic-energy change
// ½m(|v′|² − |v*|²) is booked directly, split into the normal and the friction part. Driven
// nodes move as prescribed (Δx their actual displacement); the supports' work is −F·Δx with F
// every force the step computed on them, and every term's share at a driven node is booked
// with the same Δx, so the books close. Positions use x + dt·v′, not Δx: the difference between
// a potential's change and its force's work is the integrator's own energy error, which the
// energy balance (energy-balance.ts) reports.
//
// Recorded forces are impulse averages over the record interval: Σ F·dt / interval, the force
// that explains the velocity change between two records.
import { CONTACT_FRICTION_COLUMN, CONTACT_NORMAL_COLUMN, FLOW_COLUMN_COUNT, SUPPORT_WORK_COLUMN } from './energy-flows.ts';
import type { ForceTermContext } from './force-terms.ts';
import { FORCE_TERMS } from './force-terms.ts';
import type { Model } from './model.ts';
import { writeSpringTensions } from './spring-force-parts.ts';
import type { World } from './world.ts';

const FLUID_TERM = FORCE_TERMS.findIndex((term) => term.name === 'fluid_drag');

export class StepLedger {
  /** Cumulative flows since the ledger was made, in the order of FLOW_COLUMNS, J. */
  readonly flowsJ = new Float64Array(FLOW_COLUMN_COUNT);
  /** Velocity change of the current sub-step from contact, normal and friction parts, m/s. */
  readonly contactNormalDvMPerS: Float64Array;
  readonly contactFrictionDvMPerS: Float64Array;
  /** Impulses since the last takeAverageForces, N·s (tension: N·s per spring). */
  readonly tensionImpulseNS: Float64Array;
  readonly contactNormalImpulseNS: Float64Array;
  readonly contactFrictionImpulseNS: Float64Array;
  readonly fluidImpulseNS: Float64Array;
  private impulseDurationS = 0;
  private readonly termForceN: Float64Array[];
  private readonly velocityBeforeMPerS: Float64Array;
  private readonly velocityAfterForcesMPerS: Float64Array;
  /** (v + v*)/2·dt per free node this sub-step, 0 for pinned and driven nodes, m. */
  private readonly displacementM: Float64Array;
  private readonly tensionN: Float64Array;
  private readonly drivenStartM: Float64Array;
  private readonly context: ForceTermContext;
  /** Indices of the terms that act in this model and world; the others stay zero. */
  private readonly activeTerms: number[];
  private readonly recordForces: boolean;

  constructor(model: Model, world: World, handleForceN: Float64Array, recordForces = true) {
    this.recordForces = recordForces;
    this.activeTerms = FORCE_TERMS.map((term, t) => (term.acts(model, world) ? t : -1)).filter((t) => t >= 0);
    const n3 = 3 * model.nodeCount;
    this.contactNormalDvMPerS = new Float64Array(n3);
    this.contactFrictionDvMPerS = new Float64Array(n3);
    this.tensionImpulseNS = new Float64Array(model.springCount);
    this.contactNormalImpulseNS = new Float64Array(n3);
    this.contactFrictionImpulseNS = new Float64Array(n3);
    this.fluidImpulseNS = new Float64Array(n3);
    this.termForceN = FORCE_TERMS.map(() => new Float64Array(n3));
    this.velocityBeforeMPerS = new Float64Array(n3);
    this.velocityAfterForcesMPerS = new Float64Array(n3);
    this.displacementM = new Float64Array(n3);
    this.tensionN = new Float64Array(model.springCount);
    this.drivenStartM = new Float64Array(3 * model.drivenNodes.length);
    this.context = { model, world, handleForceN };
  }

  /** At the start-of-step state, after the step summed its forces. */
  beginStep(dtS: number): void {
    const model = this.context.model;
    for (const t of this.activeTerms) FORCE_TERMS[t].write(this.context, this.termForceN[t]);
    this.velocityBeforeMPerS.set(model.velocityMPerS);
    this.contactNormalDvMPerS.fill(0);
    this.contactFrictionDvMPerS.fill(0);
    const driven = model.drivenNodes;
    for (let d = 0; d < driven.length; d++) {
      for (let k = 0; k < 3; k++) this.drivenStartM[3 * d + k] = model.positionM[3 * driven[d] + k];
    }
    if (!this.recordForces) return;
    writeSpringTensions(model, this.tensionN);
    for (let s = 0; s < this.tensionN.length; s++) this.tensionImpulseNS[s] += this.tensionN[s] * dtS;
    const fluid = this.termForceN[FLUID_TERM];
    for (let j = 0; j < fluid.length; j++) this.fluidImpulseNS[j] += fluid[j] * dtS;
    this.impulseDurationS += dtS;
  }

  /** After v* = v + dt·F/m, before contact: books each term's work with Δx = (v + v*)/2·dt. */
  afterForceUpdate(dtS: number): void {
    const model = this.context.model;
    const v = model.velocityMPerS;
    const before = this.velocityBeforeMPerS;
    this.velocityAfterForcesMPerS.set(v);
    const invM = model.inverseMassPerKg;
    const dx = this.displacementM;
    for (let i = 0; i < model.nodeCount; i++) {
      const o = 3 * i;
      const free = invM[i] !== 0;
      dx[o] = free ? 0.5 * (before[o] + v[o]) * dtS : 0;
      dx[o + 1] = free ? 0.5 * (before[o + 1] + v[o + 1]) * dtS : 0;
      dx[o + 2] = free ? 0.5 * (before[o + 2] + v[o + 2]) * dtS : 0;
    }
    for (const t of this.activeTerms) {
      const f = this.termForceN[t];
      let work = 0;
      for (let j = 0; j < dx.length; j++) work += f[j] * dx[j];
      this.flowsJ[t] += FORCE_TERMS[t].role === 'dissipative' ? -work : work;
    }
  }

  /** After the contact projections: books the kinetic energy they removed and their impulses. */
  afterContact(): void {
    const model = this.context.model;
    const v = model.velocityMPerS;
    const vs = this.velocityAfterForcesMPerS;
    const dn = this.contactNormalDvMPerS;
    const df = this.contactFrictionDvMPerS;
    const m = model.massKg;
    let normalJ = 0;
    let frictionJ = 0;
    for (let i = 0; i < model.nodeCount; i++) {
      const o = 3 * i;
      if (dn[o] === 0 && dn[o + 1] === 0 && dn[o + 2] === 0 && df[o] === 0 && df[o + 1] === 0 && df[o + 2] === 0) continue;
      const s2 = vs[o] * vs[o] + vs[o + 1] * vs[o + 1] + vs[o + 2] * vs[o + 2];
      const mx = vs[o] + dn[o];
      const my = vs[o + 1] + dn[o + 1];
      const mz = vs[o + 2] + dn[o + 2];
      const m2 = mx * mx + my * my + mz * mz;
      const e2 = v[o] * v[o] + v[o + 1] * v[o + 1] + v[o + 2] * v[o + 2];
      normalJ += 0.5 * m[i] * (s2 - m2);
      frictionJ += 0.5 * m[i] * (m2 - e2);
      if (!this.recordForces) continue;
      for (let k = 0; k < 3; k++) {
        this.contactNormalImpulseNS[o + k] += m[i] * dn[o + k];
        this.contactFrictionImpulseNS[o + k] += m[i] * df[o + k];
      }
    }
    this.flowsJ[CONTACT_NORMAL_COLUMN] += normalJ;
    this.flowsJ[CONTACT_FRICTION_COLUMN] += frictionJ;
  }

  /** After the driven nodes reached their new places: the supports' work and their shares. */
  afterSupportsMoved(forceN: Float64Array): void {
    const model = this.context.model;
    const driven = model.drivenNodes;
    const x = model.positionM;
    let supportJ = 0;
    for (let d = 0; d < driven.length; d++) {
      const o = 3 * driven[d];
      const dx = x[o] - this.drivenStartM[3 * d];
      const dy = x[o + 1] - this.drivenStartM[3 * d + 1];
      const dz = x[o + 2] - this.drivenStartM[3 * d + 2];
      supportJ -= forceN[o] * dx + forceN[o + 1] * dy + forceN[o + 2] * dz;
      for (const t of this.activeTerms) {
        const f = this.termForceN[t];
        const work = f[o] * dx + f[o + 1] * dy + f[o + 2] * dz;
        this.flowsJ[t] += FORCE_TERMS[t].role === 'dissipative' ? -work : work;
      }
    }
    this.flowsJ[SUPPORT_WORK_COLUMN] += supportJ;
  }

  /**
   * Writes the impulse-averaged forces since the last call (impulse / elapsed time) and starts
   * a new interval: tension per spring (N), contact normal, contact friction and fluid force
   * per node (N, 3 per node). Any output may be null.
   */
  takeAverageForces(tensionN: Float64Array | null, normalN: Float64Array | null, frictionN: Float64Array | null, fluidN: Float64Array | null, offsetSprings: number, offsetNodes: number): void {
    const inv = this.impulseDurationS > 0 ? 1 / this.impulseDurationS : 0;
    if (tensionN) for (let s = 0; s < this.tensionImpulseNS.length; s++) tensionN[offsetSprings + s] = this.tensionImpulseNS[s] * inv;
    if (normalN) for (let j = 0; j < this.contactNormalImpulseNS.length; j++) normalN[offsetNodes + j] = this.contactNormalImpulseNS[j] * inv;
    if (frictionN) for (let j = 0; j < this.contactFrictionImpulseNS.length; j++) frictionN[offsetNodes + j] = this.contactFrictionImpulseNS[j] * inv;
    if (fluidN) for (let j = 0; j < this.fluidImpulseNS.length; j++) fluidN[offsetNodes + j] = this.fluidImpulseNS[j] * inv;
    this.tensionImpulseNS.fill(0);
    this.contactNormalImpulseNS.fill(0);
    this.contactFrictionImpulseNS.fill(0);
    this.fluidImpulseNS.fill(0);
    this.impulseDurationS = 0;
  }
}
