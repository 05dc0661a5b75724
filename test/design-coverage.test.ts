// The coverage measure and the inverse CDFs of sim/design and sim/random against SciPy under
// /usr/bin/python3: the squared centred L2 discrepancy of Hickernell (1998) as
// scipy.stats.qmc.discrepancy(sample, method="CD") returns it, on random, Latin hypercube and
// Sobol points; and each value spec's quantile function against scipy.stats (uniform.ppf,
// loguniform.ppf, truncnorm.ppf in moderate tails, scipy.special.ndtr with brentq in far ones)
// and the floor rule for integer and categorical values.
import { describe, expect, it } from 'vitest';

import { centredL2DiscrepancySquared } from '../sim/design/centred-discrepancy.ts';
import { expectedIndependentCentredDiscrepancySquared } from '../sim/design/design-coverage.ts';
import { LatinHypercubeCoordinate } from '../sim/design/latin-hypercube.ts';
import { scrambledSobolCoordinate, scrambledSobolDimension } from '../sim/design/sobol-scramble.ts';
import { truncatedStandardNormalQuantile, valueAtProbability } from '../sim/random/inverse-cdf.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

function pointSets(): { name: string; n: number; d: number; points: number[] }[] {
  const random = new RandomStream(5, 0, StreamPurpose.preview, 0);
  const sets: { name: string; n: number; d: number; points: number[] }[] = [];
  sets.push({ name: 'independent uniform, 200 × 3', n: 200, d: 3, points: Array.from({ length: 600 }, () => random.nextFloat64()) });
  const lhs = [0, 1, 2, 3, 4].map((s) => new LatinHypercubeCoordinate(9, 150, s));
  sets.push({ name: 'Latin hypercube, 150 × 5', n: 150, d: 5, points: Array.from({ length: 150 }, (_, i) => lhs.map((c) => c.coordinate(i))).flat() });
  const sobol = Array.from({ length: 8 }, (_, k) => scrambledSobolDimension(11, k + 1));
  sets.push({ name: 'scrambled Sobol, 256 × 8', n: 256, d: 8, points: Array.from({ length: 256 }, (_, i) => sobol.map((s) => scrambledSobolCoordinate(s, i))).flat() });
  sets.push({ name: 'one point', n: 1, d: 2, points: [0.25, 0.75] });
  return sets;
}

describe.skipIf(!python.available)('centred L2 discrepancy equals scipy.stats.qmc.discrepancy(method="CD")', () => {
  it('on random, Latin hypercube and Sobol point sets, to 1e-12 relative', () => {
    const sets = pointSets();
    const want = runReferencePython<number[]>(
      `
import json, sys, numpy as np
from scipy.stats import qmc
sets = json.load(sys.stdin)
print(json.dumps([float(qmc.discrepancy(np.array(s['points']).reshape(s['n'], s['d']), method='CD')) for s in sets]))
`,
      sets,
    );
    sets.forEach((s, k) => {
      const got = centredL2DiscrepancySquared(Float64Array.from(s.points), s.n, s.d);
      expect(Math.abs(got - want[k]) / want[k], s.name).toBeLessThan(1e-12);
    });
    // The designs spread better than independent draws would (Hickernell 1998; the reason they exist).
    const [independent, lhs, sobol] = sets.map((s) => centredL2DiscrepancySquared(Float64Array.from(s.points), s.n, s.d));
    expect(sobol).toBeLessThan(independent);
    expect(lhs).toBeLessThan(independent);
  });
});

describe('the mean the card compares with', () => {
  it('E[CD^2] = ((5/4)^d - (13/12)^d) / n for independent uniform points, within 4 standard errors of 3000 random sets (law of large numbers; the formula is derived in design-coverage.ts)', () => {
    const random = new RandomStream(8, 0, StreamPurpose.preview, 1);
    const n = 12;
    const d = 3;
    const values: number[] = [];
    for (let trial = 0; trial < 3000; trial++) values.push(centredL2DiscrepancySquared(Float64Array.from({ length: n * d }, () => random.nextFloat64()), n, d));
    const mean = values.reduce((a, b) => a + b, 0) / values.length;
    const sd = Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1));
    const want = expectedIndependentCentredDiscrepancySquared(n, d);
    expect(Math.abs(mean - want)).toBeLessThan((4 * sd) / Math.sqrt(values.length));
    // The formula is not vacuous: a wrong exponent would be far outside.
    expect(Math.abs(((5 / 4) ** d - (13 / 12) ** (d + 1)) / n - mean)).toBeGreaterThan((4 * sd) / Math.sqrt(values.length));
  });
});

describe('quantile functions of the value specs', () => {
  const probabilities = [0, 1e-12, 1e-6, 0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99, 0.999999, 1 - 2 ** -53];
  const truncations: [number, number][] = [
    [-2, 2],
    [-1, 3],
    [0, 1],
    [0.5, 6],
    [5, 9],
    [8, 8.5],
    [-30, -20],
    [-7, -0.25],
    [-40, 40],
  ];

  // truncnorm.ppf of SciPy 1.10 loses digits far in the left tail (its ppf and isf disagree by
  // 1e-6 at u = 1e-12 on [20, 30]), so the reference solves the defining equation with SciPy's
  // special functions instead: ndtr, which is accurate in relative terms in the lower tail (so
  // the upper tail is reached as ndtr(-z)), and brentq with a tolerance far below the one
  // asserted.
  it.skipIf(!python.available)('truncated standard normal matches the root of Phi(z) = Phi(a) + u (Phi(b) - Phi(a)) by scipy.special.ndtr and scipy.optimize.brentq, to 1e-11', () => {
    const want = runReferencePython<number[][]>(
      `
import json, sys
from scipy.special import ndtr
from scipy.optimize import brentq
cases = json.load(sys.stdin)
def quantile(u, a, b):
    if u == 0: return a
    if a >= 0:
        qa, qb = ndtr(-a), ndtr(-b)
        t = qa - u * (qa - qb) if u <= 0.5 else qb + (1 - u) * (qa - qb)
        return brentq(lambda z: t - ndtr(-z), a, b, xtol=1e-15, rtol=1e-15, maxiter=500)
    lo, mass = ndtr(a), ndtr(b) - ndtr(a)
    if u <= 0.5 or b <= 0:
        t = lo + u * mass if u <= 0.5 else ndtr(b) - (1 - u) * mass
        return brentq(lambda z: ndtr(z) - t, a, b, xtol=1e-15, rtol=1e-15, maxiter=500)
    top = ndtr(-b) + (1 - u) * mass
    return brentq(lambda z: top - ndtr(-z), a, b, xtol=1e-15, rtol=1e-15, maxiter=500)
print(json.dumps([[float(quantile(u, a, b)) for u in cases['u']] for a, b in cases['bounds']]))
`,
      { u: probabilities, bounds: truncations },
    );
    truncations.forEach(([a, b], k) => {
      probabilities.forEach((u, j) => {
        const got = truncatedStandardNormalQuantile(u, a, b);
        expect(Math.abs(got - want[k][j]), `u=${u} on [${a}, ${b}]`).toBeLessThan(1e-11 * Math.max(1, Math.abs(want[k][j])));
      });
    });
  });

  it.skipIf(!python.available)('uniform, log-uniform and normal specs match scipy.stats ppf in their own units', () => {
    const want = runReferencePython<{ uniform: number[]; log: number[]; normal: number[] }>(
      `
import json, sys
from scipy.stats import uniform, loguniform, truncnorm
u = json.load(sys.stdin)
print(json.dumps({
  'uniform': [float(uniform.ppf(p, loc=2, scale=3)) for p in u],
  'log': [float(loguniform.ppf(p, 1e3, 1e6)) for p in u],
  'normal': [float(truncnorm.ppf(p, (0.8 - 1.2) / 0.1, (1.5 - 1.2) / 0.1, loc=1.2, scale=0.1)) for p in u],
}))
`,
      probabilities,
    );
    probabilities.forEach((u, j) => {
      expect(valueAtProbability({ kind: 'uniform', min: 2, max: 5 }, u) as number).toBeCloseTo(want.uniform[j], 12);
      expect(Math.abs((valueAtProbability({ kind: 'log-uniform', min: 1e3, max: 1e6 }, u) as number) / want.log[j] - 1)).toBeLessThan(1e-12);
      expect(Math.abs((valueAtProbability({ kind: 'normal', mean: 1.2, std: 0.1, min: 0.8, max: 1.5 }, u) as number) - want.normal[j])).toBeLessThan(1e-12);
    });
  });

  it('integer and categorical values take the stratum u falls in: each of k equal strata gives one value (common practice, no source)', () => {
    const integers = Array.from({ length: 6 }, (_, k) => valueAtProbability({ kind: 'integer', min: 10, max: 15 }, (k + 0.5) / 6));
    expect(integers).toEqual([10, 11, 12, 13, 14, 15]);
    expect(valueAtProbability({ kind: 'integer', min: 10, max: 15 }, 1 - 2 ** -53)).toBe(15);
    // Weights 1, 0, 3: value a on [0, 1/4), b never, c on [1/4, 1).
    const weighted = { kind: 'categorical' as const, values: ['a', 'b', 'c'], weights: [1, 0, 3] };
    expect([0, 0.2499, 0.25, 0.9].map((u) => valueAtProbability(weighted, u))).toEqual(['a', 'a', 'c', 'c']);
    expect(() => valueAtProbability({ kind: 'uniform', min: 0, max: 1 }, 1)).toThrow(/outside \[0, 1\)/);
  });
});
