// The app's long jobs on the pipeline side: an export from scenario text reports counts that end
// at the episode total and writes the very bytes `pliant generate` writes (whose checksums
// dataset-export.test.ts checks against Python's hashlib); a cancelled export stops at an
// episode boundary and resumes to the same bytes; bad scenario text fails with the
// formatProblems wording; a reproduce job passes for an untouched dataset and fails, naming the
// file, after tampering. One run goes through a real worker thread and the message shapes of
// electron/job-worker-protocol.ts.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { Worker } from 'node:worker_threads';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetJob, DatasetJobMessage } from '../sim/dataset/jobs/dataset-job.ts';
import { runDatasetJob } from '../sim/dataset/jobs/dataset-job.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';

const ROOT = resolve(import.meta.dirname, '..');
const work = mkdtempSync(join(tmpdir(), 'pliant-job-'));
const scenarioPath = join(work, 'fin.json');
const reference = join(work, 'reference');

function scenarioText(): string {
  const scenario = JSON.parse(readFileSync(join(ROOT, 'scenarios/korrin-fin.json'), 'utf8'));
  scenario.episodes = 4;
  return JSON.stringify(scenario, null, 2);
}

async function job(spec: DatasetJob, cancelAfter = Infinity): Promise<DatasetJobMessage[]> {
  const messages: DatasetJobMessage[] = [];
  // A clock a second further on at every look, so no progress message is held back.
  let nowMs = 0;
  await runDatasetJob(spec, (m) => messages.push(m), () => messages.filter((m) => m.type === 'progress').length > cancelAfter, '0.1.0', () => (nowMs += 1000));
  return messages;
}

function sameData(dir: string): void {
  const want = JSON.parse(readFileSync(join(reference, 'manifest.json'), 'utf8')) as DatasetManifest;
  for (const f of [...want.files, ...want.documents]) {
    expect(readFileSync(join(dir, f.path)).equals(readFileSync(join(reference, f.path))), f.path).toBe(true);
  }
}

beforeAll(async () => {
  writeFileSync(scenarioPath, scenarioText());
  let stderr = '';
  const code = await runCli(['generate', scenarioPath, '--out', reference, '--format', 'hdf5', '--workers', '1'], { stdout: () => {}, stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  expect(stderr).toBe('');
  expect(code).toBe(0);
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('dataset jobs for the app', () => {
  it('an export counts up to the total and writes what `pliant generate` writes', async () => {
    const dir = join(work, 'export');
    const messages = await job({ kind: 'export', scenarioText: scenarioText(), outDir: dir, format: 'hdf5', workers: 1, resume: false });
    expect(messages.at(-1)).toEqual({ type: 'done', done: 4, total: 4 });
    const counts = messages.filter((m) => m.type === 'progress').map((m) => (m as { done: number }).done);
    expect(counts[0]).toBe(0);
    expect(counts.at(-1)).toBe(4);
    expect([...counts].sort((a, b) => a - b)).toEqual(counts);
    sameData(dir);
  });

  it('a cancelled export stops at an episode boundary and resumes to the same bytes', async () => {
    const dir = join(work, 'cancelled');
    const first = await job({ kind: 'export', scenarioText: scenarioText(), outDir: dir, format: 'hdf5', workers: 1, resume: false }, 1);
    const last = first.at(-1) as { type: string; done: number; total: number };
    expect(last.type).toBe('cancelled');
    expect(last.done).toBeGreaterThan(0);
    expect(last.done).toBeLessThan(4);
    const second = await job({ kind: 'export', scenarioText: scenarioText(), outDir: dir, format: 'hdf5', workers: 1, resume: true });
    expect(second[0]).toEqual({ type: 'progress', done: last.done, total: 4 });
    expect(second.at(-1)).toEqual({ type: 'done', done: 4, total: 4 });
    sameData(dir);
  });

  it('bad scenario text fails with the formatProblems wording', async () => {
    const broken = scenarioText().replace('"episodes": 4', '"episodes": 0');
    const messages = await job({ kind: 'export', scenarioText: broken, outDir: join(work, 'never'), format: 'npz', workers: 1, resume: false });
    expect(messages).toHaveLength(1);
    expect(messages[0]).toEqual({ type: 'failed', message: expect.stringMatching(/^scenario:\d+:\d+ \/episodes: must be ≥ 1 \(got 0\)/) });
  });

  it('a reproduce job passes for the untouched dataset and names the file after tampering', async () => {
    const ok = await job({ kind: 'reproduce', seedPath: join(reference, 'seed.json'), outDir: join(work, 'again') });
    expect(ok.at(-1)).toEqual({ type: 'done', done: 4, total: 4 });
    const tampered = join(work, 'tampered');
    await runCli(['reproduce', join(reference, 'seed.json'), '--out', tampered, '--workers', '1'], { stdout: () => {}, stderr: () => {}, isTerminal: false, env: {}, cwd: work });
    const h5 = (JSON.parse(readFileSync(join(tampered, 'manifest.json'), 'utf8')) as DatasetManifest).files[0].path;
    const bytes = readFileSync(join(tampered, h5));
    bytes[bytes.length - 50] ^= 1;
    writeFileSync(join(tampered, h5), bytes);
    const bad = await job({ kind: 'reproduce', seedPath: join(tampered, 'seed.json'), outDir: join(work, 'again-tampered') });
    expect(bad.at(-1)).toEqual({ type: 'failed', message: expect.stringContaining(`${h5} (different)`) });
  });

  it('runs in a worker thread started the way the shells start job workers', async () => {
    const dir = join(work, 'threaded');
    const spec: DatasetJob = { kind: 'export', scenarioText: scenarioText(), outDir: dir, format: 'hdf5', workers: 1, resume: false };
    const worker = new Worker(new URL('../sim/dataset/jobs/dataset-job-worker-entry.mjs', import.meta.url), { workerData: { jobId: 'job-1', spec } });
    const messages: DatasetJobMessage[] = [];
    const exitCode = await new Promise<number>((done, fail) => {
      worker.on('message', (m: DatasetJobMessage) => messages.push(m));
      worker.on('error', fail);
      worker.on('exit', done);
    });
    expect(exitCode).toBe(0);
    expect(messages.at(-1)).toEqual({ type: 'done', done: 4, total: 4 });
    sameData(dir);
  });
});
