// `pliant merge … --out` must never overwrite one of its own inputs. An output folder that is a
// shard, lies inside one, contains one or reaches one through a symbolic link (symlink(7):
// paths are compared after realpath(3) resolves every link) is refused with exit 2 before
// anything is touched, even with --force; the shard's files are then still byte for byte what
// its manifest records, which `pliant verify` checks against their SHA-256 (FIPS 180-4) and
// GNU coreutils' `sha256sum` confirms for the seed file.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';

const ROOT = resolve(import.meta.dirname, '..');
const work = mkdtempSync(join(tmpdir(), 'pliant-merge-overlap-'));
const shard0 = join(work, 'shards', 's0');
const shard1 = join(work, 'shards', 's1');

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

function sha256sum(path: string): string {
  const run = spawnSync('sha256sum', [path], { encoding: 'utf8' });
  expect(run.status).toBe(0);
  return run.stdout.split(' ')[0];
}

beforeAll(async () => {
  for (const [dir, shard] of [[shard0, '0/2'], [shard1, '1/2']]) {
    const made = await cli(['generate', join(ROOT, 'scenarios/korrin-tether.json'), '--out', dir, '--episodes', '4', '--format', 'npz', '--workers', '1', '--shard', shard]);
    expect(made.stderr).toBe('');
    expect(made.code).toBe(0);
  }
}, 300_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('pliant merge --out', () => {
  it('refuses an output that is, lies inside, contains or links to a shard, and leaves the shard whole', async () => {
    const seedBefore = sha256sum(join(shard0, 'seed.json'));
    const entriesBefore = readdirSync(shard0).sort();
    symlinkSync(shard0, join(work, 'link-to-s0'));
    const cases: Array<[string, RegExp]> = [
      [shard0, /is the shard folder/],
      [join(work, 'link-to-s0'), /is the shard folder/],
      [join(shard0, 'merged'), /lies inside the shard folder/],
      [join(work, 'shards'), /contains the shard folder/],
    ];
    for (const [out, wording] of cases) {
      const outcome = await cli(['merge', shard0, shard1, '--out', out, '--force']);
      expect(outcome.code, out).toBe(2);
      expect(outcome.stderr).toMatch(wording);
      expect(outcome.stderr).not.toMatch(/\n\s+at /);
    }
    expect(readdirSync(shard0).sort()).toEqual(entriesBefore);
    expect(sha256sum(join(shard0, 'seed.json'))).toBe(seedBefore);
    const verified = await cli(['verify', shard0]);
    expect(verified.stderr).toBe('');
    expect(verified.code).toBe(0);
  });

  it('still merges into a new folder beside the shards', async () => {
    const outcome = await cli(['merge', shard0, shard1, '--out', join(work, 'all')]);
    expect(outcome.stderr).toBe('');
    expect(outcome.code).toBe(0);
    expect((await cli(['verify', join(work, 'all')])).code).toBe(0);
  });
});
