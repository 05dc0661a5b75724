// The energy ledger's books, checked against the discrete work–kinetic-energy identity of
// semi-implicit Euler: with v* = v + dt·F/m, ½m|v*|² − ½m|v|² = F·(v + v*)/2·dt exactly
// (algebra of the update; the identity is the discrete form of the work–energy theorem,
// Halliday & Resnick, Fundamentals of Physics, work and kinetic energy). With every term
// recorded the work balance must close to rounding: per sub-step each booked product carries a
// relative rounding error of a few u = 2⁻⁵³ ≈ 1.1e-16, so after S sub-steps with books of
// size B the residual is bounded by about S·u·B·(terms per node); we assert 1e-10·B, which
// for S = 4,000, 10 terms and 20 nodes is a margin of ~10× over that product
// (common practice, no source).
// A second check: the energy balance residual (potentials instead of conservative work) is
// the integrator's own error, first order in dt (Hairer, Lubich & Wanner, Geometric Numerical
// Integration, 2nd ed., ch. IX): halving dt halves it.
import { describe, expect, it } from 'vitest';

import { ENERGY_NAMES } from '../sim/core/energy.ts';
import { FLOW_COLUMNS, FLOW_NAMES } from '../sim/core/energy-flows.ts';
import type { World } from '../sim/core/world.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';

function tether(anchor: ChainParameters['anchor'], handles: number[]): ChainParameters {
  return {
    partCount: 19, lengthM: 1.2, totalMassKg: 1.5, axialStiffnessN: 400, secondNeighbourSpringRatio: 0.1,
    dampingRatio: 0.05, diameterM: 0.02, anchor, originM: [0, 0, 0], directionUnit: [1, -0.3, 0.2],
    forceHandles: handles, forceAxes: ['x', 'y', 'z'], drivenAxes: ['x', 'y'],
  };
}

/** Everything on at once: drag, fluid with buoyancy and flow, a floor and two obstacles. */
function busyWorld(): World {
  const world = defaultWorld();
  world.airDragPerS = 0.3;
  world.ground = { enabled: true, heightM: -0.5, staticFriction: 0.5, kineticFriction: 0.4 };
  world.fluid = { enabled: true, densityKgPerM3: 1000, normalDragNsPerM3: 40, tangentialDragNsPerM3: 8, flowVelocityMPerS: [0.1, 0, 0.05], buoyancy: true };
  world.obstacles = [
    { shape: 'sphere', centerM: [0.6, -0.45, 0.1], halfSizeM: [0, 0, 0], radiusM: 0.12, halfLengthM: 0, axis: 1, staticFriction: 0.6, kineticFriction: 0.5 },
    { shape: 'box', centerM: [0.95, -0.45, 0.2], halfSizeM: [0.1, 0.08, 0.15], radiusM: 0, halfLengthM: 0, axis: 1, staticFriction: 0.3, kineticFriction: 0.2 },
  ];
  return world;
}

function controlsFor(channels: number, steps: number): Float64Array {
  const u = new Float64Array(channels * steps);
  for (let t = 0; t < steps; t++) {
    for (let c = 0; c < channels; c++) u[t * channels + c] = 0.04 * Math.sin(0.7 * t + c) * (c < 2 ? 1 : 2);
  }
  return u;
}

function booksSize(energies: Float64Array, flows: Float64Array): number {
  let size = 0;
  for (const value of flows) size = Math.max(size, Math.abs(value));
  for (const value of energies) size = Math.max(size, Math.abs(value));
  return size;
}

describe('energy ledger: the work balance closes to rounding with every term on', () => {
  for (const anchor of ['top-driven', 'free'] as const) {
    it(`${anchor} tether in the Korrin Bay tank: drag, fluid, buoyancy, handles, bending with damping, floor, sphere and box`, () => {
      const system = buildChain({ ...tether(anchor, [-1]), bendingStiffnessNm2: 0.01, bendingDampingRatio: 0.1 });
      const steps = 80;
      const u = controlsFor(system.model.controlChannelCount, steps);
      const trajectory = recordTrajectory(system.model, busyWorld(), u, { recordIntervalS: 0.02, recordedSteps: steps, substeps: 50, energyAccounting: true });
      const flows = trajectory.energyFlowsJ!;
      const f = FLOW_COLUMNS.length;
      const last = steps * f;
      // Every kind of flow actually happened, so the check is not closing an empty book.
      for (const name of ['elastic_work', 'gravity_work', 'buoyancy_work', 'bending_work', 'bending_damping_dissipated', 'handle_work', 'spring_damping_dissipated', 'air_drag_dissipated', 'fluid_drag_dissipated', 'contact_normal_dissipated', 'contact_friction_dissipated']) {
        expect(Math.abs(flows[last + FLOW_NAMES.indexOf(name)]), name).toBeGreaterThan(1e-6);
      }
      if (anchor === 'top-driven') expect(Math.abs(flows[last + FLOW_NAMES.indexOf('support_work')])).toBeGreaterThan(1e-6);
      // Dissipation only removes energy.
      for (const c of FLOW_COLUMNS) if (c.role === 'dissipative' && c.name !== 'spring_damping_dissipated') expect(flows[last + FLOW_NAMES.indexOf(c.name)]).toBeGreaterThan(0);
      const size = booksSize(trajectory.energiesJ, flows);
      expect(trajectory.balance!.workResidualMaxAbsJ).toBeLessThan(1e-10 * size);
      // The energy balance is not closed by bookkeeping: it holds the integrator's O(dt) error,
      // far above rounding.
      expect(trajectory.balance!.energyResidualMaxAbsJ).toBeGreaterThan(1e3 * trajectory.balance!.workResidualMaxAbsJ);
    });
  }

  it('a ledger changes no bit of the trajectory (accounting costs nothing when off, alters nothing when on)', () => {
    const run = (accounting: boolean) => {
      const system = buildChain({ ...tether('top-driven', [-1, 5]), bendingStiffnessNm2: 0.01, bendingDampingRatio: 0.1 });
      return recordTrajectory(system.model, busyWorld(), controlsFor(system.model.controlChannelCount, 30), { recordIntervalS: 0.02, recordedSteps: 30, substeps: 40, energyAccounting: accounting, recordForces: accounting });
    };
    const plain = run(false);
    const booked = run(true);
    expect(plain.energyFlowsJ).toBeNull();
    expect(Buffer.from(booked.positionM.buffer).equals(Buffer.from(plain.positionM.buffer))).toBe(true);
    expect(Buffer.from(booked.velocityMPerS.buffer).equals(Buffer.from(plain.velocityMPerS.buffer))).toBe(true);
  });
});

describe('energy balance residual: the integrator\'s error, first order in dt (Hairer, Lubich & Wanner, ch. IX)', () => {
  it('an undamped pinned chain swinging under gravity: halving dt halves the largest residual (ratio 2 ± 0.25)', () => {
    const residual = (substeps: number) => {
      const p = tether('top-pinned', []);
      const system = buildChain({ ...p, dampingRatio: 0, secondNeighbourSpringRatio: 0, directionUnit: [1, 0, 0] });
      const trajectory = recordTrajectory(system.model, defaultWorld(), new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: 60, substeps, energyAccounting: true });
      return trajectory.balance!.energyResidualMaxAbsJ;
    };
    const coarse = residual(40);
    const fine = residual(80);
    expect(coarse / fine).toBeGreaterThan(1.75);
    expect(coarse / fine).toBeLessThan(2.25);
    expect(ENERGY_NAMES).toContain('buoyancy');
  });
});

describe('bending in the ledger: hinges, a clamp and bending damping are booked like every other force', () => {
  // A clamped tether with bending rigidity EI swinging under gravity from horizontal. The same
  // textbook statements as above: the discrete work–kinetic-energy identity closes the work
  // balance to rounding (Halliday & Resnick), and the energy balance residual is first order in
  // dt (Hairer, Lubich & Wanner, ch. IX), now with the bending energy among the potentials.
  const clamped = (bendingDampingRatio: number): ChainParameters => ({
    ...tether('top-pinned', []),
    secondNeighbourSpringRatio: 0, directionUnit: [1, 0, 0],
    bendingStiffnessNm2: 0.02, bendingDampingRatio, clampedEnds: ['top'],
  });

  it('with bending damping: bending work and bending dissipation are booked and the work balance closes to rounding', () => {
    const system = buildChain(clamped(0.2));
    expect(system.model.hingeCount).toBeGreaterThan(0);
    expect(system.model.clampCount).toBe(1);
    const steps = 60;
    const trajectory = recordTrajectory(system.model, defaultWorld(), new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: steps, substeps: 40, energyAccounting: true });
    const flows = trajectory.energyFlowsJ!;
    const last = steps * FLOW_COLUMNS.length;
    const bendingWork = flows[last + FLOW_NAMES.indexOf('bending_work')];
    const bendingDissipated = flows[last + FLOW_NAMES.indexOf('bending_damping_dissipated')];
    // The tether bends as it falls, so the hinges store energy: their force did negative work.
    const width = ENERGY_NAMES.length;
    const bending = ENERGY_NAMES.indexOf('bending');
    expect(trajectory.energiesJ[steps * width + bending]).toBeGreaterThan(1e-6);
    expect(bendingWork).toBeLessThan(-1e-6);
    // A Rayleigh dissipation only removes energy (bendingDissipationW ≥ 0).
    expect(bendingDissipated).toBeGreaterThan(1e-7);
    const size = booksSize(trajectory.energiesJ, flows);
    expect(trajectory.balance!.workResidualMaxAbsJ).toBeLessThan(1e-10 * size);
  });

  it('undamped: halving dt halves the largest energy balance residual (ratio 2 ± 0.25), bending energy included', () => {
    const residual = (substeps: number) => {
      const system = buildChain({ ...clamped(0), dampingRatio: 0 });
      const trajectory = recordTrajectory(system.model, defaultWorld(), new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: 60, substeps, energyAccounting: true });
      return trajectory.balance!.energyResidualMaxAbsJ;
    };
    const coarse = residual(40);
    const fine = residual(80);
    expect(coarse / fine).toBeGreaterThan(1.75);
    expect(coarse / fine).toBeLessThan(2.25);
  });
});
