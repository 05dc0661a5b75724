// What a resumed run reads back from its work folder is checked for shape before it is trusted
// (sim/dataset/manifest/completion-check.ts): a completion record whose file entry points outside the
// episode's own names is not trusted (the episode is computed again, and the finished folder
// equals an uninterrupted run's, compared by SHA-256 against the reference `pliant generate`
// wrote), and a run plan of the wrong shape stops the resume with a message naming plan.json and
// no stack trace. Real temporary folders; the interrupted run is the app's export job, stopped
// after its first episode as a cancel does.
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetJobMessage } from '../sim/dataset/jobs/dataset-job.ts';
import { runDatasetJob } from '../sim/dataset/jobs/dataset-job.ts';
import { completionProblem } from '../sim/dataset/manifest/completion-check.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { cutDownScenario } from './support/app-flow-session.ts';

const work = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-resume-records-')));
const scenarioText = cutDownScenario('korrin-tether.json', 3, 10);
const reference = join(work, 'reference');

async function cli(args: string[]): Promise<{ code: number; stderr: string }> {
  let stderr = '';
  const code = await runCli(args, { stdout: () => {}, stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stderr };
}

/** An export stopped after its first episode, as the app's cancel leaves it. */
async function interrupted(name: string): Promise<string> {
  const dir = join(work, name);
  const messages: DatasetJobMessage[] = [];
  let clockMs = 0;
  await runDatasetJob({ kind: 'export', scenarioText, outDir: dir, format: 'npz', workers: 1, resume: false }, (m) => messages.push(m), () => messages.filter((m) => m.type === 'progress').length > 1, '0.1.0', () => (clockMs += 1000));
  expect(messages.at(-1)).toMatchObject({ type: 'cancelled' });
  return dir;
}

const manifestOf = (dir: string): DatasetManifest => JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as DatasetManifest;

beforeAll(async () => {
  writeFileSync(join(work, 'tether.json'), scenarioText);
  const made = await cli(['generate', 'tether.json', '--out', reference, '--format', 'npz', '--workers', '1', '--progress', 'none']);
  expect(made.stderr).toBe('');
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('records a resumed run reads back', () => {
  it('does not trust a completion record whose file lies outside the episode\'s own names', async () => {
    const dir = await interrupted('escaped-record');
    const donePath = join(dir, '.pliant-work', 'done', 'ep-000000.json');
    const record = JSON.parse(readFileSync(donePath, 'utf8'));
    expect(completionProblem(record, 'ep-000000')).toBeNull();
    // The same bytes elsewhere, so the recorded checksum still matches the file it points at.
    mkdirSync(join(work, 'elsewhere'));
    copyFileSync(join(dir, record.npz.path), join(work, 'elsewhere', 'ep.npz'));
    record.npz.path = '../elsewhere/ep.npz';
    writeFileSync(donePath, JSON.stringify(record));
    expect(completionProblem(record, 'ep-000000')).toBe('/npz/path is "../elsewhere/ep.npz", not one of the episode\'s own files (episodes/ep-000000.npz, .pliant-work/parts/ep-000000.npz)');
    const resumed = await cli(['generate', 'tether.json', '--out', dir, '--resume', '--progress', 'none']);
    expect(resumed.stderr).toBe('');
    expect(resumed.code).toBe(0);
    const files = manifestOf(dir).files.map((f) => [f.path, f.sha256]);
    expect(files).toEqual(manifestOf(reference).files.map((f) => [f.path, f.sha256]));
  });

  it('stops at a run plan of the wrong shape, naming plan.json, with no stack trace', async () => {
    const dir = await interrupted('bad-plan');
    const planPath = join(dir, '.pliant-work', 'plan.json');
    writeFileSync(planPath, 'null\n');
    const resumed = await cli(['generate', 'tether.json', '--out', dir, '--resume', '--progress', 'none']);
    expect(resumed.code).toBe(1);
    expect(resumed.stderr).toContain(`${planPath}: the run plan is not one Pliant writes: it is not an object with a "shard" member; delete it and resume again (the run writes it anew), or use --force to start over`);
    expect(resumed.stderr).not.toMatch(/\n\s+at\s/);
    writeFileSync(planPath, '{"shard": {"index": 3, "count": 2}}');
    expect((await cli(['generate', 'tether.json', '--out', dir, '--resume', '--progress', 'none'])).stderr).toContain('/shard is neither null nor {"index": I, "count": N} with 0 <= I < N');
  });

  it('names what is wrong with a record of the wrong shape', () => {
    expect(completionProblem(null, 'ep-000001')).toBe('it is not a JSON object');
    expect(completionProblem({ record: { id: 'ep-000002' } }, 'ep-000001')).toBe('/record/id is "ep-000002", not "ep-000001"');
    expect(completionProblem({ record: { id: 'ep-000001' }, arrays: [], npz: null }, 'ep-000001')).toBe('/record/files is not the empty list a run leaves there');
    expect(completionProblem({ record: { id: 'ep-000001', files: [] }, arrays: [], npz: null }, 'ep-000001')).toMatch(/^\/record\/: must have required property/);
  });
});
