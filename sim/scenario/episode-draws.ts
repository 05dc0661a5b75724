// The parameter resolver of one episode: every value is drawn from the stream of its own JSON
// pointer and recorded as a label under that pointer.
import { sampleValue } from '../random/distribution.ts';
import type { NumericValueSpec } from '../random/distribution.ts';
import type { LabelValue } from './sampled-episode.ts';
import type { DemandingEnd, ParameterResolver } from './parameter-resolver.ts';
import { parameterStream } from './parameter-streams.ts';

export class EpisodeDraws implements ParameterResolver {
  readonly labels: Record<string, LabelValue> = {};

  constructor(
    private readonly seed: number | string,
    private readonly episodeIndex: number,
  ) {}

  // Which end is demanding does not matter to a draw.
  value(spec: NumericValueSpec, pointer: string, _demanding?: DemandingEnd): number {
    const drawn = sampleValue(spec, parameterStream(this.seed, this.episodeIndex, pointer), pointer);
    this.labels[pointer] = drawn;
    return drawn;
  }
}
