// The Richardson error estimate (Richardson extrapolation; Hairer, Nørsett & Wanner, Solving
// ODEs I, §II.4): for a first-order method (semi-implicit Euler; Hairer, Lubich & Wanner,
// Geometric Numerical Integration, ch. I) the recorded run's error ≈ 2·|x_h − x_{h/2}| and the
// half-step run's error ≈ |x_h − x_{h/2}|. Checked against the actual error versus SciPy's DOP853
// at rtol = atol = 1e-12 on a small pinned chain swinging under gravity.
import { describe, expect, it } from 'vitest';

import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { richardsonEstimate, startStateOf } from '../sim/episode/richardson-estimate.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import type { ChainReferenceResult } from './support/dop853-chain-reference.ts';
import { chainReferenceInput,DOP853_CHAIN_SCRIPT } from './support/dop853-chain-reference.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

const CHAIN: ChainParameters = {
  partCount: 4, lengthM: 0.8, totalMassKg: 0.4, axialStiffnessN: 300, secondNeighbourSpringRatio: 0, dampingRatio: 0,
  diameterM: 0.01, anchor: 'top-pinned', originM: [0, 1, 0], directionUnit: [1, 0, 0.3], forceHandles: [], forceAxes: [], drivenAxes: [],
};
const INTERVAL_S = 0.02;
const STEPS = 15;

describe.runIf(python.available)('Richardson estimate against the actual error (SciPy DOP853 reference)', () => {
  for (const substeps of [8, 16]) {
    it(`${substeps} sub-steps per record: estimates within 20% of the actual largest position error`, () => {
      const world = defaultWorld();
      const model = buildChain(CHAIN).model;
      const times = Array.from({ length: STEPS + 1 }, (_, t) => t * INTERVAL_S);
      const reference = runReferencePython<ChainReferenceResult>(DOP853_CHAIN_SCRIPT, chainReferenceInput(model, world, times));
      expect(reference.status).toBe(0);
      const start = startStateOf(model);
      const settings = { recordIntervalS: INTERVAL_S, recordedSteps: STEPS, substeps };
      const recorded = recordTrajectory(model, world, new Float64Array(0), settings);
      const estimate = richardsonEstimate(model, start, world, new Float64Array(0), settings, recorded);
      expect(estimate.substepCount).toBe(2 * substeps);
      const actualMax = (positions: Float64Array) => {
        let worst = 0;
        for (let t = 0; t <= STEPS; t++) {
          for (let i = 0; i < model.nodeCount; i++) {
            const o = (t * model.nodeCount + i) * 3;
            const r = reference.positionM[t];
            worst = Math.max(worst, Math.hypot(positions[o] - r[3 * i], positions[o + 1] - r[3 * i + 1], positions[o + 2] - r[3 * i + 2]));
          }
        }
        return worst;
      };
      const actual = actualMax(recorded.positionM);
      expect(actual).toBeGreaterThan(1e-5); // far above the reference's own 1e-12 tolerance
      expect(estimate.positionErrorMaxM / actual).toBeGreaterThan(0.8);
      expect(estimate.positionErrorMaxM / actual).toBeLessThan(1.25);
      // The half-step run's error is about half the estimate (d/(2^p − 1) with p = 1).
      const half = recordTrajectory(buildChain(CHAIN).model, world, new Float64Array(0), { ...settings, substeps: 2 * substeps });
      expect((0.5 * estimate.positionErrorMaxM) / actualMax(half.positionM)).toBeGreaterThan(0.8);
      expect((0.5 * estimate.positionErrorMaxM) / actualMax(half.positionM)).toBeLessThan(1.25);
    });
  }
});

describe('which episodes get the rerun: a draw of their own stream against numerics.richardsonShare', () => {
  it('share 0.25 over 400 episodes picks 100 ± 30 (binomial, 3σ ≈ 26), the same ones every time, independent of the episode count', () => {
    const scenario = (episodes: number) => {
      const checked = checkScenarioValue({
        formatVersion: 1, name: 'korrin-tether-numerics', episodes, seed: 77,
        system: { kind: 'chain', partCount: 3, lengthM: 1, totalMassKg: 0.2, axialStiffnessN: 100, dampingRatio: 0.1, diameterM: 0.01, anchor: 'top-pinned' },
        time: { recordIntervalS: 0.01, recordedSteps: 2 },
        numerics: { richardsonShare: 0.25 },
      });
      if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
      return checked.scenario;
    };
    const big = scenario(400);
    const small = scenario(50);
    const picked = Array.from({ length: 400 }, (_, i) => sampleEpisode(big, i).richardson);
    const count = picked.filter(Boolean).length;
    expect(Math.abs(count - 100)).toBeLessThan(30);
    for (let i = 0; i < 50; i++) expect(sampleEpisode(small, i).richardson).toBe(picked[i]);
  });
});
