// The worker-thread job runner: long jobs run in node:worker_threads workers, never on the main
// thread, and their episode counts become job.progress events. Rates are checked on a worked
// example (40 of 100 episodes after 8 s is 5 episodes/s, so 60 left take 12 s; plain arithmetic,
// common practice, no source); the rest runs real worker threads from a small worker script that
// speaks the protocol in electron/job-worker-protocol.ts.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { defaultJobLimits } from '../electron/job-limits.ts';
import type { JobSpec, JobWorkerData } from '../electron/job-worker-protocol.ts';
import { RequestError } from '../electron/request-error.ts';
import type { JobWorker } from '../electron/worker-job-runner.ts';
import { createWorkerJobRunner } from '../electron/worker-job-runner.ts';
import type { JobProgress } from '../sim/bridge/bridge-contract.ts';

const exportSpec = (behaviour: string): JobSpec => ({
  kind: 'export',
  scenarioText: JSON.stringify({ behaviour }),
  outDir: '/tmp/korrin-bay-out',
  format: 'npz',
  workers: 1,
  resume: false,
});

/** A hand-driven worker, so the clock and the messages are fully under the test's control. */
function handWorker() {
  const listeners: Record<string, (value: unknown) => void> = {};
  const sent: unknown[] = [];
  let terminated = 0;
  const worker: JobWorker = {
    postMessage: (message) => void sent.push(message),
    on: (event: string, listener: (value: never) => void) => {
      listeners[event] = listener as (value: unknown) => void;
      return worker;
    },
    terminate: async () => {
      terminated += 1;
      return 1;
    },
  };
  return { worker, listeners, sent, terminations: () => terminated };
}

describe('progress arithmetic (worked example)', () => {
  it('derives episodes per second and seconds left from the counts and the clock', () => {
    let nowS = 1000;
    const hand = handWorker();
    const data: JobWorkerData[] = [];
    const runner = createWorkerJobRunner({
      workerUrls: { export: new URL('file:///unused.mjs') },
      startWorker: (_url, workerData) => {
        data.push(workerData);
        return hand.worker;
      },
      nowS: () => nowS,
      newJobId: () => 'job-1',
    });
    const events: JobProgress[] = [];
    runner.onProgress((p) => events.push(p));
    expect(runner.begin(exportSpec('hand'))).toEqual({ jobId: 'job-1' });
    expect(data).toEqual([{ jobId: 'job-1', spec: exportSpec('hand') }]);
    expect(events[0]).toEqual({ jobId: 'job-1', kind: 'export', done: 0, total: 0, episodesPerS: 0, etaS: null, state: 'running' });

    nowS = 1008;
    hand.listeners.message({ type: 'progress', done: 40, total: 100 });
    expect(events[1]).toEqual({ jobId: 'job-1', kind: 'export', done: 40, total: 100, episodesPerS: 5, etaS: 12, state: 'running' });

    nowS = 1020;
    hand.listeners.message({ type: 'done', done: 100, total: 100 });
    expect(events[2]).toEqual({
      jobId: 'job-1', kind: 'export', done: 100, total: 100, episodesPerS: 5, etaS: 0, state: 'done',
      message: "Finished all 100 episodes; the dataset folder is complete, with every file's SHA-256 in manifest.json.",
    });
    // A finished job can no longer be cancelled, and its exit is not reported as a failure.
    hand.listeners.exit(0);
    expect(events).toHaveLength(3);
    expect(runner.cancel('job-1')).toBe(false);
  });

  it('terminates a worker that does not stop within the grace period after cancel', async () => {
    const hand = handWorker();
    const runner = createWorkerJobRunner({ workerUrls: { export: new URL('file:///unused.mjs') }, startWorker: () => hand.worker, cancelGraceMs: 20, newJobId: () => 'job-2' });
    const events: JobProgress[] = [];
    runner.onProgress((p) => events.push(p));
    runner.begin(exportSpec('hand'));
    hand.listeners.message({ type: 'progress', done: 3, total: 10 });
    expect(runner.cancel('job-2')).toBe(true);
    expect(runner.cancel('job-2')).toBe(false);
    expect(hand.sent).toEqual([{ type: 'cancel' }]);
    await new Promise((r) => setTimeout(r, 60));
    expect(hand.terminations()).toBe(1);
    expect(events.at(-1)).toMatchObject({ state: 'cancelled', done: 3, total: 10 });
    expect(events.at(-1)?.message).toMatch(/did not stop by itself/);
  });

  it('fails a job whose worker sends counts that make no sense', () => {
    const hand = handWorker();
    const runner = createWorkerJobRunner({ workerUrls: { export: new URL('file:///unused.mjs') }, startWorker: () => hand.worker, newJobId: () => 'job-3' });
    const events: JobProgress[] = [];
    runner.onProgress((p) => events.push(p));
    runner.begin(exportSpec('hand'));
    hand.listeners.message({ type: 'progress', done: 5, total: 2 });
    expect(events.at(-1)).toMatchObject({ state: 'failed' });
    expect(hand.terminations()).toBe(1);
  });

  it('says what done means for a reproduce job, and prefers a message the worker sends', () => {
    const hand = handWorker();
    const runner = createWorkerJobRunner({ workerUrls: { reproduce: new URL('file:///unused.mjs') }, startWorker: () => hand.worker });
    const events: JobProgress[] = [];
    runner.onProgress((p) => events.push(p));
    runner.begin({ kind: 'reproduce', seedPath: '/tank/seed.json', outDir: '/tank/again' });
    hand.listeners.message({ type: 'done', done: 40, total: 40 });
    expect(events.at(-1)).toMatchObject({ state: 'done', message: 'Regenerated all 40 episodes; every file is byte-identical to the original (compared by SHA-256).' });

    const second = handWorker();
    const own = createWorkerJobRunner({ workerUrls: { export: new URL('file:///unused.mjs') }, startWorker: () => second.worker });
    own.onProgress((p) => events.push(p));
    own.begin(exportSpec('hand'));
    second.listeners.message({ type: 'done', done: 3, total: 3, message: 'Wrote 3 Korrin Bay tether episodes.' });
    expect(events.at(-1)).toMatchObject({ state: 'done', message: 'Wrote 3 Korrin Bay tether episodes.' });
    // A message that is not text is not passed on to the page.
    const third = handWorker();
    const odd = createWorkerJobRunner({ workerUrls: { export: new URL('file:///unused.mjs') }, startWorker: () => third.worker });
    odd.onProgress((p) => events.push(p));
    odd.begin(exportSpec('hand'));
    third.listeners.message({ type: 'done', done: 3, total: 3, message: { html: '<b>' } });
    expect(events.at(-1)).toMatchObject({ state: 'failed' });
  });

  it('refuses a job kind no worker was provided for, with not-available', () => {
    const runner = createWorkerJobRunner({ workerUrls: {} });
    expect(() => runner.begin({ kind: 'reproduce', seedPath: '/a/seed.json', outDir: '/a/out' })).toThrow(RequestError);
    try {
      runner.begin({ kind: 'reproduce', seedPath: '/a/seed.json', outDir: '/a/out' });
    } catch (error) {
      expect((error as RequestError).code).toBe('not-available');
    }
  });
});

describe('queue and limits', () => {
  const limits = { runningJobs: 1, queuedJobs: 2, workerThreadsPerJob: 2 };

  it('runs at most runningJobs at once, queues the rest in order with their places, and refuses beyond the queue', () => {
    const hands: ReturnType<typeof handWorker>[] = [];
    const started: JobWorkerData[] = [];
    let next = 0;
    const runner = createWorkerJobRunner({
      workerUrls: { export: new URL('file:///unused.mjs') },
      startWorker: (_url, data) => {
        started.push(data);
        const hand = handWorker();
        hands.push(hand);
        return hand.worker;
      },
      newJobId: () => `job-${(next += 1)}`,
      limits,
    });
    expect(runner.limits).toEqual(limits);
    const events: JobProgress[] = [];
    runner.onProgress((p) => events.push(p));
    runner.begin(exportSpec('a'));
    runner.begin(exportSpec('b'));
    runner.begin(exportSpec('c'));
    expect(started.map((d) => d.jobId)).toEqual(['job-1']);
    expect(events.map((e) => [e.jobId, e.state, e.queuePosition])).toEqual([
      ['job-1', 'running', undefined],
      ['job-2', 'queued', 1],
      ['job-3', 'queued', 2],
    ]);
    let refusal: unknown;
    try {
      runner.begin(exportSpec('d'));
    } catch (error) {
      refusal = error;
    }
    expect(refusal).toBeInstanceOf(RequestError);
    expect((refusal as RequestError).code).toBe('not-available');
    expect((refusal as RequestError).message).toBe('1 jobs are running and 2 are waiting, the most Pliant accepts. Wait for one to finish, or cancel one, then start this one again.');

    // The first finishes: the next in line starts and the one behind it moves up.
    events.length = 0;
    hands[0].listeners.message({ type: 'done', done: 3, total: 3 });
    expect(started.map((d) => d.jobId)).toEqual(['job-1', 'job-2']);
    expect(events.map((e) => [e.jobId, e.state, e.queuePosition])).toEqual([
      ['job-1', 'done', undefined],
      ['job-2', 'running', undefined],
      ['job-3', 'queued', 1],
    ]);

    // A waiting job cancels at once and never starts a worker.
    events.length = 0;
    expect(runner.cancel('job-3')).toBe(true);
    expect(runner.cancel('job-3')).toBe(false);
    expect(events).toEqual([{ jobId: 'job-3', kind: 'export', done: 0, total: 0, episodesPerS: 0, etaS: null, state: 'cancelled', message: 'Cancelled while waiting in the queue; it never started, so nothing was written.' }]);
    hands[1].listeners.message({ type: 'done', done: 3, total: 3 });
    expect(started.map((d) => d.jobId)).toEqual(['job-1', 'job-2']);
  });

  it('gives an export no more worker threads than workerThreadsPerJob', () => {
    const started: JobWorkerData[] = [];
    const runner = createWorkerJobRunner({ workerUrls: { export: new URL('file:///unused.mjs') }, startWorker: (_url, data) => (started.push(data), handWorker().worker), limits });
    runner.begin({ ...exportSpec('many'), workers: 64 } as JobSpec);
    runner.onProgress(() => {});
    expect(started[0].spec).toMatchObject({ kind: 'export', workers: 2 });
  });

  it('by default runs two jobs at once, queues up to 16 and caps worker threads at the core count', () => {
    expect(defaultJobLimits(2)).toEqual({ runningJobs: 2, queuedJobs: 16, workerThreadsPerJob: 2 });
    expect(defaultJobLimits(8).workerThreadsPerJob).toBe(8);
    expect(createWorkerJobRunner({ workerUrls: {} }).limits).toEqual(defaultJobLimits(availableParallelism()));
  });
});

describe('real worker threads', () => {
  let dir: string;
  let workerUrl: URL;

  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'pliant-jobs-'));
    const file = join(dir, 'fixture-worker.mjs');
    writeFileSync(
      file,
      `import { parentPort, workerData, threadId } from 'node:worker_threads';
const { behaviour } = JSON.parse(workerData.spec.scenarioText);
if (behaviour === 'count') {
  for (let done = 1; done <= 4; done += 1) parentPort.postMessage({ type: 'progress', done, total: 4 });
  parentPort.postMessage({ type: 'done', done: 4, total: 4, threadId });
} else if (behaviour === 'polite') {
  parentPort.postMessage({ type: 'progress', done: 1, total: 50 });
  const timer = setInterval(() => {}, 1000);
  parentPort.on('message', (m) => {
    if (m.type === 'cancel') { clearInterval(timer); parentPort.postMessage({ type: 'cancelled', done: 1, total: 50 }); parentPort.close(); }
  });
} else if (behaviour === 'fails') {
  parentPort.postMessage({ type: 'failed', message: '/system/partCount must be at least 2 (got 1).' });
} else if (behaviour === 'crash') {
  throw new Error('tether worker crashed\\n    at fake (fixture-worker.mjs:1:1)');
}
`,
    );
    workerUrl = pathToFileURL(file);
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  function run(behaviour: string): Promise<JobProgress[]> {
    const runner = createWorkerJobRunner({ workerUrls: { export: workerUrl } });
    const events: JobProgress[] = [];
    return new Promise((resolve) => {
      runner.onProgress((p) => {
        events.push(p);
        if (p.state !== 'running') resolve(events);
        if (behaviour === 'polite' && p.done === 1 && p.state === 'running') runner.cancel(p.jobId);
      });
      runner.begin(exportSpec(behaviour));
    });
  }

  it('relays each episode count and finishes with done', async () => {
    const events = await run('count');
    expect(events.map((e) => [e.state, e.done, e.total])).toEqual([
      ['running', 0, 0],
      ['running', 1, 4],
      ['running', 2, 4],
      ['running', 3, 4],
      ['running', 4, 4],
      ['done', 4, 4],
    ]);
    expect(new Set(events.map((e) => e.jobId)).size).toBe(1);
    expect(events[0].jobId).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('asks a worker to cancel and reports it cancelled at an episode boundary', async () => {
    const events = await run('polite');
    expect(events.at(-1)).toMatchObject({ state: 'cancelled', done: 1, total: 50 });
    expect(events.at(-1)?.message).toMatch(/Cancelled after 1 of 50 episodes/);
  });

  it('passes on the worker\'s own failure message', async () => {
    const events = await run('fails');
    expect(events.at(-1)).toMatchObject({ state: 'failed', message: '/system/partCount must be at least 2 (got 1).' });
  });

  it('reports a crashed worker as failed with the first line of its error only', async () => {
    const events = await run('crash');
    expect(events.at(-1)?.state).toBe('failed');
    expect(events.at(-1)?.message).toBe('The export job stopped with an error: tether worker crashed');
  });
});
