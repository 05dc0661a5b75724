// A scenario's "design" key, end to end up to the sampled labels: checking (grid levels against
// the episode count, unknown pointers, too many Sobol dimensions), the labels being each
// parameter's inverse CDF at the design coordinate (Latin hypercube strata of McKay, Beckman &
// Conover 1979 seen in the labels themselves; a grid visiting every combination once), and the
// reproducibility rules of DEVELOPERS.md: no design means the draws of before, "independent"
// equals no design, a constant parameter added moves nothing, any episode computed alone
// equals the same episode computed after all the others.
import { describe, expect, it } from 'vitest';

import { sampleValue } from '../sim/random/distribution.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { designParameters, scenarioDesignPlan } from '../sim/scenario/design/scenario-design.ts';
import { parameterStream } from '../sim/scenario/parameter-streams.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';

function tether(extra: Record<string, unknown> = {}, system: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    formatVersion: 1,
    name: 'korrin-tether-design',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 8, max: 12 },
      lengthM: { kind: 'uniform', min: 1.5, max: 2.5 },
      totalMassKg: 0.3,
      axialStiffnessN: { kind: 'log-uniform', min: 2000, max: 20000 },
      dampingRatio: { kind: 'normal', mean: 0.1, std: 0.03, min: 0.05, max: 0.2 },
      diameterM: 0.008,
      anchor: 'top-pinned',
      ...system,
    },
    time: { recordIntervalS: 0.02, recordedSteps: 2 },
    episodes: 40,
    seed: 2024,
    ...extra,
  };
}

function checked(value: Record<string, unknown>): Scenario {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

function problemsOf(value: Record<string, unknown>): { pointer: string; message: string }[] {
  const result = checkScenarioValue(value);
  return result.ok ? [] : result.problems;
}

const DESIGNED = ['/system/axialStiffnessN', '/system/dampingRatio', '/system/lengthM', '/system/partCount'];

describe('checking a design', () => {
  it('accepts every kind and lists the distributed parameters in code-unit order', () => {
    for (const kind of ['independent', 'latin-hypercube', 'sobol']) expect(problemsOf(tether({ design: { kind } }))).toEqual([]);
    const plan = scenarioDesignPlan(checked(tether({ design: { kind: 'sobol' } })));
    expect(plan?.pointers).toEqual(DESIGNED);
  });

  it('refuses a grid whose levels do not multiply to the episode count, naming the product', () => {
    const problems = problemsOf(tether({ design: { kind: 'grid', levels: { '/system/lengthM': 5, '/system/partCount': 5 } } }));
    expect(problems).toEqual([{ pointer: '/episodes', message: expect.stringContaining('5 × 5 = 25 combinations') }]);
    expect(problems[0].message).toContain('set "episodes" to 25');
  });

  it('refuses a gridded pointer that is not a distributed parameter, suggesting the near one', () => {
    const problems = problemsOf(tether({ episodes: 4, design: { kind: 'grid', levels: { '/system/lengthm': 4 } } }));
    expect(problems).toHaveLength(1);
    expect(problems[0].pointer).toBe('/design/levels/~1system~1lengthm');
    expect(problems[0].message).toContain('did you mean "/system/lengthM"?');
    const fixed = problemsOf(tether({ episodes: 4, design: { kind: 'grid', levels: { '/system/totalMassKg': 4 } } }));
    expect(fixed[0].message).toContain('is not a distributed parameter');
  });

  it('refuses more levels than an integer parameter has values, levels on a non-grid, a grid without levels and an unknown kind', () => {
    expect(problemsOf(tether({ episodes: 6, design: { kind: 'grid', levels: { '/system/partCount': 6 } } }))[0].message).toContain('takes only 5 values');
    expect(problemsOf(tether({ design: { kind: 'sobol', levels: { '/system/partCount': 5 } } }))[0].pointer).toBe('/design/levels');
    expect(problemsOf(tether({ design: { kind: 'grid' } }))[0].message).toContain('a grid needs "levels"');
    const unknown = problemsOf(tether({ design: { kind: 'latin-square' } }));
    expect(unknown[0].pointer).toBe('/design/kind');
  });

  it('refuses a design over a scenario with nothing distributed', () => {
    const fixed = tether({ design: { kind: 'latin-hypercube' } }, { partCount: 10, lengthM: 2, axialStiffnessN: 5000, dampingRatio: 0.1 });
    expect(problemsOf(fixed)[0]).toEqual({ pointer: '/design/kind', message: expect.stringContaining('every value of this scenario is fixed') });
  });
});

describe('sampling with a design', () => {
  it('without a design, or with "independent", every label is the independent draw of its own stream (the bytes of before)', () => {
    for (const scenario of [checked(tether()), checked(tether({ design: { kind: 'independent' } }))]) {
      for (let i = 0; i < 5; i++) {
        const labels = sampleEpisode(scenario, i).labels;
        for (const parameter of designParameters(scenario)) {
          expect(labels[parameter.pointer]).toBe(sampleValue(parameter.spec, parameterStream(2024, i, parameter.pointer)));
        }
      }
    }
  });

  it('a Latin hypercube puts one episode in each of the 40 equally likely strata of every parameter, seen in the labels', () => {
    const scenario = checked(tether({ design: { kind: 'latin-hypercube' } }));
    const episodes = Array.from({ length: 40 }, (_, i) => sampleEpisode(scenario, i));
    // Probability of each label under its own distribution, computed here in closed form.
    const cdfs: Record<string, (x: number) => number> = {
      '/system/lengthM': (x) => (x - 1.5) / 1,
      '/system/axialStiffnessN': (x) => Math.log(x / 2000) / Math.log(10),
    };
    for (const [pointer, cdf] of Object.entries(cdfs)) {
      const strata = episodes.map((e) => Math.floor(cdf(e.labels[pointer] as number) * 40 + 1e-9)).sort((a, b) => a - b);
      expect(strata).toEqual(Array.from({ length: 40 }, (_, k) => k));
    }
    // 40 strata of an integer with 5 values: each value exactly 8 times.
    const counts = new Map<number, number>();
    for (const e of episodes) counts.set(e.labels['/system/partCount'] as number, (counts.get(e.labels['/system/partCount'] as number) ?? 0) + 1);
    expect([...counts.entries()].sort((a, b) => a[0] - b[0])).toEqual([[8, 8], [9, 8], [10, 8], [11, 8], [12, 8]]);
  });

  it('a grid visits each combination once, at stratum midpoints, and leaves ungridded parameters to independent draws', () => {
    const scenario = checked(tether({ episodes: 10, design: { kind: 'grid', levels: { '/system/lengthM': 2, '/system/partCount': 5 } } }));
    const episodes = Array.from({ length: 10 }, (_, i) => sampleEpisode(scenario, i));
    const pairs = episodes.map((e) => `${e.labels['/system/lengthM']}@${e.labels['/system/partCount']}`);
    expect(pairs).toEqual(['1.75@8', '1.75@9', '1.75@10', '1.75@11', '1.75@12', '2.25@8', '2.25@9', '2.25@10', '2.25@11', '2.25@12']);
    expect(episodes[3].labels['/system/axialStiffnessN']).toBe(sampleValue({ kind: 'log-uniform', min: 2000, max: 20000 }, parameterStream(2024, 3, '/system/axialStiffnessN')));
  });

  it('any episode alone equals the same episode after all the others, in every kind', () => {
    for (const kind of ['latin-hypercube', 'sobol']) {
      const all = checked(tether({ design: { kind } }));
      const labelsInOrder = Array.from({ length: 40 }, (_, i) => sampleEpisode(all, i).labels);
      for (const i of [39, 0, 17]) expect(sampleEpisode(checked(tether({ design: { kind } })), i).labels).toEqual(labelsInOrder[i]);
    }
  });

  it('adding a constant parameter moves nothing; a Latin hypercube keeps each parameter\'s strata when another distributed parameter joins', () => {
    for (const kind of ['latin-hypercube', 'sobol']) {
      const before = checked(tether({ design: { kind } }));
      const withConstant = checked(tether({ design: { kind } }, { secondNeighbourSpringRatio: 0.05 }));
      for (let i = 0; i < 10; i++) {
        const a = sampleEpisode(before, i).labels;
        const b = sampleEpisode(withConstant, i).labels;
        for (const pointer of DESIGNED) expect(b[pointer]).toBe(a[pointer]);
      }
    }
    const before = checked(tether({ design: { kind: 'latin-hypercube' } }));
    const joined = checked(tether({ design: { kind: 'latin-hypercube' } }, { secondNeighbourSpringRatio: { kind: 'uniform', min: 0, max: 0.1 } }));
    for (let i = 0; i < 10; i++) expect(sampleEpisode(joined, i).labels['/system/lengthM']).toBe(sampleEpisode(before, i).labels['/system/lengthM']);
  });

  it('a Sobol design of 32 episodes (2^5) has one episode per 1/32 of probability in every parameter', () => {
    const scenario = checked(tether({ episodes: 32, design: { kind: 'sobol' } }));
    const lengths = Array.from({ length: 32 }, (_, i) => sampleEpisode(scenario, i).labels['/system/lengthM'] as number);
    expect(new Set(lengths.map((x) => Math.floor((x - 1.5) * 32))).size).toBe(32);
  });
});
