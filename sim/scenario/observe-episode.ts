// The observation of one sampled episode's recorded trajectory, drawn from the episode's own
// observation streams (noise and dropouts apart), so it is a pure function of the seed file and
// the same in worker threads, the page's preview worker and the command line.
import type { ObservedSource, ObservedTrajectory } from '../episode/observe-trajectory.ts';
import { observeTrajectory } from '../episode/observe-trajectory.ts';
import { OBSERVATION_DROPOUT_SUB_STREAM, OBSERVATION_NOISE_SUB_STREAM, observationStream } from './parameter-streams.ts';
import type { SampledEpisode } from './sampled-episode.ts';

/** Null when the episode's scenario has no observation block. */
export function observeEpisode(episode: SampledEpisode, trajectory: ObservedSource): ObservedTrajectory | null {
  if (episode.observation === null) return null;
  return observeTrajectory(
    trajectory,
    episode.observation,
    observationStream(episode.masterSeed, episode.index, OBSERVATION_NOISE_SUB_STREAM),
    observationStream(episode.masterSeed, episode.index, OBSERVATION_DROPOUT_SUB_STREAM),
  );
}
