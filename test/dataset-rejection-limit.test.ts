// maxRejectedFraction: a sweep that loses more episodes than the limit stops with exit code 2
// and a message naming the parameter whose range the rejected episodes come from, instead of
// finishing with exit 0. The physics is that of test/dataset-rejected-episodes.test.ts: a tip
// force of 5000 N on a pinned five-part chain of EA = 100 N stretches each part about 10 m
// statically (F/k with k = EA/l = 500 N/m; Hooke's law for a bar, Gere & Goodno, Mechanics of
// Materials), far past the 10x stretch limit, while 50 N stays well below it; so exactly the
// 5000 N episodes are rejected.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { rejectedRangeLines } from '../sim/dataset/write/rejection-limit.ts';

const work = mkdtempSync(join(tmpdir(), 'pliant-rejection-limit-'));

function scenario(extra: Record<string, unknown>, weights: number[]): Record<string, unknown> {
  return {
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
    controls: { default: { kind: 'constant', value: { kind: 'categorical', values: [-50, -5000], weights } } },
    time: { recordIntervalS: 0.005, recordedSteps: 100, substeps: 'auto' },
    episodes: 12,
    seed: 5,
    ...extra,
  };
}

async function generate(name: string, value: Record<string, unknown>): Promise<{ code: number; stdout: string; stderr: string; dir: string }> {
  const path = join(work, `${name}.json`);
  writeFileSync(path, JSON.stringify(value));
  const dir = join(work, name);
  let stdout = '';
  let stderr = '';
  const code = await runCli(['generate', path, '--out', dir, '--workers', '1', '--progress', 'none'], { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr, dir };
}

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('maxRejectedFraction', () => {
  it('stops a sweep that loses more than the limit with exit 2, naming the control value the rejected episodes share', async () => {
    const run = await generate('strict', scenario({ maxRejectedFraction: 0.25 }, [1, 3]));
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/^pliant generate: stopped: \d+ of the \d+ episodes computed so far were rejected as unstable, more than maxRejectedFraction 0\.25 of this run's 12 episodes allows \(3\)\./);
    // The rejected episodes are exactly the -5000 N ones, at or below the median of the force.
    expect(run.stderr).toMatch(/\/controls\/force-tip-y\/value: rejected 0 of \d+ episodes above -5000 and (\d+) of \1 at or below; the rejected ones span -5000 to -5000/);
    expect(run.stderr).toContain('"maxRejectedFraction"');
    expect(run.stderr).not.toMatch(/\n\s+at /);
  });

  it('applies the default of 0.5 when the key is absent, and lets a sweep within the limit finish with exit 0', async () => {
    const mostly = await generate('default-limit', scenario({}, [1, 9]));
    expect(mostly.code).toBe(2);
    expect(mostly.stderr).toContain('maxRejectedFraction 0.5 (the default)');
    const within = await generate('within', scenario({ maxRejectedFraction: 1 }, [1, 9]));
    expect(within.stderr).toBe('');
    expect(within.code).toBe(0);
    const manifest = JSON.parse(readFileSync(join(within.dir, 'manifest.json'), 'utf8')) as DatasetManifest;
    expect(manifest.episodes.filter((e) => e.status === 'rejected').length).toBeGreaterThan(6);
  });

  it('names the lopsided parameter first and leaves out parameters that do not separate the rejected episodes', () => {
    const episodes = Array.from({ length: 20 }, (_, i) => ({ labels: { '/system/lengthM': i, '/system/totalMassKg': i % 2 }, rejected: i >= 15 }));
    const lines = rejectedRangeLines(episodes);
    expect(lines[0]).toContain('/system/lengthM: rejected 5 of 10 episodes above 9 and 0 of 10 at or below; the rejected ones span 15 to 19 (all so far: 0 to 19)');
    // Mass 0 and 1 alternate, rejected ones are 15..19 (three odd, two even): a weak separation, ranked after length.
    expect(lines).toHaveLength(2);
    expect(lines[1]).toContain('/system/totalMassKg');
  });
});
