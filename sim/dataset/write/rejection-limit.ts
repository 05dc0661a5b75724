// The limit on rejected episodes: a sweep whose scenario ranges produce mostly unstable systems
// should stop and say which ranges fail, not finish quietly with exit 0 and a thin dataset. The
// limit is the scenario's maxRejectedFraction (DEFAULT_MAX_REJECTED_FRACTION when absent) of the
// episodes this run computes (one shard's share under --shard). The report splits the episodes
// done so far at the median of each numeric label and names the labels whose rejections gather
// on one side, with the range the rejected episodes came from.
import { PliantError } from '../../errors/pliant-error.ts';
import type { LabelValue } from '../../scenario/sampled-episode.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import { COMMAND_LINE_WORDS, say, wordRun } from '../formats/run-words.ts';

export const DEFAULT_MAX_REJECTED_FRACTION = 0.5;

/** Labels named in the message, most lopsided first. */
const NAMED_LABELS = 3;

/** Thrown when more episodes were rejected than the limit allows; the command line exits with 2. */
export class RejectionLimitError extends PliantError {
  /** The message with the run's settings in neutral form (run-words.ts), for a shell to word itself. */
  readonly neutralMessage: string;

  constructor(message: string) {
    super('user', 'rejection-limit', wordRun(message, COMMAND_LINE_WORDS));
    this.name = 'RejectionLimitError';
    this.neutralMessage = message;
  }
}

export function maxRejectedFraction(scenario: Scenario): number {
  return scenario.maxRejectedFraction ?? DEFAULT_MAX_REJECTED_FRACTION;
}

/** Most rejected episodes a run of `runEpisodes` may have and still go on. */
export function rejectedEpisodeLimit(scenario: Scenario, runEpisodes: number): number {
  return Math.floor(maxRejectedFraction(scenario) * runEpisodes);
}

interface DoneEpisode {
  labels: Record<string, LabelValue>;
  rejected: boolean;
}

function shown(value: number): string {
  return String(Number(value.toPrecision(4)));
}

/** One line per label whose rejected episodes gather above or below its median. */
export function rejectedRangeLines(episodes: readonly DoneEpisode[]): string[] {
  const pointers = new Set<string>();
  for (const e of episodes) for (const [pointer, value] of Object.entries(e.labels)) if (typeof value === 'number') pointers.add(pointer);
  const found: { score: number; line: string }[] = [];
  for (const pointer of pointers) {
    const rows = episodes.filter((e) => typeof e.labels[pointer] === 'number').map((e) => ({ value: e.labels[pointer] as number, rejected: e.rejected }));
    const values = rows.map((r) => r.value).sort((a, b) => a - b);
    if (values[0] === values[values.length - 1]) continue;
    const median = values[Math.floor((values.length - 1) / 2)];
    const high = rows.filter((r) => r.value > median);
    const low = rows.filter((r) => r.value <= median);
    const rate = (side: typeof rows): number => (side.length === 0 ? 0 : side.filter((r) => r.rejected).length / side.length);
    const score = Math.abs(rate(high) - rate(low));
    const bad = rows.filter((r) => r.rejected).map((r) => r.value);
    if (bad.length === 0 || score === 0) continue;
    const count = (side: typeof rows): string => `${side.filter((r) => r.rejected).length} of ${side.length}`;
    found.push({
      score,
      line: `  ${pointer}: rejected ${count(high)} episodes above ${shown(median)} and ${count(low)} at or below; the rejected ones span ${shown(Math.min(...bad))} to ${shown(Math.max(...bad))} (all so far: ${shown(values[0])} to ${shown(values[values.length - 1])})`,
    });
  }
  return found.sort((a, b) => b.score - a.score).slice(0, NAMED_LABELS).map((f) => f.line);
}

/** The whole message for a run stopped by the limit. */
export function rejectionLimitMessage(scenario: Scenario, runEpisodes: number, episodes: readonly DoneEpisode[], outDir: string): string {
  const rejected = episodes.filter((e) => e.rejected).length;
  const fraction = maxRejectedFraction(scenario);
  const lines = rejectedRangeLines(episodes);
  return [
    `stopped: ${rejected} of the ${episodes.length} episodes computed so far were rejected as unstable, more than maxRejectedFraction ${fraction}${scenario.maxRejectedFraction === undefined ? ' (the default)' : ''} of this run's ${runEpisodes} episodes allows (${rejectedEpisodeLimit(scenario, runEpisodes)}).`,
    lines.length > 0 ? 'Where the rejected episodes come from:' : 'No sampled parameter separates the rejected episodes from the others.',
    ...lines,
    `Narrow those ranges in the scenario (or let "substeps": "auto" choose the step), or raise "maxRejectedFraction" (1 never stops); then ${say('start-over')}. The records of the episodes done so far stay in ${outDir}/.pliant-work/done for inspection.`,
  ].join('\n');
}
