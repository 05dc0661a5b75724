// Checks the one-way data flow of DEVELOPERS.md: each folder of sim/ imports only the folders
// below it, the environment-free folders import nothing from Node, the DOM or Electron, and the
// renderer never imports Node-side code. (Project rule; common practice, no source.)
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve, dirname } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(import.meta.dirname, '..');

/**
 * The bottom room every folder may import: the error taxonomy (kinds and stable codes), which
 * imports nothing itself, so that an error thrown anywhere says what kind it is.
 */
const SHARED = ['sim/errors'];

/** Which top-level folders each folder may import from (besides itself and SHARED). */
const ALLOWED: Record<string, string[]> = {
  'sim/errors': [],
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
};
const ENVIRONMENT_FREE = ['sim/errors', 'sim/plots', 'sim/random', 'sim/core', 'sim/systems', 'sim/controls', 'sim/design', 'sim/episode', 'sim/scenario'];

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
    const path = join(abs, name);
    if (statSync(path).isDirectory()) return sourceFiles(relative(ROOT, path));
    return /\.(ts|mts|mjs|js)$/.test(name) && !name.endsWith('.d.ts') ? [relative(ROOT, path)] : [];
  });
}

function importsOf(file: string): string[] {
  const text = readFileSync(join(ROOT, file), 'utf8');
  const specifiers: string[] = [];
  const pattern = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s*['"]([^'"]+)['"]/gm;
  for (const m of text.matchAll(pattern)) specifiers.push(m[1] ?? m[2] ?? m[3]);
  return specifiers;
}

function folderOf(path: string): string {
  const parts = path.split('/');
  return parts.slice(0, 2).join('/');
}

describe('layering of sim/ (DEVELOPERS.md, project rule)', () => {
  for (const [folder, allowed] of Object.entries(ALLOWED)) {
    const mayImport = folder === 'sim/errors' ? allowed : [...SHARED, ...allowed];
    it(`${folder} imports only ${mayImport.length ? mayImport.join(', ') : 'itself'}${ENVIRONMENT_FREE.includes(folder) ? ' and nothing from Node, the DOM or Electron' : ''}`, () => {
      const violations: string[] = [];
      for (const file of sourceFiles(folder)) {
        for (const spec of importsOf(file)) {
          if (spec.startsWith('.')) {
            const target = relative(ROOT, resolve(dirname(join(ROOT, file)), spec));
            const targetFolder = folderOf(target);
            if (targetFolder !== folder && !mayImport.includes(targetFolder) && !mayImport.includes(target)) {
              violations.push(`${file} imports ${target}`);
            }
          } else if (ENVIRONMENT_FREE.includes(folder) && (spec.startsWith('node:') || ['fs', 'path', 'os', 'electron', 'worker_threads', 'child_process'].includes(spec))) {
            violations.push(`${file} imports ${spec}`);
          }
        }
      }
      expect(violations).toEqual([]);
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
    const hashing = [...sourceFiles('sim'), ...sourceFiles('electron')].filter((file) => /\bcreateHash\s*\(/.test(readFileSync(join(ROOT, file), 'utf8')));
    expect(hashing).toEqual(['sim/dataset/formats/file-digest.ts']);
  });

  it('has source files in the core folders (the check above is not vacuous)', () => {
    expect(sourceFiles('sim/core').length).toBeGreaterThan(5);
    expect(sourceFiles('sim/systems').length).toBeGreaterThan(3);
    expect(sourceFiles('sim/errors').length).toBeGreaterThan(2);
  });

  it('renderer/ imports no Node-side code (sim/dataset, sim/cli, electron/ other than the bridge contract, node:*)', () => {
    const violations: string[] = [];
    for (const file of sourceFiles('renderer')) {
      if (file.endsWith('vite.config.ts')) continue;
      for (const spec of importsOf(file)) {
        if (spec.startsWith('node:')) violations.push(`${file} imports ${spec}`);
        if (spec.startsWith('.')) {
          const target = relative(ROOT, resolve(dirname(join(ROOT, file)), spec));
          if (target.startsWith('sim/dataset') || target.startsWith('sim/cli')) violations.push(`${file} imports ${target}`);
          if (target.startsWith('electron/') && target !== 'electron/bridge-contract.ts') violations.push(`${file} imports ${target}`);
        }
      }
    }
    expect(violations).toEqual([]);
  });
});
