// The chain's bending model (sim/core/bending-forces.ts) against outside results:
// - its forces are minus the gradient of its energy (central finite differences of
//   bendingEnergyJ; calculus, common practice, no source) and its damping does exactly the
//   stated negative work and none under rigid motion;
// - a horizontal cantilever clamped at one end sags under its own weight like an
//   Euler–Bernoulli beam, δ = w·L⁴/(8·EI) (Timoshenko & Gere, Mechanics of Materials, table of
//   cantilever deflections; from memory), converging as the part count grows;
// - its first bending frequency is f₁ = (1.8751²/2π)·√(EI/(ρA·L⁴)) (Euler–Bernoulli
//   cantilever, β₁L = 1.8751 from cos βL·cosh βL = −1; Rao, Mechanical Vibrations; from memory);
// - a stiff chain with automatic sub-steps stays stable and the bound is not wasteful.
import { describe, expect, it } from 'vitest';

import { bendingDissipationW, bendingEnergyJ } from '../sim/core/bending-energy.ts';
import { accumulateBendingForces, accumulateClampForces } from '../sim/core/bending-forces.ts';
import type { Model } from '../sim/core/model.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import { zeroCrossingPeriodS } from './support/zero-crossing-period.ts';
import { zeroGravityWorld } from './support/zero-gravity-world.ts';

function chain(overrides: Partial<ChainParameters>): ChainParameters {
  return {
    partCount: 10, lengthM: 1, totalMassKg: 0.1, axialStiffnessN: 1e5, secondNeighbourSpringRatio: 0,
    bendingStiffnessNm2: 10, bendingDampingRatio: 0, dampingRatio: 0, diameterM: 0.01, anchor: 'free', clampedEnds: [],
    originM: [0, 0, 0], directionUnit: [1, 0, 0], forceHandles: [], forceAxes: [], drivenAxes: [], ...overrides,
  };
}

function bendingForce(model: Model): Float64Array {
  const f = new Float64Array(3 * model.nodeCount);
  accumulateBendingForces(model, f);
  accumulateClampForces(model, f);
  return f;
}

/** A bent, twisted pose: small-ish helix-like offsets that give every hinge its own plane. */
function bend(model: Model): void {
  for (let i = 0; i < model.nodeCount; i++) {
    model.positionM[3 * i + 1] += 0.03 * Math.sin(1.3 * i) + 0.002 * i * i;
    model.positionM[3 * i + 2] += 0.02 * Math.cos(0.7 * i + 0.4);
  }
}

describe('bending forces are −∇E (central differences of bendingEnergyJ, h = 1e-6 m)', () => {
  it('hinges and a clamp, on a bent 3-D pose: every component within 1e-6 relative of the largest', () => {
    const model = buildChain(chain({ partCount: 7, clampedEnds: ['top'], bendingStiffnessNm2: 0.8 })).model;
    bend(model);
    const f = bendingForce(model);
    const x = model.positionM;
    const h = 1e-6;
    let largest = 0;
    for (const value of f) largest = Math.max(largest, Math.abs(value));
    expect(largest).toBeGreaterThan(1);
    for (let j = 0; j < x.length; j++) {
      const keep = x[j];
      x[j] = keep + h;
      const up = bendingEnergyJ(model, x);
      x[j] = keep - h;
      const down = bendingEnergyJ(model, x);
      x[j] = keep;
      const numeric = -(up - down) / (2 * h);
      expect(Math.abs(f[j] - numeric)).toBeLessThan(1e-6 * largest);
    }
  });

  it('small bend: E = ½·(EI/ℓ)·φ² to second order (Euler–Bernoulli energy ½·EI·κ²·ℓ with κ = φ/ℓ)', () => {
    const model = buildChain(chain({ partCount: 2, lengthM: 0.2, bendingStiffnessNm2: 0.5 })).model;
    const phi = 1e-3;
    // Turn the second segment by φ about z.
    model.positionM[6] = 0.1 + 0.1 * Math.cos(phi);
    model.positionM[7] = 0.1 * Math.sin(phi);
    const expected = 0.5 * (0.5 / 0.1) * phi * phi;
    expect(Math.abs(bendingEnergyJ(model, model.positionM) / expected - 1)).toBeLessThan(1e-6);
  });
});

describe('bending damping: Rayleigh dissipation ½·η·(d|w|/dt)² (definition in bending-forces.ts)', () => {
  function dampingForce(model: Model): Float64Array {
    const withDamping = bendingForce(model);
    const saved = model.hingeDampingNms.slice();
    const savedClamp = model.clampDampingNms.slice();
    model.hingeDampingNms.fill(0);
    model.clampDampingNms.fill(0);
    const elastic = bendingForce(model);
    model.hingeDampingNms.set(saved);
    model.clampDampingNms.set(savedClamp);
    return withDamping.map((value, i) => value - elastic[i]);
  }

  it('its force does −P of work per second, P = bendingDissipationW ≥ 0 (power of a Rayleigh dissipation: F·v = −2D)', () => {
    const model = buildChain(chain({ partCount: 6, clampedEnds: ['top'], bendingDampingRatio: 0.3 })).model;
    bend(model);
    for (let i = 0; i < model.velocityMPerS.length; i++) model.velocityMPerS[i] = 0.4 * Math.sin(2.1 * i + 0.3);
    const fd = dampingForce(model);
    let work = 0;
    for (let i = 0; i < fd.length; i++) work += fd[i] * model.velocityMPerS[i];
    const power = bendingDissipationW(model, model.positionM, model.velocityMPerS);
    expect(power).toBeGreaterThan(0);
    // The damping force is a difference of two force evaluations, so some digits go.
    expect(Math.abs(work + power)).toBeLessThan(1e-9 * power);
  });

  it('rigid rotation and translation of a bent chain are not damped (objectivity, common practice, no source)', () => {
    const model = buildChain(chain({ partCount: 6, bendingDampingRatio: 0.5 })).model;
    bend(model);
    const omega = [0.3, -1.1, 0.7];
    const drift = [0.2, 0.1, -0.4];
    const x = model.positionM;
    for (let i = 0; i < model.nodeCount; i++) {
      const r = [x[3 * i], x[3 * i + 1], x[3 * i + 2]];
      model.velocityMPerS[3 * i] = drift[0] + omega[1] * r[2] - omega[2] * r[1];
      model.velocityMPerS[3 * i + 1] = drift[1] + omega[2] * r[0] - omega[0] * r[2];
      model.velocityMPerS[3 * i + 2] = drift[2] + omega[0] * r[1] - omega[1] * r[0];
    }
    const fd = dampingForce(model);
    const elastic = bendingForce(model).map((value, i) => value - fd[i]);
    let largest = 0;
    for (const value of elastic) largest = Math.max(largest, Math.abs(value));
    for (const value of fd) expect(Math.abs(value)).toBeLessThan(1e-12 * largest);
    expect(bendingDissipationW(model, model.positionM, model.velocityMPerS)).toBeLessThan(1e-20);
  });
});

/** Settles a clamped horizontal chain under gravity with strong air drag; returns the tip sag, m. */
function cantileverSagM(partCount: number): number {
  const model = buildChain(chain({ partCount, clampedEnds: ['top'], bendingDampingRatio: 0.5, dampingRatio: 0.5 })).model;
  const world = defaultWorld();
  world.airDragPerS = 40; // near critical for the first mode (ω₁ ≈ 35 rad/s)
  const dtS = 0.5 * stabilityBound(model, world.airDragPerS).criticalDtS;
  const simulator = new Simulator(model, world);
  const steps = Math.ceil(2 / dtS);
  for (let s = 0; s < steps; s++) simulator.step(dtS);
  return -model.positionM[3 * partCount + 1];
}

describe('cantilever under its own weight (Euler–Bernoulli: δ = w·L⁴/(8·EI))', () => {
  // L = 1 m, EI = 10 N·m², 0.1 kg: w = 0.981 N/m, δ = 12.26 mm (1.2% of L, so small-deflection
  // theory holds to about 1e-4).
  const expectedM = (0.1 * 9.81 * 1) / (8 * 10);
  const errors = [5, 10, 20].map((n) => Math.abs(cantileverSagM(n) / expectedM - 1));

  it('tip sag within 4.5% at 5 parts, 1.2% at 10, 0.3% at 20', () => {
    expect(errors[0]).toBeLessThan(0.045);
    expect(errors[1]).toBeLessThan(0.012);
    expect(errors[2]).toBeLessThan(0.003);
  });

  it('converges at second order: each doubling of parts divides the error by 3.5 or more', () => {
    expect(errors[0] / errors[1]).toBeGreaterThan(3.5);
    expect(errors[1] / errors[2]).toBeGreaterThan(3.5);
  });
});

describe('chain clamped at both ends (Euler–Bernoulli fixed–fixed beam: δ_mid = w·L⁴/(384·EI); same source)', () => {
  function midspanError(partCount: number): number {
    const model = buildChain(chain({ partCount, clampedEnds: ['top', 'bottom'], bendingDampingRatio: 0.5, dampingRatio: 0.5 })).model;
    expect(model.clampCount).toBe(2);
    expect(model.inverseMassPerKg[0]).toBe(0);
    expect(model.inverseMassPerKg[partCount]).toBe(0);
    const world = defaultWorld();
    world.airDragPerS = 150; // near critical for the fixed–fixed first mode (ω₁ ≈ 22.37·√(EI/ρA)/L² ≈ 224 rad/s)
    const dtS = 0.5 * stabilityBound(model, world.airDragPerS).criticalDtS;
    const simulator = new Simulator(model, world);
    for (let s = 0, steps = Math.ceil(0.6 / dtS); s < steps; s++) simulator.step(dtS);
    const expectedM = (0.1 * 9.81) / (384 * 10);
    return Math.abs(-model.positionM[3 * (partCount / 2) + 1] / expectedM - 1);
  }

  it('midspan sag within 2.5% at 20 parts and 0.6% at 40 (second order: error ÷ 3.5 or more)', () => {
    const coarse = midspanError(20);
    const fine = midspanError(40);
    expect(coarse).toBeLessThan(0.025);
    expect(fine).toBeLessThan(0.006);
    expect(coarse / fine).toBeGreaterThan(3.5);
  });
});

describe('cantilever first frequency (Euler–Bernoulli: f₁ = (1.8751²/2π)·√(EI/(ρA·L⁴)))', () => {
  const betaL = 1.875104;
  const expectedHz = ((betaL * betaL) / (2 * Math.PI)) * Math.sqrt(10 / (0.1 * 1));

  function firstFrequencyHz(partCount: number): number {
    const model = buildChain(chain({ partCount, clampedEnds: ['top'] })).model;
    // Start in the beam's own first mode shape (Rao, same source), 1 mm at the tip.
    const sigma = (Math.cosh(betaL) + Math.cos(betaL)) / (Math.sinh(betaL) + Math.sin(betaL));
    const shape = (s: number): number => Math.cosh(betaL * s) - Math.cos(betaL * s) - sigma * (Math.sinh(betaL * s) - Math.sin(betaL * s));
    for (let i = 0; i <= partCount; i++) model.positionM[3 * i + 1] = (1e-3 * shape(i / partCount)) / shape(1);
    const simulator = new Simulator(model, zeroGravityWorld());
    const dtS = 0.1 * stabilityBound(model).criticalDtS;
    const tip = 3 * partCount + 1;
    const steps = Math.ceil(6.3 / expectedHz / dtS);
    const signal = new Float64Array(steps);
    for (let s = 0; s < steps; s++) {
      simulator.step(dtS);
      signal[s] = model.positionM[tip];
    }
    return 1 / zeroCrossingPeriodS(signal, dtS);
  }

  it('40 parts: within 0.3% of f₁ = 5.596 Hz; 10 parts within 2%', () => {
    expect(Math.abs(firstFrequencyHz(40) / expectedHz - 1)).toBeLessThan(0.003);
    expect(Math.abs(firstFrequencyHz(10) / expectedHz - 1)).toBeLessThan(0.02);
  });
});

describe('stiff bending with automatic sub-steps (stability bound in stability-bound.ts)', () => {
  it('EI = 50 N·m² on a 30-part chain released horizontally from a pinned top: no blow-up, energy does not grow', () => {
    const model = buildChain(chain({ partCount: 30, lengthM: 0.6, totalMassKg: 0.05, axialStiffnessN: 2e4, bendingStiffnessNm2: 50, anchor: 'top-pinned', bendingDampingRatio: 0.05, dampingRatio: 0.05 })).model;
    // A kink in the start pose excites the highest bending modes the bound has to cover.
    for (let i = 15; i <= 30; i++) model.positionM[3 * i + 1] += 0.01 * (i - 15);
    const trajectory = recordTrajectory(model, defaultWorld(), new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: 100, substeps: 'auto' });
    const e = trajectory.energiesJ;
    const total = (t: number): number => e[4 * t] + e[4 * t + 1] + e[4 * t + 2] + e[4 * t + 3];
    for (let t = 1; t <= trajectory.steps; t++) {
      expect(Number.isFinite(total(t))).toBe(true);
      expect(total(t)).toBeLessThanOrEqual(total(0) + 1e-9 * Math.abs(total(0)) + 1e-9);
    }
  });

  it('the same chain at one sub-step per interval (above the critical step) is caught as a blow-up, so the bound matters', () => {
    const model = buildChain(chain({ partCount: 30, lengthM: 0.6, totalMassKg: 0.05, axialStiffnessN: 1, bendingStiffnessNm2: 50, anchor: 'top-pinned' })).model;
    for (let i = 15; i <= 30; i++) model.positionM[3 * i + 1] += 0.01 * (i - 15);
    const criticalS = stabilityBound(model).criticalDtS;
    expect(() => recordTrajectory(model, defaultWorld(), new Float64Array(0), { recordIntervalS: 4 * criticalS, recordedSteps: 200, substeps: 1 })).toThrow();
  });
});
