// JobRunner that runs each long job in its own worker thread, so an export of thousands of
// episodes never blocks the Electron main process or the web server's event loop. It relays the
// worker's episode counts as job.progress events, deriving the rate and the time left itself.
// At most `limits.runningJobs` run at once; later jobs wait, in order, as 'queued' with their
// place in the queue, and an export's worker threads are capped at `limits.workerThreadsPerJob`
// (job-limits.ts).
import { randomUUID } from 'node:crypto';
import { Worker } from 'node:worker_threads';

import type { JobKind, JobLimits, JobProgress, JobState } from '../sim/bridge/bridge-contract.ts';
import { inAppWords } from './app-run-words.ts';
import { defaultJobLimits } from './job-limits.ts';
import type { FromJobWorker, JobSpec, JobWorkerData, ToJobWorker } from './job-worker-protocol.ts';
import { RequestError } from './request-error.ts';
import type { JobRunner } from './request-services.ts';

/** The parts of node:worker_threads' Worker the runner uses; tests may pass their own. */
export interface JobWorker {
  postMessage(message: ToJobWorker): void;
  on(event: 'message', listener: (message: unknown) => void): unknown;
  on(event: 'error', listener: (error: Error) => void): unknown;
  on(event: 'exit', listener: (exitCode: number) => void): unknown;
  terminate(): Promise<number>;
}

export interface WorkerJobRunnerOptions {
  /** Worker entry per job kind; a kind without one is refused with 'not-available'. */
  workerUrls: Partial<Record<JobKind, URL>>;
  startWorker?: (url: URL, data: JobWorkerData) => JobWorker;
  /** Monotonic clock in seconds. */
  nowS?: () => number;
  /** How long a cancelled worker may take to stop at an episode boundary before it is terminated. */
  cancelGraceMs?: number;
  newJobId?: () => string;
  /** Receives errors thrown by progress listeners, which must not kill the runner. */
  reportListenerError?: (error: unknown) => void;
  /** Defaults to defaultJobLimits(). */
  limits?: JobLimits;
}

interface QueuedJob {
  jobId: string;
  kind: JobKind;
  spec: JobSpec;
}

interface RunningJob {
  jobId: string;
  kind: JobKind;
  worker: JobWorker;
  startedS: number;
  done: number;
  total: number;
  cancelRequested: boolean;
  cancelTimer: ReturnType<typeof setTimeout> | undefined;
}

export function createWorkerJobRunner(options: WorkerJobRunnerOptions): JobRunner {
  const startWorker = options.startWorker ?? ((url, workerData) => new Worker(url, { workerData }));
  const nowS = options.nowS ?? (() => performance.now() / 1000);
  const cancelGraceMs = options.cancelGraceMs ?? 5000;
  const newJobId = options.newJobId ?? (() => randomUUID());
  const limits = options.limits ?? defaultJobLimits();
  const listeners = new Set<(progress: JobProgress) => void>();
  const jobs = new Map<string, RunningJob>();
  const queue: QueuedJob[] = [];

  const tell = (progress: JobProgress): void => {
    for (const listener of listeners) {
      try {
        listener(progress);
      } catch (error) {
        options.reportListenerError?.(error);
      }
    }
  };

  const emit = (job: RunningJob, state: JobState, message?: string): void => {
    const elapsedS = nowS() - job.startedS;
    const episodesPerS = elapsedS > 0 ? job.done / elapsedS : 0;
    const remaining = Math.max(0, job.total - job.done);
    const etaS = state === 'done' ? 0 : episodesPerS > 0 ? remaining / episodesPerS : null;
    const progress: JobProgress = { jobId: job.jobId, kind: job.kind, done: job.done, total: job.total, episodesPerS, etaS, state };
    if (message !== undefined) progress.message = message;
    tell(progress);
  };

  const emitQueued = (): void => {
    queue.forEach((waiting, index) => {
      tell({ jobId: waiting.jobId, kind: waiting.kind, done: 0, total: 0, episodesPerS: 0, etaS: null, state: 'queued', queuePosition: index + 1 });
    });
  };

  const start = (jobId: string, spec: JobSpec, url: URL): void => {
    const worker = startWorker(url, { jobId, spec });
    const job: RunningJob = { jobId, kind: spec.kind, worker, startedS: nowS(), done: 0, total: 0, cancelRequested: false, cancelTimer: undefined };
    jobs.set(jobId, job);
    worker.on('message', (raw) => onMessage(job, raw));
    worker.on('error', (error) => finish(job, 'failed', `The ${job.kind} job stopped with an error: ${firstLine(error.message)}`));
    worker.on('exit', (exitCode) => {
      if (job.cancelRequested) finish(job, 'cancelled', `Cancelled after ${job.done} of ${job.total} episodes.`);
      else finish(job, 'failed', `The ${job.kind} job's worker stopped before finishing (exit code ${exitCode}).`);
    });
    emit(job, 'running');
  };

  /** Starts waiting jobs while there is room, then tells the rest their new places. */
  const startWaiting = (): void => {
    let moved = false;
    while (jobs.size < limits.runningJobs && queue.length > 0) {
      const next = queue.shift()!;
      moved = true;
      start(next.jobId, next.spec, options.workerUrls[next.kind]!);
    }
    if (moved) emitQueued();
  };

  const finish = (job: RunningJob, state: Exclude<JobState, 'running' | 'queued'>, message?: string): void => {
    if (!jobs.has(job.jobId)) return;
    jobs.delete(job.jobId);
    if (job.cancelTimer !== undefined) clearTimeout(job.cancelTimer);
    emit(job, state, message);
    startWaiting();
  };

  const onMessage = (job: RunningJob, raw: unknown): void => {
    const message = asWorkerMessage(raw);
    if (message === null) {
      finish(job, 'failed', `The ${job.kind} worker sent a message Pliant does not understand; the job was stopped.`);
      void job.worker.terminate();
      return;
    }
    if (message.type === 'failed') {
      // The pipeline names run settings in neutral form (sim/dataset/formats/run-words.ts); the app words them.
      finish(job, 'failed', inAppWords(message.message));
      return;
    }
    job.done = message.done;
    job.total = message.total;
    if (message.type === 'progress') emit(job, 'running');
    else if (message.type === 'done') finish(job, 'done', message.message ?? doneMessage(job));
    else finish(job, 'cancelled', `Cancelled after ${job.done} of ${job.total} episodes. Files written so far are complete; start again with "resume" to continue.`);
  };

  return {
    limits,

    begin(spec: JobSpec) {
      const url = options.workerUrls[spec.kind];
      if (!url) {
        throw new RequestError('not-available', `Running ${spec.kind} jobs is not part of this build of Pliant yet.`);
      }
      const capped: JobSpec = spec.kind === 'export' ? { ...spec, workers: Math.min(spec.workers, limits.workerThreadsPerJob) } : spec;
      if (jobs.size >= limits.runningJobs && queue.length >= limits.queuedJobs) {
        throw new RequestError('not-available', `${limits.runningJobs} jobs are running and ${queue.length} are waiting, the most Pliant accepts. Wait for one to finish, or cancel one, then start this one again.`);
      }
      const jobId = newJobId();
      if (jobs.size < limits.runningJobs) {
        start(jobId, capped, url);
      } else {
        queue.push({ jobId, kind: spec.kind, spec: capped });
        tell({ jobId, kind: spec.kind, done: 0, total: 0, episodesPerS: 0, etaS: null, state: 'queued', queuePosition: queue.length });
      }
      return { jobId };
    },

    cancel(jobId) {
      const waiting = queue.findIndex((q) => q.jobId === jobId);
      if (waiting >= 0) {
        const [removed] = queue.splice(waiting, 1);
        tell({ jobId, kind: removed.kind, done: 0, total: 0, episodesPerS: 0, etaS: null, state: 'cancelled', message: 'Cancelled while waiting in the queue; it never started, so nothing was written.' });
        emitQueued();
        return true;
      }
      const job = jobs.get(jobId);
      if (!job || job.cancelRequested) return false;
      job.cancelRequested = true;
      job.worker.postMessage({ type: 'cancel' });
      job.cancelTimer = setTimeout(() => {
        void job.worker.terminate();
        finish(job, 'cancelled', `Stopped after ${job.done} of ${job.total} episodes; the worker did not stop by itself, so the last episode may be incomplete. Start again with "resume" to redo it.`);
      }, cancelGraceMs);
      return true;
    },

    onProgress(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

function asWorkerMessage(raw: unknown): FromJobWorker | null {
  if (typeof raw !== 'object' || raw === null) return null;
  const m = raw as Record<string, unknown>;
  if (m.type === 'failed') return typeof m.message === 'string' ? { type: 'failed', message: m.message } : null;
  if (m.type !== 'progress' && m.type !== 'done' && m.type !== 'cancelled') return null;
  const { done, total } = m;
  if (!isCount(done) || !isCount(total) || done > total) return null;
  if (m.type === 'done' && m.message !== undefined) return typeof m.message === 'string' ? { type: 'done', done, total, message: m.message } : null;
  return { type: m.type, done, total };
}

/** What 'done' means for each kind of job (job-worker-protocol.ts), in words for the person. */
function doneMessage(job: RunningJob): string {
  if (job.kind === 'export') return `Finished all ${job.total} episodes; the dataset folder is complete, with every file's SHA-256 in manifest.json.`;
  if (job.kind === 'score') return `Scored all ${job.total} predicted episodes; the report folder holds score.json, REPORT.md and the plots.`;
  return `Regenerated all ${job.total} episodes; every file is byte-identical to the original (compared by SHA-256).`;
}

function isCount(value: unknown): value is number {
  return typeof value === 'number' && Number.isInteger(value) && value >= 0;
}

function firstLine(text: string): string {
  const end = text.indexOf('\n');
  return end < 0 ? text : text.slice(0, end);
}
