// The episodes the app previews: the first ones of the sweep, identical to what `generate`
// writes for the same indices, so what is shown is what the dataset will hold.
import type { SampleEpisodeOptions } from './sample-episode.ts';
import { sampleEpisode } from './sample-episode.ts';
import type { SampledEpisode } from './sampled-episode.ts';
import type { Scenario } from './scenario-types.ts';

export function previewEpisodes(scenario: Scenario, count: number, options: SampleEpisodeOptions = {}): SampledEpisode[] {
  const n = Math.max(0, Math.min(Math.floor(count), scenario.episodes));
  const episodes: SampledEpisode[] = [];
  for (let i = 0; i < n; i++) episodes.push(sampleEpisode(scenario, i, options));
  return episodes;
}
