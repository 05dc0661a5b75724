// Latin hypercube stratification (McKay, Beckman & Conover 1979, Technometrics 21, 239-245):
// with n points, each of the n equal strata [k/n, (k+1)/n) of every coordinate holds exactly
// one point. Checked as a property over seeds, sizes and sub-streams, together with the
// permutation it rests on being a bijection of [0, n) (Black & Rogaway 2002, cycle walking).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { IndexPermutation } from '../sim/design/index-permutation.ts';
import { LatinHypercubeCoordinate } from '../sim/design/latin-hypercube.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';

describe('Latin hypercube coordinates', () => {
  it('put exactly one point in each of the n strata of every coordinate (McKay, Beckman & Conover 1979)', () => {
    fc.assert(
      fc.property(fc.nat({ max: 2 ** 50 }), fc.integer({ min: 1, max: 700 }), fc.array(fc.integer({ min: 0, max: 0xffffff }), { minLength: 1, maxLength: 4 }), (seed, n, subStreams) => {
        for (const sub of subStreams) {
          const column = new LatinHypercubeCoordinate(seed, n, sub);
          const seen = new Uint8Array(n);
          for (let i = 0; i < n; i++) {
            const u = column.coordinate(i);
            if (!(u >= 0 && u < 1)) return false;
            const stratum = Math.floor(u * n);
            if (stratum !== column.stratum(i) || seen[stratum]) return false;
            seen[stratum] = 1;
          }
        }
        return true;
      }),
      { numRuns: 80 },
    );
  });

  it('hold the stratification for a size whose strata edges are not exact in binary (n = 3 × 10^5)', () => {
    const n = 300_000;
    const column = new LatinHypercubeCoordinate('18446744073709551615', n, 12345);
    const seen = new Uint8Array(n);
    for (let i = 0; i < n; i++) seen[Math.floor(column.coordinate(i) * n)]++;
    expect(seen.every((count) => count === 1)).toBe(true);
  });

  it('give episode i the same point whatever else is computed, and different parameters unrelated strata', () => {
    const a = new LatinHypercubeCoordinate(7, 1000, 1);
    const b = new LatinHypercubeCoordinate(7, 1000, 2);
    const late = a.coordinate(999);
    const again = new LatinHypercubeCoordinate(7, 1000, 1);
    for (let i = 0; i < 999; i++) again.coordinate(i);
    expect(again.coordinate(999)).toBe(late);
    // Two independent random permutations of 1000 agree in about one place (a derangement-count
    // fact: the number of fixed points of a random permutation is close to Poisson(1); common
    // practice, no source). Equal strata in more than 10 places would mean the keys are shared.
    let same = 0;
    for (let i = 0; i < 1000; i++) if (a.stratum(i) === b.stratum(i)) same++;
    expect(same).toBeLessThan(10);
  });
});

describe('keyed index permutation', () => {
  it('is a bijection of [0, n) for every size and key', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.nat({ max: 2 ** 40 }), (n, seed) => {
        const p = new IndexPermutation(n, new RandomStream(seed, 0, StreamPurpose.designSetup, 3));
        const seen = new Uint8Array(n);
        for (let i = 0; i < n; i++) {
          const j = p.map(i);
          if (!(j >= 0 && j < n) || seen[j]) return false;
          seen[j] = 1;
        }
        return true;
      }),
      { numRuns: 100 },
    );
  });

  it('maps an index of a sweep of 10^8 episodes without a table', () => {
    const p = new IndexPermutation(100_000_000, new RandomStream(1, 0, StreamPurpose.designSetup, 0));
    const j = p.map(99_999_999);
    expect(Number.isInteger(j) && j >= 0 && j < 100_000_000).toBe(true);
    expect(p.map(99_999_999)).toBe(j);
  });
});
