// The state vector of the linear baseline and its snapshot column. State z_t stacks the node
// positions and velocities of record row t (6N numbers: x, then v, node-major); in "relative"
// form positions are taken from the episode's own initial positions, so episodes of equal size
// but different rest shape share one operator. A snapshot column for the step t → t+1 holds
// the delay-embedded state [z_t; z_{t−1}; …; z_{t−K}], the controls u_t and, with the affine
// term, a constant 1 (gravity and rest lengths make the map affine, not linear). Rows before
// the start of the episode are padded with z_0, the only state a rollout knows there.

export type LinearStateForm = 'relative' | 'absolute';

export interface LinearLayout {
  nodeCount: number;
  channelCount: number;
  delays: number;
  affine: boolean;
  stateForm: LinearStateForm;
}

export function stateSize(layout: LinearLayout): number {
  return 6 * layout.nodeCount;
}

/** Length of a snapshot column: n(K+1) + C + (1 if affine). */
export function snapshotSize(layout: LinearLayout): number {
  return stateSize(layout) * (layout.delays + 1) + layout.channelCount + (layout.affine ? 1 : 0);
}

/** Writes z_t of a recording into out[offset…offset+6N). */
export function writeState(layout: LinearLayout, positionM: Float64Array, velocityMPerS: Float64Array, t: number, out: Float64Array, offset: number): void {
  const width = 3 * layout.nodeCount;
  const row = t * width;
  const relative = layout.stateForm === 'relative';
  for (let i = 0; i < width; i++) {
    out[offset + i] = relative ? positionM[row + i] - positionM[i] : positionM[row + i];
    out[offset + width + i] = velocityMPerS[row + i];
  }
}

/**
 * Writes the snapshot column of step t → t+1 into out, given a way to read past states:
 * `stateAt(j, out, offset)` writes z_j for 0 ≤ j ≤ t.
 */
export function writeSnapshot(
  layout: LinearLayout,
  t: number,
  controls: Float64Array,
  stateAt: (j: number, out: Float64Array, offset: number) => void,
  out: Float64Array,
): void {
  const n = stateSize(layout);
  for (let d = 0; d <= layout.delays; d++) stateAt(Math.max(0, t - d), out, d * n);
  const c0 = n * (layout.delays + 1);
  const channels = layout.channelCount;
  for (let c = 0; c < channels; c++) out[c0 + c] = controls[t * channels + c];
  if (layout.affine) out[c0 + channels] = 1;
}
