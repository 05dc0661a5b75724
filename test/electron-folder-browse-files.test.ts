// Web mode's folder chooser lists a folder's .json files when asked (folder.browse with
// jsonFiles), so a scenario file is picked in one step; without the flag the listing is as
// before, folders only. Reference for the file names: Python's os.listdir, os.path.isfile and
// sorted() (code-point order, as the handler sorts), run by Debian's /usr/bin/python3. The
// purposes "seed" and "scenario-save" are accepted, an unknown purpose refused (JSON Schema
// draft 2020-12 Validation, 6.1.2 enum).
import { mkdirSync, mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDefaultServices } from '../electron/default-services.ts';
import { createNativeFolderChooser, folderDialogOptions } from '../electron/folder-dialog.ts';
import type { RequestHandlers } from '../electron/request-handlers.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import type { FolderListing } from '../sim/bridge/bridge-contract.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

let root: string;
let handlers: RequestHandlers;

beforeAll(async () => {
  root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-browse-files-')));
  mkdirSync(join(root, 'korrin-bay'));
  mkdirSync(join(root, '.settings'));
  mkdirSync(join(root, 'folder.json'));
  for (const name of ['tank-tether.json', 'Eel-Sweep.JSON', 'notes.txt', '.hidden.json', 'b-fin.json']) writeFileSync(join(root, name), '{}');
  const services = await createDefaultServices({ mode: 'web', version: '0.1.0', bundledScenariosDir: join(root, 'korrin-bay'), folderChooser: { mode: 'in-page', rootDir: root } });
  handlers = createRequestHandlers(services);
});

afterAll(() => rmSync(root, { recursive: true, force: true }));

async function browse(args: Record<string, unknown>): Promise<FolderListing> {
  const reply = await handlers.handle('folder.browse', args);
  if (!reply.ok) throw new Error(JSON.stringify(reply.error));
  return reply.result as FolderListing;
}

describe('folder.browse with jsonFiles', () => {
  it('without the flag lists folders only', async () => {
    const listing = await browse({ path: root });
    expect(listing.jsonFiles).toBeUndefined();
    expect(listing.folders.map((f) => f.name)).toEqual(['.settings', 'folder.json', 'korrin-bay']);
  });

  it.runIf(referencePythonAvailability().available)('with the flag lists the regular .json files (any case), as Python lists them', async () => {
    const listing = await browse({ path: root, jsonFiles: true });
    const expected = runReferencePython<string[]>('import json, sys, os\nd = json.load(sys.stdin)\nprint(json.dumps(sorted(n for n in os.listdir(d) if os.path.isfile(os.path.join(d, n)) and n.lower().endswith(".json"))))', root);
    expect(listing.jsonFiles?.map((f) => f.name)).toEqual(expected);
    expect(expected).toEqual(['.hidden.json', 'Eel-Sweep.JSON', 'b-fin.json', 'tank-tether.json']);
    expect(listing.jsonFiles?.every((f) => f.path === join(root, f.name))).toBe(true);
  });

  it('refuses a flag that is not true or false', async () => {
    const reply = await handlers.handle('folder.browse', { path: root, jsonFiles: 'yes' });
    expect(reply.ok).toBe(false);
  });

  it('accepts the seed and scenario-save purposes and refuses an unknown one', async () => {
    for (const purpose of ['seed', 'scenario-save']) {
      const reply = await handlers.handle('folder.allow', { path: join(root, 'korrin-bay'), purpose });
      expect(reply.ok, purpose).toBe(true);
    }
    expect((await handlers.handle('folder.allow', { path: root, purpose: 'anything' })).ok).toBe(false);
  });

  it('the desktop app opens a scenario file in one step: the file\'s folder is allowed and the file named', async () => {
    const file = join(root, 'tank-tether.json');
    const services = await createDefaultServices({ mode: 'desktop', version: '0.1.0', bundledScenariosDir: join(root, 'korrin-bay'), folderChooser: createNativeFolderChooser(async (options) => ({ canceled: false, filePaths: [options.properties?.includes('openFile') ? file : root] })) });
    const desktop = createRequestHandlers(services);
    expect(await desktop.handle('folder.choose', { purpose: 'scenario' })).toEqual({ ok: true, result: { path: root, file: 'tank-tether.json' } });
    expect((await desktop.handle('scenario.read', { path: file })).ok).toBe(true);
    // A folder purpose still answers with the folder alone.
    expect(await desktop.handle('folder.choose', { purpose: 'scenario-save' })).toEqual({ ok: true, result: { path: root } });
    expect(folderDialogOptions('scenario').properties).toEqual(['openFile', 'dontAddToRecent']);
    expect(folderDialogOptions('scenario-save').properties).toContain('openDirectory');
  });

  it('a desktop dialog opens where the last pick for its purpose was, else where it is told to start', async () => {
    const asked: (string | undefined)[] = [];
    const answers = [join(root, 'tank-tether.json'), join(root, 'korrin-bay'), join(root, 'korrin-bay')];
    const chooser = createNativeFolderChooser(async (options) => {
      asked.push(options.defaultPath);
      return { canceled: false, filePaths: [answers.shift()!] };
    }, { scenario: '/opt/pliant/scenarios' });
    if (chooser.mode !== 'native') throw new Error('expected the native chooser');
    await chooser.choose('scenario');
    await chooser.choose('scenario-save');
    await chooser.choose('dataset');
    // First from the bundled scenarios; then from the picked file's folder, shared by saving;
    // a dataset dialog has no memory yet.
    expect(asked).toEqual(['/opt/pliant/scenarios', root, undefined]);
  });

  it('the desktop dialogs are titled for what they open', () => {
    expect(folderDialogOptions('seed').title).toBe('Open a seed file');
    expect(folderDialogOptions('scenario').title).toBe('Open a scenario file');
    expect(folderDialogOptions('scenario-save').title).toBe('Where should the scenario go?');
    expect(folderDialogOptions('dataset').title).toBe('Open a dataset');
  });
});
