// RandomStream: its words are Philox4x32-10 blocks with counter (episode low, episode high,
// purpose word, block) under the seed's key, checked against Random123 known-answer lines
// (girving/random123-manual, examples/kat_vectors); its uniforms, normals and integers are
// checked with Debian's SciPy (Kolmogorov–Smirnov and chi-square tests, fixed seeds).
import { describe, expect, it } from 'vitest';

import { masterSeedKey, RandomStream, StreamPurpose, SUB_STREAM_LIMIT } from '../sim/random/random-stream.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

function draws(stream: RandomStream, count: number): string[] {
  return Array.from({ length: count }, () => stream.nextUint32().toString(16).padStart(8, '0'));
}

describe('RandomStream words are Philox4x32-10 blocks (Random123 kat_vectors)', () => {
  it('seed 1, episode 1, purpose 0 gives the line ctr 00000001 0 0 0, key 00000001 0', () => {
    const stream = new RandomStream(1, 1, StreamPurpose.parameters);
    expect(draws(stream, 4).join(' ')).toBe('ac08141b dfc5ccbe 79c07a47 a7f66093');
  });

  it('the second block of seed 1, episode 0 is the line ctr 0 0 0 00000001, key 00000001 0', () => {
    const stream = new RandomStream(1, 0, StreamPurpose.parameters);
    expect(draws(stream, 8).slice(4).join(' ')).toBe('127bee41 1e047488 48842b20 0a393496');
  });

  it('sub-stream 1 of purpose 0 is the line ctr 0 0 00000001 0, key 00000001 0', () => {
    const stream = new RandomStream(1, 0, StreamPurpose.parameters, 1);
    expect(draws(stream, 4).join(' ')).toBe('07071c12 428264b6 3909104b 6da2bda2');
  });

  it('episode 2^32 sets the counter high word: line ctr 0 00000001 0 0, key 00000001 0', () => {
    const stream = new RandomStream(1, 2 ** 32, StreamPurpose.parameters);
    expect(draws(stream, 4).join(' ')).toBe('833ff8dc 225c963c 232b88b3 0b334b07');
  });

  it('seed 2^32 as number or decimal string is key (0, 1): line ctr 00000001 0 0 0, key 0 00000001', () => {
    for (const seed of [2 ** 32, '4294967296']) {
      const stream = new RandomStream(seed, 1, StreamPurpose.parameters);
      expect(draws(stream, 4).join(' ')).toBe('ccf3076a 6306f434 bea71965 d96fe48a');
    }
  });
});

describe('masterSeedKey splits seeds into little-endian 32-bit words (checked with BigInt)', () => {
  it('splits the largest safe integer and 64-bit decimal strings', () => {
    const cases: [number | string, bigint][] = [
      [0, 0n],
      [Number.MAX_SAFE_INTEGER, 2n ** 53n - 1n],
      ['9007199254740993', 2n ** 53n + 1n],
      ['18446744073709551615', 2n ** 64n - 1n],
      ['12345678901234567890', 12345678901234567890n],
    ];
    for (const [seed, wide] of cases) {
      expect(Array.from(masterSeedKey(seed))).toEqual([Number(wide & 0xffffffffn), Number(wide >> 32n)]);
    }
  });

  it('rejects seeds outside the accepted forms with a message saying what is accepted', () => {
    for (const seed of [-1, 1.5, 2 ** 53, Number.NaN, '18446744073709551616', '007', ' 1', '-3', '1e3', '']) {
      expect(() => masterSeedKey(seed)).toThrow(/masterSeed .* (whole number|decimal string)/);
    }
  });

  it('rejects unknown purposes, negative episodes and out-of-range sub-streams', () => {
    expect(() => new RandomStream(1, -1, StreamPurpose.shape)).toThrow(/episodeIndex/);
    expect(() => new RandomStream(1, 0, 99 as never)).toThrow(/purpose 99/);
    expect(() => new RandomStream(1, 0, StreamPurpose.shape, SUB_STREAM_LIMIT)).toThrow(/subStream/);
  });
});

describe('draws depend only on (seed, episode, purpose, sub-stream, draw index)', () => {
  it('creation order and interleaved use of other streams change nothing', () => {
    const alone = new RandomStream('987654321987654321', 17, StreamPurpose.controls, 2);
    const expected = Array.from({ length: 50 }, () => alone.nextFloat64());

    const other = new RandomStream('987654321987654321', 17, StreamPurpose.controls, 3);
    const sibling = new RandomStream('987654321987654321', 17, StreamPurpose.parameters, 2);
    const late = new RandomStream('987654321987654321', 17, StreamPurpose.controls, 2);
    const interleaved: number[] = [];
    for (let i = 0; i < 50; i++) {
      other.nextNormal();
      sibling.nextUint32();
      interleaved.push(late.nextFloat64());
    }
    expect(interleaved).toEqual(expected);
  });

  it('different purposes, sub-streams, episodes and seeds give different words', () => {
    const first = (seed: number, episode: number, purpose: (typeof StreamPurpose)[keyof typeof StreamPurpose], sub = 0): string =>
      draws(new RandomStream(seed, episode, purpose, sub), 4).join(' ');
    const variants = new Set([
      first(5, 3, StreamPurpose.parameters),
      first(5, 3, StreamPurpose.shape),
      first(5, 3, StreamPurpose.initialState),
      first(5, 3, StreamPurpose.controls),
      first(5, 3, StreamPurpose.split),
      first(5, 3, StreamPurpose.preview),
      first(5, 3, StreamPurpose.controls, 1),
      first(5, 4, StreamPurpose.controls),
      first(6, 3, StreamPurpose.controls),
    ]);
    expect(variants.size).toBe(9);
  });

  it('counts words: a float takes two, a Box–Muller pair of normals takes two floats', () => {
    const stream = new RandomStream(3, 0, StreamPurpose.preview);
    stream.nextFloat64();
    expect(stream.uint32DrawCount).toBe(2);
    stream.nextNormal();
    expect(stream.uint32DrawCount).toBe(6);
    stream.nextNormal(); // the cached second value of the pair
    expect(stream.uint32DrawCount).toBe(6);
    stream.nextNormal();
    expect(stream.uint32DrawCount).toBe(10);
  });
});

describe('nextFloat64 and nextIntInclusive edge behaviour (definition, common practice, no source)', () => {
  it('floats are multiples of 2^-53 in [0, 1)', () => {
    const stream = new RandomStream(11, 0, StreamPurpose.preview);
    for (let i = 0; i < 10_000; i++) {
      const u = stream.nextFloat64();
      expect(u >= 0 && u < 1).toBe(true);
      expect(Number.isInteger(u * 2 ** 53)).toBe(true);
    }
  });

  it('integers stay within [min, max], hit both ends, and a one-value range returns it', () => {
    const stream = new RandomStream(12, 0, StreamPurpose.preview);
    const seen = new Set<number>();
    for (let i = 0; i < 2000; i++) {
      const k = stream.nextIntInclusive(-3, 3);
      expect(k >= -3 && k <= 3 && Number.isInteger(k)).toBe(true);
      seen.add(k);
    }
    expect(seen.size).toBe(7);
    expect(stream.nextIntInclusive(42, 42)).toBe(42);
    expect(() => stream.nextIntInclusive(3, 2)).toThrow(RangeError);
    expect(() => stream.nextIntInclusive(0, 2 ** 53)).toThrow(RangeError);
  });
});

describe('nextNormal moments (standard normal, textbook)', () => {
  it('nextNormal has mean 0 and variance 1 within 5 standard errors (standard normal: SE 1/sqrt(n) and sqrt(2/n))', () => {
    const stream = new RandomStream(77, 5, StreamPurpose.initialState);
    const n = 200_000;
    let sum = 0;
    let sumSquares = 0;
    for (let i = 0; i < n; i++) {
      const z = stream.nextNormal();
      sum += z;
      sumSquares += z * z;
    }
    const mean = sum / n;
    const variance = sumSquares / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(variance - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });
});

const python = referencePythonAvailability();

describe.runIf(python.available)('RandomStream statistics against SciPy (Debian /usr/bin/python3)', () => {
  const SAMPLE_COUNT = 20_000;

  it('nextFloat64 passes Kolmogorov–Smirnov against scipy.stats.uniform; nextNormal against scipy.stats.norm', () => {
    const uniforms = new RandomStream(2024, 0, StreamPurpose.preview);
    const normals = new RandomStream(2024, 1, StreamPurpose.preview);
    const u = Array.from({ length: SAMPLE_COUNT }, () => uniforms.nextFloat64());
    const z = Array.from({ length: SAMPLE_COUNT }, () => normals.nextNormal());
    const result = runReferencePython<{ pUniform: number; pNormal: number; pNormalAsUniform: number }>(
      `
import json, sys
from scipy import stats
d = json.load(sys.stdin)
print(json.dumps({
  "pUniform": float(stats.kstest(d["u"], stats.uniform().cdf).pvalue),
  "pNormal": float(stats.kstest(d["z"], stats.norm().cdf).pvalue),
  "pNormalAsUniform": float(stats.kstest(d["z"], stats.uniform().cdf).pvalue),
}))
`,
      { u, z },
    );
    expect(result.pUniform).toBeGreaterThan(1e-3);
    expect(result.pNormal).toBeGreaterThan(1e-3);
    // The test has power: normals are not uniform on [0, 1).
    expect(result.pNormalAsUniform).toBeLessThan(1e-10);
  });

  it('nextIntInclusive is uniform by scipy.stats.chisquare, also where a bare remainder would be biased', () => {
    const small = new RandomStream(31, 0, StreamPurpose.split);
    const smallCounts = new Array(7).fill(0);
    for (let i = 0; i < SAMPLE_COUNT; i++) smallCounts[small.nextIntInclusive(0, 6)]++;

    // A range of 3 * 2^30: taking u % range would make the lowest third twice as likely.
    const span = 3 * 2 ** 30;
    const wide = new RandomStream(32, 0, StreamPurpose.split);
    const naive = new RandomStream(32, 0, StreamPurpose.split);
    const wideCounts = [0, 0, 0];
    const naiveCounts = [0, 0, 0];
    for (let i = 0; i < SAMPLE_COUNT; i++) {
      wideCounts[Math.floor(wide.nextIntInclusive(0, span - 1) / 2 ** 30)]++;
      naiveCounts[Math.floor((naive.nextUint32() % span) / 2 ** 30)]++;
    }

    // More than 2^32 values: the 53-bit path, binned by its top 4 bits of 2^40.
    const huge = new RandomStream(33, 0, StreamPurpose.split);
    const hugeCounts = new Array(16).fill(0);
    for (let i = 0; i < SAMPLE_COUNT; i++) hugeCounts[Math.floor(huge.nextIntInclusive(0, 2 ** 40 - 1) / 2 ** 36)]++;

    const p = runReferencePython<number[]>(
      `
import json, sys
from scipy import stats
print(json.dumps([float(stats.chisquare(c).pvalue) for c in json.load(sys.stdin)]))
`,
      [smallCounts, wideCounts, hugeCounts, naiveCounts],
    );
    expect(p[0]).toBeGreaterThan(1e-3);
    expect(p[1]).toBeGreaterThan(1e-3);
    expect(p[2]).toBeGreaterThan(1e-3);
    // The same test catches the remainder bias it guards against.
    expect(p[3]).toBeLessThan(1e-10);
  });
});
