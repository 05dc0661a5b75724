// A chain hanging from its pinned top, settled to rest: every structural spring carries the
// weight of everything below it, so its extension is (g · mass below) / k (Hooke's law and
// statics of a hanging rope; e.g. Halliday & Resnick, Fundamentals of Physics, tension in a
// hanging rope). Mass-proportional air drag settles it without changing the equilibrium.
import { describe, expect, it } from 'vitest';

import { RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';

function hangingChain(partCount: number, dampingRatio: number): ChainParameters {
  return {
    partCount,
    lengthM: 2,
    totalMassKg: 1.5,
    axialStiffnessN: 3000,
    secondNeighbourSpringRatio: 0,
    dampingRatio,
    diameterM: 0.01,
    anchor: 'top-pinned',
    originM: [0, 3, 0],
    directionUnit: [0, -1, 0],
    forceHandles: [],
    forceAxes: [],
    drivenAxes: [],
  };
}

describe('hanging chain at rest (Hooke\'s law + statics: extension of spring j = g·Σ m_below / k)', () => {
  for (const [partCount, dampingRatio] of [[8, 0.2], [20, 0.05]] as const) {
    it(`${partCount} parts, damping ratio ${dampingRatio}: every structural extension within 0.5%`, () => {
      const system = buildChain(hangingChain(partCount, dampingRatio));
      const model = system.model;
      const world = defaultWorld();
      // Fundamental of a fixed–free bar: ω₁ = (π/2)·√(EA/μ)/L ≈ 50 rad/s here; drag near
      // 2·ω₁ damps it critically.
      world.airDragPerS = 100;
      const trajectory = recordTrajectory(model, world, new Float64Array(0), { recordIntervalS: 0.05, recordedSteps: 60, substeps: 'auto' });
      const last = trajectory.steps * model.nodeCount * 3;
      const x = trajectory.positionM;
      const g = 9.81;
      let checked = 0;
      for (let s = 0; s < model.springCount; s++) {
        if (model.springRelation[s] !== RELATION_STRUCTURAL) continue;
        const a = model.springNodeA[s];
        const b = model.springNodeB[s];
        const upper = Math.min(a, b);
        let massBelowKg = 0;
        for (let i = upper + 1; i < model.nodeCount; i++) massBelowKg += model.massKg[i];
        const expectedExtensionM = (g * massBelowKg) / model.stiffnessNPerM[s];
        const dy = x[last + 3 * b + 1] - x[last + 3 * a + 1];
        const dxz = Math.hypot(x[last + 3 * b] - x[last + 3 * a], x[last + 3 * b + 2] - x[last + 3 * a + 2]);
        const extensionM = Math.hypot(dy, dxz) - model.restLengthM[s];
        expect(Math.abs(extensionM / expectedExtensionM - 1)).toBeLessThan(0.005);
        checked++;
      }
      expect(checked).toBe(partCount);
      // At rest: no node still moving faster than 1 µm/s.
      for (let i = 0; i < 3 * model.nodeCount; i++) expect(Math.abs(trajectory.velocityMPerS[last + i])).toBeLessThan(1e-6);
      // The whole chain's weight hangs on the top spring: total mass check from the builder.
      let freeMassKg = 0;
      for (let i = 1; i < model.nodeCount; i++) freeMassKg += model.massKg[i];
      expect(freeMassKg).toBeCloseTo(1.5 * (1 - 0.5 / partCount), 12);
    });
  }
});
