// Computes a list of episodes on W worker threads (or in this thread when W is 1) and hands each
// finished outcome to the writer one at a time. Workers take the next index as soon as they are
// free, so the order outcomes arrive in varies; nothing written depends on that order.
import { Worker } from 'node:worker_threads';

import { type ErrorReport,ReportedError } from '../../errors/error-report.ts';
import { PliantError } from '../../errors/pliant-error.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import type { ExportDtype } from '../manifest/dataset-manifest.ts';
import type { EpisodeOutcome } from './episode-outcome.ts';
import { computeEpisodeOutcome } from './episode-outcome.ts';
import { EPISODE_BUILD_ERROR_CODE, EpisodeBuildError } from './episode-product.ts';
import type { FromEpisodeWorker, ToEpisodeWorker } from './episode-worker-messages.ts';
import { episodeWorkerUrl } from './episode-worker-source.ts';
import type { ReplayTable } from './replay-inputs.ts';

export interface PoolRequest {
  scenario: Scenario;
  dtype: ExportDtype;
  replay: ReplayTable;
  workers: number;
  indices: readonly number[];
  /** Called once per episode, never concurrently. */
  onOutcome: (outcome: EpisodeOutcome) => Promise<void>;
  /** Checked between episodes; once true no new episode is started. */
  shouldStop?: () => boolean;
}

/** A worker thread failed for a reason other than the episode itself. */
export class EpisodeWorkerError extends PliantError {
  constructor(message: string) {
    super('bug', 'episode-worker', message);
    this.name = 'EpisodeWorkerError';
  }
}

/**
 * The error a worker's report stands for on this side: an episode the scenario cannot build stays
 * an EpisodeBuildError (the command line adds the --resume hint), another expected failure keeps
 * its kind and code, and a bug in the worker is an EpisodeWorkerError naming the episode.
 */
function failureFromWorker(index: number, report: ErrorReport): Error {
  if (report.errorCode === EPISODE_BUILD_ERROR_CODE) return new EpisodeBuildError(report.message);
  if (report.kind !== 'bug') return new ReportedError(report);
  return new EpisodeWorkerError(`episode ${index}: ${report.message}`);
}

// An episode's arrays, and the deflate tables its NPZ file is compressed with, die young and
// their memory sits outside the JavaScript heap until a collection frees it. A young generation
// smaller than V8's default collects them sooner, so the memory is reused rather than held:
// 400 korrin-tether episodes on two workers peaked near 300 MiB instead of near 335 MiB
// (three runs each), with no measurable change in run time.
const WORKER_YOUNG_GENERATION_MB = 4;

export async function computeEpisodes(request: PoolRequest): Promise<void> {
  const workerCount = Math.min(request.workers, request.indices.length);
  if (workerCount <= 1) {
    for (const index of request.indices) {
      if (request.shouldStop?.()) return;
      await request.onOutcome(computeEpisodeOutcome(request.scenario, index, request.dtype, request.replay));
      // Let timers and signals run between episodes.
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
    return;
  }
  await runOnWorkers(request, workerCount);
}

function runOnWorkers(request: PoolRequest, workerCount: number): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    const workers: Worker[] = [];
    let next = 0;
    let inFlight = 0;
    let over = false;
    let writing: Promise<void> = Promise.resolve();

    const end = (error?: Error): void => {
      if (over) return;
      over = true;
      for (const w of workers) void w.terminate();
      if (error) reject(error);
      else resolve();
    };
    const endWhenIdle = (): void => {
      if (inFlight === 0 && (next >= request.indices.length || request.shouldStop?.())) void writing.then(() => end(), end);
    };
    const dispatch = (worker: Worker): void => {
      if (over || next >= request.indices.length || request.shouldStop?.()) return;
      inFlight++;
      worker.postMessage({ type: 'episode', index: request.indices[next++] } satisfies ToEpisodeWorker);
    };

    for (let w = 0; w < workerCount; w++) {
      const worker = new Worker(episodeWorkerUrl(), {
        resourceLimits: { maxYoungGenerationSizeMb: WORKER_YOUNG_GENERATION_MB },
        workerData: { scenario: request.scenario, dtype: request.dtype, replay: request.replay.toTransfer() },
      });
      workers.push(worker);
      worker.on('message', (message: FromEpisodeWorker) => {
        inFlight--;
        if (message.type === 'failed') {
          end(failureFromWorker(message.index, message.error));
          return;
        }
        // Writes happen one after another; a failed write ends the run.
        writing = writing.then(() => (over ? undefined : request.onOutcome(message.outcome)));
        writing.catch((error: unknown) => end(error instanceof Error ? error : new Error(String(error))));
        dispatch(worker);
        endWhenIdle();
      });
      worker.on('error', (error) => end(new EpisodeWorkerError(`a worker thread stopped: ${error.message}`)));
      worker.on('exit', (code) => {
        if (!over) end(new EpisodeWorkerError(`a worker thread exited early (code ${code})`));
      });
      dispatch(worker);
    }
    endWhenIdle();
  });
}
