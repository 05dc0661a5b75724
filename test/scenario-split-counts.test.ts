// Planned splits: exact counts after the held-out rules, a split left out taking the rest,
// stratified dealing, and independence from sharding and rejection (the plan is computed from
// the scenario alone, so any episode sampled alone gets the split it gets in a full pass).
// Sources: that dealing by largest deficit under quotas ends with exactly the counts follows
// from the quota cap (common practice, no source); the per-stratum bound (each split within 2
// of its proportional share in every run of consecutive episodes of the order) is the
// sequential-apportionment bound of Balinski & Young, Fair Representation (1982), from memory,
// and is checked here as a property; largest remainders (Hamilton's method) as there.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { countsFromFractions, dealInOrder } from '../sim/scenario/splits/split-dealing.ts';

function tether(splits: Record<string, unknown>, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    formatVersion: 1,
    name: 'korrin-tether-splits',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 8, max: 24 },
      lengthM: { kind: 'uniform', min: 1.5, max: 2.5 },
      totalMassKg: 0.3,
      axialStiffnessN: 5000,
      dampingRatio: 0.1,
      diameterM: 0.008,
      anchor: 'top-pinned',
    },
    time: { recordIntervalS: 0.02, recordedSteps: 2 },
    episodes: 40,
    seed: 31,
    splits,
    ...extra,
  };
}

function checked(value: Record<string, unknown>): Scenario {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

function tally(scenario: Scenario): Record<string, number> {
  const out: Record<string, number> = {};
  for (let i = 0; i < scenario.episodes; i++) {
    const split = sampleEpisode(scenario, i).split;
    out[split] = (out[split] ?? 0) + 1;
  }
  return out;
}

const HELD_OUT = [{ parameter: '/system/partCount', above: 21 }];

describe('exact split counts', () => {
  it('a split left out takes the rest after the held-out rules; the others get exactly their counts', () => {
    const scenario = checked(tether({ heldOut: HELD_OUT, counts: { validation: 4, test: 4 } }));
    const counts = tally(scenario);
    expect(counts.validation).toBe(4);
    expect(counts.test).toBe(4);
    expect(counts.train + counts.validation + counts.test + counts['held-out']).toBe(40);
    // Held-out rules stay exact: every episode above 21 parts, and only those.
    for (let i = 0; i < 40; i++) {
      const e = sampleEpisode(scenario, i);
      expect(e.split === 'held-out').toBe((e.labels['/system/partCount'] as number) > 21);
    }
  });

  it('counts that cannot be met are refused with the number of episodes left and how many were held out', () => {
    const result = checkScenarioValue(tether({ heldOut: HELD_OUT, counts: { train: 30, validation: 5, test: 5 } }));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems).toHaveLength(1);
    expect(result.problems[0].pointer).toBe('/splits/counts');
    expect(result.problems[0].message).toMatch(/train 30 \+ validation 5 \+ test 5 = 40, but \d+ episodes are left for them \(40 episodes, \d+ held out/);
    const two = checkScenarioValue(tether({ counts: { train: 30 } }));
    expect(two.ok ? '' : two.problems[0].message).toContain('leaves out validation and test');
  });

  it('without held-out rules all three counts are met exactly, and fractions alone keep the per-episode draws', () => {
    expect(tally(checked(tether({ counts: { train: 30, validation: 6, test: 4 } })))).toEqual({ train: 30, validation: 6, test: 4 });
    const drawn = checked(tether({ fractions: { train: 0.8, validation: 0.1, test: 0.1 } }));
    const planned = checked(tether({ fractions: { train: 0.8, validation: 0.1, test: 0.1 }, stratify: { parameters: ['/system/lengthM'] } }));
    expect(tally(planned)).toEqual({ train: 32, validation: 4, test: 4 });
    // The drawn assignment is the one of before (exact counts are not promised there).
    expect(Object.values(tally(drawn)).reduce((a, b) => a + b, 0)).toBe(40);
  });

  it('an episode sampled alone gets the split it gets in the full pass (shard- and order-independent)', () => {
    const value = tether({ heldOut: HELD_OUT, counts: { validation: 5, test: 5 }, stratify: { parameters: ['/system/lengthM'], bins: 3 } });
    const full = checked(value);
    const splits = Array.from({ length: 40 }, (_, i) => sampleEpisode(full, i).split);
    for (const i of [39, 7, 0]) expect(sampleEpisode(checked(value), i).split).toBe(splits[i]);
  });
});

describe('stratified splits', () => {
  it('each split spans the stratified parameter: each quarter of lengths holds validation and test episodes', () => {
    const scenario = checked(tether({ counts: { train: 48, validation: 16, test: 16 }, stratify: { parameters: ['/system/lengthM'] } }, { episodes: 80 }));
    const episodes = Array.from({ length: 80 }, (_, i) => sampleEpisode(scenario, i));
    const sorted = [...episodes].sort((a, b) => (a.labels['/system/lengthM'] as number) - (b.labels['/system/lengthM'] as number));
    for (let q = 0; q < 4; q++) {
      const quarter = sorted.slice(q * 20, q * 20 + 20);
      const count = (split: string): number => quarter.filter((e) => e.split === split).length;
      // Proportional shares 12 / 4 / 4 per quarter, within the bound.
      expect(Math.abs(count('train') - 12)).toBeLessThan(2);
      expect(Math.abs(count('validation') - 4)).toBeLessThan(2);
      expect(Math.abs(count('test') - 4)).toBeLessThan(2);
    }
  });

  it('refuses a stratifying parameter that is fixed or misspelt', () => {
    const fixed = checkScenarioValue(tether({ stratify: { parameters: ['/system/totalMassKg'] } }));
    expect(fixed.ok ? '' : fixed.problems[0].message).toContain('same value in every episode');
    const typo = checkScenarioValue(tether({ stratify: { parameters: ['/system/lenghtM'] } }));
    expect(typo.ok ? '' : typo.problems[0].message).toContain('did you mean "/system/lengthM"?');
  });
});

describe('dealing in exact numbers', () => {
  it('ends with exactly the counts and keeps every run of consecutive positions within 2 of its share', () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 60 }), { minLength: 1, maxLength: 4 }).filter((c) => c.some((x) => x > 0)), (counts) => {
        const total = counts.reduce((a, b) => a + b, 0);
        const dealt = dealInOrder(counts, total);
        for (let s = 0; s < counts.length; s++) if (dealt.filter((x) => x === s).length !== counts[s]) return false;
        for (let start = 0; start < total; start++) {
          const seen = new Array<number>(counts.length).fill(0);
          for (let end = start; end < total; end++) {
            seen[dealt[end]]++;
            const length = end - start + 1;
            for (let s = 0; s < counts.length; s++) if (Math.abs(seen[s] - (counts[s] * length) / total) >= 2) return false;
          }
        }
        return true;
      }),
      { numRuns: 150 },
    );
  });

  it('rounds fractions by largest remainders (Hamilton): 0.8/0.1/0.1 of 37 is 29/4/4, of 32 is 26/3/3', () => {
    // Worked by hand: quotas 29.6, 3.7, 3.7 → 29, 3, 3 and two left over, to the largest
    // remainders 0.7 and 0.7 (validation, test).
    expect(countsFromFractions([0.8, 0.1, 0.1], 37)).toEqual([29, 4, 4]);
    // 25.6, 3.2, 3.2 → 25, 3, 3 and one left: remainder 0.6 of train is largest.
    expect(countsFromFractions([0.8, 0.1, 0.1], 32)).toEqual([26, 3, 3]);
    expect(countsFromFractions([1, 0, 0], 5)).toEqual([5, 0, 0]);
  });
});
