// substeps {accuracy: ε}: sub-steps chosen so that ω_max·dt ≤ ε. Checked against the modified-
// energy result for symplectic Euler (Hairer, Lubich & Wanner, Geometric Numerical
// Integration, 2nd ed., ch. IX; for x'' = −ω²x the method keeps H̃ = H − ½·dt·ω²·x·v exactly,
// so H swings in a relative band of ω·dt to first order) and its first-order behaviour: the
// band halves when dt halves.
import { describe, expect, it } from 'vitest';

import { accuracySubsteps } from '../sim/core/accuracy-substeps.ts';
import { ENERGY_BASE_COUNT, ENERGY_NAMES } from '../sim/core/energy.ts';
import { NODE_PINNED, RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { ModelBuilder } from '../sim/core/model-builder.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import { defaultWorld } from '../sim/core/world.ts';
import type { RecordingSettings } from '../sim/episode/record-episode.ts';
import { recordTrajectory, resolveSubsteps } from '../sim/episode/record-episode.ts';
import { buildChain } from '../sim/systems/chain.ts';

/** (max − min)/mean of kinetic + potential energies over the record times (no fluid here, so the columns recorded without accounting hold them all). */
function relativeBand(energiesJ: Float64Array): number {
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  const rows = energiesJ.length / ENERGY_BASE_COUNT;
  for (let r = 0; r < rows; r++) {
    let total = 0;
    for (const name of ['kinetic', 'elastic', 'gravitational', 'bending']) total += energiesJ[r * ENERGY_BASE_COUNT + ENERGY_NAMES.indexOf(name)];
    min = Math.min(min, total);
    max = Math.max(max, total);
    sum += total;
  }
  return (max - min) / (sum / rows);
}

describe('one oscillator: the energy band is ω·dt (modified energy of symplectic Euler, Hairer–Lubich–Wanner ch. IX)', () => {
  it('k = 400 N/m, m = 1 kg (ω = 20 rad/s), accuracy 0.05 gives dt = 0.05/20 s and a band within 5% of 0.05', () => {
    const builder = new ModelBuilder(8, 2, 0);
    builder.addNode({ positionM: [0, 0, 0], massKg: 1, flags: NODE_PINNED });
    builder.addNode({ positionM: [1.1, 0, 0], massKg: 1 });
    builder.addSpring(0, 1, 400, 0, RELATION_STRUCTURAL, 1);
    const model = builder.build();
    const world = defaultWorld();
    world.gravityMPerS2 = [0, 0, 0];
    // Record every sub-step (interval = dt), so the band is sampled finely over 2 periods.
    const settings: RecordingSettings = { recordIntervalS: 0.1, recordedSteps: 7, substeps: { accuracy: 0.05 } };
    const { substeps, dtS } = resolveSubsteps(model, world, settings);
    expect(substeps).toBe(40); // ceil(0.1·20/0.05)
    const fine = recordTrajectory(model, world, new Float64Array(0), { recordIntervalS: dtS, recordedSteps: Math.round(0.63 / dtS), substeps: 1 });
    expect(Math.abs(relativeBand(fine.energiesJ) / (20 * dtS) - 1)).toBeLessThan(0.05);
  });
});

describe('an undamped free chain: the band falls first order with the accuracy target', () => {
  it('ε = 0.2, 0.1, 0.05: band ≤ ε and each halving of ε halves the band (ratio 2 ± 0.3)', () => {
    const bands: number[] = [];
    const substepCounts: number[] = [];
    for (const accuracy of [0.2, 0.1, 0.05]) {
      const system = buildChain({
        partCount: 12, lengthM: 0.6, totalMassKg: 0.12, axialStiffnessN: 60, secondNeighbourSpringRatio: 0.2, dampingRatio: 0,
        diameterM: 0.01, anchor: 'free', originM: [0, 0, 0], directionUnit: [1, 0, 0], forceHandles: [], forceAxes: [], drivenAxes: [],
      });
      const model = system.model;
      // A stretched, bent start so many modes ring: nodes displaced sideways on a sine.
      for (let i = 0; i < model.nodeCount; i++) {
        model.positionM[3 * i] *= 1.04;
        model.positionM[3 * i + 1] = 0.02 * Math.sin((Math.PI * i) / 4);
      }
      const world = defaultWorld();
      const settings: RecordingSettings = { recordIntervalS: 0.002, recordedSteps: 400, substeps: { accuracy } };
      substepCounts.push(resolveSubsteps(model, world, settings).substeps);
      const trajectory = recordTrajectory(model, world, new Float64Array(0), settings);
      bands.push(relativeBand(trajectory.energiesJ));
    }
    for (let j = 0; j < bands.length; j++) expect(bands[j]).toBeLessThan([0.2, 0.1, 0.05][j]);
    for (let j = 1; j < bands.length; j++) {
      const dtRatio = substepCounts[j] / substepCounts[j - 1];
      // Compare band ratio with the actual dt ratio (sub-step counts are whole numbers).
      expect(bands[j - 1] / bands[j] / dtRatio).toBeGreaterThan(0.85);
      expect(bands[j - 1] / bands[j] / dtRatio).toBeLessThan(1.15);
      expect(dtRatio).toBeGreaterThan(1.7);
    }
  });

  it('never fewer sub-steps than the stability rule; a loose target falls back to it', () => {
    const system = buildChain({
      partCount: 8, lengthM: 0.4, totalMassKg: 0.1, axialStiffnessN: 80, secondNeighbourSpringRatio: 0, dampingRatio: 0.1,
      diameterM: 0.01, anchor: 'top-pinned', originM: [0, 0, 0], directionUnit: [0, -1, 0], forceHandles: [], forceAxes: [], drivenAxes: [],
    });
    const world = defaultWorld();
    const loose = resolveSubsteps(system.model, world, { recordIntervalS: 0.01, recordedSteps: 1, substeps: { accuracy: 1 } });
    const auto = resolveSubsteps(system.model, world, { recordIntervalS: 0.01, recordedSteps: 1, substeps: 'auto' });
    expect(loose.substeps).toBe(auto.substeps);
    const bound = stabilityBound(system.model);
    expect(accuracySubsteps(0.01, bound, 0.01)).toBe(Math.ceil((0.01 * bound.omegaMaxRadPerS) / 0.01));
    expect(() => accuracySubsteps(0.01, bound, 0)).toThrow(/positive relative energy band/);
  });
});
