// Ground contact with Coulomb friction (elementary mechanics, e.g. Halliday & Resnick,
// Fundamentals of Physics, friction):
//  - a body sliding with initial speed v0 on a floor with kinetic coefficient μ_k decelerates
//    at μ_k·g and stops after d = v0² / (2·μ_k·g);
//  - a body pushed sideways with F ≤ μ_s·m·g does not move; with F > μ_s·m·g it accelerates at
//    F/m − μ_k·g;
//  - kinetic friction opposes sliding and at most stops it, never reverses it;
//  - a body resting on the floor stays on it: no sinking, no lift-off, no jitter.
import { describe, expect, it } from 'vitest';

import type { Model } from '../sim/core/model.ts';
import { ModelBuilder } from '../sim/core/model-builder.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { autoSubsteps, stabilityBound } from '../sim/core/stability-bound.ts';
import type { World } from '../sim/core/world.ts';
import { defaultWorld } from '../sim/core/world.ts';
import type { LatticeMaterial, MaterialMap2D, MaterialMap3D } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';
import { freeNodeMeanOf } from './support/centre-of-mass.ts';

const G = 9.81;

function floorWorld(staticFriction: number, kineticFriction: number): World {
  const world = defaultWorld();
  world.gravityMPerS2 = [0, -G, 0];
  world.ground = { enabled: true, heightM: 0, staticFriction, kineticFriction };
  return world;
}

const RUBBER: LatticeMaterial = { name: 'tank-floor pad', youngsModulusPa: 2e5, densityKgPerM3: 1200, dampingRatio: 0.5, actuatorChannel: null, actuationStrainMax: 0 };

function block(map: MaterialMap2D | MaterialMap3D): Model {
  return buildLattice({ cellSizeM: 0.05, materialMap: map, materials: [RUBBER], base: 'free', originM: [0, 0, 0] }).model;
}

/**
 * Runs for durationS and returns the first time the centre of mass's x-velocity fell to 1% of
 * its start (Infinity if it never did). The elastic block rocks a little after it stops, so
 * the centre of mass, not the nodes, says when sliding ended.
 */
function runAndTimeStop(model: Model, world: World, dtS: number, durationS: number, v0: number): number {
  const simulator = new Simulator(model, world);
  const comVelocity = new Float64Array(3);
  let stoppedAtS = Infinity;
  for (let s = 1; s * dtS <= durationS; s++) {
    simulator.step(dtS);
    if (stoppedAtS !== Infinity) continue;
    freeNodeMeanOf(model, model.velocityMPerS, 0, comVelocity);
    if (comVelocity[0] < 0.01 * v0) stoppedAtS = s * dtS;
  }
  return stoppedAtS;
}

function safeStepS(model: Model): number {
  return 0.5 * stabilityBound(model).criticalDtS;
}

describe('sliding to a stop: d = v0²/(2·μ_k·g) (Halliday & Resnick, Fundamentals of Physics)', () => {
  const cases: { name: string; map: MaterialMap2D | MaterialMap3D; v0: number; muK: number }[] = [
    { name: '3-D cube cell', map: [[[1]]], v0: 1.2, muK: 0.5 },
    { name: '3-D 2×1×2 block, low friction', map: [[[1, 1], [1, 1]]], v0: 0.8, muK: 0.25 },
    { name: '2-D strip of 3 cells', map: [[1, 1, 1]], v0: 1.0, muK: 0.4 },
  ];
  for (const c of cases) {
    it(`${c.name}: v0 = ${c.v0} m/s, μ_k = ${c.muK}, stopping distance within 5%`, () => {
      const model = block(c.map);
      for (let i = 0; i < model.nodeCount; i++) model.velocityMPerS[3 * i] = c.v0;
      const start = freeNodeMeanOf(model, model.positionM, 0, new Float64Array(3));
      const world = floorWorld(c.muK + 0.1, c.muK);
      const stopTimeS = c.v0 / (c.muK * G);
      const stoppedAtS = runAndTimeStop(model, world, safeStepS(model), 1.5 * stopTimeS, c.v0);
      const end = freeNodeMeanOf(model, model.positionM, 0, new Float64Array(3));
      const expectedM = (c.v0 * c.v0) / (2 * c.muK * G);
      expect(Math.abs((end[0] - start[0]) / expectedM - 1)).toBeLessThan(0.05);
      // Stopping time v0/(μ_k·g), within 5%.
      expect(Math.abs(stoppedAtS / stopTimeS - 1)).toBeLessThan(0.05);
      // Sideways it stayed on its line, and no node ever went below the floor.
      expect(Math.abs(end[2] - start[2])).toBeLessThan(1e-9);
      for (let i = 0; i < model.nodeCount; i++) expect(model.positionM[3 * i + 1]).toBeGreaterThanOrEqual(0);
    });
  }
});

describe('a point mass pushed sideways on the floor (Coulomb\'s law; Halliday & Resnick)', () => {
  function pushedNode(staticFriction: number, kineticFriction: number, forceN: number, steps: number, v0 = 0) {
    const builder = new ModelBuilder(8, 2, 0);
    builder.addNode({ positionM: [0, 0, 0], massKg: 2, velocityMPerS: [v0, 0, 0] });
    builder.addHandle(0, [0, -1, -1]);
    const model = builder.build();
    const simulator = new Simulator(model, floorWorld(staticFriction, kineticFriction));
    simulator.setControls(Float64Array.of(forceN));
    const dtS = 1e-3;
    for (let s = 0; s < steps; s++) simulator.step(dtS);
    return { model, dtS };
  }

  it('F = 0.95·μ_s·m·g leaves it exactly at rest (static friction)', () => {
    const { model } = pushedNode(0.6, 0.5, 0.95 * 0.6 * 2 * G, 2000);
    expect(model.positionM[0]).toBe(0);
    expect(model.positionM[1]).toBe(0);
    expect(model.velocityMPerS[0]).toBe(0);
  });

  it('F = 1.2·μ_s·m·g slides it with acceleration F/m − μ_k·g', () => {
    const forceN = 1.2 * 0.6 * 2 * G;
    const steps = 1000;
    const { model, dtS } = pushedNode(0.6, 0.5, forceN, steps);
    const a = forceN / 2 - 0.5 * G;
    expect(model.velocityMPerS[0]).toBeCloseTo(a * steps * dtS, 10);
    expect(model.positionM[0]).toBeCloseTo((a * dtS * dtS * steps * (steps + 1)) / 2, 10);
    expect(model.positionM[1]).toBe(0);
  });

  it('kinetic friction never reverses the motion, even with μ_s = 0 (pure kinetic friction)', () => {
    // Sliding at 0.05 m/s with μ_k = 0.8 and dt = 1 ms: each step removes μ_k·g·dt ≈ 7.8 mm/s,
    // so the node stops within seven steps and must then stay stopped.
    const v0 = 0.05;
    const { model, dtS } = pushedNode(0, 0.8, 0, 200, v0);
    expect(model.velocityMPerS[0]).toBe(0);
    // Discrete stopping distance dt·Σ max(0, v0 − n·μ_k·g·dt), and within 20% of the
    // continuous v0²/(2·μ_k·g) at this coarse step.
    let discreteM = 0;
    for (let n = 1; v0 - n * 0.8 * G * dtS > 0; n++) discreteM += dtS * (v0 - n * 0.8 * G * dtS);
    expect(model.positionM[0]).toBeCloseTo(discreteM, 14);
    expect(Math.abs(model.positionM[0] / (v0 ** 2 / (2 * 0.8 * G)) - 1)).toBeLessThan(0.2);
  });
});

describe('resting on the floor: no sinking, no lift-off, no jitter (statics; common practice, no source)', () => {
  it('a 3-D 2×2×2 block placed on the floor settles and then stays still', () => {
    const model = block([[[1, 1], [1, 1]], [[1, 1], [1, 1]]]);
    const world = floorWorld(0.8, 0.6);
    const dtS = 0.004 / autoSubsteps(0.004, stabilityBound(model));
    const simulator = new Simulator(model, world);
    const bottom: number[] = [];
    for (let i = 0; i < model.nodeCount; i++) if (model.positionM[3 * i + 1] === 0) bottom.push(i);
    expect(bottom.length).toBe(9);
    const bottomXZ = bottom.map((i) => [model.positionM[3 * i], model.positionM[3 * i + 2]]);
    const steps = Math.ceil(1.5 / dtS);
    let lateJitter = 0;
    let lowest = Infinity;
    for (let s = 0; s < steps; s++) {
      simulator.step(dtS);
      for (const i of bottom) lowest = Math.min(lowest, model.positionM[3 * i + 1]);
      if (s > 0.8 * steps) {
        for (let i = 0; i < model.velocityMPerS.length; i++) lateJitter = Math.max(lateJitter, Math.abs(model.velocityMPerS[i]));
      }
    }
    // Bottom nodes never left the plane, in either direction.
    expect(lowest).toBe(0);
    for (const i of bottom) expect(model.positionM[3 * i + 1]).toBe(0);
    // Static friction held them where they were put, although the block's weight spreads it.
    bottom.forEach((i, j) => {
      expect(model.positionM[3 * i]).toBe(bottomXZ[j][0]);
      expect(model.positionM[3 * i + 2]).toBe(bottomXZ[j][1]);
    });
    expect(lateJitter).toBeLessThan(1e-6);
    // The top settled at the elastic compression under its own weight: small and downward.
    // Uniaxial estimate for a block standing on its base: strain at mid-height ≈ ρ·g·h/(2E).
    const top = [...Array(model.nodeCount).keys()].filter((i) => Math.abs(model.positionM[3 * i + 1] - 0.1) < 0.01);
    expect(top.length).toBe(9);
    const heightM = top.reduce((sum, i) => sum + model.positionM[3 * i + 1], 0) / top.length;
    const sagM = 0.1 - heightM;
    const estimateM = (RUBBER.densityKgPerM3 * G * 0.1 * 0.1) / (2 * RUBBER.youngsModulusPa);
    expect(sagM).toBeGreaterThan(0.5 * estimateM);
    expect(sagM).toBeLessThan(2 * estimateM);
  });
});
