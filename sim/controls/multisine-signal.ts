// Band-limited noise as a random-phase multisine: equal sinusoids on the grid k * cutoff / n
// (k = 1..n) with independent uniform phases. Every component lies at or below the cutoff, and
// with amplitude std * sqrt(2 / n) the variance over phases is exactly std^2 at every instant.
import type { RandomStream } from '../random/random-stream.ts';

export interface Multisine {
  componentAmplitude: number;
  frequenciesHz: Float64Array;
  phasesRad: Float64Array;
}

/** Draws the phases of an n-component multisine (n uniforms from the stream, in order). */
export function drawMultisine(cutoffHz: number, std: number, componentCount: number, stream: RandomStream): Multisine {
  const frequenciesHz = new Float64Array(componentCount);
  const phasesRad = new Float64Array(componentCount);
  for (let k = 0; k < componentCount; k++) {
    frequenciesHz[k] = ((k + 1) * cutoffHz) / componentCount;
    phasesRad[k] = 2 * Math.PI * stream.nextFloat64();
  }
  return { componentAmplitude: std * Math.sqrt(2 / componentCount), frequenciesHz, phasesRad };
}

export function fillMultisine(out: Float64Array, channel: number, channelCount: number, stepCount: number, recordIntervalS: number, multisine: Multisine): void {
  const amplitude = multisine.componentAmplitude;
  const frequenciesHz = multisine.frequenciesHz;
  const phasesRad = multisine.phasesRad;
  const count = frequenciesHz.length;
  for (let t = 0; t < stepCount; t++) {
    const timeS = t * recordIntervalS;
    let sum = 0;
    for (let k = 0; k < count; k++) sum += Math.sin(2 * Math.PI * frequenciesHz[k] * timeS + phasesRad[k]);
    out[t * channelCount + channel] = amplitude * sum;
  }
}
