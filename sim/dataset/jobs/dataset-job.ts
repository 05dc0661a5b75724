// The pipeline's side of the app's long jobs: writing a dataset from scenario text ("export") or
// regenerating one from its seed file ("reproduce"), reporting episode counts and stopping at an
// episode boundary when asked. The shapes of the job and its messages follow the job protocol
// the desktop and web shells define (electron/job-worker-protocol.ts); they are restated here
// rather than imported, so sim/ never depends on the shells.
import { reportOf } from '../../errors/error-report.ts';
import { checkScenarioText } from '../../scenario/check-scenario.ts';
import { withOverrides } from '../../scenario/scenario-overrides.ts';
import { formatProblems,ScenarioProblemError } from '../../scenario/scenario-problem.ts';
import { neutralMessageOf } from '../formats/run-words.ts';
import { generateDataset } from '../write/generate-dataset.ts';
import type { GenerationEvent } from '../write/generation-progress.ts';
import { replayFilesOf } from '../write/replay-inputs.ts';
import { reproduceDataset, seedEditedWords } from '../write/reproduce-dataset.ts';
import type { JobMessage } from './job-message.ts';

export type DatasetJob =
  | { kind: 'export'; scenarioText: string; outDir: string; format: 'npz' | 'hdf5' | 'both'; workers: number; resume: boolean }
  | { kind: 'reproduce'; seedPath: string; outDir: string };

export type DatasetJobMessage = JobMessage;

/** Progress more often than this only loads the shell's message queue. */
const PROGRESS_INTERVAL_MS = 250;

/** The job's words for an expected failure (a user's or the environment's), or null for a bug. */
function expectedFailure(error: unknown): string | null {
  if (error instanceof ScenarioProblemError) return formatProblems(error.problems, 'scenario');
  const report = reportOf(error);
  if (report.kind === 'bug') return null;
  // Neutral text (run-words.ts) where the error has it: the shell that shows the message words the
  // run's settings itself.
  return neutralMessageOf(error) ?? report.message;
}

export async function runDatasetJob(job: DatasetJob, post: (message: DatasetJobMessage) => void, cancelled: () => boolean, pliantVersion: string, nowMs: () => number = Date.now): Promise<void> {
  let done = 0;
  let total = 0;
  let lastPostMs = -Infinity;
  const onEvent = (event: GenerationEvent): void => {
    if (event.type === 'start') {
      total = event.total;
      done = event.alreadyDone;
    } else if (event.type === 'episode') {
      done = event.done;
    } else {
      return;
    }
    const now = nowMs();
    if (event.type === 'start' || done === total || now - lastPostMs >= PROGRESS_INTERVAL_MS) {
      lastPostMs = now;
      post({ type: 'progress', done, total });
    }
  };
  try {
    if (job.kind === 'export') {
      const checked = checkScenarioText(job.scenarioText, 'scenario');
      if (!checked.ok) {
        post({ type: 'failed', message: formatProblems(checked.problems, 'scenario') });
        return;
      }
      const scenario = withOverrides(checked.scenario, { format: job.format });
      if (replayFilesOf(scenario).length > 0) {
        post({ type: 'failed', message: 'this scenario replays control tables from .npy files, which are read next to the scenario file; export it with `pliant generate SCENARIO --out DIR` instead' });
        return;
      }
      const result = await generateDataset({
        scenario,
        inputs: { kind: 'scenario', scenarioDir: job.outDir },
        outDir: job.outDir,
        shard: null,
        workers: job.workers,
        resume: job.resume,
        force: false,
        pliantVersion,
        onEvent,
        shouldStop: cancelled,
        runInfo: { command: ['app', 'export'] },
      });
      post({ type: result.status === 'stopped' ? 'cancelled' : 'done', done, total });
      return;
    }
    const report = await reproduceDataset({ seedPath: job.seedPath, outDir: job.outDir, workers: 1, force: false, pliantVersion, onEvent, shouldStop: cancelled });
    if (report.generated.status === 'stopped') {
      post({ type: 'cancelled', done, total });
      return;
    }
    const different = report.comparisons.filter((c) => c.result !== 'identical');
    if (different.length > 0) {
      const why = report.seedFile.matches === false ? `${seedEditedWords(report.seedFile)}. ` : '';
      post({ type: 'failed', message: `${why}Regenerated, but ${different.length} of ${report.comparisons.length} files are not identical: ${different.map((c) => `${c.path} (${c.result})`).join(', ')}` });
      return;
    }
    post({ type: 'done', done, total });
  } catch (error) {
    const message = expectedFailure(error);
    if (message === null) throw error;
    post({ type: 'failed', message });
  }
}
