// Newton's laws on free bodies.
//  - Internal spring and damper forces come in equal and opposite pairs (Newton's third law),
//    so a free chain in zero gravity keeps its total momentum; the semi-implicit Euler update
//    Σm·v_{n+1} = Σm·v_n + dt·Σf_n keeps it to rounding. Pair forces along the line of centres
//    also keep angular momentum: L_{n+1} = Σ x_n × m·v_{n+1} = L_n + dt·Σ x_n × f_n = L_n
//    (symplectic Euler conserves this quadratic invariant; Hairer, Lubich & Wanner, Geometric
//    Numerical Integration, ch. IV; chapter from memory).
//  - A constant external force F on a free body moves its centre of mass with acceleration
//    F/M (Newton's second law), whatever the internal forces and actuation do; discretely the
//    centre of mass follows the free-fall closed form with g = F/M.
import { describe, expect, it } from 'vitest';

import type { Model } from '../sim/core/model.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { buildChain } from '../sim/systems/chain.ts';
import type { LatticeMaterial } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';
import { freeMassKg, freeNodeMeanOf } from './support/centre-of-mass.ts';
import { withForceHandles } from './support/force-handles.ts';
import { zeroGravityWorld } from './support/zero-gravity-world.ts';

function momentum(model: Model, out: Float64Array): Float64Array {
  out.fill(0);
  for (let i = 0; i < model.nodeCount; i++) {
    for (let k = 0; k < 3; k++) out[k] += model.massKg[i] * model.velocityMPerS[3 * i + k];
  }
  return out;
}

function angularMomentum(model: Model, out: Float64Array): Float64Array {
  out.fill(0);
  const x = model.positionM;
  const v = model.velocityMPerS;
  for (let i = 0; i < model.nodeCount; i++) {
    const o = 3 * i;
    const m = model.massKg[i];
    out[0] += m * (x[o + 1] * v[o + 2] - x[o + 2] * v[o + 1]);
    out[1] += m * (x[o + 2] * v[o] - x[o] * v[o + 2]);
    out[2] += m * (x[o] * v[o + 1] - x[o + 1] * v[o]);
  }
  return out;
}

describe('free chain in zero gravity (Newton\'s third law; Hairer, Lubich & Wanner ch. IV)', () => {
  it('linear and angular momentum stay constant to ~1e-12 relative over 20,000 steps with springs and damping', () => {
    const system = buildChain({
      partCount: 15, lengthM: 1.5, totalMassKg: 0.8, axialStiffnessN: 400, secondNeighbourSpringRatio: 0.3,
      dampingRatio: 0.4, diameterM: 0.01, anchor: 'free', originM: [0.2, 1, -0.1], directionUnit: [1, 0.3, 0.2],
      forceHandles: [], forceAxes: [], drivenAxes: [],
    });
    const model = system.model;
    // Tangled, uneven start so every spring and damper works: deterministic pseudo-random
    // offsets and velocities.
    for (let i = 0; i < model.nodeCount; i++) {
      for (let k = 0; k < 3; k++) {
        model.positionM[3 * i + k] += 0.02 * Math.sin(1.7 * i + 2.3 * k);
        model.velocityMPerS[3 * i + k] = 0.8 * Math.cos(0.9 * i * (k + 1)) + 0.1 * k;
      }
    }
    const p0 = momentum(model, new Float64Array(3));
    const l0 = angularMomentum(model, new Float64Array(3));
    let momentumScale = 0;
    for (let i = 0; i < model.nodeCount; i++) {
      momentumScale += model.massKg[i] * Math.hypot(model.velocityMPerS[3 * i], model.velocityMPerS[3 * i + 1], model.velocityMPerS[3 * i + 2]);
    }
    const angularScale = momentumScale * 2; // |x| ≲ 2 m
    const kineticStart = 0.5 * momentumScale;
    const simulator = new Simulator(model, zeroGravityWorld());
    const p = new Float64Array(3);
    const l = new Float64Array(3);
    let worstP = 0;
    let worstL = 0;
    for (let s = 0; s < 20_000; s++) {
      simulator.step(2e-4);
      if (s % 100 !== 99) continue;
      momentum(model, p);
      angularMomentum(model, l);
      worstP = Math.max(worstP, Math.hypot(p[0] - p0[0], p[1] - p0[1], p[2] - p0[2]) / momentumScale);
      worstL = Math.max(worstL, Math.hypot(l[0] - l0[0], l[1] - l0[1], l[2] - l0[2]) / angularScale);
    }
    expect(worstP).toBeLessThan(1e-12);
    expect(worstL).toBeLessThan(1e-12);
    // The dampers did work: relative motion decayed, so the check ran with real damping forces.
    let kineticEnd = 0;
    for (let i = 0; i < model.nodeCount; i++) {
      kineticEnd += 0.5 * model.massKg[i] * (model.velocityMPerS[3 * i] ** 2 + model.velocityMPerS[3 * i + 1] ** 2 + model.velocityMPerS[3 * i + 2] ** 2);
    }
    expect(kineticEnd).toBeLessThan(kineticStart);
  });
});

function expectCentreOfMassAcceleration(model: Model, forceChannels: number[], forcePerHandleN: [number, number, number], handleCount: number, channelCount: number, actuate: (t: number, controls: Float64Array) => void): void {
  const world = zeroGravityWorld();
  const steps = 200;
  const substeps = 4;
  const recordIntervalS = 0.004;
  const controls = new Float64Array(steps * channelCount);
  for (let t = 0; t < steps; t++) {
    const row = controls.subarray(t * channelCount, (t + 1) * channelCount);
    actuate(t, row);
    for (let h = 0; h < handleCount; h++) {
      for (let k = 0; k < 3; k++) row[forceChannels[h] + k] = forcePerHandleN[k];
    }
  }
  const totalMassKg = freeMassKg(model);
  const trajectory = recordTrajectory(model, world, controls, { recordIntervalS, recordedSteps: steps, substeps });
  const frame = 3 * model.nodeCount;
  const start = freeNodeMeanOf(model, trajectory.positionM, 0, new Float64Array(3));
  const startVelocity = freeNodeMeanOf(model, trajectory.velocityMPerS, 0, new Float64Array(3));
  const com = new Float64Array(3);
  const comVelocity = new Float64Array(3);
  const dtS = recordIntervalS / substeps;
  for (const t of [1, 50, steps]) {
    freeNodeMeanOf(model, trajectory.positionM, t * frame, com);
    freeNodeMeanOf(model, trajectory.velocityMPerS, t * frame, comVelocity);
    const n = t * substeps;
    for (let k = 0; k < 3; k++) {
      const a = (handleCount * forcePerHandleN[k]) / totalMassKg;
      // Centre-of-mass velocity V_n = V_0 + n·dt·F/M and position as under a uniform field.
      expect(Math.abs(comVelocity[k] - (startVelocity[k] + n * dtS * a))).toBeLessThan(1e-11);
      const expected = start[k] + n * dtS * startVelocity[k] + (a * dtS * dtS * n * (n + 1)) / 2;
      expect(Math.abs(com[k] - expected)).toBeLessThan(1e-11);
    }
  }
}

describe('constant force on a free body: centre of mass accelerates at F/M (Newton\'s second law)', () => {
  it('chain: force channels on two handles', () => {
    const system = buildChain({
      partCount: 10, lengthM: 1, totalMassKg: 0.4, axialStiffnessN: 200, secondNeighbourSpringRatio: 0.2,
      dampingRatio: 0.1, diameterM: 0.01, anchor: 'free', originM: [0, 0, 0], directionUnit: [1, 0, 0],
      forceHandles: [0, -1], forceAxes: ['x', 'y', 'z'], drivenAxes: [],
    });
    expect(system.controlChannels.map((c) => c.name)).toEqual([
      'force-node0-x', 'force-node0-y', 'force-node0-z', 'force-tip-x', 'force-tip-y', 'force-tip-z',
    ]);
    expectCentreOfMassAcceleration(system.model, [0, 3], [0.3, -0.12, 0.05], 2, 6, () => {});
  });

  it('3-D lattice with an actuated material pulsing while one corner is pushed', () => {
    const materials: LatticeMaterial[] = [
      { name: 'passive', youngsModulusPa: 2e4, densityKgPerM3: 1100, dampingRatio: 0.1, actuatorChannel: null, actuationStrainMax: 0 },
      { name: 'actuator', youngsModulusPa: 1e4, densityKgPerM3: 1000, dampingRatio: 0.1, actuatorChannel: 0, actuationStrainMax: 0.15 },
    ];
    const system = buildLattice({
      cellSizeM: 0.02, materials, base: 'free', originM: [0, 0.1, 0],
      materialMap: [[[1, 2], [2, 1]], [[2, 1], [1, 1]]],
    });
    const { model, firstChannel } = withForceHandles(system.model, [0]);
    expect(firstChannel).toBe(1);
    expectCentreOfMassAcceleration(model, [firstChannel], [0.02, 0.01, -0.015], 1, 4, (t, row) => {
      row[0] = Math.sin(0.2 * t);
    });
  });
});
