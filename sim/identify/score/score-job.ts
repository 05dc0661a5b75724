// One score job for the app: scores a predictions folder against a dataset (the same code and the
// same report files as `pliant score`) and reports progress as the job runner's messages
// (electron/job-worker-protocol.ts). Expected failures — a predictions folder that does not fit
// the dataset, a damaged file — end the job with their message, never a stack trace.
import { neutralMessageOf } from '../../dataset/formats/run-words.ts';
import type { JobMessage } from '../../dataset/jobs/job-message.ts';
import { reportOf } from '../../errors/error-report.ts';
import { writeScore } from './score-outputs.ts';
import { DEFAULT_VPT_THRESHOLD, scorePredictions } from './score-predictions.ts';

export interface ScoreJob {
  kind: 'score';
  datasetDir: string;
  predictionsDir: string;
  outDir: string;
  /** Score the episodes present and list the others (as `pliant score --allow-missing`). */
  allowMissing: boolean;
}

export type ScoreJobMessage = JobMessage;

class ScoreCancelled extends Error {}

const PROGRESS_INTERVAL_MS = 200;

export async function runScoreJob(job: ScoreJob, post: (message: ScoreJobMessage) => void, cancelled: () => boolean, nowMs: () => number = Date.now): Promise<void> {
  let done = 0;
  let total = 0;
  let lastPostMs = -Infinity;
  try {
    const score = await scorePredictions({
      datasetDir: job.datasetDir,
      predictionsDir: job.predictionsDir,
      splits: null,
      horizons: null,
      vptThreshold: DEFAULT_VPT_THRESHOLD,
      allowMissing: job.allowMissing,
      onEpisode: (finished, of) => {
        done = finished;
        total = of;
        if (cancelled()) throw new ScoreCancelled();
        const now = nowMs();
        if (now - lastPostMs >= PROGRESS_INTERVAL_MS || finished === of) {
          lastPostMs = now;
          post({ type: 'progress', done, total });
        }
      },
    });
    writeScore(job.outDir, score);
    done = score.episodes.length;
    post({ type: 'done', done, total: done, message: `Scored ${done} predicted episodes of ${score.dataset.name} (${score.predictions.model || 'unnamed model'}); score.json, REPORT.md and the plots are in the report folder.` });
  } catch (error) {
    if (error instanceof ScoreCancelled) {
      post({ type: 'cancelled', done, total });
      return;
    }
    const report = reportOf(error);
    if (report.kind === 'bug') throw error;
    // Neutral text (run-words.ts) where the error has it: the app words the run's settings itself.
    post({ type: 'failed', message: neutralMessageOf(error) ?? report.message });
  }
}
