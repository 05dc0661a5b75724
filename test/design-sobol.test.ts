// The Sobol sequence of sim/design against outside references: Joe & Kuo's published direction
// numbers (new-joe-kuo-6.21201, the first rows of the file as published on their page, from
// memory), the well-known first points of the unscrambled sequence, SciPy's
// scipy.stats.qmc.Sobol(scramble=False) under /usr/bin/python3 on the same dimensions, and the
// net property that scrambling must keep: the first 2^m points of a scrambled Sobol sequence are
// a (0, m, 1)-net in every coordinate and a (0, m, 2)-net in the first two (Niederreiter 1992,
// "Random Number Generation and Quasi-Monte Carlo Methods", SIAM, ch. 4: Sobol's first two
// dimensions have t = 0; linear matrix scrambles and digital shifts keep t, Owen 2003).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { JOE_KUO_D6_LINES, SOBOL_MAX_DIMENSION } from '../sim/design/sobol-direction-numbers.ts';
import { scrambledSobolCoordinate, scrambledSobolDimension } from '../sim/design/sobol-scramble.ts';
import { sobolCoordinate, sobolDirectionNumbers } from '../sim/design/sobol-sequence.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

describe('Joe & Kuo direction numbers (new-joe-kuo-6.21201)', () => {
  it('the first rows match the published file: d, s, a, m_1..m_s (Joe & Kuo 2008 file, from memory)', () => {
    const published = [
      '2 1 0 1',
      '3 2 1 1 3',
      '4 3 1 1 3 1',
      '5 3 2 1 1 1',
      '6 4 1 1 1 3 3',
      '7 4 4 1 3 5 13',
      '8 5 2 1 1 5 5 17',
      '9 5 4 1 1 5 5 5',
      '10 5 7 1 1 7 11 19',
      '11 5 11 1 1 5 1 1',
      '12 5 13 1 1 1 3 11',
      '13 5 14 1 3 5 5 31',
      '14 6 1 1 3 3 9 7 49',
    ];
    const lines = JOE_KUO_D6_LINES.split('\n');
    expect(lines.length).toBe(SOBOL_MAX_DIMENSION - 1);
    published.forEach((row, k) => expect(`${k + 2} ${lines[k]}`).toBe(row));
  });

  it.skipIf(!referencePythonAvailability().available)('every row equals SciPy\'s copy of the file (scipy/stats/_sobol_direction_numbers.npz)', () => {
    const rows = runReferencePython<string[]>(
      `
import json, os, sys, numpy as np, scipy.stats
z = np.load(os.path.join(os.path.dirname(scipy.stats.__file__), '_sobol_direction_numbers.npz'))
n = json.load(sys.stdin)
poly, vinit = z['poly'], z['vinit']
out = []
for j in range(1, n):
    p = int(poly[j]); s = p.bit_length() - 1
    a = (p >> 1) & ((1 << (s - 1)) - 1)
    out.append(' '.join(str(v) for v in [s, a] + [int(m) for m in vinit[j, :s]]))
print(json.dumps(out))
`,
      SOBOL_MAX_DIMENSION,
    );
    expect(JOE_KUO_D6_LINES.split('\n')).toEqual(rows);
  });
});

describe('unscrambled Sobol points', () => {
  it('start 0, 1/2, 3/4, 1/4, 3/8, 7/8, 5/8, 1/8 in dimension 1 and 0, 1/2, 1/4, 3/4, 3/8, 7/8, 1/8, 5/8 in dimension 2 (Gray-code order, well known; Bratley & Fox 1988)', () => {
    const first = (d: number): number[] => Array.from({ length: 8 }, (_, i) => sobolCoordinate(sobolDirectionNumbers(d), i));
    expect(first(1)).toEqual([0, 0.5, 0.75, 0.25, 0.375, 0.875, 0.625, 0.125]);
    expect(first(2)).toEqual([0, 0.5, 0.25, 0.75, 0.375, 0.875, 0.125, 0.625]);
  });

  it.skipIf(!referencePythonAvailability().available)('equal scipy.stats.qmc.Sobol(d, scramble=False) exactly: 4096 points in 40 dimensions, and 64 points of dimensions 1100 to 1111', () => {
    const want = runReferencePython<{ low: number[][]; high: number[][] }>(
      `
import json, sys, warnings
from scipy.stats import qmc
warnings.simplefilter('ignore')
low = qmc.Sobol(40, scramble=False).random(4096)
high = qmc.Sobol(1111, scramble=False).random(64)[:, 1099:]
print(json.dumps({'low': low.tolist(), 'high': high.tolist()}))
`,
      null,
    );
    const low = Array.from({ length: 40 }, (_, d) => sobolDirectionNumbers(d + 1));
    const mismatches: string[] = [];
    want.low.forEach((row, i) => row.forEach((x, d) => {
      const got = sobolCoordinate(low[d], i);
      if (got !== x) mismatches.push(`point ${i} dim ${d + 1}: ${got} vs ${x}`);
    }));
    want.high.forEach((row, i) => row.forEach((x, k) => {
      const got = sobolCoordinate(sobolDirectionNumbers(1100 + k), i);
      if (got !== x) mismatches.push(`point ${i} dim ${1100 + k}: ${got} vs ${x}`);
    }));
    expect(mismatches.slice(0, 5)).toEqual([]);
  });

  it('point 2^31 + 5 is the XOR of the direction numbers of its Gray code (computed on its own, no earlier points)', () => {
    const v = sobolDirectionNumbers(3);
    const index = 2 ** 31 + 5;
    // Gray code of 2^31 + 5 = (2^31 + 5) ^ (2^30 + 2) = bits 31, 30, 2, 1, 0 set.
    const word = (v[31] ^ v[30] ^ v[2] ^ v[1] ^ v[0]) >>> 0;
    expect(sobolCoordinate(v, index)).toBe(word / 2 ** 32);
  });
});

describe('scrambled Sobol points (linear matrix scramble + digital shift from the seed)', () => {
  it('keep one point per interval of length 2^-m in every coordinate, and one per elementary box of volume 2^-m in dimensions 1 and 2', () => {
    fc.assert(
      fc.property(fc.nat({ max: 2 ** 40 }), fc.integer({ min: 1, max: 10 }), fc.integer({ min: 1, max: 30 }), (seed, m, dimension) => {
        const n = 2 ** m;
        const dims = [scrambledSobolDimension(seed, 1), scrambledSobolDimension(seed, 2), scrambledSobolDimension(seed, dimension)];
        const points = Array.from({ length: n }, (_, i) => dims.map((d) => scrambledSobolCoordinate(d, i)));
        for (let k = 0; k < 3; k++) {
          const cells = new Set(points.map((p) => Math.floor(p[k] * n)));
          if (cells.size !== n) return false;
        }
        for (let j = 0; j <= m; j++) {
          const boxes = new Set(points.map((p) => `${Math.floor(p[0] * 2 ** j)},${Math.floor(p[1] * 2 ** (m - j))}`));
          if (boxes.size !== n) return false;
        }
        return points.every((p) => p.every((x) => x >= 0 && x < 1));
      }),
      { numRuns: 60 },
    );
  });

  it('depend on the seed and are the same for the same seed', () => {
    const a = scrambledSobolDimension(42, 5);
    const b = scrambledSobolDimension(42, 5);
    const c = scrambledSobolDimension(43, 5);
    const pointsOf = (d: typeof a): number[] => Array.from({ length: 16 }, (_, i) => scrambledSobolCoordinate(d, i));
    expect(pointsOf(a)).toEqual(pointsOf(b));
    expect(pointsOf(a)).not.toEqual(pointsOf(c));
    // The scramble is not the identity: the unscrambled first point is 0 in every dimension.
    expect(pointsOf(a)[0]).not.toBe(0);
  });
});
