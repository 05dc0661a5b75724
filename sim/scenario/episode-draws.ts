// The parameter resolver of one episode: every value is drawn from the stream of its own JSON
// pointer and recorded as a label under that pointer. A parameter a design places takes the
// value of its design coordinate under its distribution's inverse CDF instead.
import type { NumericValueSpec } from '../random/distribution.ts';
import { sampleValue } from '../random/distribution.ts';
import { valueAtProbability } from '../random/inverse-cdf.ts';
import type { DemandingEnd, ParameterResolver } from './parameter-resolver.ts';
import { parameterStream } from './parameter-streams.ts';
import type { LabelValue } from './sampled-episode.ts';

export class EpisodeDraws implements ParameterResolver {
  readonly labels: Record<string, LabelValue> = {};

  constructor(
    private readonly seed: number | string,
    private readonly episodeIndex: number,
    /** Unit-cube coordinate per designed parameter's pointer; absent for independent draws. */
    private readonly design?: ReadonlyMap<string, number>,
  ) {}

  // Which end is demanding does not matter to a draw.
  value(spec: NumericValueSpec, pointer: string, _demanding?: DemandingEnd): number {
    const coordinate = this.design?.get(pointer);
    const drawn = coordinate === undefined ? sampleValue(spec, parameterStream(this.seed, this.episodeIndex, pointer), pointer) : (valueAtProbability(spec, coordinate, pointer) as number);
    this.labels[pointer] = drawn;
    return drawn;
  }

  /** Labels a value the episode computed rather than drew (a derived named parameter). */
  record(pointer: string, value: number): void {
    this.labels[pointer] = value;
  }
}
