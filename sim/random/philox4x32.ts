// Philox4x32-10, the counter-based generator of Salmon, Moraes, Dror & Shaw (2011), "Parallel
// random numbers: as easy as 1, 2, 3", SC'11. A pure function of (counter, key): any draw of any
// episode can be recomputed on its own, which is what lets a dataset be regenerated in shards.
// Written with 32-bit integer arithmetic only, so it gives the same words in every JS engine.

// Multipliers and Weyl key increments fixed by the paper (the round function's constants).
const MULTIPLIER_0 = 0xd2511f53;
const MULTIPLIER_1 = 0xcd9e8d57;
const KEY_INCREMENT_0 = 0x9e3779b9;
const KEY_INCREMENT_1 = 0xbb67ae85;

/** Rounds of the generator named Philox4x32-10. */
export const PHILOX4X32_ROUNDS = 10;

/**
 * High 32 bits of the 64-bit product of two unsigned 32-bit integers. A double holds only 53
 * bits, so the product is taken in 16-bit halves whose partial sums stay below 2^53.
 */
export function mulHi32(a: number, b: number): number {
  const aLow = a & 0xffff;
  const aHigh = a >>> 16;
  const bLow = b & 0xffff;
  const bHigh = b >>> 16;
  const lowLow = aLow * bLow;
  const lowHigh = aLow * bHigh;
  const highLow = aHigh * bLow;
  const carry = ((lowLow >>> 16) + (lowHigh & 0xffff) + (highLow & 0xffff)) >>> 16;
  return (aHigh * bHigh + (lowHigh >>> 16) + (highLow >>> 16) + carry) >>> 0;
}

/**
 * Philox4x32 with a chosen number of rounds (7 and 10 have published known answers). Writes
 * four words to `out`, which may be the counter array itself.
 */
export function philox4x32Rounds(out: Uint32Array, counter: Uint32Array, key: Uint32Array, rounds: number): Uint32Array {
  let c0 = counter[0];
  let c1 = counter[1];
  let c2 = counter[2];
  let c3 = counter[3];
  let k0 = key[0];
  let k1 = key[1];
  for (let round = 0; round < rounds; round++) {
    if (round > 0) {
      k0 = (k0 + KEY_INCREMENT_0) >>> 0;
      k1 = (k1 + KEY_INCREMENT_1) >>> 0;
    }
    const high0 = mulHi32(MULTIPLIER_0, c0);
    const low0 = Math.imul(MULTIPLIER_0, c0) >>> 0;
    const high1 = mulHi32(MULTIPLIER_1, c2);
    const low1 = Math.imul(MULTIPLIER_1, c2) >>> 0;
    c0 = (high1 ^ c1 ^ k0) >>> 0;
    c1 = low1;
    c2 = (high0 ^ c3 ^ k1) >>> 0;
    c3 = low0;
  }
  out[0] = c0;
  out[1] = c1;
  out[2] = c2;
  out[3] = c3;
  return out;
}

/** Philox4x32-10 of a 4-word counter under a 2-word key, written into `out` (4 words). */
export function philox4x32(out: Uint32Array, counter: Uint32Array, key: Uint32Array): Uint32Array {
  return philox4x32Rounds(out, counter, key, PHILOX4X32_ROUNDS);
}
