// Turns the pipeline's expected failures into command-line messages: a refused request exits
// with 2, a failed read or write (full disk, no permission) with 1, and an episode that cannot
// be built from its scenario with 2. Anything else is a bug and keeps its stack trace.
import { CliUsageError } from './command.ts';
import { DatasetRequestError } from '../dataset/dataset-request-error.ts';
import { RejectionLimitError } from '../dataset/rejection-limit.ts';
import { DatasetReadError } from '../dataset/dataset-read-error.ts';
import { DatasetWriteError } from '../dataset/dataset-write-error.ts';
import { EpisodeBuildError } from '../dataset/episode-product.ts';
import { ShardPlanError } from '../dataset/shard-plan.ts';
import { ScenarioProblemError, formatProblems } from '../scenario/scenario-problem.ts';

export function asCliFailure(error: unknown, scenarioName = 'scenario'): unknown {
  if (error instanceof DatasetRequestError || error instanceof ShardPlanError || error instanceof RejectionLimitError) return new CliUsageError(error.message, 2);
  if (error instanceof DatasetWriteError || error instanceof DatasetReadError) return new CliUsageError(error.message, 1);
  if (error instanceof EpisodeBuildError) return new CliUsageError(`${error.message}\nFix the scenario; episodes finished so far are kept for --resume.`, 2);
  if (error instanceof ScenarioProblemError) return new CliUsageError(formatProblems(error.problems, scenarioName), 2);
  return error;
}

/** Runs `body`, rethrowing expected failures as CliUsageError. */
export async function withCliFailures<T>(scenarioName: string, body: () => Promise<T>): Promise<T> {
  try {
    return await body();
  } catch (error) {
    throw asCliFailure(error, scenarioName);
  }
}
