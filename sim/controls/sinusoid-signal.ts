// Deterministic oscillations: a fixed sinusoid, and a linear chirp whose instantaneous
// frequency runs from f0 at t = 0 to f1 at the end of the episode, T = stepCount * record
// interval (the last record is held for one interval like every other).

export function fillSinusoid(
  out: Float64Array,
  channel: number,
  channelCount: number,
  stepCount: number,
  recordIntervalS: number,
  amplitude: number,
  frequencyHz: number,
  phaseRad: number,
  offset: number,
): void {
  const angularRadPerS = 2 * Math.PI * frequencyHz;
  for (let t = 0; t < stepCount; t++) {
    out[t * channelCount + channel] = offset + amplitude * Math.sin(angularRadPerS * (t * recordIntervalS) + phaseRad);
  }
}

/** Phase 2 pi (f0 t + (f1 - f0) t^2 / (2 T)) + phaseRad, whose derivative / 2 pi is f0 + (f1 - f0) t / T. */
export function fillChirp(
  out: Float64Array,
  channel: number,
  channelCount: number,
  stepCount: number,
  recordIntervalS: number,
  amplitude: number,
  startFrequencyHz: number,
  endFrequencyHz: number,
  phaseRad: number,
  offset: number,
): void {
  const durationS = stepCount * recordIntervalS;
  const sweepHzPerS = (endFrequencyHz - startFrequencyHz) / durationS;
  for (let t = 0; t < stepCount; t++) {
    const timeS = t * recordIntervalS;
    const cycles = startFrequencyHz * timeS + 0.5 * sweepHzPerS * timeS * timeS;
    out[t * channelCount + channel] = offset + amplitude * Math.sin(2 * Math.PI * cycles + phaseRad);
  }
}
