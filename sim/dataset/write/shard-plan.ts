// Which episodes one machine of an array job computes: shard I of N takes every episode whose
// index leaves remainder I when divided by N, so shards interleave and stay balanced however
// the costs of episodes vary along the sweep. Also reads the shard from the scheduler's
// environment for `--shard auto` (Slurm job arrays, Kubernetes Indexed Jobs).
import { PliantError } from '../../errors/pliant-error.ts';

export interface ShardPlan {
  index: number;
  count: number;
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function isCount(value: unknown): value is number {
  return typeof value === 'number' && Number.isInteger(value) && value >= 0;
}

/**
 * The shard recorded in a resumed run's parsed plan (.pliant-work/plan.json), or a string saying
 * what is wrong with it: the folder may have been edited or damaged since the run wrote it.
 */
export function planShard(value: unknown): ShardPlan | null | string {
  if (!isObject(value) || !('shard' in value)) return 'it is not an object with a "shard" member';
  const shard = value.shard;
  if (shard === null) return null;
  if (!isObject(shard) || !isCount(shard.index) || !isCount(shard.count) || shard.count < 1 || shard.index >= shard.count) {
    return '/shard is neither null nor {"index": I, "count": N} with 0 <= I < N';
  }
  return { index: shard.index, count: shard.count };
}

/** A shard that cannot be used: the message names the flag or variable and how to fix it. */
export class ShardPlanError extends PliantError {
  constructor(message: string) {
    super('user', 'shard-plan', message);
    this.name = 'ShardPlanError';
  }
}

/** Environment variable giving the shard count of a Kubernetes Indexed Job (our own name). */
export const SHARD_COUNT_VARIABLE = 'PLIANT_SHARD_COUNT';

const WHOLE = /^(0|[1-9][0-9]*)$/;

function wholeNumber(text: string | undefined, what: string): number {
  if (text === undefined || !WHOLE.test(text.trim())) {
    throw new ShardPlanError(`${what} is ${text === undefined ? 'not set' : `"${text}"`}; it must be a whole number`);
  }
  const value = Number(text.trim());
  if (!Number.isSafeInteger(value)) throw new ShardPlanError(`${what} is "${text}", which is too large`);
  return value;
}

function checked(index: number, count: number, source: string): ShardPlan {
  if (count < 1) throw new ShardPlanError(`${source}: the shard count must be at least 1 (got ${count})`);
  if (index >= count) {
    throw new ShardPlanError(`${source}: shard index ${index} is not below the shard count ${count}; indices run from 0 to ${count - 1}`);
  }
  return { index, count };
}

/** Parses the text of `--shard I/N`. */
export function parseShard(text: string): ShardPlan {
  const match = /^\s*([^/]+)\/([^/]+)\s*$/.exec(text);
  if (!match) throw new ShardPlanError(`--shard "${text}" is not of the form I/N (for example 0/4), or "auto"`);
  const index = wholeNumber(match[1], `the shard index in --shard ${text}`);
  const count = wholeNumber(match[2], `the shard count in --shard ${text}`);
  return checked(index, count, `--shard ${text}`);
}

/**
 * The shard of this task from the scheduler's environment. Slurm job arrays set
 * SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_COUNT (and SLURM_ARRAY_TASK_MIN, subtracted so
 * `--array=1-8` works as well as `--array=0-7`); Kubernetes Indexed Jobs set
 * JOB_COMPLETION_INDEX, and the count comes from `--shard-count` or PLIANT_SHARD_COUNT.
 */
export function shardFromEnvironment(env: Record<string, string | undefined>, shardCountFlag?: string): ShardPlan {
  if (env.SLURM_ARRAY_TASK_ID !== undefined) {
    const id = wholeNumber(env.SLURM_ARRAY_TASK_ID, 'SLURM_ARRAY_TASK_ID');
    const count = shardCountFlag !== undefined
      ? wholeNumber(shardCountFlag, '--shard-count')
      : wholeNumber(env.SLURM_ARRAY_TASK_COUNT, 'SLURM_ARRAY_TASK_COUNT (or give --shard-count)');
    const min = env.SLURM_ARRAY_TASK_MIN === undefined ? 0 : wholeNumber(env.SLURM_ARRAY_TASK_MIN, 'SLURM_ARRAY_TASK_MIN');
    const step = env.SLURM_ARRAY_TASK_STEP === undefined ? 1 : wholeNumber(env.SLURM_ARRAY_TASK_STEP, 'SLURM_ARRAY_TASK_STEP');
    if (step !== 1) {
      throw new ShardPlanError(`SLURM_ARRAY_TASK_STEP is ${step}; --shard auto needs consecutive task ids (submit with --array=0-${count - 1})`);
    }
    if (id < min) throw new ShardPlanError(`SLURM_ARRAY_TASK_ID ${id} is below SLURM_ARRAY_TASK_MIN ${min}`);
    return checked(id - min, count, 'the Slurm job array');
  }
  if (env.JOB_COMPLETION_INDEX !== undefined) {
    const index = wholeNumber(env.JOB_COMPLETION_INDEX, 'JOB_COMPLETION_INDEX');
    const countText = shardCountFlag ?? env[SHARD_COUNT_VARIABLE];
    if (countText === undefined) {
      throw new ShardPlanError(`JOB_COMPLETION_INDEX is set but the shard count is not: give --shard-count N or set ${SHARD_COUNT_VARIABLE} to the Job's completions`);
    }
    const count = wholeNumber(countText, shardCountFlag !== undefined ? '--shard-count' : SHARD_COUNT_VARIABLE);
    return checked(index, count, 'the Kubernetes Indexed Job');
  }
  throw new ShardPlanError(
    '--shard auto found neither SLURM_ARRAY_TASK_ID (Slurm job array) nor JOB_COMPLETION_INDEX (Kubernetes Indexed Job); give --shard I/N instead',
  );
}

/** The episode indices of a shard, ascending. */
export function shardEpisodes(plan: ShardPlan, episodeCount: number): number[] {
  const indices: number[] = [];
  for (let i = plan.index; i < episodeCount; i += plan.count) indices.push(i);
  return indices;
}
