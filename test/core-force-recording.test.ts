// Recorded forces (export.forces), impulse averages over each record interval, against
// statics and the drag law:
//  - a chain hanging at rest: each spring's tension equals the weight of everything below it
//    (statics of a hanging rope; e.g. Meriam & Kraige, Engineering Mechanics: Statics, ch. 3);
//  - a body resting on the floor or on a box top: the normal force equals its weight
//    (Newton's first law; Halliday & Resnick, Fundamentals of Physics, ch. 5);
//  - a straight segment held in a uniform flow: resistive-force drag C·A·U along the normal and
//    the tangent (Gray & Hancock 1955, the drag law the fluid model is defined by).
import { describe, expect, it } from 'vitest';

import { NODE_PINNED, RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { ModelBuilder } from '../sim/core/model-builder.ts';
import { autoSubsteps, stabilityBound } from '../sim/core/stability-bound.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { buildLattice } from '../sim/systems/lattice.ts';

const G = 9.81;

describe('hanging chain at rest: tension at each spring = weight below (statics)', () => {
  it('10 parts, 0.1 kg each, k = 500 N/m, pinned top, started in its static equilibrium', () => {
    const parts = 10;
    const partKg = 0.1;
    const k = 500;
    const builder = new ModelBuilder(8, 2, 0);
    let y = 0;
    builder.addNode({ positionM: [0, 0, 0], massKg: 0.5 * partKg, flags: NODE_PINNED });
    for (let i = 1; i <= parts; i++) {
      // Spring i−1→i carries the nodes i … parts: (parts − i + ½) parts' mass.
      const below = (parts - i + 0.5) * partKg;
      y -= 0.1 + (below * G) / k;
      builder.addNode({ positionM: [0, y, 0], massKg: i === parts ? 0.5 * partKg : partKg });
    }
    for (let i = 0; i < parts; i++) builder.addSpring(i, i + 1, k, 0.2, RELATION_STRUCTURAL, 0.1);
    const model = builder.build();
    const trajectory = recordTrajectory(model, defaultWorld(), new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: 20, substeps: 'auto', recordForces: true });
    const tension = trajectory.forces!.edgeTensionN;
    for (let t = 0; t < 20; t++) {
      for (let s = 0; s < parts; s++) {
        const weightBelowN = (parts - s - 0.5) * partKg * G;
        expect(Math.abs(tension[t * parts + s] - weightBelowN)).toBeLessThan(1e-9 * weightBelowN);
      }
    }
    // The top spring holds the whole hanging weight: 0.95 kg × g (the pinned half-part excluded).
    expect(tension[0]).toBeCloseTo(0.95 * G, 9);
    // No contact, no fluid.
    expect(trajectory.forces!.contactNormalForceN.every((f) => f === 0)).toBe(true);
    expect(trajectory.forces!.fluidForceN.every((f) => f === 0)).toBe(true);
  });
});

describe('resting body: contact normal force = weight (Newton\'s first law)', () => {
  it('a 0.3 kg node on the floor: exactly m·g per record interval, no friction force', () => {
    const builder = new ModelBuilder(8, 2, 0);
    builder.addNode({ positionM: [0.2, 0, -0.1], massKg: 0.3 });
    const world = defaultWorld();
    world.ground = { enabled: true, heightM: 0, staticFriction: 0.5, kineticFriction: 0.4 };
    const trajectory = recordTrajectory(builder.build(), world, new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: 10, substeps: 7, recordForces: true });
    const f = trajectory.forces!;
    for (let t = 0; t < 10; t++) {
      expect(f.contactNormalForceN[3 * t + 1]).toBeCloseTo(0.3 * G, 12);
      expect(f.contactNormalForceN[3 * t]).toBe(0);
      expect(f.contactFrictionForceN[3 * t]).toBe(0);
    }
  });

  it('a 2×2×2 pad on a box top settles: the normal forces sum to its weight within 1e-6', () => {
    const model = buildLattice({
      cellSizeM: 0.05,
      materialMap: [[[1, 1], [1, 1]], [[1, 1], [1, 1]]],
      materials: [{ name: 'fin pad', youngsModulusPa: 2e5, densityKgPerM3: 1100, dampingRatio: 0.6, actuatorChannel: null, actuationStrainMax: 0 }],
      base: 'free',
      originM: [-0.05, 0.2, -0.05],
    }).model;
    const world = defaultWorld();
    world.obstacles = [{ shape: 'box', centerM: [0, 0.1, 0], halfSizeM: [0.3, 0.1, 0.3], radiusM: 0, halfLengthM: 0, axis: 1, staticFriction: 0.8, kineticFriction: 0.6 }];
    let massKg = 0;
    for (let i = 0; i < model.nodeCount; i++) massKg += model.massKg[i];
    const substeps = autoSubsteps(0.01, stabilityBound(model));
    const steps = 150;
    const trajectory = recordTrajectory(model, world, new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: steps, substeps, recordForces: true });
    const normal = trajectory.forces!.contactNormalForceN;
    const n = model.nodeCount;
    let sumY = 0;
    for (let i = 0; i < n; i++) sumY += normal[((steps - 1) * n + i) * 3 + 1];
    expect(Math.abs(sumY / (massKg * G) - 1)).toBeLessThan(1e-6);
    // No node ever went into the box.
    for (let j = 1; j < trajectory.positionM.length; j += 3) expect(trajectory.positionM[j]).toBeGreaterThanOrEqual(0.2 - 1e-12);
  });
});

describe('fluid force on a held segment in a uniform flow (Gray & Hancock 1955)', () => {
  it('0.4 m × 0.02 m segment, C_n = 30, C_t = 6 N·s/m³, flow 0.5 m/s at 30° to it', () => {
    const builder = new ModelBuilder(8, 2, 0.02);
    builder.addNode({ positionM: [0, 0, 0], massKg: 0.1, flags: NODE_PINNED });
    builder.addNode({ positionM: [0.2, 0, 0], massKg: 0.1, flags: NODE_PINNED });
    builder.addNode({ positionM: [0.4, 0, 0], massKg: 0.1, flags: NODE_PINNED });
    builder.addPanel([0, 1]);
    builder.addPanel([1, 2]);
    const world = defaultWorld();
    const u = 0.5;
    world.fluid = { enabled: true, densityKgPerM3: 1000, normalDragNsPerM3: 30, tangentialDragNsPerM3: 6, flowVelocityMPerS: [u * Math.cos(Math.PI / 6), u * Math.sin(Math.PI / 6), 0], buoyancy: false };
    const trajectory = recordTrajectory(builder.build(), world, new Float64Array(0), { recordIntervalS: 0.01, recordedSteps: 2, substeps: 3, recordForces: true });
    const f = trajectory.forces!.fluidForceN;
    const area = 0.4 * 0.02;
    let fx = 0;
    let fy = 0;
    for (let i = 0; i < 3; i++) {
      fx += f[3 * i];
      fy += f[3 * i + 1];
    }
    // The flow pushes the body: tangential C_t·A·U·cos30°, normal C_n·A·U·sin30°.
    expect(fx).toBeCloseTo(6 * area * u * Math.cos(Math.PI / 6), 12);
    expect(fy).toBeCloseTo(30 * area * u * Math.sin(Math.PI / 6), 12);
  });
});
