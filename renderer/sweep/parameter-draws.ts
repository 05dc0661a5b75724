// Draws of one distributed parameter for its histogram, made with the sampler itself: the same
// value spec, the same sampleValue and the same per-parameter random stream generate uses, for
// the sweep's first episodes. What the histogram shows is what those episodes will get.
import type { ValueSpec } from '../../sim/random/distribution.ts';
import { sampleValue } from '../../sim/random/distribution.ts';
import { parameterStream } from '../../sim/scenario/parameter-streams.ts';

export const HISTOGRAM_DRAWS = 1000;

/**
 * `count` draws for episodes 0 … count − 1, or null when the spec cannot be drawn from (the
 * inline problem says why) or yields something other than numbers.
 */
export function parameterDraws(spec: ValueSpec, pointer: string, masterSeed: number | string, count = HISTOGRAM_DRAWS): Float64Array | null {
  const draws = new Float64Array(count);
  try {
    for (let episode = 0; episode < count; episode++) {
      const value = sampleValue(spec, parameterStream(masterSeed, episode, pointer), pointer);
      if (typeof value !== 'number') return null;
      draws[episode] = value;
    }
  } catch {
    return null;
  }
  return draws;
}
