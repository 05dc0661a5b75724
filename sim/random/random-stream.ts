// A reproducible stream of random numbers for one purpose of one episode. Every draw is a pure
// function of (master seed, episode index, purpose, sub-stream, draw index): Philox4x32-10 keyed
// by the seed, with the counter (episode low word, episode high word, purpose word, block index).
// Separate purposes never share counters, so adding a sampled parameter to a scenario leaves the
// controls, shapes and splits of every episode exactly as they were.
import { philox4x32 } from './philox4x32.ts';

/**
 * The named sub-streams of an episode. The ids are part of the dataset format: a recorded seed
 * file regenerates the same data only while they stay fixed, so new purposes get new ids.
 */
export const StreamPurpose = {
  parameters: 0,
  shape: 1,
  initialState: 2,
  controls: 3,
  split: 4,
  preview: 5,
  /** Sensor noise and dropouts of the observed arrays (sub-streams in sim/scenario/parameter-streams.ts). */
  observation: 6,
  /** Per-episode draws of a design, e.g. a Latin hypercube point's place inside its stratum (sub-stream: the parameter's). */
  designPoint: 7,
  /** Draws shared by every episode of a design: Sobol scrambles, stratum permutations (episode index 0). */
  designSetup: 8,
  /** Which episodes get numerical-error reruns (Richardson). */
  numerics: 9,
} as const;

export type StreamPurposeName = keyof typeof StreamPurpose;
export type StreamPurposeId = (typeof StreamPurpose)[StreamPurposeName];

/** Sub-streams per purpose (e.g. one per control channel): the low 24 bits of the purpose word. */
export const SUB_STREAM_LIMIT = 0x1000000;

const TWO_POW_26 = 67108864;
const TWO_POW_32 = 4294967296;
const TWO_POW_53 = 9007199254740992;
const UINT64_MAX = 18446744073709551615n;
const BLOCK_LIMIT = TWO_POW_32;
const purposeIds: readonly number[] = Object.values(StreamPurpose);

/** The seed as the generator's two key words; throws a message naming the accepted forms. */
export function masterSeedKey(masterSeed: number | string): Uint32Array {
  const key = new Uint32Array(2);
  if (typeof masterSeed === 'number') {
    if (!Number.isSafeInteger(masterSeed) || masterSeed < 0) {
      throw new RangeError(
        `masterSeed ${masterSeed} is not a whole number from 0 to 9007199254740991 (2^53 - 1); ` +
          'use such a number, or a decimal string for seeds up to 18446744073709551615 (2^64 - 1)',
      );
    }
    key[0] = masterSeed % TWO_POW_32;
    key[1] = Math.floor(masterSeed / TWO_POW_32);
    return key;
  }
  if (typeof masterSeed !== 'string' || !/^(0|[1-9][0-9]*)$/.test(masterSeed) || BigInt(masterSeed) > UINT64_MAX) {
    throw new RangeError(
      `masterSeed ${JSON.stringify(masterSeed)} is not a decimal string of a whole number from 0 to ` +
        '18446744073709551615 (2^64 - 1) without sign, spaces or leading zeros; write it like "42"',
    );
  }
  const wide = BigInt(masterSeed);
  key[0] = Number(wide & 0xffffffffn);
  key[1] = Number(wide >> 32n);
  return key;
}

export class RandomStream {
  readonly episodeIndex: number;
  readonly purpose: StreamPurposeId;
  readonly subStream: number;
  private readonly key: Uint32Array;
  private readonly counter = new Uint32Array(4);
  private readonly block = new Uint32Array(4);
  private wordInBlock = 4;
  private nextBlock = 0;
  private spareNormal = 0;
  private hasSpareNormal = false;

  constructor(masterSeed: number | string, episodeIndex: number, purpose: StreamPurposeId, subStream = 0) {
    this.key = masterSeedKey(masterSeed);
    if (!Number.isSafeInteger(episodeIndex) || episodeIndex < 0) {
      throw new RangeError(`episodeIndex ${episodeIndex} is not a whole number from 0 to 2^53 - 1`);
    }
    if (!purposeIds.includes(purpose)) {
      throw new RangeError(`purpose ${purpose} is not one of the StreamPurpose ids ${purposeIds.join(', ')}`);
    }
    if (!Number.isInteger(subStream) || subStream < 0 || subStream >= SUB_STREAM_LIMIT) {
      throw new RangeError(`subStream ${subStream} is not a whole number from 0 to ${SUB_STREAM_LIMIT - 1}`);
    }
    this.episodeIndex = episodeIndex;
    this.purpose = purpose;
    this.subStream = subStream;
    this.counter[0] = episodeIndex % TWO_POW_32;
    this.counter[1] = Math.floor(episodeIndex / TWO_POW_32);
    this.counter[2] = purpose * SUB_STREAM_LIMIT + subStream;
  }

  /** How many 32-bit words this stream has handed out so far (each float takes two). */
  get uint32DrawCount(): number {
    return this.nextBlock * 4 - (4 - this.wordInBlock);
  }

  nextUint32(): number {
    if (this.wordInBlock === 4) this.refill();
    return this.block[this.wordInBlock++];
  }

  /** Uniform on [0, 1) with all 53 mantissa bits random (27 + 26 bits of two words). */
  nextFloat64(): number {
    return this.nextUint53() / TWO_POW_53;
  }

  /**
   * Standard normal by the Box–Muller transform. Each pair of uniforms gives two normals; the
   * second is kept for the next call so that the stream's position after n calls is fixed.
   * ECMAScript leaves the last bit of log, sin and cos to the engine; V8 (Node and Chromium)
   * uses one fdlibm port on every platform, so normals agree wherever Pliant runs.
   */
  nextNormal(): number {
    if (this.hasSpareNormal) {
      this.hasSpareNormal = false;
      return this.spareNormal;
    }
    // 1 - u lies in (0, 1], so the logarithm is finite.
    const radius = Math.sqrt(-2 * Math.log(1 - this.nextFloat64()));
    const angleRad = 2 * Math.PI * this.nextFloat64();
    this.spareNormal = radius * Math.sin(angleRad);
    this.hasSpareNormal = true;
    return radius * Math.cos(angleRad);
  }

  /**
   * Uniform integer in [min, max]. Draws outside the largest multiple of the range are rejected
   * and redrawn, because taking a remainder alone would favour the small values.
   */
  nextIntInclusive(min: number, max: number): number {
    if (!Number.isSafeInteger(min) || !Number.isSafeInteger(max) || max < min || max - min >= TWO_POW_53) {
      throw new RangeError(`nextIntInclusive(${min}, ${max}) needs whole numbers min <= max spanning at most 2^53 values`);
    }
    const span = max - min + 1;
    if (span <= TWO_POW_32) {
      const limit = Math.floor(TWO_POW_32 / span) * span;
      let draw = this.nextUint32();
      while (draw >= limit) draw = this.nextUint32();
      return min + (draw % span);
    }
    const limit = Math.floor(TWO_POW_53 / span) * span;
    let draw = this.nextUint53();
    while (draw >= limit) draw = this.nextUint53();
    return min + (draw % span);
  }

  private nextUint53(): number {
    const high = this.nextUint32() >>> 5;
    const low = this.nextUint32() >>> 6;
    return high * TWO_POW_26 + low;
  }

  private refill(): void {
    if (this.nextBlock >= BLOCK_LIMIT) {
      throw new RangeError('random stream exhausted after 2^34 draws; split the work over more sub-streams');
    }
    this.counter[3] = this.nextBlock;
    philox4x32(this.block, this.counter, this.key);
    this.nextBlock++;
    this.wordInBlock = 0;
  }
}
