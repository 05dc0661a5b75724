// The unscrambled Sobol sequence in base 2 with 32-bit digits: dimension 1 is the van der Corput
// sequence, dimensions 2 and up are built from Joe & Kuo's primitive polynomials and initial
// direction numbers (sobol-direction-numbers.ts) by the recurrence of Bratley & Fox (1988),
// ACM TOMS Algorithm 659, as Joe & Kuo's notes on generating Sobol sequences write it. Points
// are taken in Gray-code order (Antonov & Saleev 1979), the order every published table uses,
// so point n is the XOR of the direction numbers of the set bits of n ^ (n >> 1). That makes any
// point computable on its own, which is what lets every shard find its episodes' points.
import { JOE_KUO_D6_LINES, SOBOL_MAX_DIMENSION } from './sobol-direction-numbers.ts';

/** Binary digits per coordinate; points are multiples of 2^-32. */
export const SOBOL_DIGITS = 32;
/** Points the 32-digit sequence has before it repeats. */
export const SOBOL_MAX_POINTS = 2 ** SOBOL_DIGITS;

const TWO_POW_32 = 4294967296;

let parsedLines: string[] | undefined;

/**
 * The 32 direction numbers v_1..v_32 of `dimension` (1-based), as 32-bit words with digit 1 in
 * the highest bit: v_k = m_k / 2^k.
 */
export function sobolDirectionNumbers(dimension: number): Uint32Array {
  if (!Number.isInteger(dimension) || dimension < 1 || dimension > SOBOL_MAX_DIMENSION) {
    throw new RangeError(`Sobol dimension ${dimension} is outside 1 to ${SOBOL_MAX_DIMENSION}, the dimensions of the Joe & Kuo table`);
  }
  const v = new Uint32Array(SOBOL_DIGITS);
  if (dimension === 1) {
    for (let k = 0; k < SOBOL_DIGITS; k++) v[k] = (1 << (31 - k)) >>> 0;
    return v;
  }
  parsedLines ??= JOE_KUO_D6_LINES.split('\n');
  const fields = parsedLines[dimension - 2].split(' ').map(Number);
  const s = fields[0];
  const a = fields[1];
  for (let k = 0; k < s && k < SOBOL_DIGITS; k++) v[k] = (fields[2 + k] << (31 - k)) >>> 0;
  for (let k = s; k < SOBOL_DIGITS; k++) {
    let word = (v[k - s] ^ (v[k - s] >>> s)) >>> 0;
    for (let i = 1; i < s; i++) {
      if ((a >>> (s - 1 - i)) & 1) word = (word ^ v[k - i]) >>> 0;
    }
    v[k] = word;
  }
  return v;
}

/** The 32-bit digits of point `index` (0-based, Gray-code order) for the given direction numbers. */
export function sobolDigits(directions: Uint32Array, index: number): number {
  if (!Number.isSafeInteger(index) || index < 0 || index >= SOBOL_MAX_POINTS) {
    throw new RangeError(`Sobol point index ${index} is outside 0 to 2^32 - 1`);
  }
  // ToInt32 keeps the low 32 bits, so the XOR is exact for every index below 2^32.
  let gray = (index ^ Math.floor(index / 2)) >>> 0;
  let word = 0;
  for (let k = 0; gray !== 0; k++, gray >>>= 1) if (gray & 1) word ^= directions[k];
  return word >>> 0;
}

/** Coordinate of point `index` in [0, 1), unscrambled. */
export function sobolCoordinate(directions: Uint32Array, index: number): number {
  return sobolDigits(directions, index) / TWO_POW_32;
}
