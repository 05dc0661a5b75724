// The same seed file must give the same bytes however the work is done: with one or two worker
// threads, split into three array-job shards (found from Slurm's and Kubernetes' environment
// variables) and merged, killed with SIGKILL part-way and resumed, and stopped by a full disk
// (a file-size limit, RLIMIT_FSIZE, stands in for it) and resumed. Every file the reference
// manifest lists is compared byte for byte, and the folders must hold nothing else.
// Scheduler facts, from memory: a Slurm job array gives each task SLURM_ARRAY_TASK_ID, with
// SLURM_ARRAY_TASK_COUNT and SLURM_ARRAY_TASK_MIN (sbatch manual, "--array"); a Kubernetes
// Indexed Job gives each pod JOB_COMPLETION_INDEX (Job documentation, "Indexed completion
// mode"). That a file-size limit turns writes into EFBIG once SIGXFSZ is ignored is POSIX
// setrlimit(2), from memory.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';

const ROOT = resolve(import.meta.dirname, '..');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');
const work = mkdtempSync(join(tmpdir(), 'pliant-repro-'));
const scenarioPath = join(work, 'tether.json');
const reference = join(work, 'reference');

async function cli(args: string[], env: Record<string, string> = {}): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env, cwd: work });
  return { code, stdout, stderr };
}

function manifestOf(dir: string): DatasetManifest {
  return JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as DatasetManifest;
}

function filesBelow(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' })
    .filter((p) => statSync(join(dir, p)).isFile())
    .map((p) => p.split('\\').join('/'))
    .sort();
}

/** Same listed files with the same bytes, nothing else in the folder, and the same manifest apart from `run`. */
function expectSameDataset(dir: string): void {
  const want = manifestOf(reference);
  const got = manifestOf(dir);
  const listed = [...want.documents, ...want.files].map((f) => f.path).sort();
  expect(filesBelow(dir)).toEqual([...listed, 'manifest.json'].sort());
  for (const path of listed) {
    expect(readFileSync(join(dir, path)).equals(readFileSync(join(reference, path))), `${relative(work, dir)}/${path}`).toBe(true);
  }
  const { run: _a, ...wantRest } = want;
  const { run: _b, ...gotRest } = got;
  expect(gotRest).toEqual(wantRest);
}

beforeAll(async () => {
  const text = readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8');
  const checked = checkScenarioText(text, 'korrin-tether.json');
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  // Nine episodes in every split format; held-out tethers (over 21 parts) make a fourth split.
  writeFileSync(scenarioPath, JSON.stringify(withOverrides(checked.scenario, { episodes: 9, format: 'both' }), null, 2));
  const made = await cli(['generate', scenarioPath, '--out', reference, '--workers', '1']);
  expect(made.stderr).toBe('');
  expect(made.code).toBe(0);
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('bit-for-bit reproducibility of a dataset folder', () => {
  it('the reference has NPZ per episode and HDF5 per split, over several splits', () => {
    const m = manifestOf(reference);
    expect(m.episodes.length).toBe(9);
    expect(m.files.filter((f) => f.kind === 'episode-npz').length).toBe(m.episodes.filter((e) => e.status === 'ok').length);
    expect(m.files.filter((f) => f.kind === 'split-hdf5').length).toBeGreaterThanOrEqual(2);
    // The card's SVG pictures are documents, so every comparison below covers their bytes too.
    const pictures = m.documents.map((d) => d.path).filter((p) => p.startsWith('card/') && p.endsWith('.svg'));
    expect(pictures).toContain('card/scatter.svg');
    expect(pictures).toContain('card/episodes.svg');
    expect(pictures.filter((p) => p.startsWith('card/params-')).length).toBeGreaterThanOrEqual(2);
  });

  it('two worker threads write the same bytes as one', async () => {
    const dir = join(work, 'two-workers');
    const made = await cli(['generate', scenarioPath, '--out', dir, '--workers', '2']);
    expect(made.code).toBe(0);
    expectSameDataset(dir);
  });

  it('three shards found from Slurm and Kubernetes variables, merged in any order, equal a single run', async () => {
    const shards = [join(work, 'shard-a'), join(work, 'shard-b'), join(work, 'shard-c')];
    // Slurm array --array=1-3: task ids 1 and 2 are shards 0 and 1.
    expect((await cli(['generate', scenarioPath, '--out', shards[0], '--shard', 'auto', '--workers', '1'], { SLURM_ARRAY_TASK_ID: '1', SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '1' })).code).toBe(0);
    expect((await cli(['generate', scenarioPath, '--out', shards[1], '--shard', 'auto', '--workers', '1'], { SLURM_ARRAY_TASK_ID: '2', SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '1' })).code).toBe(0);
    // Kubernetes Indexed Job: completion index 2 of 3, count from PLIANT_SHARD_COUNT.
    expect((await cli(['generate', scenarioPath, '--out', shards[2], '--shard', 'auto', '--workers', '1'], { JOB_COMPLETION_INDEX: '2', PLIANT_SHARD_COUNT: '3' })).code).toBe(0);
    shards.forEach((dir, i) => {
      const m = manifestOf(dir);
      expect(m.shard).toEqual({ index: i, count: 3 });
      expect(m.episodes.map((e) => e.index)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8].filter((n) => n % 3 === i));
      expect(readFileSync(join(dir, 'seed.json')).equals(readFileSync(join(reference, 'seed.json')))).toBe(true);
    });
    const merged = join(work, 'merged');
    const result = await cli(['merge', shards[2], shards[0], shards[1], '--out', merged]);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    expectSameDataset(merged);
    // A missing shard is refused before anything is written.
    const incomplete = await cli(['merge', shards[0], shards[2], '--out', join(work, 'merged-incomplete')]);
    expect(incomplete.code).toBe(2);
    expect(incomplete.stderr).toContain('shard 1/3 is missing');
    expect(existsSync(join(work, 'merged-incomplete'))).toBe(false);
  });

  it('a run killed with SIGKILL after some episodes resumes to the same bytes', async () => {
    const dir = join(work, 'killed');
    const child = spawn(process.execPath, [LAUNCHER, 'generate', scenarioPath, '--out', dir, '--workers', '1', '--progress', 'json'], { cwd: work });
    let episodes = 0;
    let buffered = '';
    const exit = new Promise<NodeJS.Signals | null>((done) => child.on('exit', (_code, signal) => done(signal)));
    child.stdout.on('data', (chunk: Buffer) => {
      buffered += chunk.toString('utf8');
      const lines = buffered.split('\n');
      buffered = lines.pop()!;
      for (const line of lines) {
        if ((JSON.parse(line) as { type: string }).type === 'episode' && ++episodes === 3) child.kill('SIGKILL');
      }
    });
    expect(await exit).toBe('SIGKILL');
    // Killed part-way: work in progress, no manifest, not all episodes.
    expect(existsSync(join(dir, '.pliant-work'))).toBe(true);
    expect(existsSync(join(dir, 'manifest.json'))).toBe(false);
    const done = readdirSync(join(dir, '.pliant-work/done')).length;
    expect(done).toBeGreaterThanOrEqual(3);
    expect(done).toBeLessThan(9);
    // Without --resume the folder is refused.
    const refused = await cli(['generate', scenarioPath, '--out', dir, '--workers', '1']);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain('--resume');
    const resumed = spawnSync(process.execPath, [LAUNCHER, 'generate', scenarioPath, '--out', dir, '--workers', '1', '--resume', '--progress', 'json'], { cwd: work, encoding: 'utf8' });
    expect(resumed.stderr).toBe('');
    expect(resumed.status).toBe(0);
    const start = JSON.parse(resumed.stdout.split('\n')[0]) as { type: string; alreadyDone: number };
    expect(start.type).toBe('start');
    expect(start.alreadyDone).toBe(done);
    expectSameDataset(dir);
    expect(manifestOf(dir).run.resumed).toBe(true);
  });

  it('a full disk stops the run with a message naming the file, and --resume completes it to the same bytes', async () => {
    const dir = join(work, 'full-disk');
    // RLIMIT_FSIZE of 300 KiB: episode files fit, the larger split files do not.
    const limited = spawnSync('bash', ['-c', `trap '' XFSZ; ulimit -f 300; exec "${process.execPath}" "${LAUNCHER}" generate "${scenarioPath}" --out "${dir}" --workers 1 --progress none`], { cwd: work, encoding: 'utf8' });
    expect(limited.status).toBe(1);
    expect(limited.stderr).toMatch(/^pliant generate: could not write \S+\.h5: .*run again with --resume\n$/);
    expect(limited.stderr).not.toMatch(/\n\s+at /);
    // Nothing half-written under a final name: every file there is a whole, listed episode file.
    const present = filesBelow(dir).filter((p) => !p.startsWith('.pliant-work/'));
    const reference_ = manifestOf(reference);
    for (const path of present) {
      const record = [...reference_.files, ...reference_.documents].find((f) => f.path === path);
      expect(record, path).toBeDefined();
      expect(readFileSync(join(dir, path)).equals(readFileSync(join(reference, path))), path).toBe(true);
    }
    expect(present.some((p) => p.endsWith('.h5'))).toBe(false);
    const resumed = await cli(['generate', scenarioPath, '--out', dir, '--workers', '1', '--resume']);
    expect(resumed.code).toBe(0);
    expectSameDataset(dir);
  });

  it('--resume on a finished folder changes nothing and says so', async () => {
    const before = statSync(join(reference, 'manifest.json')).mtimeMs;
    const again = await cli(['generate', scenarioPath, '--out', reference, '--resume']);
    expect(again.code).toBe(0);
    expect(again.stdout).toContain('already complete');
    expect(statSync(join(reference, 'manifest.json')).mtimeMs).toBe(before);
  });
});
