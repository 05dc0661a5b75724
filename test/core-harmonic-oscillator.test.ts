// The mass on a spring under semi-implicit Euler: its period, its bounded energy error and its
// stability limit.
//  - Period T = 2π·√(m/k) (Halliday & Resnick, Fundamentals of Physics, simple harmonic motion).
//  - Symplectic Euler conserves the modified energy H̃ = ½m·v² + ½k·x² − ½·dt·k·x·v exactly for
//    a linear oscillator (Hairer, Lubich & Wanner, Geometric Numerical Integration, ch. IX,
//    backward error analysis; chapter numbers in this file from memory; the invariant itself
//    is verified by substituting one step), so the true energy oscillates with relative
//    amplitude ω·dt/2 and does not drift.
//  - It is stable for ω·dt < 2 and unstable above (same reference, and the Jury criterion in
//    sim/core/stability-bound.ts).
import { describe, expect, it } from 'vitest';

import { ENERGY_BASE_COUNT } from '../sim/core/energy.ts';
import { SimulationBlowUpError } from '../sim/core/simulation-error.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { buildSpringOscillator } from './support/spring-oscillator.ts';
import { zeroCrossingPeriodS } from './support/zero-crossing-period.ts';
import { zeroGravityWorld } from './support/zero-gravity-world.ts';

const MASS_KG = 0.25;
const K_N_PER_M = 400;
const REST_M = 0.5;
const AMPLITUDE_M = 0.01;
const OMEGA = Math.sqrt(K_N_PER_M / MASS_KG); // 40 rad/s

describe('mass on a spring (Halliday & Resnick, Fundamentals of Physics: T = 2π√(m/k))', () => {
  it('period measured from upward zero crossings is 2π√(m/k) within 1e-4', () => {
    const model = buildSpringOscillator({ massKg: MASS_KG, stiffnessNPerM: K_N_PER_M, restLengthM: REST_M, initialDisplacementM: AMPLITUDE_M });
    const dtS = 1e-4; // ω·dt = 0.004: the scheme's period error (ω·dt)²/24 ≈ 7e-7 is negligible
    const simulator = new Simulator(model, zeroGravityWorld());
    const steps = 20_000; // ≈ 12.7 periods
    const displacement = new Float64Array(steps);
    for (let n = 0; n < steps; n++) {
      simulator.step(dtS);
      displacement[n] = model.positionM[3] - REST_M;
    }
    const expected = 2 * Math.PI * Math.sqrt(MASS_KG / K_N_PER_M);
    expect(Math.abs(zeroCrossingPeriodS(displacement, dtS) / expected - 1)).toBeLessThan(1e-4);
  });
});

describe('symplectic Euler energy error (Hairer, Lubich & Wanner, Geometric Numerical Integration, ch. IX)', () => {
  const omegaDt = 0.05;
  const dtS = omegaDt / OMEGA;
  const steps = 100_000;

  it('over 1e5 steps: |ΔE|/E ≤ ω·dt, close to the modified-energy value ω·dt/2, no drift between first and last 10%', () => {
    const model = buildSpringOscillator({ massKg: MASS_KG, stiffnessNPerM: K_N_PER_M, restLengthM: REST_M, initialDisplacementM: AMPLITUDE_M });
    const trajectory = recordTrajectory(model, zeroGravityWorld(), new Float64Array(0), { recordIntervalS: dtS, recordedSteps: steps, substeps: 1 });
    const e = trajectory.energiesJ;
    const e0 = e[0] + e[1];
    expect(e0).toBeCloseTo(0.5 * K_N_PER_M * AMPLITUDE_M * AMPLITUDE_M, 15);
    const tenth = steps / 10;
    let firstMax = 0;
    let lastMax = 0;
    let overallMax = 0;
    let worstInvariant = 0;
    for (let t = 0; t <= steps; t++) {
      const deviation = Math.abs(e[ENERGY_BASE_COUNT * t] + e[ENERGY_BASE_COUNT * t + 1] - e0) / e0;
      overallMax = Math.max(overallMax, deviation);
      if (t <= tenth) firstMax = Math.max(firstMax, deviation);
      if (t >= steps - tenth) lastMax = Math.max(lastMax, deviation);
      // The exactly conserved modified energy (x measured from rest, v the stored velocity).
      const x = trajectory.positionM[6 * t + 3] - REST_M;
      const v = trajectory.velocityMPerS[6 * t + 3];
      const modified = 0.5 * MASS_KG * v * v + 0.5 * K_N_PER_M * x * x - 0.5 * dtS * K_N_PER_M * x * v;
      worstInvariant = Math.max(worstInvariant, Math.abs(modified - e0) / e0);
    }
    expect(overallMax).toBeLessThanOrEqual(omegaDt);
    expect(Math.abs(overallMax / (omegaDt / 2) - 1)).toBeLessThan(0.05);
    // Bounded, not drifting: the last tenth's worst error equals the first tenth's.
    expect(Math.abs(lastMax / firstMax - 1)).toBeLessThan(0.02);
    // The modified energy holds to rounding over all 1e5 steps.
    expect(worstInvariant).toBeLessThan(1e-9);
  });
});

describe('stability limit ω·dt = 2 of semi-implicit Euler (Hairer, Lubich & Wanner, ch. I; Jury criterion)', () => {
  it('the stability bound is exact for a single oscillator: ω_max = √(k/m), critical dt = 2/ω', () => {
    const model = buildSpringOscillator({ massKg: MASS_KG, stiffnessNPerM: K_N_PER_M, restLengthM: REST_M, initialDisplacementM: 0 });
    const bound = stabilityBound(model);
    expect(bound.omegaMaxRadPerS).toBeCloseTo(OMEGA, 12);
    expect(bound.dampingRateMaxPerS).toBe(0);
    expect(bound.criticalDtS).toBeCloseTo(2 / OMEGA, 14);
  });

  it('ω·dt = 2.02 blows up and recordTrajectory throws SimulationBlowUpError naming the limit', () => {
    const model = buildSpringOscillator({ massKg: MASS_KG, stiffnessNPerM: K_N_PER_M, restLengthM: REST_M, initialDisplacementM: AMPLITUDE_M });
    const dtS = 2.02 / OMEGA;
    let caught: unknown;
    try {
      recordTrajectory(model, zeroGravityWorld(), new Float64Array(0), { recordIntervalS: dtS, recordedSteps: 500, substeps: 1 });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(SimulationBlowUpError);
    const blowUp = caught as SimulationBlowUpError;
    // The free mass, not the pinned anchor, is named as where it went wrong.
    expect(blowUp.details.node).toBe(1);
    expect(blowUp.details.dtS).toBeCloseTo(dtS, 15);
    expect(blowUp.details.criticalDtS).toBeCloseTo(2 / OMEGA, 15);
    // Growth per step is the spectral radius 1.33 of the step matrix, so it is caught early.
    expect(blowUp.details.step).toBeLessThan(60);
    expect(blowUp.message).toContain('exceeds the stability limit');
  });

  it('ω·dt = 1.98 stays bounded for 1e4 steps, within the invariant ellipse x_max = A/√(1 − (ω·dt/2)²)', () => {
    const model = buildSpringOscillator({ massKg: MASS_KG, stiffnessNPerM: K_N_PER_M, restLengthM: REST_M, initialDisplacementM: AMPLITUDE_M });
    const omegaDt = 1.98;
    const steps = 10_000;
    const trajectory = recordTrajectory(model, zeroGravityWorld(), new Float64Array(0), { recordIntervalS: omegaDt / OMEGA, recordedSteps: steps, substeps: 1 });
    let maxDisplacement = 0;
    for (let t = 0; t <= steps; t++) maxDisplacement = Math.max(maxDisplacement, Math.abs(trajectory.positionM[6 * t + 3] - REST_M));
    // From the modified energy above: the largest |x| on the conserved ellipse.
    const ellipseMax = AMPLITUDE_M / Math.sqrt(1 - (omegaDt / 2) ** 2);
    expect(maxDisplacement).toBeLessThanOrEqual(ellipseMax * (1 + 1e-9));
    expect(maxDisplacement).toBeGreaterThan(0.95 * ellipseMax);
  });
});
