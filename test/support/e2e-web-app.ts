// Starts Pliant's web mode for the end-to-end suites: builds the renderer with Vite into a
// temporary folder, then runs the web-mode server (electron/web-server.ts) with the same services
// `npm run web` builds (electron/web-cli.ts: the real dataset pipeline in every seam), on a free
// loopback port.
import { readFileSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { build } from 'vite';

import { createDefaultServices } from '../../electron/default-services.ts';
import { createRequestHandlers } from '../../electron/request-handlers.ts';
import type { RunningWebServer } from '../../electron/web-server.ts';
import { startWebServer } from '../../electron/web-server.ts';

export const REPO_ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const SCENARIOS_DIR = join(REPO_ROOT, 'scenarios');

export interface PliantWebApp {
  server: RunningWebServer;
  rendererDir: string;
  close(): Promise<void>;
}

/** Builds the renderer once per call; takes a couple of seconds. */
export async function buildRendererInto(outDir: string): Promise<void> {
  await build({
    configFile: join(REPO_ROOT, 'renderer', 'vite.config.ts'),
    root: join(REPO_ROOT, 'renderer'),
    logLevel: 'warn',
    // three.js alone is about 600 kB; the app loads it from disk, so the web-page size hint
    // would only add noise to the test log.
    build: { outDir, emptyOutDir: true, sourcemap: false, chunkSizeWarningLimit: 2000 },
  });
}

export async function startPliantWebApp(): Promise<PliantWebApp> {
  const rendererDir = await mkdtemp(join(tmpdir(), 'pliant-e2e-renderer-'));
  await buildRendererInto(rendererDir);
  const version = (JSON.parse(readFileSync(join(REPO_ROOT, 'package.json'), 'utf8')) as { version: string }).version;
  const services = await createDefaultServices({
    mode: 'web',
    version,
    bundledScenariosDir: SCENARIOS_DIR,
    // The e2e tests make their folders in the system's temporary folder.
    folderChooser: { mode: 'in-page', rootDir: tmpdir() },
    reportInternalError: (name, error) => console.error(`[e2e] request ${name} failed:`, error),
  });
  const server = await startWebServer({ handlers: createRequestHandlers(services), rendererDir, port: 0 });
  return {
    server,
    rendererDir,
    async close() {
      await server.close();
      await rm(rendererDir, { recursive: true, force: true });
    },
  };
}
