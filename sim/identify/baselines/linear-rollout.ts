// Open-loop rollout of a fitted linear operator: from the recorded initial state and the
// recorded controls only, z_{t+1} = G·ω_t step after step, each prediction feeding the next.
// Delay rows before the start are z_0 (see linear-state.ts). Buffers are allocated once.
import { type LinearLayout,snapshotSize, stateSize, writeSnapshot } from './linear-state.ts';
import type { RolloutStart } from './rollout-start.ts';

export function linearRollout(
  layout: LinearLayout,
  operator: Float64Array,
  start: RolloutStart,
  out: { positionM: Float64Array; velocityMPerS: Float64Array },
): void {
  const n = stateSize(layout);
  const p = snapshotSize(layout);
  const width = 3 * layout.nodeCount;
  const states = new Float64Array((start.steps + 1) * n);
  // z_0 in the layout's form: relative positions start at zero.
  for (let i = 0; i < width; i++) {
    states[i] = layout.stateForm === 'relative' ? 0 : start.positionM[i];
    states[width + i] = start.velocityMPerS[i];
  }
  const stateAt = (j: number, target: Float64Array, offset: number): void => {
    target.set(states.subarray(j * n, (j + 1) * n), offset);
  };
  const column = new Float64Array(p);
  for (let t = 0; t < start.steps; t++) {
    writeSnapshot(layout, t, start.controls, stateAt, column);
    const next = (t + 1) * n;
    for (let r = 0; r < n; r++) {
      let sum = 0;
      const row = r * p;
      for (let c = 0; c < p; c++) sum += operator[row + c] * column[c];
      states[next + r] = sum;
    }
  }
  for (let t = 0; t <= start.steps; t++) {
    for (let i = 0; i < width; i++) {
      const z = states[t * n + i];
      out.positionM[t * width + i] = layout.stateForm === 'relative' ? start.positionM[i] + z : z;
      out.velocityMPerS[t * width + i] = states[t * n + width + i];
    }
  }
  // Row 0 is the recorded initial state exactly, as the predictions contract asks.
  out.positionM.set(start.positionM.subarray(0, width), 0);
  out.velocityMPerS.set(start.velocityMPerS.subarray(0, width), 0);
}
