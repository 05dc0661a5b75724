// How much long work the app runs at once. Without limits, twenty exports started in a second
// each got their own worker thread plus up to 64 episode workers, and a small machine ran out of
// memory. Jobs beyond `runningJobs` wait in a queue; an export's worker threads are capped at
// the core count, since threads beyond the cores only add memory and switching, not speed.
import { availableParallelism } from 'node:os';

import type { JobLimits } from '../sim/bridge/bridge-contract.ts';

/**
 * Two at once, so a quick render or score is not stuck behind a long export; a handful more
 * waiting is plenty for a person, and a page that starts hundreds is refused.
 */
export function defaultJobLimits(cores: number = availableParallelism()): JobLimits {
  return { runningJobs: 2, queuedJobs: 16, workerThreadsPerJob: Math.max(1, cores) };
}
