// A keyed permutation of the whole numbers 0 to n - 1 that maps any one of them on its own, in
// constant time and memory: a balanced Feistel network on the smallest even number of bits that
// covers n, walked along its cycle until the value falls below n (Black & Rogaway 2002, "Ciphers
// with arbitrary finite domains", CT-RSA, LNCS 2271; from memory). A Feistel network is a
// bijection whatever its round function, and cycle walking restricts a bijection of a larger set
// to a bijection of [0, n). This is what lets a Latin hypercube of 10^8 episodes give episode i
// its stratum without building a table of 10^8 entries.
import type { RandomStream } from '../random/random-stream.ts';

const ROUNDS = 6;

export class IndexPermutation {
  readonly size: number;
  private readonly halfBits: number;
  private readonly halfMask: number;
  private readonly roundKeys = new Uint32Array(ROUNDS);

  /** `size` at most 2^52; the round keys are the next six words of `keys`. */
  constructor(size: number, keys: RandomStream) {
    if (!Number.isSafeInteger(size) || size < 1 || size > 2 ** 52) throw new RangeError(`permutation size ${size} is not a whole number from 1 to 2^52`);
    this.size = size;
    let bits = 2;
    while (2 ** bits < size) bits += 2;
    this.halfBits = bits / 2;
    this.halfMask = 2 ** this.halfBits - 1;
    for (let r = 0; r < ROUNDS; r++) this.roundKeys[r] = keys.nextUint32();
  }

  /** The image of `index` (0 to size - 1). */
  map(index: number): number {
    if (!Number.isSafeInteger(index) || index < 0 || index >= this.size) throw new RangeError(`index ${index} is outside 0 to ${this.size - 1}`);
    let value = index;
    do value = this.feistel(value);
    while (value >= this.size);
    return value;
  }

  private feistel(value: number): number {
    const scale = 2 ** this.halfBits;
    let left = Math.floor(value / scale);
    let right = value % scale;
    for (let r = 0; r < ROUNDS; r++) {
      const next = (left ^ this.round(right, this.roundKeys[r])) & this.halfMask;
      left = right;
      right = next >>> 0;
    }
    return left * scale + right;
  }

  // A 32-bit integer mix (the finaliser of MurmurHash3, Appleby; from memory): any function would
  // keep the bijection, a well-mixing one makes the strata of different parameters unrelated.
  private round(half: number, key: number): number {
    let h = (half ^ key) >>> 0;
    h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
    h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
    return (h ^ (h >>> 16)) >>> 0;
  }
}
