// Split assignment: held-out rules are applied exactly (every episode whose sampled parameter
// matches goes to the rule's split, no other does), the rest follow the fractions within
// binomial tolerance (4.5 standard deviations of Binomial(n, p), normal approximation, any
// probability text, e.g. Feller, An Introduction to Probability Theory, vol. 1), and SciPy's
// exact binomial test (scipy.stats.binomtest, via /usr/bin/python3) agrees, p > 1e-3.
import { beforeAll, describe, expect, it } from 'vitest';

import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { SampledEpisode } from '../sim/scenario/sampled-episode.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const EPISODES = 3000;

function sweep(heldOut: unknown[]): Scenario {
  const result = checkScenarioValue({
    formatVersion: 1,
    name: 'korrin-tether-splits',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 10, max: 40 },
      lengthM: { kind: 'uniform', min: 2, max: 5 },
      totalMassKg: 0.8,
      axialStiffnessN: 5000,
      dampingRatio: 0.1,
      diameterM: 0.012,
      anchor: 'top-pinned',
    },
    time: { recordIntervalS: 0.02, recordedSteps: 2 },
    episodes: EPISODES,
    seed: 77,
    splits: { fractions: { train: 0.7, validation: 0.2, test: 0.1 }, heldOut },
  });
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

const RULES = [
  { parameter: '/system/partCount', above: 36 },
  { split: 'held-out-long', parameter: '/system/lengthM', inside: [4.5, 5] },
  { split: 'held-out-short-light', parameter: '/system/lengthM', below: 2.2 },
];

describe('held-out rules are exact and checked in order', () => {
  let episodes: SampledEpisode[];
  beforeAll(() => {
    const scenario = sweep(RULES);
    episodes = Array.from({ length: EPISODES }, (_, i) => sampleEpisode(scenario, i));
  });

  it('sends exactly the matching episodes to each rule\'s split, the first matching rule winning', () => {
    let heldOut = 0;
    for (const e of episodes) {
      const parts = e.labels['/system/partCount'] as number;
      const length = e.labels['/system/lengthM'] as number;
      const expected = parts > 36 ? 'held-out' : length >= 4.5 && length <= 5 ? 'held-out-long' : length < 2.2 ? 'held-out-short-light' : null;
      if (expected !== null) {
        heldOut++;
        expect(e.split).toBe(expected);
      } else {
        expect(['train', 'validation', 'test']).toContain(e.split);
      }
    }
    // 4 of 31 part counts, then 1/6 and 1/15 of lengths: roughly a third of the episodes.
    expect(heldOut).toBeGreaterThan(EPISODES * 0.25);
    expect(heldOut).toBeLessThan(EPISODES * 0.45);
  });

  it('follows the fractions among the remaining episodes within 4.5 binomial standard deviations', () => {
    const rest = episodes.filter((e) => !e.split.startsWith('held-out'));
    const n = rest.length;
    for (const [name, fraction] of [['train', 0.7], ['validation', 0.2], ['test', 0.1]] as const) {
      const k = rest.filter((e) => e.split === name).length;
      expect(Math.abs(k - n * fraction)).toBeLessThan(4.5 * Math.sqrt(n * fraction * (1 - fraction)));
    }
  });

  it('changing the rules moves only the episodes they match: the others keep their split', () => {
    const without = sweep([]);
    let kept = 0;
    for (const e of episodes) {
      if (e.split.startsWith('held-out')) continue;
      expect(sampleEpisode(without, e.index).split).toBe(e.split);
      kept++;
    }
    expect(kept).toBeGreaterThan(EPISODES / 2);
  });
});

const python = referencePythonAvailability();

describe.runIf(python.available)('fractions against scipy.stats.binomtest (p > 1e-3)', () => {
  it('train, validation and test counts of 3000 episodes without rules', () => {
    const scenario = sweep([]);
    const splits = Array.from({ length: EPISODES }, (_, i) => sampleEpisode(scenario, i).split);
    const counts = { train: 0, validation: 0, test: 0 } as Record<string, number>;
    for (const s of splits) counts[s]++;
    expect(counts.train + counts.validation + counts.test).toBe(EPISODES);
    const p = runReferencePython<number[]>(
      'import json, sys\nfrom scipy import stats\nd = json.load(sys.stdin)\nprint(json.dumps([stats.binomtest(k, d["n"], q).pvalue for k, q in d["cases"]]))',
      { n: EPISODES, cases: [[counts.train, 0.7], [counts.validation, 0.2], [counts.test, 0.1]] },
    );
    for (const value of p) expect(value).toBeGreaterThan(1e-3);
  });
});
