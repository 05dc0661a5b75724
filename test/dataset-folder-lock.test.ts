// One writer per dataset folder. While a run holds `.pliant-lock` (created with O_CREAT|O_EXCL,
// open(2)), a second `pliant generate` or `pliant merge` on the folder must stop at once with
// exit 2 and "another run is using this folder", naming the holder, instead of both failing
// later with ENOTEMPTY. The holder is a live process: kill(2) with signal 0 succeeds for it. A
// lock naming this host and a process that has exited (kill(2) then fails with ESRCH) is stale
// and is taken over; a lock from another host is reported with how to remove it.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';

const ROOT = resolve(import.meta.dirname, '..');
const TETHER = join(ROOT, 'scenarios/korrin-tether.json');
const work = mkdtempSync(join(tmpdir(), 'pliant-lock-'));
const sleeper = spawn('sleep', ['600'], { stdio: 'ignore' });
afterAll(() => {
  sleeper.kill();
  rmSync(work, { recursive: true, force: true });
});

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

function lockedFolder(name: string, holder: { pid: number; host: string }): string {
  const dir = join(work, name);
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, '.pliant-lock'), JSON.stringify({ ...holder, since: '2026-04-12T09:00:00.000Z', purpose: 'pliant generate' }));
  return dir;
}

const GENERATE = ['--episodes', '2', '--format', 'npz', '--workers', '1'];

describe('the folder lock', () => {
  it('stops a second run while a live process holds the folder, and leaves the folder as it was', async () => {
    expect(sleeper.pid).toBeTypeOf('number');
    const dir = lockedFolder('held', { pid: sleeper.pid!, host: hostname() });
    for (const args of [['generate', TETHER, '--out', dir, ...GENERATE], ['generate', TETHER, '--out', dir, ...GENERATE, '--force']]) {
      const outcome = await cli(args);
      expect(outcome.code).toBe(2);
      expect(outcome.stderr).toContain('another run is using this folder');
      expect(outcome.stderr).toContain(`process ${sleeper.pid} on ${hostname()}`);
      expect(outcome.stderr).not.toMatch(/ENOTEMPTY|\n\s+at /);
    }
    expect(readdirSync(dir)).toEqual(['.pliant-lock']);
  });

  it('stops a merge into a held folder', async () => {
    const s0 = join(work, 'shard-0');
    const s1 = join(work, 'shard-1');
    expect((await cli(['generate', TETHER, '--out', s0, ...GENERATE, '--shard', '0/2'])).code).toBe(0);
    expect((await cli(['generate', TETHER, '--out', s1, ...GENERATE, '--shard', '1/2'])).code).toBe(0);
    const dir = lockedFolder('held-merge', { pid: sleeper.pid!, host: hostname() });
    const outcome = await cli(['merge', s0, s1, '--out', dir, '--force']);
    expect(outcome.code).toBe(2);
    expect(outcome.stderr).toContain('another run is using this folder');
  }, 120_000);

  it('takes over a lock left by a process of this host that has exited, and removes it when done', async () => {
    const exited = spawnSync('true');
    expect(exited.status).toBe(0);
    const dir = lockedFolder('stale', { pid: exited.pid!, host: hostname() });
    const outcome = await cli(['generate', TETHER, '--out', dir, ...GENERATE, '--resume']);
    expect(outcome.stderr).toBe('');
    expect(outcome.code).toBe(0);
    expect(existsSync(join(dir, '.pliant-lock'))).toBe(false);
    expect((await cli(['verify', dir])).code).toBe(0);
  }, 120_000);

  it('reports a lock from another host with the way to remove it', async () => {
    const dir = lockedFolder('other-host', { pid: 1, host: 'korrin-bay-cluster-node-7' });
    const outcome = await cli(['generate', TETHER, '--out', dir, ...GENERATE, '--resume']);
    expect(outcome.code).toBe(2);
    expect(outcome.stderr).toContain('korrin-bay-cluster-node-7');
    expect(outcome.stderr).toContain(`delete ${join(dir, '.pliant-lock')}`);
  });
});
