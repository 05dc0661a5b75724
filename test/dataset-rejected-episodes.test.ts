// Unstable episodes are listed as rejected with their reason, get no data, and do not stop the
// sweep. The sweep pulls the tip of a pinned five-part chain (EA = 100 N, so k = EA/ℓ = 500 N/m
// per part; Hooke's law for a bar, Gere & Goodno, Mechanics of Materials) with a constant force
// of either 50 N or 5000 N. Statically each part then stretches by F/k: 0.1 m (L/L0 = 1.5) or
// 10 m (L/L0 = 51); a suddenly applied load at most doubles an undamped spring's static
// extension (Timoshenko, Vibration Problems in Engineering, from memory), so 50 N stays far
// below the 10× stretch limit while 5000 N must pass it: exactly the 5000 N episodes are unstable.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { REFERENCE_PYTHON, referencePythonAvailability } from './support/reference-python.ts';

const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-rejected-'));
const scenarioPath = join(work, 'pulled-tether.json');

const scenario = {
  formatVersion: 1,
  name: 'korrin-tether-overload',
  description: 'Korrin Bay test tank: a tether piece overloaded at its tip in some episodes.',
  system: {
    kind: 'chain',
    partCount: 5,
    lengthM: 1,
    totalMassKg: 0.5,
    axialStiffnessN: 100,
    dampingRatio: 0.05,
    diameterM: 0.01,
    anchor: 'top-pinned',
    forceHandles: [-1],
    forceAxes: ['y'],
  },
  world: { gravityMPerS2: [0, -9.81, 0] },
  controls: { default: { kind: 'constant', value: { kind: 'categorical', values: [-50, -5000] } } },
  time: { recordIntervalS: 0.005, recordedSteps: 100, substeps: 'auto' },
  episodes: 10,
  seed: 5,
  export: { format: 'both', dtype: 'float32' },
  // This sweep is about rejections themselves (6 of 10 here), so it must not stop at the default limit of 0.5.
  maxRejectedFraction: 1,
};

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

let manifest: DatasetManifest;
const dir = join(work, 'out');

beforeAll(async () => {
  writeFileSync(scenarioPath, JSON.stringify(scenario));
  const made = await cli(['generate', scenarioPath, '--out', dir, '--workers', '1']);
  expect(made.stderr).toBe('');
  expect(made.code).toBe(0);
  manifest = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as DatasetManifest;
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('rejected episodes', () => {
  it('rejects exactly the overloaded episodes, with step, node and cause, and records the rest', () => {
    const channel = manifest.episodes[0].controlChannels.find((c) => c.kind === 'handle-force')!;
    const FORCE_LABEL = `/controls/${channel.name}/value`;
    const overloaded = manifest.episodes.filter((e) => e.labels[FORCE_LABEL] === -5000);
    const gentle = manifest.episodes.filter((e) => e.labels[FORCE_LABEL] === -50);
    expect(overloaded.length).toBeGreaterThan(0);
    expect(gentle.length).toBeGreaterThan(0);
    expect(overloaded.length + gentle.length).toBe(10);
    for (const e of overloaded) {
      expect(e.status).toBe('rejected');
      expect(e.files).toEqual([]);
      const r = e.rejection!;
      expect(['over-stretch', 'over-speed']).toContain(r.kind);
      expect(r.step).toBeGreaterThanOrEqual(1);
      expect(r.step).toBeLessThanOrEqual(100);
      expect(r.node).toBeGreaterThanOrEqual(0);
      expect(r.node).toBeLessThanOrEqual(5);
      expect(r.message).toContain(`episode ${e.index}, recorded step ${r.step}, node ${r.node}`);
      expect(r.likelyCause.length).toBeGreaterThan(20);
      expect(existsSync(join(dir, `episodes/${e.id}.npz`))).toBe(false);
    }
    for (const e of gentle) {
      expect(e.status).toBe('ok');
      expect(e.rejection).toBeNull();
      expect(existsSync(join(dir, `episodes/${e.id}.npz`))).toBe(true);
    }
    const inFiles = new Set(manifest.files.flatMap((f) => f.episodes));
    for (const e of overloaded) expect(inFiles.has(e.id)).toBe(false);
    const counted = Object.values(manifest.splits).reduce((sum, s) => sum + s.rejected, 0);
    expect(counted).toBe(overloaded.length);
  });

  it('lists the rejected episodes in the card and in `pliant inspect`, and the folder still verifies', async () => {
    const card = readFileSync(join(dir, 'CARD.md'), 'utf8');
    const rejected = manifest.episodes.filter((e) => e.status === 'rejected');
    expect(card).toContain(`${rejected.length} episode${rejected.length === 1 ? ' was' : 's were'} rejected`);
    for (const e of rejected) expect(card).toContain(`| ${e.id} | ${e.split} | ${e.rejection!.step} | ${e.rejection!.node} |`);
    const inspected = await cli(['inspect', dir]);
    expect(inspected.code).toBe(0);
    expect(inspected.stdout).toContain(`Rejected episodes (${rejected.length}):`);
    for (const e of rejected) expect(inspected.stdout).toContain(e.id);
    const verified = await cli(['verify', dir]);
    expect(verified.code).toBe(0);
  });

  it.runIf(python.available)('no HDF5 split file holds a group for a rejected episode (h5py)', () => {
    const run = spawnSync(REFERENCE_PYTHON, ['-c', 'import h5py, glob, json\nprint(json.dumps(sorted(k for p in glob.glob("*.h5") for k in h5py.File(p, "r").keys())))'], { cwd: dir, encoding: 'utf8' });
    expect(run.status).toBe(0);
    const groups = JSON.parse(run.stdout) as string[];
    expect(groups).toEqual(manifest.episodes.filter((e) => e.status === 'ok').map((e) => e.id));
  });

  it('rejects the same episodes when two workers share the sweep', async () => {
    const other = join(work, 'two-workers');
    expect((await cli(['generate', scenarioPath, '--out', other, '--workers', '2'])).code).toBe(0);
    const again = JSON.parse(readFileSync(join(other, 'manifest.json'), 'utf8')) as DatasetManifest;
    expect(again.episodes).toEqual(manifest.episodes);
  });
});
