// The ramp-in window every control signal starts with, so an episode never begins with a jolt:
// a signal drawn at random is rarely 0 at t = 0, and a driven node or actuator would jump to
// it within the first record interval. The window is a raised cosine (a half Hann window,
// common practice, no source): w(t) = ½·(1 − cos(π·t/rampInS)) for t < rampInS, 1 afterwards.
// Its value and slope start at 0, so the windowed signal starts at 0 and leaves it smoothly;
// the window's own rate of change peaks at π/(2·rampInS) per second.

/** Default ramp-in length, s: long enough that the window's slope π/(2·0.5 s) ≈ 3 per second stays
 * near the rate of the demos' slowest drives. */
export const DEFAULT_RAMP_IN_S = 0.5;

/** The window at time tS, dimensionless in [0, 1]. */
export function rampInWindow(tS: number, rampInS: number): number {
  if (!(rampInS > 0) || tS >= rampInS) return 1;
  if (tS <= 0) return 0;
  return 0.5 * (1 - Math.cos((Math.PI * tS) / rampInS));
}

/** Multiplies channel `channel` of a step-major signal by the window at each record time. */
export function applyRampIn(out: Float64Array, channel: number, channelCount: number, stepCount: number, recordIntervalS: number, rampInS: number): void {
  if (!(rampInS > 0)) return;
  for (let t = 0; t < stepCount; t++) {
    const timeS = t * recordIntervalS;
    if (timeS >= rampInS) break;
    out[t * channelCount + channel] *= rampInWindow(timeS, rampInS);
  }
}
