// The prebuilt `pliant` command line: sim/cli/main.ts, the episode worker and everything they
// import from the checkout, compiled by esbuild into ES modules in a cache folder (split into
// chunks, so each command loads only its own code), plus the scenario checker written ahead of
// time by ajv. A start then runs JavaScript instead of compiling TypeScript file by file (tsx)
// and the whole schema (ajv) as before. Plain JavaScript, because it runs before any TypeScript
// can be loaded.
//
// The cache is keyed by the contents of the bundle's own source files (the ones esbuild read), not
// their modification times, which a checkout or a copy does not keep. A start reads those files
// back and hashes them; a change to any of them, or a file gone, builds a new bundle. npm runs no
// install scripts here (.npmrc), so the first start after `npm install` builds it.
//
// Several processes may start at once (a test run, an array job). Each bundle is written to a
// private folder and renamed into place under its key, and the pointer to the current bundle is
// replaced by rename too, so a reader never sees half a bundle.
//
// `import.meta.url` in each source file is replaced by that file's own URL in the checkout: the
// worker entry points, the demo scenarios and the Python loader are found beside the sources,
// exactly as when tsx runs them, although the code runs from the cache folder.
import { createHash } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, relative, sep } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** The checkout: the bundle's sources and node_modules are found from here. */
export const CHECKOUT_ROOT = fileURLToPath(new URL('../../', import.meta.url));

/** Raise when the build recipe below changes, so bundles built by an older recipe are not reused. */
const RECIPE = 'pliant-cli-bundle 2; esm, node20, splitting, packages external, import.meta.url → source URL';

const ENTRY = 'sim/cli/main.ts';
/** Writes the scenario checker's code at build time (sim/scenario/prebuilt-scenario-checker.ts). */
const CHECKER_CODE_ENTRY = 'sim/cli/scenario-checker-code.ts';
export const CHECKER_FILE = 'scenario-checker.cjs';
/** The episode pool's worker thread, compiled with the rest (sim/dataset/write/episode-worker-source.ts). */
const EPISODE_WORKER_ENTRY = 'sim/dataset/write/episode-worker.ts';
const EPISODE_WORKER_FILE = 'episode-worker.mjs';
const POINTER_FILE = 'current.json';
/** TypeScript settings esbuild applies while compiling (class fields, import elision). */
const TS_SETTINGS = ['tsconfig.json', 'tsconfig.base.json'];
/** Bundles other than the current one are removed once this old (a running process may still load chunks from one). */
const STALE_BUNDLE_AGE_MS = 24 * 3600 * 1000;

/**
 * node_modules/.cache/pliant-cli in the checkout, or PLIANT_CLI_CACHE, which must also lie inside
 * the checkout: the bundle imports its packages by name, found in node_modules above it.
 */
export function cliCacheDir(env = process.env) {
  return env.PLIANT_CLI_CACHE || join(CHECKOUT_ROOT, 'node_modules', '.cache', 'pliant-cli');
}

function keyOf(root, pairs) {
  const hash = createHash('sha256');
  hash.update(RECIPE);
  // The checkout's own path too: the bundle names its sources' URLs, so it is only this checkout's.
  hash.update('\0');
  hash.update(root);
  for (const [path, bytes] of [...pairs].sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0))) {
    hash.update('\0');
    hash.update(path);
    hash.update('\0');
    hash.update(bytes);
  }
  return hash.digest('hex').slice(0, 32);
}

/**
 * The key of a bundle: SHA-256 over the recipe, the checkout's path `root` and each input's path
 * (relative to `root`, sorted) and bytes. Throws when an input cannot be read (a file deleted since the bundle was built).
 */
export function bundleKey(root, inputs) {
  return keyOf(root, inputs.map((path) => [path, readFileSync(join(root, path))]));
}

/** The entry module of the current bundle if its sources are unchanged, else undefined. */
export function currentBundle(root, cacheDir) {
  let pointer;
  try {
    pointer = JSON.parse(readFileSync(join(cacheDir, POINTER_FILE), 'utf8'));
    if (bundleKey(root, pointer.inputs) !== pointer.key) return undefined;
    const entry = join(cacheDir, pointer.key, pointer.entry);
    statSync(entry);
    return entry;
  } catch {
    return undefined;
  }
}

function loaderFor(path) {
  if (path.endsWith('.ts') || path.endsWith('.mts')) return 'ts';
  if (path.endsWith('.json')) return 'json';
  return 'js';
}

/** Builds a bundle of the checkout at `root` into `cacheDir` and returns its entry module's path. */
export async function buildBundle(root, cacheDir) {
  // Loaded only to build: a start from a current bundle never loads esbuild.
  const esbuild = createRequire(import.meta.url)('esbuild');
  const inputs = new Map();
  const sourceUrls = {
    name: 'pliant-source-urls',
    setup(build) {
      build.onLoad({ filter: /\.(ts|mts|mjs|js|json)$/ }, async (args) => {
        const path = relative(root, args.path);
        if (path.startsWith('..') || path.split(sep).includes('node_modules')) return undefined;
        const bytes = readFileSync(args.path);
        inputs.set(path.split(sep).join('/'), bytes);
        const loader = loaderFor(args.path);
        const text = bytes.toString('utf8');
        if (!text.includes('import.meta')) return { contents: bytes, loader };
        // Replaced on the syntax tree (esbuild's define), so the words in a string or comment stay.
        const replaced = await esbuild.transform(text, {
          loader,
          format: 'esm',
          target: 'node20',
          sourcefile: args.path,
          define: { 'import.meta.url': JSON.stringify(pathToFileURL(args.path).href) },
          tsconfigRaw: { compilerOptions: { verbatimModuleSyntax: true, useDefineForClassFields: true } },
        });
        return { contents: replaced.code, loader: 'js' };
      });
    },
  };
  const result = await esbuild.build({
    absWorkingDir: root,
    entryPoints: [ENTRY, CHECKER_CODE_ENTRY, EPISODE_WORKER_ENTRY],
    bundle: true,
    splitting: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    // Packages are loaded from node_modules at run time, as under tsx; only their import is lazy.
    packages: 'external',
    outdir: 'bundle',
    entryNames: '[name]',
    // .mjs: inside node_modules no package.json says "type": "module".
    outExtension: { '.js': '.mjs' },
    chunkNames: 'chunks/[name]-[hash]',
    write: false,
    logLevel: 'silent',
    plugins: [sourceUrls],
  });
  // esbuild also reads the TypeScript settings, which no onLoad sees.
  for (const settings of TS_SETTINGS) {
    try {
      inputs.set(settings, readFileSync(join(root, settings)));
    } catch {
      // Not in this checkout (a copy of sim/ alone).
    }
  }
  const inputPaths = [...inputs.keys()].sort();
  // The key is of the bytes esbuild compiled, so an edit made during the build is not hidden.
  const key = keyOf(root, inputs.entries());
  const outRoot = join(root, 'bundle');
  const entry = 'main.mjs';
  mkdirSync(cacheDir, { recursive: true });
  const finalDir = join(cacheDir, key);
  const privateDir = join(cacheDir, `.building-${process.pid}-${Date.now()}`);
  for (const file of result.outputFiles) {
    const target = join(privateDir, relative(outRoot, file.path));
    mkdirSync(dirname(target), { recursive: true });
    writeFileSync(target, file.contents);
  }
  await writeScenarioChecker(privateDir);
  try {
    renameSync(privateDir, finalDir);
  } catch {
    // Another process put the same bundle in place first; theirs is byte for byte ours.
    rmSync(privateDir, { recursive: true, force: true });
  }
  const pointerTemp = join(cacheDir, `.${POINTER_FILE}-${process.pid}-${Date.now()}`);
  writeFileSync(pointerTemp, `${JSON.stringify({ key, entry, inputs: inputPaths }, null, 1)}\n`);
  renameSync(pointerTemp, join(cacheDir, POINTER_FILE));
  removeStaleBundles(cacheDir, key);
  return join(finalDir, entry);
}

/**
 * Runs the freshly built checker-code entry once and writes the checker it returns beside the
 * bundle. Without it (an error here) the bundle still works: ajv then compiles at run time.
 */
async function writeScenarioChecker(bundleDir) {
  try {
    const { scenarioCheckerModuleCode } = await import(pathToFileURL(join(bundleDir, 'scenario-checker-code.mjs')).href);
    writeFileSync(join(bundleDir, CHECKER_FILE), scenarioCheckerModuleCode());
  } catch (error) {
    if (process.env.PLIANT_CLI_BUNDLE_DEBUG) process.stderr.write(`pliant: no prebuilt scenario checker, ajv compiles at run time: ${error?.message ?? error}\n`);
  }
}

/**
 * Hands the bundle's prebuilt parts to the bundled CLI just imported from `entryPath`: the
 * scenario checker, where there is one (loaded on first use), and the episode worker.
 */
export function connectPrebuiltParts(bundle, entryPath) {
  const checker = join(dirname(entryPath), CHECKER_FILE);
  bundle.usePrebuiltScenarioChecker(() => createRequire(import.meta.url)(checker));
  bundle.usePrebuiltEpisodeWorker(pathToFileURL(join(dirname(entryPath), EPISODE_WORKER_FILE)));
}

function removeStaleBundles(cacheDir, keep) {
  const now = Date.now();
  for (const name of readdirSync(cacheDir)) {
    if (name === keep || name === POINTER_FILE) continue;
    const path = join(cacheDir, name);
    try {
      if (now - statSync(path).mtimeMs > STALE_BUNDLE_AGE_MS) rmSync(path, { recursive: true, force: true });
    } catch {
      // Removed by another process meanwhile.
    }
  }
}

/** The bundle's entry module, built first if needed; undefined when it cannot be built (then run through tsx). */
export async function bundledCliEntry(root = CHECKOUT_ROOT, cacheDir = cliCacheDir()) {
  const current = currentBundle(root, cacheDir);
  if (current !== undefined) return current;
  try {
    return await buildBundle(root, cacheDir);
  } catch (error) {
    if (process.env.PLIANT_CLI_BUNDLE_DEBUG) process.stderr.write(`pliant: could not build the command-line bundle, running through tsx: ${error?.message ?? error}\n`);
    return undefined;
  }
}
