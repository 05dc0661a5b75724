// The command line's rewording of two expected failures before main.ts reports them: scenario
// problems are placed in the named scenario file, and an episode that cannot be built says that
// finished episodes are kept for --resume. Which exit code a failure gets is not decided here
// but by its kind, once, in exit-codes.ts.
import { EpisodeBuildError } from '../dataset/write/episode-product.ts';
import { formatProblems,ScenarioProblemError } from '../scenario/scenario-problem.ts';
import { CliUsageError } from './command.ts';

export function asCliFailure(error: unknown, scenarioName = 'scenario'): unknown {
  if (error instanceof EpisodeBuildError) return new CliUsageError(`${error.message}\nFix the scenario; episodes finished so far are kept for --resume.`);
  if (error instanceof ScenarioProblemError) return new CliUsageError(formatProblems(error.problems, scenarioName));
  return error;
}

/** Runs `body`, rewording the failures above; every other error passes through unchanged. */
export async function withCliFailures<T>(scenarioName: string, body: () => Promise<T>): Promise<T> {
  try {
    return await body();
  } catch (error) {
    throw asCliFailure(error, scenarioName);
  }
}
