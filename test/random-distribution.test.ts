// Value specs: each distribution's samples against Debian SciPy (Kolmogorov–Smirnov for
// uniform, loguniform and truncnorm; chi-square for integer and weighted categorical), on fixed seeds
// so the p-values are fixed numbers, not flaky draws. The bounds, constancy and error rules
// are the spec format's own definition (common practice, no source).
import { describe, expect, it } from 'vitest';

import type { CategoricalSpec, NumericValueSpec, ValueSpec } from '../sim/random/distribution.ts';
import { isConstant, sampleValue, specBounds } from '../sim/random/distribution.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';
import { SpecError } from '../sim/random/spec-problem.ts';
import { findValueSpecProblems } from '../sim/random/value-spec-problems.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const SAMPLE_COUNT = 20_000;

function samples(spec: NumericValueSpec, seed: number): number[] {
  const stream = new RandomStream(seed, 0, StreamPurpose.parameters);
  return Array.from({ length: SAMPLE_COUNT }, () => sampleValue(spec, stream));
}

// Korrin Bay tank tether and fin quantities, plus standard-normal truncations that exercise
// every proposal of the truncated-normal sampler (around zero narrow/wide, tail uniform/exponential, lower tail).
const TRUNCATED_CASES: { name: string; spec: { kind: 'normal'; mean: number; std: number; min: number; max: number } }[] = [
  { name: 'tether Young’s modulus, Pa (wide, around the mean)', spec: { kind: 'normal', mean: 2.1e9, std: 3e8, min: 1.5e9, max: 3e9 } },
  { name: 'fin thickness, m (narrow, around the mean)', spec: { kind: 'normal', mean: 0.004, std: 0.001, min: 0.0035, max: 0.0055 } },
  { name: 'upper tail [2, 8] sd (exponential proposal)', spec: { kind: 'normal', mean: 0, std: 1, min: 2, max: 8 } },
  { name: 'upper tail [2, 2.3] sd (uniform proposal)', spec: { kind: 'normal', mean: 0, std: 1, min: 2, max: 2.3 } },
  { name: 'far tail [6, 6.5] sd', spec: { kind: 'normal', mean: 0, std: 1, min: 6, max: 6.5 } },
  { name: 'lower tail [-10, -3] sd (mirrored)', spec: { kind: 'normal', mean: 10, std: 1, min: 0, max: 7 } },
];

const python = referencePythonAvailability();

describe.runIf(python.available)('continuous value specs against scipy.stats (Kolmogorov–Smirnov, p > 1e-3)', () => {
  it('uniform, log-uniform and truncated normal match scipy.stats.uniform, loguniform and truncnorm', () => {
    const uniform = { kind: 'uniform', min: 0.2, max: 0.35 } as const; // tether segment length, m
    const logUniform = { kind: 'log-uniform', min: 1e4, max: 1e7 } as const; // fin Young's modulus, Pa
    const input = {
      uniform: { samples: samples(uniform, 1), min: uniform.min, max: uniform.max },
      logUniform: { samples: samples(logUniform, 2), min: logUniform.min, max: logUniform.max },
      truncated: TRUNCATED_CASES.map((c, i) => ({ samples: samples(c.spec, 10 + i), ...c.spec })),
    };
    const result = runReferencePython<{ uniform: number; logUniform: number; logUniformAsUniform: number; truncated: number[]; truncatedAsNormal: number }>(
      `
import json, sys
from scipy import stats
d = json.load(sys.stdin)
u, l = d["uniform"], d["logUniform"]
def trunc(c):
    a, b = (c["min"] - c["mean"]) / c["std"], (c["max"] - c["mean"]) / c["std"]
    return stats.truncnorm(a, b, loc=c["mean"], scale=c["std"])
t0 = d["truncated"][2]
print(json.dumps({
  "uniform": float(stats.kstest(u["samples"], stats.uniform(loc=u["min"], scale=u["max"] - u["min"]).cdf).pvalue),
  "logUniform": float(stats.kstest(l["samples"], stats.loguniform(l["min"], l["max"]).cdf).pvalue),
  "logUniformAsUniform": float(stats.kstest(l["samples"], stats.uniform(loc=l["min"], scale=l["max"] - l["min"]).cdf).pvalue),
  "truncated": [float(stats.kstest(c["samples"], trunc(c).cdf).pvalue) for c in d["truncated"]],
  "truncatedAsNormal": float(stats.kstest(t0["samples"], stats.norm(loc=t0["mean"], scale=t0["std"]).cdf).pvalue),
}))
`,
      input,
    );
    expect(result.uniform).toBeGreaterThan(1e-3);
    expect(result.logUniform).toBeGreaterThan(1e-3);
    TRUNCATED_CASES.forEach((c, i) => expect(result.truncated[i], c.name).toBeGreaterThan(1e-3));
    // The same tests reject the wrong distribution, so they can fail.
    expect(result.logUniformAsUniform).toBeLessThan(1e-10);
    expect(result.truncatedAsNormal).toBeLessThan(1e-10);
  });

  it('integer and weighted categorical match their expected counts by scipy.stats.chisquare (p > 1e-3)', () => {
    const segmentCount = { kind: 'integer', min: 8, max: 24 } as const;
    const integerCounts = new Array(17).fill(0);
    for (const k of samples(segmentCount, 3)) integerCounts[k - 8]++;

    const finStiffness: CategoricalSpec<number> = { kind: 'categorical', values: [0.5, 1, 2, 4], weights: [1, 2, 3, 4] };
    const choiceCounts = [0, 0, 0, 0];
    for (const v of samples(finStiffness, 4)) choiceCounts[finStiffness.values.indexOf(v)]++;

    const result = runReferencePython<{ integer: number; categorical: number; categoricalAsEqual: number }>(
      `
import json, sys
import numpy as np
from scipy import stats
d = json.load(sys.stdin)
w = np.array(d["weights"], dtype=float)
expected = w / w.sum() * sum(d["categorical"])
print(json.dumps({
  "integer": float(stats.chisquare(d["integer"]).pvalue),
  "categorical": float(stats.chisquare(d["categorical"], expected).pvalue),
  "categoricalAsEqual": float(stats.chisquare(d["categorical"]).pvalue),
}))
`,
      { integer: integerCounts, categorical: choiceCounts, weights: finStiffness.weights },
    );
    expect(result.integer).toBeGreaterThan(1e-3);
    expect(result.categorical).toBeGreaterThan(1e-3);
    expect(result.categoricalAsEqual).toBeLessThan(1e-10);
  });
});

describe('value spec rules (definition of the spec format, common practice, no source)', () => {
  it('a number is returned as is and draws nothing', () => {
    const stream = new RandomStream(1, 0, StreamPurpose.parameters);
    expect(sampleValue(0.012, stream)).toBe(0.012);
    expect(stream.uint32DrawCount).toBe(0);
  });

  it('every sample lies within specBounds, and the same stream position gives the same value', () => {
    const specs: NumericValueSpec[] = [
      { kind: 'uniform', min: -1, max: 1 },
      { kind: 'log-uniform', min: 1e-6, max: 1e-3 },
      { kind: 'normal', mean: 0.3, std: 0.5, min: 0, max: 0.4 },
      { kind: 'integer', min: -2, max: 2 },
      { kind: 'categorical', values: [3, 1, 2], weights: [0, 1, 1] },
    ];
    for (const spec of specs) {
      const { min, max } = specBounds(spec);
      const a = samples(spec, 9);
      expect(a.every((v) => v >= min && v <= max), JSON.stringify(spec)).toBe(true);
      expect(samples(spec, 9)).toEqual(a);
    }
    // A zero weight removes its value from the bounds.
    expect(specBounds({ kind: 'categorical', values: [3, 1, 2], weights: [0, 1, 1] })).toEqual({ min: 1, max: 2 });
    expect(specBounds({ kind: 'categorical', values: ['silicone-a', 'silicone-b'] })).toBeNull();
  });

  it('a categorical spec may hold any JSON values; zero-weight values are never drawn', () => {
    const spec: ValueSpec = { kind: 'categorical', values: ['silicone-a', { shore: 30 }, null], weights: [1, 0, 1] };
    const stream = new RandomStream(8, 0, StreamPurpose.shape);
    const seen = new Set<string>();
    for (let i = 0; i < 500; i++) seen.add(JSON.stringify(sampleValue(spec, stream)));
    expect([...seen].sort()).toEqual(['"silicone-a"', 'null']);
  });

  it('isConstant is true exactly when only one value can come out', () => {
    expect(isConstant(4)).toBe(true);
    expect(isConstant({ kind: 'uniform', min: 2, max: 2 })).toBe(true);
    expect(isConstant({ kind: 'uniform', min: 2, max: 3 })).toBe(false);
    expect(isConstant({ kind: 'categorical', values: ['a', 'b'], weights: [0, 5] })).toBe(true);
    expect(isConstant({ kind: 'categorical', values: [1, 1] })).toBe(true);
    expect(isConstant({ kind: 'categorical', values: [1, 2] })).toBe(false);
  });

  it('reports every problem with a JSON pointer and a fix, and sampling refuses the spec', () => {
    const pointer = '/parameters/tether/youngsModulusPa';
    const cases: [unknown, string, RegExp][] = [
      [{ kind: 'log-uniform', min: 0, max: 1e9 }, `${pointer}/min`, /min > 0/],
      [{ kind: 'uniform', min: 2, max: 1 }, `${pointer}/max`, /below min/],
      [{ kind: 'normal', mean: 1, std: 0, min: 0, max: 2 }, `${pointer}/std`, /above 0/],
      [{ kind: 'integer', min: 0.5, max: 3 }, `${pointer}/min`, /whole number/],
      [{ kind: 'uniform', min: 0, max: 1, mx: 2 }, `${pointer}/mx`, /not a member/],
      [{ kind: 'gaussian', mean: 1 }, `${pointer}/kind`, /unknown distribution kind/],
      [{ kind: 'categorical', values: [1, 2], weights: [1] }, `${pointer}/weights`, /one entry per value/],
      [{ kind: 'categorical', values: [1, 2], weights: [0, 0] }, `${pointer}/weights`, /all weights are zero/],
      [{ kind: 'categorical', values: [1, 2], weights: [1, -1] }, `${pointer}/weights/1`, /not a number >= 0/],
      ['2e9', pointer, /expected a number/],
    ];
    for (const [spec, where, message] of cases) {
      const problems = findValueSpecProblems(spec, pointer);
      expect(problems.length, JSON.stringify(spec)).toBeGreaterThan(0);
      expect(problems[0].pointer).toBe(where);
      expect(problems[0].message).toMatch(message);
      expect(problems[0].fix.length).toBeGreaterThan(0);
      const stream = new RandomStream(1, 0, StreamPurpose.parameters);
      expect(() => sampleValue(spec as ValueSpec, stream, pointer)).toThrow(SpecError);
    }
  });
});
