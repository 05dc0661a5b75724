// Bundles the desktop shell for Electron: main.mjs (an ES module; Electron's main process loads
// those) and preload.cjs (one CommonJS file, because a sandboxed preload script cannot import
// other modules). Run with `npm run build:electron` after `npm run build:renderer`.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

await build({
  absWorkingDir: root,
  entryPoints: ['electron/main.ts'],
  outfile: 'dist/electron/main.mjs',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  external: ['electron'],
  // Bundled CommonJS dependencies (ajv) call require(); give them one inside the ES module.
  banner: { js: "import { createRequire as pliantCreateRequire } from 'node:module'; const require = pliantCreateRequire(import.meta.url);" },
  logLevel: 'info',
});

await build({
  absWorkingDir: root,
  entryPoints: ['electron/preload.ts'],
  outfile: 'dist/electron/preload.cjs',
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  external: ['electron'],
  logLevel: 'info',
});
