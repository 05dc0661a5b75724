// Scrambling of the Sobol sequence: a random linear matrix scramble followed by a random digital
// shift (Matoušek 1998, "On the L2-discrepancy for anchored boxes", J. Complexity 14, 527-556;
// Owen 2003, "Variance with alternative scramblings of digital nets", ACM TOMACS 13, 363-378;
// from memory). Each dimension's direction numbers are multiplied by a random lower-triangular
// binary matrix with ones on the diagonal, then every point is XORed with a random word. Both keep
// the digital-net structure, so every 2^m consecutive points from index 0 still put exactly one
// point in each interval [k 2^-m, (k + 1) 2^-m) of every coordinate. The random bits come from
// the design-setup Philox stream of the master seed, sub-stream = dimension, so every shard and
// worker derives the same scrambled sequence from the seed alone.
import { RandomStream, StreamPurpose } from '../random/random-stream.ts';
import { SOBOL_DIGITS, sobolDigits, sobolDirectionNumbers } from './sobol-sequence.ts';

const TWO_POW_32 = 4294967296;

/** One scrambled dimension: scrambled direction numbers and the shift applied to every point. */
export interface ScrambledSobolDimension {
  directions: Uint32Array;
  shift: number;
}

function parity32(word: number): number {
  let x = word >>> 0;
  x ^= x >>> 16;
  x ^= x >>> 8;
  x ^= x >>> 4;
  x ^= x >>> 2;
  x ^= x >>> 1;
  return x & 1;
}

/** Dimension `dimension` (1-based) of the Sobol sequence scrambled under `seed`. */
export function scrambledSobolDimension(seed: number | string, dimension: number): ScrambledSobolDimension {
  const plain = sobolDirectionNumbers(dimension);
  const stream = new RandomStream(seed, 0, StreamPurpose.designSetup, dimension);
  // Row r of the matrix gives output digit r (digit 0 in the highest bit): random bits left of
  // the diagonal, a one on it, zeros right of it.
  const rows = new Uint32Array(SOBOL_DIGITS);
  for (let r = 0; r < SOBOL_DIGITS; r++) {
    const diagonalBit = 2 ** (31 - r);
    const left = r === 0 ? 0 : (stream.nextUint32() & ~(2 * diagonalBit - 1)) >>> 0;
    rows[r] = (left | diagonalBit) >>> 0;
  }
  const directions = new Uint32Array(SOBOL_DIGITS);
  for (let k = 0; k < SOBOL_DIGITS; k++) {
    let out = 0;
    for (let r = 0; r < SOBOL_DIGITS; r++) if (parity32(rows[r] & plain[k])) out |= 2 ** (31 - r);
    directions[k] = out >>> 0;
  }
  return { directions, shift: stream.nextUint32() };
}

/** Coordinate in [0, 1) of point `index` of a scrambled dimension. */
export function scrambledSobolCoordinate(dimension: ScrambledSobolDimension, index: number): number {
  return ((sobolDigits(dimension.directions, index) ^ dimension.shift) >>> 0) / TWO_POW_32;
}
