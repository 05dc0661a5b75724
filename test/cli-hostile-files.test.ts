// Files a careless or hostile user points Pliant at: a scenario or a measurement table that is a
// link to /dev/zero, a
// file far larger than any scenario, JSON nested thousands of levels deep (in the CLI and in
// the app's scenario check), and a UTF-8 byte-order mark. Each gets exit 2 (or a problem list in
// the app) with a message naming the file and what is wrong, never a stack trace or an endless
// read. The byte-order mark is accepted as RFC 8259 §8.1 allows ("MAY ignore"); Python's
// 'utf-8-sig' codec, which strips it, reads the same document (reference: Python's codecs).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, realpathSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { createDefaultServices } from '../electron/default-services.ts';
import { createNativeFolderChooser } from '../electron/folder-dialog.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import { MAX_JSON_DEPTH } from '../sim/scenario/json-source-map.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');
const work = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-hostile-')));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const python = referencePythonAvailability();

function pliant(...args: string[]): { code: number | null; stdout: string; stderr: string } {
  const run = spawnSync(process.execPath, [LAUNCHER, ...args], { cwd: work, encoding: 'utf8', timeout: 60_000 });
  return { code: run.status, stdout: run.stdout, stderr: run.stderr };
}

function expectRefused(run: { code: number | null; stderr: string }, ...phrases: string[]): void {
  expect(run.code, run.stderr).toBe(2);
  for (const p of phrases) expect(run.stderr).toContain(p);
  expect(run.stderr).not.toMatch(/\n\s+at /);
  expect(run.stderr).not.toMatch(/RangeError|Invalid string length|Maximum call stack/);
}

const deep = `${'['.repeat(5000)}${']'.repeat(5000)}`;

describe('hostile and careless files', () => {
  it('a scenario that is a link to /dev/zero is refused as not a regular file, without reading it', () => {
    symlinkSync('/dev/zero', join(work, 'zero.json'));
    expectRefused(pliant('validate', 'zero.json'), 'the scenario file zero.json is not a regular file');
  });

  it('a scenario file over 16 MiB is refused by its size', () => {
    writeFileSync(join(work, 'huge.json'), Buffer.alloc(17 * 1024 * 1024, 0x20));
    expectRefused(pliant('validate', 'huge.json'), 'the scenario file huge.json is 17 MiB, more than the 16 MiB');
  });

  it("a measurement's NPY table that is a link to /dev/zero is refused as not a regular file", () => {
    const descriptor = JSON.parse(readFileSync(join(ROOT, 'scenarios/bench/korrin-tether-bench.json'), 'utf8')) as Record<string, unknown>;
    descriptor.table = 'zero-table.npy';
    writeFileSync(join(work, 'zero-measurement.json'), JSON.stringify(descriptor));
    symlinkSync('/dev/zero', join(work, 'zero-table.npy'));
    expectRefused(pliant('calibrate', join(ROOT, 'scenarios/korrin-tether.json'), 'zero-measurement.json', '--out', join(work, 'fitted.json')), 'zero-table.npy is not a regular file');
  });

  it('5,000 levels of nesting: exit 2 naming the line and column where the limit is passed', () => {
    writeFileSync(join(work, 'deep.json'), deep);
    // The bracket that opens level MAX_JSON_DEPTH + 1 is character MAX_JSON_DEPTH + 1 of line 1.
    expectRefused(pliant('validate', 'deep.json'), `deep.json:1:${MAX_JSON_DEPTH + 1}`, `more than ${MAX_JSON_DEPTH} levels`);
  });

  it("the app's scenario check answers the same nesting with a problem, not an internal error", async () => {
    const services = await createDefaultServices({
      mode: 'desktop',
      version: '0.1.0',
      bundledScenariosDir: join(work, 'none'),
      folderChooser: createNativeFolderChooser(async () => ({ canceled: false, filePaths: [work] })),
    });
    const handlers = createRequestHandlers(services);
    const reply = (await handlers.handle('scenario.check', { text: deep, fileName: 'deep.json' })) as { ok: boolean; result: { ok: boolean; problems: { message: string; line?: number; column?: number }[] } };
    expect(reply.ok, JSON.stringify(reply).slice(0, 300)).toBe(true);
    const checked = reply.result;
    expect(checked.ok).toBe(false);
    expect(checked.problems[0].message).toContain(`more than ${MAX_JSON_DEPTH} levels`);
    expect([checked.problems[0].line, checked.problems[0].column]).toEqual([1, MAX_JSON_DEPTH + 1]);
  });

  it.skipIf(!python.available)('a byte-order mark before a valid scenario is accepted, and the scenario is the one Python reads with utf-8-sig', () => {
    const tether = readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8');
    writeFileSync(join(work, 'bom.json'), `\uFEFF${tether}`);
    const same = runReferencePython<boolean>(`
import json, sys
r = json.load(sys.stdin)
print(json.dumps(json.load(open(r['bom'], encoding='utf-8-sig')) == json.load(open(r['plain'], encoding='utf-8'))))`, { bom: join(work, 'bom.json'), plain: join(ROOT, 'scenarios/korrin-tether.json') });
    expect(same).toBe(true);
    const run = pliant('validate', 'bom.json');
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('valid');
  });
});
