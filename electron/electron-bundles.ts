// The desktop build's JavaScript: main.mjs (an ES module; Electron's main process loads those),
// preload.cjs (one CommonJS file, because a sandboxed preload script cannot import other modules)
// and the dataset pipeline's worker threads. A packaged app has no TypeScript loader and no sim/
// folder, so each worker is bundled beside main.mjs under the file name its URL names in a
// checkout (sim/dataset/jobs/app-worker-urls.ts, episode-pool.ts, sim/identify/score/score-worker-url.ts,
// sim/render/render-worker-url.ts): the same `new URL('./…',
// import.meta.url)` then finds the bundled worker in dist/electron.
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import type { BuildOptions } from 'esbuild';
import { build } from 'esbuild';

const ROOT = fileURLToPath(new URL('..', import.meta.url));

/** Bundled worker file name → its TypeScript entry. */
export const WORKER_BUNDLES: Readonly<Record<string, string>> = {
  'dataset-job-worker-entry.mjs': 'sim/dataset/jobs/dataset-job-worker.ts',
  'dataset-verify-worker-entry.mjs': 'sim/dataset/jobs/dataset-verify-worker.ts',
  'episode-worker-entry.mjs': 'sim/dataset/write/episode-worker.ts',
  'score-job-worker-entry.mjs': 'sim/identify/score/score-job-worker.ts',
  'render-job-worker-entry.mjs': 'sim/render/render-job-worker.ts',
};

const NODE_ESM: BuildOptions = {
  absWorkingDir: ROOT,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  external: ['electron'],
  // Prefer a package's ES module build: jsonc-parser's CommonJS build is a UMD wrapper whose
  // require('./impl/…') calls a bundler cannot follow, so they would fail at run time.
  mainFields: ['module', 'main'],
  // Bundled CommonJS dependencies (ajv) call require(); give them one inside the ES module.
  banner: { js: "import { createRequire as pliantCreateRequire } from 'node:module'; const require = pliantCreateRequire(import.meta.url);" },
};

export async function buildElectronBundles(outDir: string, logLevel: BuildOptions['logLevel'] = 'info'): Promise<void> {
  await build({ ...NODE_ESM, entryPoints: ['electron/main.ts'], outfile: join(outDir, 'main.mjs'), logLevel });
  await build({
    absWorkingDir: ROOT,
    entryPoints: ['electron/preload.ts'],
    outfile: join(outDir, 'preload.cjs'),
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    external: ['electron'],
    logLevel,
  });
  for (const [fileName, entry] of Object.entries(WORKER_BUNDLES)) {
    await build({ ...NODE_ESM, entryPoints: [entry], outfile: join(outDir, fileName), logLevel });
  }
}
