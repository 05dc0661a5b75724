// The options `generate` and `reproduce` share — workers, progress style — and the parsing of
// generate's own overrides, so each flag is checked (and refused with exit 2) before any folder
// is made.
import { availableParallelism } from 'node:os';

import type { ShardPlan } from '../dataset/write/shard-plan.ts';
import { parseShard, shardFromEnvironment } from '../dataset/write/shard-plan.ts';
import { MAX_EPISODES } from '../scenario/scenario-limits.ts';
import type { CliIo } from './command.ts';
import { CliUsageError } from './command.ts';
import type { ParsedArguments } from './command-arguments.ts';
import { choiceOption, wholeNumberOption } from './command-arguments.ts';
import type { ProgressMode } from './progress-display.ts';

export const PROGRESS_MODES: readonly ProgressMode[] = ['bar', 'json', 'none'];
export const FORMATS = ['npz', 'hdf5', 'both'] as const;
/** More threads than this only adds memory use on the machines Pliant targets. */
const MAX_WORKERS = 256;

export function workersOption(parsed: ParsedArguments): number {
  const text = parsed.values.get('--workers');
  return text === undefined ? Math.max(1, availableParallelism()) : wholeNumberOption('--workers', text, 1, MAX_WORKERS);
}

export function progressOption(parsed: ParsedArguments, io: CliIo): ProgressMode {
  const text = parsed.values.get('--progress');
  return text === undefined ? (io.isTerminal ? 'bar' : 'none') : choiceOption('--progress', text, PROGRESS_MODES);
}

export function shardOption(parsed: ParsedArguments, io: CliIo): ShardPlan | null {
  const text = parsed.values.get('--shard');
  const countText = parsed.values.get('--shard-count');
  if (text === undefined) {
    if (countText !== undefined) throw new CliUsageError('--shard-count goes with --shard auto');
    return null;
  }
  if (text === 'auto') return shardFromEnvironment(io.env, countText);
  if (countText !== undefined) throw new CliUsageError('--shard-count goes with --shard auto; with --shard I/N the count is N');
  return parseShard(text);
}

export interface Overrides {
  episodes?: number;
  seed?: number | string;
  format?: (typeof FORMATS)[number];
}

export function overrideOptions(parsed: ParsedArguments): Overrides {
  const overrides: Overrides = {};
  const episodes = parsed.values.get('--episodes');
  if (episodes !== undefined) overrides.episodes = wholeNumberOption('--episodes', episodes, 1, MAX_EPISODES);
  const seed = parsed.values.get('--seed');
  if (seed !== undefined) {
    if (!/^(0|[1-9][0-9]*)$/.test(seed) || BigInt(seed) > 18446744073709551615n) {
      throw new CliUsageError(`--seed "${seed}" is not a whole number from 0 to 18446744073709551615 (2^64 - 1)`);
    }
    // Seeds a JSON number carries exactly stay numbers, as they would be written in a scenario.
    overrides.seed = BigInt(seed) <= BigInt(Number.MAX_SAFE_INTEGER) ? Number(seed) : seed;
  }
  const format = parsed.values.get('--format');
  if (format !== undefined) overrides.format = choiceOption('--format', format, FORMATS);
  return overrides;
}
