// The fixed-sub-step check: the count it names must be the smallest that keeps dt below the
// critical step of semi-implicit Euler (ω·dt < 2 undamped, Jury criterion with damping; see
// sim/core/stability-bound.ts and e.g. Hairer, Lubich & Wanner, Geometric Numerical
// Integration) for every system the scenario can draw, which holds only if the checks really
// build the stiffest, lightest corner of the ranges. Checked by sampling many episodes and
// computing each one's bound.
import { describe, expect, it } from 'vitest';

import { stabilityBound } from '../sim/core/stability-bound.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';

type Json = any; // fixtures are edited freely before checking

function tether(substeps: number | 'auto'): Json {
  return {
    formatVersion: 1,
    name: 'korrin-tether-stiff',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 10, max: 60 },
      lengthM: { kind: 'uniform', min: 2, max: 5 },
      totalMassKg: { kind: 'log-uniform', min: 0.3, max: 1.5 },
      axialStiffnessN: { kind: 'log-uniform', min: 1000, max: 50000 },
      secondNeighbourSpringRatio: { kind: 'uniform', min: 0, max: 0.2 },
      dampingRatio: { kind: 'uniform', min: 0.02, max: 0.5 },
      diameterM: 0.012,
      anchor: 'top-pinned',
    },
    world: { airDragPerS: { kind: 'uniform', min: 0, max: 2 } },
    time: { recordIntervalS: 0.02, recordedSteps: 10, substeps },
    episodes: 300,
    seed: 11,
  };
}

function swimmer(substeps: number | 'auto'): Json {
  return {
    formatVersion: 1,
    name: 'korrin-eel-stiff',
    system: {
      kind: 'lattice',
      cellSizeM: { kind: 'uniform', min: 0.008, max: 0.02 },
      shape: { generator: { dimension: 3, boundsCells: [6, 3, 3], cellCount: { kind: 'integer', min: 4, max: 40 }, materialWeights: [1, 1] } },
      materials: [
        { name: 'skin', youngsModulusPa: { kind: 'log-uniform', min: 5e4, max: 5e5 }, densityKgPerM3: { kind: 'uniform', min: 900, max: 1100 }, dampingRatio: 0.1 },
        { name: 'core', youngsModulusPa: 1e5, densityKgPerM3: 1200, dampingRatio: { kind: 'uniform', min: 0, max: 0.3 } },
      ],
    },
    time: { recordIntervalS: 0.01, recordedSteps: 3, substeps },
    episodes: 300,
    seed: 12,
  };
}

function minimumNamed(value: Json): number {
  const result = checkScenarioValue(value);
  if (result.ok) throw new Error('expected the one-sub-step scenario to be refused');
  expect(result.problems).toHaveLength(1);
  expect(result.problems[0].pointer).toBe('/time/substeps');
  const match = /use at least (\d+) sub-steps/.exec(result.problems[0].message);
  if (match === null) throw new Error(result.problems[0].message);
  return Number(match[1]);
}

for (const [name, fixture] of [['chain', tether], ['generated lattice', swimmer]] as const) {
  describe(`fixed sub-steps for a ${name} sweep`, () => {
    const minimum = minimumNamed(fixture(1));

    it('accepts exactly the named minimum and refuses one fewer', () => {
      expect(minimum).toBeGreaterThan(1);
      expect(checkScenarioValue(fixture(minimum)).ok).toBe(true);
      expect(checkScenarioValue(fixture(minimum - 1)).ok).toBe(false);
    });

    it('the named minimum keeps every sampled episode below its own critical step', () => {
      const result = checkScenarioValue(fixture(minimum));
      if (!result.ok) throw new Error(JSON.stringify(result.problems));
      const scenario = result.scenario;
      const dtS = scenario.time.recordIntervalS / minimum;
      let tightest = Infinity;
      for (let i = 0; i < scenario.episodes; i++) {
        const e = sampleEpisode(scenario, i);
        const bound = stabilityBound(e.system.model, e.world.airDragPerS);
        expect(dtS).toBeLessThan(bound.criticalDtS);
        tightest = Math.min(tightest, bound.criticalDtS / dtS);
      }
      // The corner is not absurdly pessimistic: some episode comes within a factor 3 of it.
      expect(tightest).toBeLessThan(3);
    });
  });
}
