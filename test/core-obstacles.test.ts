// Static obstacles with velocity-projection contact and Coulomb friction, against elementary
// mechanics (Halliday & Resnick, Fundamentals of Physics, friction and the inclined plane):
//  - a body sliding on a flat top with kinetic coefficient μ_k stops after v0²/(2·μ_k·g);
//    at a finite step the exact discrete distance is dt·Σ max(0, v0 − n·μ_k·g·dt);
//  - a body at rest on a surface tilted by θ stays put while tan θ ≤ μ_s and slides otherwise;
//    on a sphere the surface under a node at polar angle θ is tilted by θ;
//  - nothing ever goes into an obstacle, and a body resting on one stays still.
import { describe, expect, it } from 'vitest';

import { ModelBuilder } from '../sim/core/model-builder.ts';
import { obstacleDistanceM } from '../sim/core/obstacle-contact.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import type { Obstacle, World } from '../sim/core/world.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { buildLattice } from '../sim/systems/lattice.ts';

const G = 9.81;

function obstacle(partial: Partial<Obstacle> & Pick<Obstacle, 'shape'>): Obstacle {
  return { centerM: [0, 0, 0], halfSizeM: [0, 0, 0], radiusM: 0, halfLengthM: 0, axis: 1, staticFriction: 0.5, kineticFriction: 0.4, ...partial };
}

function worldWith(...obstacles: Obstacle[]): World {
  const world = defaultWorld();
  world.gravityMPerS2 = [0, -G, 0];
  world.obstacles = obstacles;
  return world;
}

function pointMass(positionM: [number, number, number], velocityMPerS: [number, number, number] = [0, 0, 0]) {
  const builder = new ModelBuilder(8, 2, 0);
  builder.addNode({ positionM, massKg: 0.25, velocityMPerS });
  return builder.build();
}

describe('sliding to a stop on a box top: d = v0²/(2·μ_k·g)', () => {
  for (const [v0, muK] of [[0.6, 0.3], [1.2, 0.5]] as const) {
    it(`v0 = ${v0} m/s, μ_k = ${muK}: the exact discrete distance, and within 2% of the continuous one`, () => {
      const box = obstacle({ shape: 'box', centerM: [0, -0.1, 0], halfSizeM: [2, 0.1, 2], staticFriction: muK + 0.1, kineticFriction: muK });
      const model = pointMass([-1, 0, 0], [v0, 0, 0]);
      const simulator = new Simulator(model, worldWith(box));
      const dtS = 1e-4;
      const stopS = v0 / (muK * G);
      for (let s = 0; s * dtS < 1.2 * stopS; s++) simulator.step(dtS);
      let discreteM = 0;
      for (let n = 1; v0 - n * muK * G * dtS > 0; n++) discreteM += dtS * (v0 - n * muK * G * dtS);
      expect(model.positionM[0] + 1).toBeCloseTo(discreteM, 9);
      expect(Math.abs((model.positionM[0] + 1) / ((v0 * v0) / (2 * muK * G)) - 1)).toBeLessThan(0.02);
      expect(model.velocityMPerS[0]).toBe(0);
      expect(model.positionM[1]).toBe(0); // on the top face, not in it
    });
  }
});

describe('on a sphere: static friction holds at polar angle θ iff tan θ ≤ μ_s (inclined plane)', () => {
  const radius = 0.3;
  for (const [thetaDeg, muS, holds] of [[20, 0.5, true], [30, 0.5, false], [40, 0.9, true], [45, 0.9, false]] as const) {
    it(`θ = ${thetaDeg}°, μ_s = ${muS}: ${holds ? 'stays' : 'slides'} (tan θ = ${Math.tan((thetaDeg * Math.PI) / 180).toFixed(3)})`, () => {
      const theta = (thetaDeg * Math.PI) / 180;
      const sphere = obstacle({ shape: 'sphere', centerM: [0, 0, 0], radiusM: radius, staticFriction: muS, kineticFriction: 0.8 * muS });
      const start: [number, number, number] = [radius * Math.sin(theta), radius * Math.cos(theta), 0];
      const model = pointMass(start);
      const simulator = new Simulator(model, worldWith(sphere));
      for (let s = 0; s < 2000; s++) simulator.step(1e-4);
      const moved = Math.hypot(model.positionM[0] - start[0], model.positionM[1] - start[1]);
      if (holds) expect(moved).toBeLessThan(1e-12);
      else expect(moved).toBeGreaterThan(1e-4);
      const out = new Float64Array(3);
      expect(obstacleDistanceM(sphere, model.positionM[0], model.positionM[1], model.positionM[2], out)).toBeGreaterThan(-1e-12);
    });
  }
});

describe('no penetration: a soft block dropped onto a cylinder and a box', () => {
  it('every node stays outside both solids at every step, and the block comes to rest', () => {
    const model = buildLattice({
      cellSizeM: 0.04,
      materialMap: [[[1, 1, 1], [1, 1, 1]], [[1, 1, 1], [1, 1, 1]]],
      materials: [{ name: 'fin skin', youngsModulusPa: 1e5, densityKgPerM3: 1050, dampingRatio: 0.5, actuatorChannel: null, actuationStrainMax: 0 }],
      base: 'free',
      originM: [-0.06, 0.15, -0.04],
    }).model;
    const cylinder = obstacle({ shape: 'cylinder', centerM: [0, 0.05, 0], radiusM: 0.05, halfLengthM: 0.2, axis: 2, staticFriction: 0.9, kineticFriction: 0.7 });
    const box = obstacle({ shape: 'box', centerM: [0, -0.05, 0], halfSizeM: [0.5, 0.05, 0.5], staticFriction: 0.9, kineticFriction: 0.7 });
    const world = worldWith(cylinder, box);
    const simulator = new Simulator(model, world);
    const dtS = 0.5 * stabilityBound(model).criticalDtS;
    const out = new Float64Array(3);
    let deepest = 0;
    const steps = Math.ceil(1.5 / dtS);
    for (let s = 0; s < steps; s++) {
      simulator.step(dtS);
      for (let i = 0; i < model.nodeCount; i++) {
        for (const solid of [cylinder, box]) {
          deepest = Math.min(deepest, obstacleDistanceM(solid, model.positionM[3 * i], model.positionM[3 * i + 1], model.positionM[3 * i + 2], out));
        }
      }
    }
    expect(deepest).toBeGreaterThan(-1e-9);
    let fastest = 0;
    for (const v of model.velocityMPerS) fastest = Math.max(fastest, Math.abs(v));
    expect(fastest).toBeLessThan(1e-3);
  });
});

describe('obstacle distance: signed distance and outward normal of each solid (analytic geometry)', () => {
  const out = new Float64Array(3);
  it('sphere r = 1 at the origin: (0, 3, 4) is 4 outside along (0, 0.6, 0.8)', () => {
    expect(obstacleDistanceM(obstacle({ shape: 'sphere', radiusM: 1 }), 0, 3, 4, out)).toBeCloseTo(4, 14);
    expect(Array.from(out)).toEqual([0, 0.6, 0.8]);
  });
  it('box of half sizes (1, 2, 3): corner region (4, 6, 3) is √(9 + 16) = 5 away; inside point nearest the top face', () => {
    const b = obstacle({ shape: 'box', halfSizeM: [1, 2, 3] });
    expect(obstacleDistanceM(b, 4, 6, 3, out)).toBeCloseTo(5, 14);
    expect(Array.from(out)).toEqual([0.6, 0.8, 0]);
    expect(obstacleDistanceM(b, 0.2, 1.9, 0, out)).toBeCloseTo(-0.1, 14);
    expect(Array.from(out)).toEqual([0, 1, 0]);
  });
  it('cylinder along x, r = 1, half length 2: (3, 0, 4) is √(1 + 9) away from the rim', () => {
    const c = obstacle({ shape: 'cylinder', radiusM: 1, halfLengthM: 2, axis: 0 });
    expect(obstacleDistanceM(c, 3, 0, 4, out)).toBeCloseTo(Math.sqrt(10), 14);
    expect(obstacleDistanceM(c, 0, 0, 0.5, out)).toBeCloseTo(-0.5, 14);
    expect(Array.from(out)).toEqual([0, 0, 1]);
  });
});
