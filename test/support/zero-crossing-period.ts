// Period of an oscillating signal from its upward zero crossings, each located by linear
// interpolation between samples. Used to measure oscillator and normal-mode periods from a
// simulated trajectory.

/** Mean time between successive upward zero crossings, s; throws if fewer than two. */
export function zeroCrossingPeriodS(signal: ArrayLike<number>, sampleIntervalS: number): number {
  const crossings: number[] = [];
  for (let i = 1; i < signal.length; i++) {
    const before = signal[i - 1];
    const after = signal[i];
    if (before < 0 && after >= 0) {
      crossings.push((i - 1 + before / (before - after)) * sampleIntervalS);
    }
  }
  if (crossings.length < 2) {
    throw new Error(`need at least two upward zero crossings to measure a period, found ${crossings.length}`);
  }
  return (crossings[crossings.length - 1] - crossings[0]) / (crossings.length - 1);
}
