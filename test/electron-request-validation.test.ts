// The transport-free request registry refuses malformed and hostile arguments before any handler
// runs, and keeps file access inside the folders picked in a dialog plus the read-only bundled
// examples. References: JSON Schema draft 2020-12 Validation, sections 6.3.1 (maxLength),
// 6.3.3 (pattern), 6.5.3 (required), 10.3.2.3 (additionalProperties); OWASP "Path Traversal"
// (dot-dot sequences, symlinks, absolute paths outside the web root); Electron's security
// checklist, item 17 (treat every IPC message as untrusted input).
import { mkdirSync, mkdtempSync, readFileSync, realpathSync,rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDefaultServices } from '../electron/default-services.ts';
import { createNativeFolderChooser } from '../electron/folder-dialog.ts';
import type { RequestHandlers } from '../electron/request-handlers.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import type { RequestErrorInfo, RequestName, RequestReply } from '../sim/bridge/bridge-contract.ts';
import { BRIDGE_LIMITS } from '../sim/bridge/bridge-contract.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

let root: string;
let picked: string;
let outside: string;
let bundled: string;
let handlers: RequestHandlers;

const TETHER_SCENARIO = JSON.stringify({ name: 'korrin-bay-rover-tether', note: 'demo data, Korrin Bay test tank' }, null, 2);

beforeAll(async () => {
  root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-requests-')));
  picked = join(root, 'picked');
  outside = join(root, 'outside');
  bundled = join(root, 'bundled');
  for (const dir of [picked, outside, bundled]) mkdirSync(dir);
  writeFileSync(join(outside, 'secret.json'), '{"not":"yours"}');
  writeFileSync(join(bundled, 'korrin-bay-tether.json'), TETHER_SCENARIO);
  symlinkSync(outside, join(picked, 'link-to-outside'));
  let nextPick = picked;
  const services = await createDefaultServices({
    mode: 'desktop',
    version: '0.1.0',
    bundledScenariosDir: bundled,
    folderChooser: createNativeFolderChooser(async () => ({ canceled: false, filePaths: [nextPick] })),
  });
  handlers = createRequestHandlers(services);
  expect(await handlers.handle('folder.choose', { purpose: 'scenario' })).toEqual({ ok: true, result: { path: picked } });
  nextPick = bundled; // the person also opens the bundled folder in a dialog; writes there must still be refused
  expect(await handlers.handle('folder.choose', { purpose: 'scenario' })).toEqual({ ok: true, result: { path: bundled } });
});

afterAll(() => rmSync(root, { recursive: true, force: true }));

function refusal(reply: RequestReply<RequestName>): RequestErrorInfo {
  if (reply.ok) throw new Error(`expected a refusal, got ${JSON.stringify(reply.result)}`);
  // A clear error never carries a stack trace ("    at fn (file:line:col)").
  expect(reply.error.message).not.toMatch(/\n\s+at\s/);
  expect(reply.error.message.length).toBeLessThan(600);
  return reply.error;
}

describe('argument validation against the contract schemas (JSON Schema 2020-12)', () => {
  it('refuses arguments that are not an object: null, a string, a list', async () => {
    for (const args of [null, 'path=/etc/passwd', ['a'], 7, undefined]) {
      const error = refusal(await handlers.handle('scenario.read', args));
      expect(error.code).toBe('invalid-arguments');
      expect(error.message).toMatch(/must be an object/);
    }
  });

  it('refuses a non-string path (type keyword, 6.1.1)', async () => {
    for (const path of [42, { toString: '/etc/passwd' }, ['/etc/passwd'], true, null]) {
      const error = refusal(await handlers.handle('scenario.read', { path }));
      expect(error).toMatchObject({ code: 'invalid-arguments' });
      expect(error.message).toMatch(/^Argument \/path of scenario\.read must be a string, not /);
    }
  });

  it('refuses an extra key and names the keys that are accepted (additionalProperties false, 10.3.2.3)', async () => {
    const error = refusal(await handlers.handle('scenario.read', { path: join(picked, 'a.json'), mode: 'w' }));
    expect(error.code).toBe('invalid-arguments');
    expect(error.message).toBe('Unexpected key "mode" in the arguments of scenario.read. It accepts only: path.');
  });

  it('refuses a __proto__ key as JSON.parse creates it, and nothing is polluted', async () => {
    const hostile: unknown = JSON.parse(`{"path": ${JSON.stringify(join(picked, 'a.json'))}, "__proto__": {"polluted": true}}`);
    const error = refusal(await handlers.handle('scenario.read', hostile));
    expect(error.code).toBe('invalid-arguments');
    expect(error.message).toContain('"__proto__"');
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('refuses "constructor" and "prototype" keys', async () => {
    for (const key of ['constructor', 'prototype']) {
      const error = refusal(await handlers.handle('app.info', { [key]: { name: 'x' } }));
      expect(error.code).toBe('invalid-arguments');
      expect(error.message).toContain(`"${key}"`);
    }
  });

  it('refuses a class instance posing as the argument object', async () => {
    class Sneaky {
      path = join(picked, 'a.json');
    }
    const error = refusal(await handlers.handle('scenario.read', new Sneaky()));
    expect(error.message).toMatch(/plain JSON object/);
  });

  it('refuses huge strings without echoing them (maxLength, 6.3.1)', async () => {
    const longPath = `/${'a'.repeat(BRIDGE_LIMITS.pathChars)}`;
    const pathError = refusal(await handlers.handle('scenario.read', { path: longPath }));
    expect(pathError.code).toBe('invalid-arguments');
    expect(pathError.message).toBe(`Argument /path of scenario.read is too long: at most 4096 characters are accepted, it has ${longPath.length}.`);

    const longText = 'x'.repeat(BRIDGE_LIMITS.scenarioTextChars + 1);
    const textError = refusal(await handlers.handle('scenario.check', { text: longText, fileName: 'a.json' }));
    expect(textError.message).toMatch(/^Argument \/text of scenario\.check is too long: at most 1048576 characters/);
  });

  it('refuses a NUL byte in a path (pattern, 6.3.3; NUL ends a C path)', async () => {
    const error = refusal(await handlers.handle('scenario.read', { path: `${picked}/a.json\u0000.png` }));
    expect(error.code).toBe('invalid-arguments');
    expect(error.message).toMatch(/contains a NUL character/);
  });

  it('refuses a missing key (required, 6.5.3)', async () => {
    const error = refusal(await handlers.handle('scenario.write', { path: join(picked, 'a.json') }));
    expect(error.message).toBe('Missing key "text" in the arguments of scenario.write. Add it.');
  });

  it('refuses values outside an enum, and integers out of range or with a fraction', async () => {
    expect(refusal(await handlers.handle('folder.choose', { purpose: 'root' })).message).toBe(
      'Argument /purpose of folder.choose must be one of "dataset", "export", "scenario", "predictions", "report", "pictures", "seed", "scenario-save", not "root".',
    );
    const base = { scenarioText: '{}', outDir: picked, format: 'npz', resume: false };
    expect(refusal(await handlers.handle('export.begin', { ...base, workers: 1.5 })).message).toMatch(/\/workers of export\.begin must be an integer, not 1\.5/);
    expect(refusal(await handlers.handle('export.begin', { ...base, workers: 0 })).message).toMatch(/must be at least 1, not 0/);
    expect(refusal(await handlers.handle('export.begin', { ...base, workers: 1000 })).message).toMatch(/must be at most 64, not 1000/);
    expect(refusal(await handlers.handle('export.begin', { ...base, workers: 2, format: 'csv' })).message).toMatch(/must be one of "npz", "hdf5", "both"/);
  });

  it('refuses extra keys in nested objects and folder names in a bare file name', async () => {
    const nested = refusal(await handlers.handle('dataset.episodes', { path: picked, offset: 0, limit: 10, filter: { split: 'train', $where: '1' } }));
    expect(nested.message).toBe('Unexpected key "$where" in argument /filter of dataset.episodes. It accepts only: split, text, ranges.');
    const fileName = refusal(await handlers.handle('scenario.check', { text: '{}', fileName: '../../etc/passwd' }));
    expect(fileName.message).toMatch(/\/fileName of scenario\.check has characters that are not allowed/);
  });

  it('refuses unknown request names, including non-strings and prototype names', async () => {
    for (const name of ['fs.readFile', '__proto__', 'constructor', { name: 'app.info' }, 12, null]) {
      const error = refusal(await handlers.handle(name, {}));
      expect(error.code).toBe('unknown-request');
      expect(error.message).toMatch(/Known requests: app\.info, /);
    }
  });
});

describe('file access stays inside chosen folders (OWASP Path Traversal)', () => {
  it('refuses ".." even when it would land back inside the folder', async () => {
    for (const path of [`${picked}/../outside/secret.json`, `${picked}/sub/../a.json`, `${picked}\\..\\..\\outside\\secret.json`]) {
      const error = refusal(await handlers.handle('scenario.read', { path }));
      expect(error.code).toBe('path-refused');
      expect(error.message).toMatch(/contains "\.\."/);
    }
  });

  it('refuses relative paths', async () => {
    const error = refusal(await handlers.handle('scenario.read', { path: 'outside/secret.json' }));
    expect(error).toMatchObject({ code: 'path-refused' });
    expect(error.message).toMatch(/is a relative path/);
  });

  it('refuses a path outside every chosen folder and says how to fix it', async () => {
    const error = refusal(await handlers.handle('scenario.read', { path: join(outside, 'secret.json') }));
    expect(error.code).toBe('path-refused');
    expect(error.message).toMatch(/outside the folders chosen in this session\. Choose the folder that holds it/);
  });

  it('refuses a symlink inside a chosen folder that leads outside it', async () => {
    const error = refusal(await handlers.handle('scenario.read', { path: join(picked, 'link-to-outside', 'secret.json') }));
    expect(error.code).toBe('path-refused');
    const write = refusal(await handlers.handle('scenario.write', { path: join(picked, 'link-to-outside', 'new.json'), text: '{}' }));
    expect(write.code).toBe('path-refused');
  });

  it('refuses writes into the bundled examples even after that folder was picked', async () => {
    const error = refusal(await handlers.handle('scenario.write', { path: join(bundled, 'korrin-bay-tether.json'), text: '{}' }));
    expect(error.code).toBe('path-refused');
    expect(error.message).toMatch(/read-only/);
    expect(readFileSync(join(bundled, 'korrin-bay-tether.json'), 'utf8')).toBe(TETHER_SCENARIO);
  });

  it('refuses scenario files that do not end in .json', async () => {
    const error = refusal(await handlers.handle('scenario.write', { path: join(picked, 'run.sh'), text: 'rm -rf ~' }));
    expect(error.code).toBe('path-refused');
    expect(error.message).toMatch(/not a \.json file/);
  });

  it('reports a write into a missing folder as not-found, naming the folder rather than a temporary file', async () => {
    const error = refusal(await handlers.handle('scenario.write', { path: join(picked, 'no-such-folder', 'a.json'), text: '{}' }));
    expect(error.code).toBe('not-found');
    expect(error.message).toBe(`The folder ${JSON.stringify(join(picked, 'no-such-folder'))} does not exist. Create it first, or save in a folder that exists.`);
  });

  it('reports a missing file as not-found, naming the path, without a stack', async () => {
    const error = refusal(await handlers.handle('scenario.read', { path: join(picked, 'missing.json') }));
    expect(error.code).toBe('not-found');
    expect(error.message).toContain(join(picked, 'missing.json'));
  });
});

describe('well-formed requests are served', () => {
  it('writes a scenario atomically inside a chosen folder and reads it back byte for byte', async () => {
    const path = join(picked, 'korrin-bay-fin.json');
    const text = JSON.stringify({ name: 'korrin-bay-soft-fin', cells: 'ünïcode ✓' });
    const written = await handlers.handle('scenario.write', { path, text });
    expect(written).toEqual({ ok: true, result: { path, bytes: Buffer.byteLength(text, 'utf8') } });
    expect(readFileSync(path, 'utf8')).toBe(text);
    expect(await handlers.handle('scenario.read', { path })).toEqual({ ok: true, result: { path, text } });
  });

  it('lists and reads the bundled examples (read-only access)', async () => {
    const listed = await handlers.handle('scenario.listExamples', {});
    expect(listed).toEqual({ ok: true, result: [{ fileName: 'korrin-bay-tether.json', path: join(bundled, 'korrin-bay-tether.json') }] });
    const read = await handlers.handle('scenario.read', { path: join(bundled, 'korrin-bay-tether.json') });
    expect(read).toEqual({ ok: true, result: { path: join(bundled, 'korrin-bay-tether.json'), text: TETHER_SCENARIO } });
  });

  it('answers app.info with the mode, the folder-choice style and the safety notice', async () => {
    const reply = await handlers.handle('app.info', {});
    expect(reply.ok).toBe(true);
    if (reply.ok) {
      expect(reply.result).toMatchObject({ name: 'Pliant', version: '0.1.0', mode: 'desktop', folderChoice: 'native', platform: process.platform });
      expect((reply.result as { safetyNotice: string }).safetyNotice).toMatch(/does not replace hardware testing.*conservative limits/s);
    }
  });



  it('refuses the web-mode folder requests in the desktop app', async () => {
    const error = refusal(await handlers.handle('folder.browse', { path: '' }));
    expect(error.code).toBe('unsupported-in-mode');
  });
});

// Reference for the listing: Python's os.listdir, os.path.isfile and sorted() (code-point order,
// as the handler sorts), run by Debian's /usr/bin/python3.
describe.runIf(referencePythonAvailability().available)('folder.listJson lists a chosen folder\'s .json files, and only inside chosen folders', () => {
  const pythonListing = (folder: string): string[] =>
    runReferencePython<string[]>('import json, sys, os\nd = json.load(sys.stdin)\nprint(json.dumps(sorted(n for n in os.listdir(d) if os.path.isfile(os.path.join(d, n)) and n.lower().endswith(".json"))))', folder);

  it('lists regular .json files (any case) and nothing else: no other files, no folders named *.json', async () => {
    const folder = join(picked, 'korrin-sweeps');
    mkdirSync(folder);
    for (const name of ['tank-tether.json', 'Fin-Sweep.JSON', 'notes.txt', 'tank-tether.json.bak', '.hidden.json']) writeFileSync(join(folder, name), '{}');
    mkdirSync(join(folder, 'old.json'));
    const reply = await handlers.handle('folder.listJson', { path: folder });
    if (!reply.ok) throw new Error(reply.error.message);
    const names = (reply.result as { files: { name: string; path: string }[] }).files.map((f) => f.name);
    expect(names).toEqual(pythonListing(folder));
    expect(names).toEqual(['.hidden.json', 'Fin-Sweep.JSON', 'tank-tether.json']);
    expect(reply.result).toMatchObject({ path: folder, files: names.map((name) => ({ name, path: join(folder, name) })) });
  });

  it('lists the bundled examples, which are readable without a pick', async () => {
    const reply = await handlers.handle('folder.listJson', { path: bundled });
    expect(reply).toEqual({ ok: true, result: { path: bundled, files: pythonListing(bundled).map((name) => ({ name, path: join(bundled, name) })) } });
  });

  it('refuses folders nobody picked, a symlink leading out of a picked one, "..", and a file', async () => {
    for (const path of [outside, join(picked, 'link-to-outside'), `${picked}/../outside`, root]) {
      const error = refusal(await handlers.handle('folder.listJson', { path }));
      expect(error.code, path).toBe('path-refused');
    }
    expect(refusal(await handlers.handle('folder.listJson', { path: outside })).message).toMatch(/outside the folders chosen in this session/);
    writeFileSync(join(picked, 'plain.json'), '{}');
    const file = refusal(await handlers.handle('folder.listJson', { path: join(picked, 'plain.json') }));
    expect(file).toMatchObject({ code: 'path-refused', message: expect.stringMatching(/is a file, not a folder/) });
  });
});
