// The values a scenario's distributions take across 2,000 episodes, each drawn from the
// sub-stream of its own JSON pointer and episode, against SciPy's reference distributions
// (scipy.stats.kstest for continuous ones, scipy.stats.chisquare for whole numbers, and
// scipy.stats.spearmanr for independence between parameters), via Debian's /usr/bin/python3.
// With a fixed seed the p-values are fixed numbers; each must exceed 1e-3.
import { beforeAll, describe, expect, it } from 'vitest';

import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const EPISODES = 2000;

function sweep(): Scenario {
  const result = checkScenarioValue({
    formatVersion: 1,
    name: 'korrin-tether-distributions',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 10, max: 40 },
      lengthM: { kind: 'uniform', min: 2, max: 5 },
      totalMassKg: 0.8,
      axialStiffnessN: { kind: 'log-uniform', min: 1000, max: 20000 },
      dampingRatio: { kind: 'normal', mean: 0.1, std: 0.05, min: 0.02, max: 0.3 },
      diameterM: { kind: 'categorical', values: [0.008, 0.012, 0.02], weights: [1, 2, 1] },
      anchor: 'top-driven',
      drivenAxes: ['x'],
    },
    controls: { rampInS: 0, default: { kind: 'constant', value: { kind: 'uniform', min: 0.05, max: 0.15 } } },
    time: { recordIntervalS: 0.02, recordedSteps: 4 },
    episodes: EPISODES,
    seed: 20260817,
  });
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

const SCRIPT = `
import json, sys
import numpy as np
from scipy import stats
d = json.load(sys.stdin)
out = {}
out['uniform'] = stats.kstest(d['lengthM'], stats.uniform(loc=2, scale=3).cdf).pvalue
out['logUniform'] = stats.kstest(d['axialStiffnessN'], stats.loguniform(1000, 20000).cdf).pvalue
a, b = (0.02 - 0.1) / 0.05, (0.3 - 0.1) / 0.05
out['truncatedNormal'] = stats.kstest(d['dampingRatio'], stats.truncnorm(a, b, loc=0.1, scale=0.05).cdf).pvalue
out['control'] = stats.kstest(d['controlValue'], stats.uniform(loc=0.05, scale=0.1).cdf).pvalue
counts = np.bincount(np.array(d['partCount']) - 10, minlength=31)
out['integer'] = stats.chisquare(counts).pvalue
choice = [d['diameterM'].count(v) for v in (0.008, 0.012, 0.02)]
n = len(d['diameterM'])
out['categorical'] = stats.chisquare(choice, [n / 4, n / 2, n / 4]).pvalue
out['independence'] = stats.spearmanr(d['lengthM'], d['axialStiffnessN']).pvalue
out['controlIndependence'] = stats.spearmanr(d['lengthM'], d['controlValue']).pvalue
out['minMax'] = [min(d['lengthM']), max(d['lengthM']), min(d['partCount']), max(d['partCount'])]
print(json.dumps(out))
`;

const python = referencePythonAvailability();

describe.runIf(python.available)(`parameter distributions over ${EPISODES} episodes against scipy.stats (p > 1e-3)`, () => {
  let p: Record<string, number> & { minMax: number[] };
  beforeAll(() => {
    const scenario = sweep();
    const samples = { lengthM: [] as number[], axialStiffnessN: [] as number[], dampingRatio: [] as number[], partCount: [] as number[], diameterM: [] as number[], controlValue: [] as number[] };
    for (let i = 0; i < EPISODES; i++) {
      const e = sampleEpisode(scenario, i);
      samples.lengthM.push(e.labels['/system/lengthM'] as number);
      samples.axialStiffnessN.push(e.labels['/system/axialStiffnessN'] as number);
      samples.dampingRatio.push(e.labels['/system/dampingRatio'] as number);
      samples.partCount.push(e.labels['/system/partCount'] as number);
      samples.diameterM.push(e.labels['/system/diameterM'] as number);
      samples.controlValue.push(e.labels['/controls/top-offset-x/value'] as number);
      // The label is what drove the channel.
      expect(e.controls[0]).toBe(e.labels['/controls/top-offset-x/value']);
    }
    p = runReferencePython(SCRIPT, samples);
  });

  it('lengthM ~ uniform(2, 5): Kolmogorov–Smirnov', () => expect(p.uniform).toBeGreaterThan(1e-3));
  it('axialStiffnessN ~ log-uniform(1e3, 2e4): Kolmogorov–Smirnov against scipy.stats.loguniform', () => expect(p.logUniform).toBeGreaterThan(1e-3));
  it('dampingRatio ~ normal(0.1, 0.05) truncated to [0.02, 0.3]: Kolmogorov–Smirnov against scipy.stats.truncnorm', () => expect(p.truncatedNormal).toBeGreaterThan(1e-3));
  it('partCount ~ uniform whole numbers 10..40: chi-square', () => expect(p.integer).toBeGreaterThan(1e-3));
  it('diameterM ~ categorical with weights 1:2:1: chi-square', () => expect(p.categorical).toBeGreaterThan(1e-3));
  it('a control parameter ~ uniform(0.05, 0.15): Kolmogorov–Smirnov', () => expect(p.control).toBeGreaterThan(1e-3));
  it('parameters on different pointers are uncorrelated (Spearman rank correlation test)', () => {
    expect(p.independence).toBeGreaterThan(1e-3);
    expect(p.controlIndependence).toBeGreaterThan(1e-3);
  });
  it('stays inside the ranges and reaches both integer ends', () => {
    const [minLength, maxLength, minParts, maxParts] = p.minMax;
    expect(minLength).toBeGreaterThanOrEqual(2);
    expect(maxLength).toBeLessThan(5);
    expect([minParts, maxParts]).toEqual([10, 40]);
  });
});
