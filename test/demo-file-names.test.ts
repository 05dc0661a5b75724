// Every demo scenario file the code names (renderer/, electron/, the bridge contract wherever it
// lives, sim/; comments included) is one that scenarios/ holds, so an example in a comment or a
// default never sends a reader to a file that no longer exists.
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';

import { describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '..');

function sourcesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && /\.(ts|html|css)$/.test(e.name))
    .map((e) => join(e.parentPath, e.name));
}

describe('demo file names in the app', () => {
  it('name only demos that scenarios/ holds', () => {
    // Names in any folder of scenarios/ (the bench measurement and identification scenarios live in subfolders).
    const demos = new Set(readdirSync(join(ROOT, 'scenarios'), { recursive: true, encoding: 'utf8' }).filter((n) => n.endsWith('.json')).map((n) => n.split('/').at(-1)!));
    expect(demos.size).toBeGreaterThan(0);
    const stale: string[] = [];
    // Every source folder at the top, so a file that moves between them stays covered.
    const folders = readdirSync(ROOT, { withFileTypes: true })
      .filter((e) => e.isDirectory() && !['node_modules', 'test', 'dist', 'datasets', 'scenarios', 'build'].includes(e.name) && !e.name.startsWith('.'))
      .map((e) => join(ROOT, e.name));
    expect(folders.map((f) => relative(ROOT, f))).toEqual(expect.arrayContaining(['electron', 'renderer', 'sim']));
    for (const file of folders.flatMap(sourcesUnder)) {
      for (const match of readFileSync(file, 'utf8').matchAll(/korrin-[a-z0-9-]+\.json/g)) {
        if (!demos.has(match[0])) stale.push(`${relative(ROOT, file)}: ${match[0]}`);
      }
    }
    expect(stale).toEqual([]);
  });
});
