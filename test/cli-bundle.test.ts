// The prebuilt command line (sim/cli/cli-bundle.mjs): the bundle must answer exactly as the
// TypeScript sources run through tsx do — the same stdout, stderr and exit status for the help, a
// valid scenario and a scenario with mistakes (some inside shared schema definitions, whose
// messages depend on ajv's schema nodes) — and files found beside the sources (the Python
// loader) must still be found. Its cache must follow the sources' contents, not their times:
// an edited source builds a new bundle, a touched one does not, and two builds at once leave
// one working bundle. Datasets written through the bundle (its own episode worker) are byte for
// byte those of the tsx path. Everything is compared with the tsx path or files on disk; no timing.
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

import { afterAll, describe, expect, it } from 'vitest';

import { buildBundle, bundledCliEntry, bundleKey, currentBundle } from '../sim/cli/cli-bundle.mjs';

const ROOT = resolve(import.meta.dirname, '..');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');
// Inside the checkout (test-output/ is ignored by git), so the copies' bundles find node_modules.
const work = join(ROOT, 'test-output', `cli-bundle-${process.pid}`);
mkdirSync(work, { recursive: true });
afterAll(() => rmSync(work, { recursive: true, force: true }));

interface Run { status: number | null; stdout: string; stderr: string }

function pliant(args: string[], tsx: boolean): Run {
  const env = { ...process.env, PLIANT_CLI_TSX: tsx ? '1' : '0' };
  const run = spawnSync(process.execPath, [LAUNCHER, ...args], { cwd: ROOT, env, encoding: 'utf8', timeout: 120_000 });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

/** A korrin-tether scenario with a misspelt key, a word for a number inside a distribution (a shared $defs entry) and an unknown distribution kind. */
function badScenarioPath(): string {
  const scenario = JSON.parse(readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8'));
  scenario.episdes = 3;
  scenario.system.lengthM = { kind: 'uniform', min: 'short', max: 2 };
  scenario.system.dampingRatio = { kind: 'gaussian', mean: 0.1 };
  scenario.world.fluid.normalDragNsPerM3 = { kind: 'log-uniform', min: 800 };
  const path = join(work, 'bad-tether.json');
  writeFileSync(path, `${JSON.stringify(scenario, null, 2)}\n`);
  return path;
}

describe('the bundled CLI answers as the tsx path does', () => {
  const cases: Array<[string, () => string[]]> = [
    ['--help', () => ['--help']],
    ['validate --help', () => ['validate', '--help']],
    ['validate of a valid scenario (with a warning)', () => ['validate', 'scenarios/korrin-eel.json']],
    ['validate of a scenario with mistakes', () => ['validate', badScenarioPath()]],
    ['a mistyped command', () => ['valdate', 'x.json']],
  ];
  for (const [name, args] of cases) {
    it(name, () => {
      const argv = args();
      const bundled = pliant(argv, false);
      const tsx = pliant(argv, true);
      expect(bundled).toEqual(tsx);
    });
  }

  it('the bad scenario really fails, with its problems named (the comparison above is not of two crashes)', () => {
    const run = pliant(['validate', badScenarioPath()], false);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('/episdes');
    expect(run.stderr).toContain('/system/lengthM/min');
    expect(run.stderr).toContain('/system/dampingRatio/kind');
    expect(run.stderr).not.toMatch(/\n\s+at /);
    expect(pliant(['validate', 'scenarios/korrin-eel.json'], false).status).toBe(0);
  });

  it('finds files beside the sources: `pliant loader` prints python/pliant_data.py byte for byte', () => {
    const run = pliant(['loader'], false);
    expect(run.status).toBe(0);
    expect(run.stdout).toBe(readFileSync(join(ROOT, 'sim/dataset/card/python/pliant_data.py'), 'utf8'));
  });
});

/** Every file under `dir`, by relative path. */
function filesUnder(dir: string, prefix = ''): string[] {
  return readdirSync(join(dir, prefix), { withFileTypes: true }).flatMap((entry) =>
    entry.isDirectory() ? filesUnder(dir, join(prefix, entry.name)) : [join(prefix, entry.name)]).sort();
}

describe('datasets from the bundled CLI and its bundled episode worker', () => {
  it('are byte for byte those of the tsx path (two workers; the manifest but for its run record)', () => {
    const out = (name: string) => join(work, name);
    const args = (dir: string) => ['generate', 'scenarios/korrin-tether.json', '--out', dir, '--episodes', '3', '--workers', '2', '--format', 'npz', '--progress', 'none'];
    const bundled = pliant(args(out('dataset-bundled')), false);
    const tsx = pliant(args(out('dataset-tsx')), true);
    expect(bundled.stderr).toBe('');
    expect(bundled.status).toBe(0);
    expect(tsx.status).toBe(0);
    const files = filesUnder(out('dataset-bundled'));
    expect(filesUnder(out('dataset-tsx'))).toEqual(files);
    expect(files.filter((f) => f.endsWith('.npz')).length).toBe(3);
    for (const file of files) {
      const a = readFileSync(join(out('dataset-bundled'), file));
      const b = readFileSync(join(out('dataset-tsx'), file));
      if (file !== 'manifest.json') {
        expect(a.equals(b), file).toBe(true);
        continue;
      }
      const withoutRun = (bytes: Buffer) => {
        const manifest = JSON.parse(bytes.toString('utf8'));
        delete manifest.run;
        return manifest;
      };
      expect(withoutRun(a)).toEqual(withoutRun(b));
    }
  });
});

describe('the bundle cache follows the sources', () => {
  const copy = join(work, 'checkout');
  const cache = join(copy, 'cache');
  cpSync(join(ROOT, 'sim'), join(copy, 'sim'), { recursive: true });

  function versionFrom(entry: string): string {
    const script = 'const { runCli } = await import(process.argv[1]); process.exitCode = await runCli(["--version"]);';
    const run = spawnSync(process.execPath, ['--input-type=module', '-e', script, pathToFileURL(entry).href], { encoding: 'utf8', timeout: 60_000 });
    expect(run.stderr).toBe('');
    return run.stdout.trim();
  }

  it('builds, reuses, and rebuilds after an edit; a touched file without an edit keeps the bundle', async () => {
    const first = await bundledCliEntry(copy, cache);
    expect(first).toBeDefined();
    expect(currentBundle(copy, cache)).toBe(first);
    expect(versionFrom(first!)).toBe(readFileSync(join(ROOT, 'sim/scenario/pliant-version.ts'), 'utf8').match(/PLIANT_VERSION = '([^']+)'/)![1]);

    const versionFile = join(copy, 'sim/scenario/pliant-version.ts');
    const later = new Date(Date.now() + 60_000);
    utimesSync(versionFile, later, later);
    expect(currentBundle(copy, cache)).toBe(first);

    writeFileSync(versionFile, readFileSync(versionFile, 'utf8').replace(/PLIANT_VERSION = '[^']+'/, "PLIANT_VERSION = '9.9.9-edited'"));
    expect(currentBundle(copy, cache)).toBeUndefined();
    const second = await bundledCliEntry(copy, cache);
    expect(second).not.toBe(first);
    expect(versionFrom(second!)).toBe('9.9.9-edited');
    expect(currentBundle(copy, cache)).toBe(second);
  });

  it('keys by paths and contents (and the checkout), in any order', () => {
    const dir = join(work, 'keys');
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'a.ts'), 'export const a = 1;\n');
    writeFileSync(join(dir, 'b.ts'), 'export const b = 2;\n');
    const key = bundleKey(dir, ['a.ts', 'b.ts']);
    expect(bundleKey(dir, ['b.ts', 'a.ts'])).toBe(key);
    writeFileSync(join(dir, 'b.ts'), 'export const b = 3;\n');
    expect(bundleKey(dir, ['a.ts', 'b.ts'])).not.toBe(key);
    rmSync(join(dir, 'b.ts'));
    expect(() => bundleKey(dir, ['a.ts', 'b.ts'])).toThrow();
  });

  it('two builds at once leave one complete bundle', async () => {
    const [a, b] = await Promise.all([buildBundle(copy, cache), buildBundle(copy, cache)]);
    expect(a).toBe(b);
    expect(currentBundle(copy, cache)).toBe(a);
    expect(versionFrom(a)).toBe('9.9.9-edited');
  });
});

describe('`npx pliant` from a checkout with no bundle yet', () => {
  it('builds the bundle on its first start and runs the command', () => {
    const cache = join(work, 'npx-cache');
    const run = spawnSync('npx', ['--no-install', 'pliant', 'validate', 'scenarios/korrin-eel.json'], {
      cwd: ROOT, env: { ...process.env, PLIANT_CLI_CACHE: cache, PLIANT_CLI_TSX: '0' }, encoding: 'utf8', timeout: 120_000,
    });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/^scenarios\/korrin-eel\.json: valid — lattice sweep "korrin-eel"/);
    expect(existsSync(join(cache, 'current.json'))).toBe(true);
    const pointer = JSON.parse(readFileSync(join(cache, 'current.json'), 'utf8')) as { key: string; inputs: string[] };
    expect(pointer.inputs).toContain('sim/cli/main.ts');
    for (const part of ['main.mjs', 'episode-worker.mjs', 'scenario-checker.cjs']) expect(existsSync(join(cache, pointer.key, part)), part).toBe(true);
  });
});
