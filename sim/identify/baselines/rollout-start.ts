// What an open-loop rollout is given (the predictions contract): the recorded initial state,
// the controls of every interval and the episode's size and record interval. Nothing later in
// the recording is visible to a model.
import type { EpisodeTrajectory } from './episode-trajectory.ts';

export interface RolloutStart {
  steps: number;
  nodeCount: number;
  channelCount: number;
  recordIntervalS: number;
  /** N·3 (at least; row 0 of the recording), m. */
  positionM: Float64Array;
  /** N·3, m/s. */
  velocityMPerS: Float64Array;
  /** T·C. */
  controls: Float64Array;
}

export function rolloutStartOf(episode: EpisodeTrajectory): RolloutStart {
  const width = 3 * episode.nodeCount;
  return {
    steps: episode.steps,
    nodeCount: episode.nodeCount,
    channelCount: episode.channelCount,
    recordIntervalS: episode.recordIntervalS,
    positionM: episode.positionM.subarray(0, width),
    velocityMPerS: episode.velocityMPerS.subarray(0, width),
    controls: episode.controls,
  };
}
