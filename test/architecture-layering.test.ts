// Checks the layering table of DEVELOPERS.md ("Layout") for every folder that holds source:
// each folder of sim/ imports only the folders below it, sim/cli and sim/bench are the top of
// sim/, the environment-free folders import nothing from Node or Electron, electron/ never
// imports the page, the page (renderer/) imports only environment-free parts of sim/ (the bridge
// contract among them) and never Node, Electron or electron/, and the two shells reach the
// simulator only through the shared handlers. Imports are read by TypeScript's own scanner
// (ts.preProcessFile), so commented-out imports and imports inside strings do not count.
// (Project rule; common practice, no source.)
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { dirname, join, relative, resolve } from 'node:path';

import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(import.meta.dirname, '..');

/** The environment-free folders: no Node, no DOM, no Electron (also type-checked by sim/tsconfig.core.json). */
const ENVIRONMENT_FREE = ['sim/errors', 'sim/bridge', 'sim/plots', 'sim/random', 'sim/core', 'sim/systems', 'sim/controls', 'sim/design', 'sim/episode', 'sim/scenario'];

const SIM_BELOW_TOP = [
  'sim/errors', 'sim/bridge', 'sim/random', 'sim/plots', 'sim/core', 'sim/systems', 'sim/controls', 'sim/design', 'sim/episode',
  'sim/scenario', 'sim/dataset', 'sim/render', 'sim/identify',
];

/**
 * The bottom room every folder may import: the error taxonomy (kinds and stable codes), which
 * imports nothing itself, so that an error thrown anywhere says what kind it is.
 */
const SHARED = ['sim/errors'];

/** Which folders each folder may import from (besides itself and SHARED). Every folder that holds source is listed. */
const ALLOWED: Record<string, string[]> = {
  'sim/errors': [],
  // The one agreement between the page and the shells: imports nothing, so neither side drags the other's environment in.
  'sim/bridge': [],
  'sim/random': [],
  // Deterministic SVG charts (line, histogram, scatter, edge sketches) for the card and the reports.
  'sim/plots': [],
  'sim/core': [],
  'sim/systems': ['sim/core'],
  'sim/controls': ['sim/random'],
  // Sampling designs (grid, Latin hypercube, Sobol) and their coverage measure: unit-cube maths.
  'sim/design': ['sim/random'],
  'sim/episode': ['sim/core', 'sim/systems'],
  'sim/scenario': ['sim/core', 'sim/systems', 'sim/random', 'sim/controls', 'sim/episode', 'sim/design'],
  'sim/dataset': ['sim/core', 'sim/systems', 'sim/random', 'sim/controls', 'sim/episode', 'sim/design', 'sim/scenario', 'sim/plots'],
  // Pictures of recorded episodes, drawn from the files.
  'sim/render': ['sim/core', 'sim/systems', 'sim/dataset'],
  // Scoring, baselines and calibration sit after the files: they read datasets, never the CLI.
  'sim/identify': ['sim/core', 'sim/systems', 'sim/random', 'sim/controls', 'sim/episode', 'sim/design', 'sim/scenario', 'sim/dataset', 'sim/plots'],
  // The top of sim/: the command line runs `pliant bench`, whose cases call the command line.
  'sim/cli': [...SIM_BELOW_TOP, 'sim/bench'],
  'sim/bench': [...SIM_BELOW_TOP, 'sim/cli'],
  // The shells: all of sim/ below its top (the app never runs command-line code), never the page.
  electron: SIM_BELOW_TOP,
  // The page: environment-free parts of sim/ only, never electron/.
  renderer: ENVIRONMENT_FREE,
  // The demo scenarios' helper scripts (the invented bench measurement).
  scenarios: SIM_BELOW_TOP,
  // Packaging and build scripts: Node and packages only.
  build: [],
  test: ['sim', 'electron', 'renderer', 'scenarios', 'build'],
};

/** Folders where Node's built-in modules may not be imported. */
const NO_NODE = [...ENVIRONMENT_FREE, 'renderer'];
/** The only folders that may import the Electron package. */
const MAY_IMPORT_ELECTRON = ['electron', 'test'];
/** Configuration files at the root, outside every room. */
const ROOT_CONFIG_FILES = ['vitest.config.ts', 'eslint.config.js'];

const NODE_BUILTINS = new Set(builtinModules.flatMap((name) => [name, `node:${name}`]));

/**
 * The rooms of sim/dataset and which other rooms of it each may import: the file formats import
 * nothing else of sim/dataset, the folder's description (manifest) only the formats, and so on up
 * to the app's jobs. Writing may use reading (merge verifies its shards, reproduce compares
 * folders); reading never uses writing.
 */
const DATASET_ROOMS: Record<string, string[]> = {
  'sim/dataset/formats': [],
  'sim/dataset/manifest': ['sim/dataset/formats'],
  'sim/dataset/card': ['sim/dataset/formats', 'sim/dataset/manifest'],
  'sim/dataset/read': ['sim/dataset/formats', 'sim/dataset/manifest', 'sim/dataset/card'],
  'sim/dataset/write': ['sim/dataset/formats', 'sim/dataset/manifest', 'sim/dataset/card', 'sim/dataset/read'],
  'sim/dataset/jobs': ['sim/dataset/formats', 'sim/dataset/manifest', 'sim/dataset/card', 'sim/dataset/read', 'sim/dataset/write'],
};

/** A room stays small enough to find one's way in (project rule). */
const MAX_FILES_PER_ROOM = 30;

function sourceFiles(folder: string): string[] {
  const abs = join(ROOT, folder);
  let entries: string[];
  try {
    entries = readdirSync(abs);
  } catch {
    return [];
  }
  return entries.flatMap((name) => {
    if (name === 'node_modules' || name === 'dist' || name === 'test-output' || name.startsWith('.')) return [];
    const path = join(abs, name);
    if (statSync(path).isDirectory()) return sourceFiles(relative(ROOT, path));
    return /\.(ts|mts|cts|mjs|cjs|js)$/.test(name) && !name.endsWith('.d.ts') ? [relative(ROOT, path)] : [];
  });
}

/** Every module specifier the text imports or re-exports, statically or with import(). */
function importsOfText(text: string): string[] {
  return ts.preProcessFile(text, true, true).importedFiles.map((f) => f.fileName);
}

function importsOf(file: string): string[] {
  return importsOfText(readFileSync(join(ROOT, file), 'utf8'));
}

/** The room a repository path belongs to: `sim/<folder>` inside sim/, else its top-level folder. */
function roomOf(path: string): string {
  const parts = path.split('/');
  return parts[0] === 'sim' && parts.length > 2 ? `${parts[0]}/${parts[1]}` : parts[0];
}

function targetOf(file: string, spec: string): string {
  return relative(ROOT, resolve(dirname(join(ROOT, file)), spec));
}

function packageName(spec: string): string {
  const parts = spec.split('/');
  return spec.startsWith('@') ? parts.slice(0, 2).join('/') : parts[0];
}

function allows(room: string, targetRoom: string): boolean {
  return targetRoom === room || SHARED.includes(targetRoom) || ALLOWED[room].some((a) => targetRoom === a || targetRoom.startsWith(`${a}/`));
}

/** Every broken rule of the table in `file`, one line each. */
function violationsOf(file: string): string[] {
  const room = roomOf(file);
  const found: string[] = [];
  for (const spec of importsOf(file)) {
    if (spec.startsWith('.')) {
      const target = targetOf(file, spec);
      if (!allows(room, roomOf(target))) found.push(`${file} imports ${target}`);
    } else if (NODE_BUILTINS.has(spec) || NODE_BUILTINS.has(packageName(spec))) {
      if (NO_NODE.includes(room)) found.push(`${file} imports the Node module ${spec}`);
    } else if (packageName(spec) === 'electron' && !MAY_IMPORT_ELECTRON.includes(room)) {
      found.push(`${file} imports ${spec}`);
    }
  }
  return found;
}

const ALL_SOURCE = ['sim', 'electron', 'renderer', 'test', 'scenarios', 'build'].flatMap(sourceFiles);

describe('the import scanner the rules rely on', () => {
  it('finds static, type-only, re-exported and dynamic imports, and ignores comments and strings', () => {
    const text = [
      "import type { A } from './a.ts';",
      "export * from './b.ts';",
      "export { x } from './x.ts';",
      "import {",
      "  y,",
      "} from '../y.ts';",
      "const c = await import('./c.ts');",
      "// import gone from './commented.ts';",
      "const s = `import z from './in-a-string.ts'`;",
      "import 'node:fs';",
    ].join('\n');
    expect(importsOfText(text)).toEqual(['./a.ts', './b.ts', './x.ts', '../y.ts', './c.ts', 'node:fs']);
  });

  it('finds source in every room (the checks below are not vacuous)', () => {
    for (const room of ['sim/core', 'sim/systems', 'sim/bridge', 'sim/cli', 'electron', 'renderer', 'scenarios', 'build']) {
      expect(ALL_SOURCE.filter((f) => roomOf(f) === room).length, room).toBeGreaterThan(0);
    }
  });

  it('flags a forbidden import (the rule can fail)', () => {
    expect(allows('renderer', 'electron')).toBe(false);
    expect(allows('renderer', 'sim/dataset')).toBe(false);
    expect(allows('renderer', 'sim/bridge')).toBe(true);
    expect(allows('electron', 'renderer')).toBe(false);
    expect(allows('electron', 'sim/cli')).toBe(false);
    expect(allows('sim/identify', 'sim/cli')).toBe(false);
    expect(allows('sim/core', 'sim/systems')).toBe(false);
  });
});

describe('layering (DEVELOPERS.md "Layout", project rule)', () => {
  it('every folder that holds source is in the table', () => {
    const unlisted = ALL_SOURCE.filter((f) => !(roomOf(f) in ALLOWED)).map(roomOf);
    expect([...new Set(unlisted)]).toEqual([]);
    const strays = readdirSync(ROOT).filter((n) => /\.(ts|mts|cts|mjs|cjs|js)$/.test(n) && !ROOT_CONFIG_FILES.includes(n));
    expect(strays).toEqual([]);
  });

  for (const [room, allowed] of Object.entries(ALLOWED)) {
    const environment = NO_NODE.includes(room) ? ', nothing from Node' : '';
    const electron = MAY_IMPORT_ELECTRON.includes(room) ? '' : ', nothing from Electron';
    it(`${room} imports only ${allowed.length ? `itself, ${allowed.join(', ')}` : 'itself'}${environment}${electron}`, () => {
      const violations = ALL_SOURCE.filter((f) => roomOf(f) === room).flatMap(violationsOf);
      expect(violations).toEqual([]);
    });
  }

  // The two shells answer with the same code: each builds the shared services and handlers and
  // reaches into sim/ no further than the bridge contract (DEVELOPERS.md "Commands").
  for (const shell of ['electron/main.ts', 'electron/web-cli.ts']) {
    it(`${shell} imports the shared services and handlers and nothing of sim/ but the bridge contract`, () => {
      const targets = importsOf(shell).filter((s) => s.startsWith('.')).map((s) => targetOf(shell, s));
      expect(targets).toContain('electron/default-services.ts');
      expect(targets).toContain('electron/request-handlers.ts');
      expect(targets.filter((t) => t.startsWith('sim/') && roomOf(t) !== 'sim/bridge')).toEqual([]);
    });
  }

  for (const [room, allowed] of Object.entries(DATASET_ROOMS)) {
    it(`${room} imports ${allowed.length ? `of sim/dataset only ${allowed.join(', ')}` : 'nothing else of sim/dataset'}`, () => {
      const violations: string[] = [];
      for (const file of sourceFiles(room)) {
        for (const spec of importsOf(file)) {
          if (!spec.startsWith('.')) continue;
          const target = relative(ROOT, resolve(dirname(join(ROOT, file)), spec));
          if (!target.startsWith('sim/dataset/')) continue;
          const targetRoom = target.split('/').slice(0, 3).join('/');
          if (targetRoom !== room && !allowed.includes(targetRoom)) violations.push(`${file} imports ${target}`);
        }
      }
      expect(sourceFiles(room).length).toBeGreaterThan(0);
      expect(violations).toEqual([]);
    });
  }

  it(`every source file of sim/dataset lives in one of its rooms, each of fewer than ${MAX_FILES_PER_ROOM} files`, () => {
    const loose = sourceFiles('sim/dataset').filter((file) => !Object.keys(DATASET_ROOMS).some((room) => file.startsWith(`${room}/`)));
    expect(loose).toEqual([]);
    for (const room of Object.keys(DATASET_ROOMS)) expect(sourceFiles(room).length, room).toBeLessThan(MAX_FILES_PER_ROOM);
  });

  it('one hashing path: only sim/dataset/formats/file-digest.ts calls createHash (files streamed, bytes, pieces)', () => {
    // The one exception hashes no dataset: the launcher's cache key (sim/cli/cli-bundle.mjs) is
    // plain JavaScript that runs before any TypeScript can load, so it cannot import file-digest.ts.
    const hashing = [...sourceFiles('sim'), ...sourceFiles('electron')].filter((file) => /\bcreateHash\s*\(/.test(readFileSync(join(ROOT, file), 'utf8')));
    expect(hashing).toEqual(['sim/cli/cli-bundle.mjs', 'sim/dataset/formats/file-digest.ts']);
  });

  it('has source files in the core folders (the check above is not vacuous)', () => {
    expect(sourceFiles('sim/core').length).toBeGreaterThan(5);
    expect(sourceFiles('sim/systems').length).toBeGreaterThan(3);
    expect(sourceFiles('sim/errors').length).toBeGreaterThan(2);
  });

  it('the sandboxed preload script imports only Electron and the bridge contract', () => {
    const imports = importsOf('electron/preload.ts').map((s) => (s.startsWith('.') ? targetOf('electron/preload.ts', s) : s));
    expect([...new Set(imports)].sort()).toEqual(['electron', 'sim/bridge/bridge-contract.ts']);
  });
});
