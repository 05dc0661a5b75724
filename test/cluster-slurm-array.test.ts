// A real Slurm array job of `pliant generate --shard auto`, submitted with `sbatch --wait
// --array` to the one-node cluster that .ci/start-slurm runs on this machine (Debian's
// slurm-wlm and munge), merged with `pliant merge`, must equal a single-machine run byte for
// byte. The job script is the one README shows (scenarios/cluster/korrin-tether-array.sbatch).
// Slurm's array variables (SLURM_ARRAY_TASK_ID, _COUNT, _MIN) are as the sbatch manual
// documents them. Off CI a machine without a running cluster skips with the reason; under
// CI=true the cluster is required.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';

const ROOT = resolve(import.meta.dirname, '..');
const JOB_SCRIPT = join(ROOT, 'scenarios/cluster/korrin-tether-array.sbatch');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');

function clusterAvailability(): { available: boolean; reason: string } {
  const probe = spawnSync('sinfo', ['-h', '-o', '%t'], { encoding: 'utf8' });
  const state = probe.status === 0 ? probe.stdout.trim().split('\n')[0] : '';
  const available = state === 'idle' || state === 'mix' || state === 'alloc';
  const reason = available ? '' : `no Slurm cluster answers here (${probe.error?.message ?? (probe.stderr.trim() || `node state "${state}"`)}); run .ci/start-slurm as root`;
  if (!available && process.env.CI === 'true') throw new Error(`A Slurm cluster is required under CI=true: ${reason}`);
  if (!available) console.warn(`[skip] Slurm array-job test skipped: ${reason}`);
  return { available, reason };
}

const cluster = clusterAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-slurm-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

function manifestOf(dir: string): DatasetManifest {
  return JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as DatasetManifest;
}

function filesBelow(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' })
    .filter((p) => statSync(join(dir, p)).isFile())
    .sort();
}

describe.runIf(cluster.available)('a Slurm array job of pliant generate --shard auto (sbatch --wait --array)', () => {
  it('three array tasks, merged, equal one run on one machine byte for byte', async () => {
    const text = readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8');
    const checked = checkScenarioText(text, 'korrin-tether.json');
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const scenarioPath = join(work, 'tether.json');
    writeFileSync(scenarioPath, JSON.stringify(withOverrides(checked.scenario, { episodes: 10, format: 'both' }), null, 2));

    const single = join(work, 'single');
    const made = await cli(['generate', scenarioPath, '--out', single, '--workers', '1']);
    expect(made.stderr).toBe('');
    expect(made.code).toBe(0);

    const shards = join(work, 'shards');
    // --array=1-3 on the command line overrides the script's own range; starting at 1 checks
    // that SLURM_ARRAY_TASK_MIN is taken off.
    const job = spawnSync('sbatch', ['--wait', '--array=1-3', `--chdir=${work}`, `--output=${join(work, 'task-%a.out')}`,
      `--export=ALL,PLIANT=${process.execPath} ${LAUNCHER},PLIANT_SCENARIO=${scenarioPath},PLIANT_OUT=${shards}`, JOB_SCRIPT],
    { encoding: 'utf8', timeout: 600_000 });
    const logs = readdirSync(work).filter((f) => f.startsWith('task-')).map((f) => `${f}:\n${readFileSync(join(work, f), 'utf8')}`).join('\n');
    expect(job.status, `${job.stdout}\n${job.stderr}\n${logs}`).toBe(0);
    expect(job.stdout).toMatch(/Submitted batch job \d+/);

    const shardDirs = readdirSync(shards).sort().map((d) => join(shards, d));
    expect(shardDirs.map((d) => d.slice(shards.length + 1))).toEqual(['shard-1', 'shard-2', 'shard-3']);
    expect(shardDirs.map((d) => manifestOf(d).shard)).toEqual([{ index: 0, count: 3 }, { index: 1, count: 3 }, { index: 2, count: 3 }]);

    const merged = join(work, 'merged');
    const result = await cli(['merge', ...shardDirs, '--out', merged]);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);

    const want = manifestOf(single);
    const got = manifestOf(merged);
    const listed = [...want.documents, ...want.files].map((f) => f.path).sort();
    expect(filesBelow(merged)).toEqual([...listed, 'manifest.json'].sort());
    for (const path of listed) {
      expect(readFileSync(join(merged, path)).equals(readFileSync(join(single, path))), path).toBe(true);
    }
    const { run: _a, ...wantRest } = want;
    const { run: _b, ...gotRest } = got;
    expect(gotRest).toEqual(wantRest);
  });
});
