// Signals that hold a level between switches (zero-order hold at the record rate): random
// levels every hold time, and a list of switching times with the level taken at each.
import type { RandomStream } from '../random/random-stream.ts';
import { recordIndexAtOrAfter } from './record-clock.ts';

/** Writes `value` to records [fromStep, toStep) of one channel of a step-major array. */
export function fillHeld(out: Float64Array, channel: number, channelCount: number, fromStep: number, toStep: number, value: number): void {
  for (let t = fromStep; t < toStep; t++) out[t * channelCount + channel] = value;
}

/**
 * levels[0] from the start, then levels[i + 1] from switchTimesS[i] on. Switch times must not
 * decrease; those at or past the end are never reached.
 */
export function fillSwitchedLevels(
  out: Float64Array,
  channel: number,
  channelCount: number,
  stepCount: number,
  recordIntervalS: number,
  switchTimesS: ArrayLike<number>,
  levels: ArrayLike<number>,
): void {
  let from = 0;
  for (let i = 0; i <= switchTimesS.length; i++) {
    const to = i < switchTimesS.length ? Math.min(stepCount, recordIndexAtOrAfter(switchTimesS[i], recordIntervalS)) : stepCount;
    fillHeld(out, channel, channelCount, from, to, levels[i]);
    from = Math.max(from, to);
  }
}

/** A new level uniform in [min, max) at every multiple of holdS (holdS >= record interval). */
export function fillPiecewiseConstant(
  out: Float64Array,
  channel: number,
  channelCount: number,
  stepCount: number,
  recordIntervalS: number,
  holdS: number,
  min: number,
  max: number,
  stream: RandomStream,
): number {
  if (!(holdS >= recordIntervalS)) {
    // Shorter holds would draw levels no record shows; zero would never finish.
    throw new RangeError(`holdS ${holdS} s must be at least the record interval ${recordIntervalS} s`);
  }
  let from = 0;
  let holdIndex = 0;
  while (from < stepCount) {
    holdIndex++;
    const to = Math.min(stepCount, recordIndexAtOrAfter(holdIndex * holdS, recordIntervalS));
    fillHeld(out, channel, channelCount, from, to, min + (max - min) * stream.nextFloat64());
    from = to;
  }
  return holdIndex;
}
