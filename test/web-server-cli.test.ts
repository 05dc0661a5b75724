// `npm run web`'s entry (electron/web-cli.ts, run through tsx): prints the address with the
// session key, serves it on 127.0.0.1, answers with the real dataset pipeline (a folder written by
// `pliant generate` opens and verifies), stops cleanly on SIGTERM, and explains bad options
// without a stack trace. BROWSER is removed from the environment so no browser is ever opened here.
import { spawn } from 'node:child_process';
import { mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';
import { cutDownScenario, runPliant } from './support/app-flow-session.ts';

let renderer: string;
let datasets: string;

beforeAll(() => {
  renderer = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-cli-')));
  writeFileSync(join(renderer, 'index.html'), '<!doctype html><title>Pliant web</title>');
  datasets = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-cli-data-')));
  const scenario = join(datasets, 'tether.json');
  writeFileSync(scenario, cutDownScenario('korrin-tether.json', 2, 10));
  const generated = runPliant(['generate', scenario, '--out', join(datasets, 'tether'), '--progress', 'none']);
  expect(generated.stderr).toBe('');
});
afterAll(() => {
  rmSync(renderer, { recursive: true, force: true });
  rmSync(datasets, { recursive: true, force: true });
});

/** `startedIn` stands for the folder `npm run web` was typed in (npm passes it as INIT_CWD). */
function startCli(args: string[], startedIn?: string) {
  const env = { ...process.env };
  delete env.BROWSER;
  delete env.INIT_CWD;
  if (startedIn !== undefined) env.INIT_CWD = startedIn;
  const child = spawn(process.execPath, ['--import', 'tsx', join(process.cwd(), 'electron/web-cli.ts'), ...args], { cwd: process.cwd(), env, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout.on('data', (c: Buffer) => (stdout += c.toString('utf8')));
  child.stderr.on('data', (c: Buffer) => (stderr += c.toString('utf8')));
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  return { child, exited, out: () => stdout, err: () => stderr };
}

function addressOf(cli: ReturnType<typeof startCli>): Promise<string> {
  return new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`no address printed; stderr: ${cli.err()}`)), 60_000);
    cli.child.stdout.on('data', () => {
      const match = /http:\/\/127\.0\.0\.1:\d+\/#session=[0-9a-f]{64}/.exec(cli.out());
      if (match && cli.out().includes(SAFETY_CAUTION)) {
        clearTimeout(timer);
        resolve(match[0]);
      }
    });
  });
}

describe('web-mode command line', () => {
  it('prints the address, serves the page and answers requests, then stops on SIGTERM', async () => {
    const cli = startCli(['--port', '0', '--renderer', renderer, '--root', datasets]);
    const url = await new Promise<string>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`no address printed; stderr: ${cli.err()}`)), 60_000);
      cli.child.stdout.on('data', () => {
        const match = /http:\/\/127\.0\.0\.1:\d+\/#session=[0-9a-f]{64}/.exec(cli.out());
        // Wait for the whole banner: a pipe may deliver one write in several chunks.
        if (match && cli.out().includes(SAFETY_CAUTION)) {
          clearTimeout(timer);
          resolve(match[0]);
        }
      });
    });
    expect(cli.out()).toMatch(/does not replace hardware testing/);
    expect(cli.out()).toContain(`The page may open and write folders inside ${datasets} only (change with --root).`);
    const address = new URL(url);
    const page = await fetch(new URL('/', address));
    expect(await page.text()).toBe('<!doctype html><title>Pliant web</title>');
    const token = address.hash.replace('#session=', '');
    const request = async (name: string, args: unknown) =>
      (await fetch(new URL(`/api/request/${name}`, address), { method: 'POST', headers: { 'content-type': 'application/json', 'x-pliant-session': token }, body: JSON.stringify(args) })).json();
    expect(await request('app.info', {})).toMatchObject({ ok: true, result: { mode: 'web', version: expect.stringMatching(/^\d+\.\d+\.\d+/) } });
    // The same pipeline as the desktop app: a folder the command line wrote opens and verifies.
    const tether = join(datasets, 'tether');
    expect(await request('folder.allow', { path: tether, purpose: 'dataset' })).toEqual({ ok: true, result: { path: tether } });
    expect(await request('dataset.summary', { path: tether })).toMatchObject({ ok: true, result: { scenarioName: 'korrin-tether', episodeCount: 2 } });
    expect(await request('dataset.verify', { path: tether })).toMatchObject({ ok: true, result: { ok: true, problems: [] } });
    cli.child.kill('SIGTERM');
    expect(await cli.exited).toBe(0);
  });

  it('confines the page to the folder it was started in when --root is not given', async () => {
    // Started in `renderer`: the dataset folder beside it is outside the root.
    const cli = startCli(['--port', '0', '--renderer', renderer], renderer);
    const url = await addressOf(cli);
    expect(cli.out()).toContain(`inside ${renderer} only`);
    const address = new URL(url);
    const token = address.hash.replace('#session=', '');
    const reply = await (await fetch(new URL('/api/request/folder.allow', address), {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-pliant-session': token },
      body: JSON.stringify({ path: join(datasets, 'tether'), purpose: 'dataset' }),
    })).json() as { ok: boolean; error: { code: string } };
    expect(reply).toMatchObject({ ok: false, error: { code: 'path-refused' } });
    cli.child.kill('SIGTERM');
    expect(await cli.exited).toBe(0);
  });

  it('explains a --root that is not a folder and exits 2', async () => {
    const cli = startCli(['--renderer', renderer, '--root', join(datasets, 'no-such-folder')]);
    expect(await cli.exited).toBe(2);
    expect(cli.err()).toMatch(/^--root ".*no-such-folder" is not a folder \(it does not exist\)\. Give a folder that exists\./);
  });

  it('explains a bad --port and exits 2', async () => {
    const cli = startCli(['--port', 'eighty']);
    expect(await cli.exited).toBe(2);
    expect(cli.err()).toMatch(/^--port needs a whole number from 0 to 65535, got "eighty"\./);
    expect(cli.err()).not.toMatch(/\n\s+at\s/);
  });

  it('explains a missing renderer build and exits 1', async () => {
    const cli = startCli(['--renderer', join(renderer, 'not-built')]);
    expect(await cli.exited).toBe(1);
    expect(cli.err()).toMatch(/No built renderer in .*not-built \(index\.html is missing\)\. Run "npm run build:renderer" first/);
  });
});
