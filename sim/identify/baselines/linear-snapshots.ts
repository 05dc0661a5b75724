// The snapshot matrices of the linear baseline over a group of equal-size episodes: one row
// per step t → t+1 of every episode (the transpose of the column layout Proctor, Brunton &
// Kutz 2016 write, which is the layout a least-squares solver takes): Ωᵀ holds the snapshot
// columns ω_t, Z'ᵀ the next states z_{t+1}. Steps before t = K (K delays) have no full delay
// history in the recording and are left out of the fit.
import type { EpisodeTrajectory } from './episode-trajectory.ts';
import { type LinearLayout,snapshotSize, stateSize, writeSnapshot, writeState } from './linear-state.ts';

export interface SnapshotMatrices {
  /** Snapshot count m. */
  rows: number;
  /** m × p, row-major: row j is ω of snapshot j. */
  inputsT: Float64Array;
  /** m × n, row-major: row j is z_{t+1} of snapshot j. */
  nextStatesT: Float64Array;
  snapshotSize: number;
  stateSize: number;
}

export function snapshotCount(layout: LinearLayout, episodes: readonly EpisodeTrajectory[]): number {
  return episodes.reduce((sum, e) => sum + Math.max(0, e.steps - layout.delays), 0);
}

export function buildSnapshots(layout: LinearLayout, episodes: readonly EpisodeTrajectory[]): SnapshotMatrices {
  const p = snapshotSize(layout);
  const n = stateSize(layout);
  const rows = snapshotCount(layout, episodes);
  const inputsT = new Float64Array(rows * p);
  const nextStatesT = new Float64Array(rows * n);
  const column = new Float64Array(p);
  let j = 0;
  for (const episode of episodes) {
    const stateAt = (t: number, out: Float64Array, offset: number): void => writeState(layout, episode.positionM, episode.velocityMPerS, t, out, offset);
    for (let t = layout.delays; t < episode.steps; t++) {
      writeSnapshot(layout, t, episode.controls, stateAt, column);
      inputsT.set(column, j * p);
      writeState(layout, episode.positionM, episode.velocityMPerS, t + 1, nextStatesT, j * n);
      j++;
    }
  }
  return { rows, inputsT, nextStatesT, snapshotSize: p, stateSize: n };
}
