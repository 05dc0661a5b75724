// Bad input to `pliant score`, end to end: a predictions folder that is not one, missing or
// extra episodes, wrong shapes and dtypes, NaN and infinite values, files that are not NPZ
// archives, a broken predictions.json, unknown split names and bad options each exit with 2,
// print one message naming the file (and array and element, where there is one) and show no
// stack trace; no report is written. (Project rule for user mistakes; common practice, no
// source.) The bad files are written by Debian's NumPy (numpy.savez) where NumPy can write them,
// so the checks see what a user's own export would give.
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';
import { type CliOutcome,generateScoreDataset, manifestOf, runPliant, writePersistencePredictions } from './support/score-fixture.ts';

const ROOT = resolve(import.meta.dirname, '..');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');
const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-score-bad-'));
let dataset = '';
const good = join(work, 'good');
let testIds: string[] = [];

afterAll(() => rmSync(work, { recursive: true, force: true }));

let caseNumber = 0;
function copyOfGood(): string {
  caseNumber += 1;
  const dir = join(work, `case-${caseNumber}`);
  cpSync(good, dir, { recursive: true });
  return dir;
}

/** Writes ep-<id>.npz with NumPy: positions from an expression of the recorded p (float64). */
function numpyPrediction(dir: string, id: string, expression: string, extra = ''): void {
  runReferencePython(`
import json, sys, numpy as np
r = json.load(sys.stdin)
p = np.load(r['src'])['positions'].astype(np.float64)
arrays = {'positions': ${expression}}
${extra}
np.savez(r['dst'], **arrays)
print('{}')
`, { src: join(dataset, 'episodes', `${id}.npz`), dst: join(dir, `${id}.npz`) });
}

function expectUserMistake(outcome: CliOutcome, ...phrases: string[]): void {
  expect(outcome.code, outcome.stderr).toBe(2);
  expect(outcome.stdout).toBe('');
  expect(outcome.stderr).toMatch(/^pliant score: \S/);
  for (const phrase of phrases) expect(outcome.stderr).toContain(phrase);
  expect(outcome.stderr).not.toMatch(/\n\s+at /);
  expect(outcome.stderr).not.toMatch(/Error:/);
}

async function score(predictions: string, ...options: string[]): Promise<{ outcome: CliOutcome; out: string }> {
  const out = join(work, `out-${caseNumber}-${options.length}`);
  const outcome = await runPliant(['score', dataset, predictions, '--out', out, '--split', 'test', ...options], work);
  return { outcome, out };
}

describe.skipIf(!python.available)('pliant score refuses bad input with exit 2 and a message', () => {
  beforeAll(async () => {
    dataset = await generateScoreDataset(work);
    writePersistencePredictions(dataset, good);
    testIds = manifestOf(dataset).episodes.filter((e) => e.split === 'test' && e.status === 'ok').map((e) => e.id);
  }, 120_000);

  it('accepts the good folder (so the refusals below are about the change alone)', async () => {
    const { outcome } = await score(good);
    expect(outcome.stderr).toBe('');
    expect(outcome.code).toBe(0);
  });

  it('a missing episode: names it and suggests --split and --allow-missing', async () => {
    const dir = copyOfGood();
    rmSync(join(dir, `${testIds[0]}.npz`));
    const { outcome, out } = await score(dir);
    expectUserMistake(outcome, `1 of the ${testIds.length} episodes of test have no prediction file: ${testIds[0]}`, '--split', '--allow-missing');
    expect(existsSync(join(out, 'score.json'))).toBe(false);
  });

  it('an extra id the dataset never recorded', async () => {
    const dir = copyOfGood();
    cpSync(join(dir, `${testIds[0]}.npz`), join(dir, 'ep-009999.npz'));
    const { outcome, out } = await score(dir);
    expectUserMistake(outcome, 'for episodes the dataset did not record: ep-009999', 'remove them');
    expect(existsSync(out)).toBe(false);
  });

  it('a file named for no episode', async () => {
    const dir = copyOfGood();
    cpSync(join(dir, `${testIds[0]}.npz`), join(dir, 'episode-1.npz'));
    expectUserMistake((await score(dir)).outcome, 'episode-1.npz', 'is not named for an episode', 'ep-000042.npz');
  });

  it('wrong shape: one node too few', async () => {
    const dir = copyOfGood();
    numpyPrediction(dir, testIds[0], 'p[:, :-1, :]');
    expectUserMistake((await score(dir)).outcome, `${testIds[0]}.npz`, 'array "positions" has shape', `but episode ${testIds[0]} has`);
  });

  it('wrong shape: a rollout one row short', async () => {
    const dir = copyOfGood();
    numpyPrediction(dir, testIds[0], 'p[:-1]');
    expectUserMistake((await score(dir)).outcome, 'array "positions" has shape (30,');
  });

  it('velocities of the wrong shape', async () => {
    const dir = copyOfGood();
    numpyPrediction(dir, testIds[0], 'p', "arrays['velocities'] = np.zeros((3, 3))");
    expectUserMistake((await score(dir)).outcome, 'array "velocities" has shape (3, 3)');
  });

  it('a NaN: names the row, node and coordinate', async () => {
    const dir = copyOfGood();
    numpyPrediction(dir, testIds[1], 'p.copy()', "arrays['positions'][7, 2, 1] = np.nan");
    expectUserMistake((await score(dir)).outcome, `${testIds[1]}.npz`, 'holds NaN at [7, 2, 1] (row 7, node 2, coordinate y)');
  });

  it('an infinite velocity', async () => {
    const dir = copyOfGood();
    numpyPrediction(dir, testIds[1], 'p', "arrays['velocities'] = np.zeros_like(p); arrays['velocities'][3, 0, 2] = np.inf");
    expectUserMistake((await score(dir)).outcome, 'array "velocities" holds Infinity at [3, 0, 2]');
  });

  it('integer positions', async () => {
    const dir = copyOfGood();
    numpyPrediction(dir, testIds[0], 'np.round(p).astype(np.int32)');
    expectUserMistake((await score(dir)).outcome, 'array "positions" is int32; it must be float32 or float64');
  });

  it('no positions array', async () => {
    const dir = copyOfGood();
    runReferencePython(`
import json, sys, numpy as np
np.savez(json.load(sys.stdin), pos=np.zeros((31, 4, 3)))
print('{}')`, join(dir, `${testIds[0]}.npz`));
    expectUserMistake((await score(dir)).outcome, 'no array "positions" (the file holds pos)');
  });

  it('a file that is not an NPZ archive', async () => {
    const dir = copyOfGood();
    writeFileSync(join(dir, `${testIds[0]}.npz`), 'positions,1,2,3\n');
    expectUserMistake((await score(dir)).outcome, `${testIds[0]}.npz`, 'not a readable ZIP archive');
  });

  it('a broken predictions.json', async () => {
    const dir = copyOfGood();
    writeFileSync(join(dir, 'predictions.json'), '{"predictionsFormat": 1, "model": ""}');
    expectUserMistake((await score(dir)).outcome, 'predictions.json: "model" must be a short non-empty text');
  });

  it('an unknown split name lists the dataset\'s splits', async () => {
    const out = join(work, 'out-unknown-split');
    const outcome = await runPliant(['score', dataset, good, '--out', out, '--split', 'test,held-in'], work);
    expectUserMistake(outcome, 'no split "held-in"', 'train, validation, test, held-out');
    expect(existsSync(out)).toBe(false);
  });

  it('a predictions folder that is not one: missing, a file, empty, the dataset itself', async () => {
    expectUserMistake((await score(join(work, 'no-such-folder'))).outcome, 'no-such-folder does not exist');
    writeFileSync(join(work, 'a-file'), 'x');
    expectUserMistake((await score(join(work, 'a-file'))).outcome, 'is a file, not a predictions folder');
    mkdirSync(join(work, 'empty'));
    expectUserMistake((await score(join(work, 'empty'))).outcome, 'is not a predictions folder: it holds no <episode id>.npz file');
    expectUserMistake((await score(dataset)).outcome, 'is a dataset folder, not a predictions folder');
  });

  it('a dataset folder that is not one', async () => {
    const outcome = await runPliant(['score', good, good, '--out', join(work, 'out-x')], work);
    expectUserMistake(outcome, 'is not a finished dataset folder', 'manifest.json is missing');
  });

  it('bad options: horizon beyond the rollout, bad threshold, no --out, empty split name, unknown option', async () => {
    expectUserMistake((await score(good, '--horizons', '1,31')).outcome, '--horizons: 31 steps lies outside episode', 'has 30 recorded steps');
    expectUserMistake((await score(good, '--horizons', '2x')).outcome, '--horizons: "2x" is neither');
    expectUserMistake((await score(good, '--vpt-threshold', '-1')).outcome, '--vpt-threshold "-1" is not a positive number');
    expectUserMistake(await runPliant(['score', dataset, good], work), '--out REPORT_DIR');
    expectUserMistake(await runPliant(['score', dataset, good, '--out', join(work, 'o'), '--split', 'test,'], work), 'has an empty name');
    expectUserMistake(await runPliant(['score', dataset, good, '--out', join(work, 'o'), '--frobnicate'], work), 'unknown option "--frobnicate"');
  });

  it('as a process: exit status 2 and no stack trace for a NaN', () => {
    const dir = copyOfGood();
    numpyPrediction(dir, testIds[0], 'p.copy()', "arrays['positions'][1, 1, 0] = np.nan");
    const run = spawnSync(process.execPath, [LAUNCHER, 'score', dataset, dir, '--out', join(work, 'out-process'), '--split', 'test'], { encoding: 'utf8', cwd: work });
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('holds NaN at [1, 1, 0]');
    expect(run.stderr).not.toMatch(/\n\s+at /);
  });
});
