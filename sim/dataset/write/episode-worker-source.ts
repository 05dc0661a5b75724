// Where the episode pool's worker threads get their code. A packaged app starts the bundled
// worker that sits beside its main bundle (electron/electron-bundles.ts). A checkout runs its
// TypeScript through tsx, and a worker started from episode-worker-entry.mjs needs a TypeScript
// loader of its own: a loader thread, some 20 MB more resident memory per worker and about half
// a second more start-up (measured with two workers on korrin-tether). So in a checkout the
// worker's code is bundled once per process with esbuild (the compiler tsx itself runs on every
// file) into one ES module, started from a data: URL, as the packaged app runs it. Where esbuild
// cannot be loaded or the bundle fails, workers start through the loader as before, which costs
// only the memory and time above. The prebuilt command line brings its own bundle of the worker.
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';

/** Starts a worker through the TypeScript loader (a checkout), or is the bundled worker itself (a packaged app). */
const ENTRY_URL = new URL('./episode-worker-entry.mjs', import.meta.url);

interface Bundler {
  buildSync(options: Record<string, unknown>): { outputFiles: { text: string }[] };
}

let chosen: URL | undefined;
let prebuilt: URL | undefined;

/**
 * The prebuilt command line (sim/cli/cli-bundle.mjs) compiles the worker with the rest of the CLI
 * into its cache and hands its module in here, so no start bundles the worker again.
 */
export function usePrebuiltEpisodeWorker(url: URL): void {
  prebuilt = url;
  chosen = undefined;
}

/** The URL to start an episode worker from; the bundle is made on the first call only. */
export function episodeWorkerUrl(): URL {
  chosen ??= prebuilt ?? (import.meta.url.endsWith('.ts') ? bundledWorker() ?? ENTRY_URL : ENTRY_URL);
  return chosen;
}

function bundledWorker(): URL | undefined {
  try {
    // Loaded by name at run time, so that bundling this file for the desktop app leaves esbuild out.
    const bundler = createRequire(import.meta.url)('esbuild') as Bundler;
    const built = bundler.buildSync({
      entryPoints: [fileURLToPath(new URL('./episode-worker.ts', import.meta.url))],
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      mainFields: ['module', 'main'],
      write: false,
      logLevel: 'silent',
    });
    return new URL(`data:text/javascript;base64,${Buffer.from(built.outputFiles[0].text).toString('base64')}`);
  } catch {
    return undefined;
  }
}
