// Free fall under the semi-implicit Euler step. With constant acceleration g the scheme
// v_{n+1} = v_n + dt·g, x_{n+1} = x_n + dt·v_{n+1} has the closed form
//   x_n = x_0 + n·dt·v_0 + g·dt²·n(n+1)/2
// (sum of the arithmetic series; derivation, common practice, no source). The simulator must
// reproduce it to rounding, with and without sub-steps, and must not match the explicit-Euler
// form g·dt²·n(n−1)/2, which would mean the position update used the old velocity.
import { describe, expect, it } from 'vitest';

import { ENERGY_BASE_COUNT } from '../sim/core/energy.ts';
import { ModelBuilder } from '../sim/core/model-builder.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';

const X0: [number, number, number] = [0.4, 12.5, -0.3];
const V0: [number, number, number] = [0.75, 3.2, -1.1];
const G: [number, number, number] = [0.2, -9.81, 0.05];

function fallingNode() {
  const builder = new ModelBuilder(8, 2, 0);
  builder.addNode({ positionM: [...X0], massKg: 0.37, velocityMPerS: [...V0] });
  return builder.build();
}

function exactDiscrete(n: number, dtS: number, axis: number): number {
  return X0[axis] + n * dtS * V0[axis] + (G[axis] * dtS * dtS * n * (n + 1)) / 2;
}

// Rounding allowance: each step adds a few ulps of the largest magnitude involved.
function roundingAllowance(n: number, scale: number): number {
  return 8 * (n + 1) * Number.EPSILON * scale;
}

describe('free fall under semi-implicit Euler (exact discrete solution; derivation, common practice)', () => {
  it('single steps match x_n = x0 + n·dt·v0 + g·dt²·n(n+1)/2 to rounding for 2000 steps', () => {
    const model = fallingNode();
    const world = defaultWorld();
    world.gravityMPerS2 = [...G];
    const simulator = new Simulator(model, world);
    const dtS = 1e-3;
    let worst = 0;
    for (let n = 1; n <= 2000; n++) {
      simulator.step(dtS);
      for (let axis = 0; axis < 3; axis++) {
        const expected = exactDiscrete(n, dtS, axis);
        const error = Math.abs(model.positionM[axis] - expected);
        const scale = Math.abs(expected) + Math.abs(X0[axis]) + 1;
        worst = Math.max(worst, error / roundingAllowance(n, scale));
        // Velocity is exact too: v_n = v0 + n·dt·g.
        const vExpected = V0[axis] + n * dtS * G[axis];
        expect(Math.abs(model.velocityMPerS[axis] - vExpected)).toBeLessThanOrEqual(roundingAllowance(n, Math.abs(vExpected) + Math.abs(V0[axis]) + 1));
      }
    }
    expect(worst).toBeLessThanOrEqual(1);
    // The explicit-Euler closed form differs by g·dt²·n at step n: 9.81e-6·2000 ≈ 2e-2 m here,
    // far above rounding, so the check above does tell the two schemes apart.
    const explicitEuler = X0[1] + 2000 * dtS * V0[1] + (G[1] * dtS * dtS * 2000 * 1999) / 2;
    expect(Math.abs(model.positionM[1] - explicitEuler)).toBeGreaterThan(1e-2);
  });

  it('recorded intervals of 7 sub-steps follow the same closed form with n = 7·t', () => {
    const model = fallingNode();
    const world = defaultWorld();
    world.gravityMPerS2 = [...G];
    const substeps = 7;
    const recordIntervalS = 0.014;
    const dtS = recordIntervalS / substeps;
    const steps = 150;
    const trajectory = recordTrajectory(model, world, new Float64Array(0), { recordIntervalS, recordedSteps: steps, substeps });
    expect(trajectory.substeps).toBe(substeps);
    expect(trajectory.dtS).toBe(dtS);
    for (let t = 0; t <= steps; t++) {
      const n = t * substeps;
      for (let axis = 0; axis < 3; axis++) {
        const expected = exactDiscrete(n, dtS, axis);
        const scale = Math.abs(expected) + Math.abs(X0[axis]) + 1;
        expect(Math.abs(trajectory.positionM[3 * t + axis] - expected)).toBeLessThanOrEqual(roundingAllowance(n, scale));
      }
    }
    // Energy: substituting the closed forms into ½m|v_n|² − m·g·x_n gives
    // E_n − E_0 = −m·|g|²·dt²·n/2 exactly (derivation, common practice, no source): the scheme's
    // known linear energy drift under a constant force. measureEnergies must show exactly that.
    const massKg = model.massKg[0];
    const g2 = G[0] * G[0] + G[1] * G[1] + G[2] * G[2];
    for (const t of [1, 40, steps]) {
      const n = t * substeps;
      const e0 = trajectory.energiesJ[0] + trajectory.energiesJ[2];
      const et = trajectory.energiesJ[ENERGY_BASE_COUNT * t] + trajectory.energiesJ[ENERGY_BASE_COUNT * t + 2];
      const expectedDrift = (-massKg * g2 * dtS * dtS * n) / 2;
      expect(Math.abs(et - e0 - expectedDrift)).toBeLessThanOrEqual(1e-12 * Math.abs(e0) * n);
    }
  });
});
