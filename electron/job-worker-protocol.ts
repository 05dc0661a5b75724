// The messages between the job runner (main process or web server) and a worker thread that
// does one long job: writing a dataset from a scenario, regenerating one from a seed file,
// scoring predictions, or drawing an episode's pictures.
// The dataset pipeline provides the worker entry; this file is all it needs to know about us.
// Imports nothing at run time so a worker bundle stays free of the shell's code.
import type { ExportFormat, JobKind, PictureOutput, PictureView } from '../sim/bridge/bridge-contract.ts';
import type { JobMessage } from '../sim/dataset/jobs/job-message.ts';

export interface ExportJobSpec {
  kind: 'export';
  scenarioText: string;
  /** Real absolute path, already checked to be inside a folder the person chose. */
  outDir: string;
  format: ExportFormat;
  workers: number;
  resume: boolean;
}

export interface ReproduceJobSpec {
  kind: 'reproduce';
  /** Real absolute path, already checked. */
  seedPath: string;
  /** Real absolute path, already checked. */
  outDir: string;
}

export interface ScoreJobSpec {
  kind: 'score';
  /** Real absolute paths, already checked. */
  datasetDir: string;
  predictionsDir: string;
  outDir: string;
  allowMissing: boolean;
}

export interface RenderJobSpec {
  kind: 'render';
  /** Real absolute path, already checked. */
  datasetDir: string;
  episodeId: string;
  output: PictureOutput;
  /** The .gif file or the pictures' folder; real, absolute, checked writable and not there yet. */
  outPath: string;
  view: PictureView;
  widthPx: number;
  heightPx: number;
  speed: number;
}

export type JobSpec = ExportJobSpec | ReproduceJobSpec | ScoreJobSpec | RenderJobSpec;

/** What the worker finds in `workerData`. */
export interface JobWorkerData {
  jobId: string;
  spec: JobSpec;
}

/**
 * Sent to the worker. On 'cancel' it should stop at the next episode boundary (so no half-written
 * file is left behind) and answer 'cancelled'; a worker that does not answer within the runner's
 * grace period is terminated.
 */
export type ToJobWorker = { type: 'cancel' };

/**
 * Sent by the worker. `done` and `total` count episodes; the runner derives the rate and the time
 * left, so the worker only counts. Post progress at most a few times a second.
 *
 * 'done' means the job did everything it was asked: an export wrote a complete dataset folder; a
 * reproduce job regenerated the folder and found every file byte-identical to the original's (any
 * difference is 'failed', naming the files). It may carry a `message` for the person; without one
 * the runner says what 'done' means for the job's kind.
 */
export type FromJobWorker = JobMessage;

export type { JobKind };
