// Mean-reverting coloured noise: the Ornstein–Uhlenbeck process sampled at the record times by
// its exact update (Gillespie 1996, Phys. Rev. E 54, 2084), which has no time-step error, so the
// stationary variance and correlation hold at any record interval. It starts in the stationary
// distribution, so the episode has no warm-up transient.
import type { RandomStream } from '../random/random-stream.ts';

export function fillOrnsteinUhlenbeck(
  out: Float64Array,
  channel: number,
  channelCount: number,
  stepCount: number,
  recordIntervalS: number,
  meanValue: number,
  std: number,
  timeConstantS: number,
  stream: RandomStream,
): void {
  const decay = Math.exp(-recordIntervalS / timeConstantS);
  // sqrt(1 - decay^2) via expm1 stays accurate when the interval is tiny against the time constant.
  const kick = std * Math.sqrt(-Math.expm1((-2 * recordIntervalS) / timeConstantS));
  let deviation = 0;
  for (let t = 0; t < stepCount; t++) {
    deviation = t === 0 ? std * stream.nextNormal() : deviation * decay + kick * stream.nextNormal();
    out[t * channelCount + channel] = meanValue + deviation;
  }
}
