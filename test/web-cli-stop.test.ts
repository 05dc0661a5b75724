// Stopping `npm run web` stops everything it started: the test runs the package script as a
// person would (npm → the shell of the script → the web-mode server under tsx's loader, and the
// esbuild service the loader starts), sends SIGINT or SIGTERM to the top npm process only — what
// `kill` or a process manager does; a terminal's Ctrl+C signals the whole group, which is the
// easier case — and checks that no process of the tree is left. The tree is read from
// /proc/<pid>/stat (proc(5): field 4 is the parent's pid, field 3 the state).
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import { REPO_ROOT } from './support/e2e-web-app.ts';

interface ProcEntry {
  pid: number;
  ppid: number;
  state: string;
}

function processTable(): ProcEntry[] {
  const table: ProcEntry[] = [];
  for (const name of readdirSync('/proc')) {
    if (!/^[0-9]+$/.test(name)) continue;
    try {
      const stat = readFileSync(`/proc/${name}/stat`, 'utf8');
      // The command name (field 2) is in parentheses and may hold spaces; fields follow the last ')'.
      const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      table.push({ pid: Number(name), state: rest[0], ppid: Number(rest[1]) });
    } catch {
      // Gone between the listing and the read.
    }
  }
  return table;
}

function descendants(root: number): number[] {
  const table = processTable();
  const found = [root];
  for (let i = 0; i < found.length; i++) for (const p of table) if (p.ppid === found[i] && !found.includes(p.pid)) found.push(p.pid);
  return found;
}

/** Alive: listed in /proc and not a zombie waiting to be reaped (state Z) or dead (X). */
function alive(pid: number): boolean {
  if (!existsSync(`/proc/${pid}`)) return false;
  const entry = processTable().find((p) => p.pid === pid);
  return entry !== undefined && entry.state !== 'Z' && entry.state !== 'X';
}

async function until(condition: () => boolean, timeoutMs: number): Promise<boolean> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (condition()) return true;
    await new Promise((r) => setTimeout(r, 100));
  }
  return condition();
}

describe('npm run web stops every process it started', () => {
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    it(`on ${signal} to the npm process`, async () => {
      const env = { ...process.env };
      delete env.BROWSER;
      const npm = spawn('npm', ['run', 'web', '--', '--port', '0'], { cwd: REPO_ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
      let out = '';
      npm.stdout.on('data', (c: Buffer) => (out += c.toString('utf8')));
      npm.stderr.on('data', (c: Buffer) => (out += c.toString('utf8')));
      const exited = new Promise<void>((resolve) => npm.on('exit', () => resolve()));
      let tree: number[] = [npm.pid!];
      try {
        expect(await until(() => /http:\/\/127\.0\.0\.1:\d+\/#session=/.test(out), 120_000), out).toBe(true);
        tree = descendants(npm.pid!);
        // npm, and under it the server: at least two processes, one of them running web-cli.ts.
        const commands = tree.map((pid) => {
          try {
            return readFileSync(`/proc/${pid}/cmdline`, 'utf8').replace(/\0/g, ' ');
          } catch {
            return '';
          }
        });
        expect(commands.some((c) => c.includes('electron/web-cli.ts')), commands.join('\n')).toBe(true);
        npm.kill(signal);
        // A tree that does not stop must fail here, not hang until the test's timeout.
        await Promise.race([exited, new Promise((r) => setTimeout(r, 15_000))]);
        const leftOver = async (): Promise<number[]> => ((await until(() => tree.every((pid) => !alive(pid)), 10_000)) ? [] : tree.filter(alive));
        expect(await leftOver(), `still running after ${signal}: ${commands.join(' | ')}`).toEqual([]);
      } finally {
        // Whatever a failed run left behind, so it does not outlive the test.
        for (const pid of tree) if (alive(pid)) process.kill(pid, 'SIGKILL');
      }
    }, 180_000);
  }
});
