// Turns one control vector into what the step reads: actuated rest lengths
// L0·(1 + Σ gain·u), per-handle external forces (N), and the targets of driven nodes (m).
// Runs once per control interval, outside the sub-step loop.
import type { Model } from './model.ts';

export function applyActuation(model: Model, controls: Float64Array): void {
  const rest = model.restLengthM;
  const base = model.baseRestLengthM;
  rest.set(base);
  const springs = model.actuationSpring;
  const channels = model.actuationChannel;
  const gains = model.actuationGain;
  const entries = model.actuationEntryCount;
  // Accumulate the relative change first, then scale, so shared springs sum their cells' shares.
  for (let e = 0; e < entries; e++) {
    const s = springs[e];
    rest[s] += base[s] * gains[e] * controls[channels[e]];
  }
}

export function writeHandleForces(model: Model, controls: Float64Array, handleForceN: Float64Array): void {
  const channels = model.handleForceChannel;
  for (let j = 0; j < channels.length; j++) {
    const c = channels[j];
    handleForceN[j] = c >= 0 ? controls[c] : 0;
  }
}

export function writeDrivenTargets(model: Model, controls: Float64Array, targetM: Float64Array): void {
  const origin = model.drivenOriginM;
  const channels = model.drivenOffsetChannel;
  for (let j = 0; j < channels.length; j++) {
    const c = channels[j];
    targetM[j] = origin[j] + (c >= 0 ? controls[c] : 0);
  }
}
