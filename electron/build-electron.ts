// `npm run build:electron`: bundles the desktop shell and its worker threads into dist/electron
// (see electron-bundles.ts). Run after `npm run build:renderer`.
import { fileURLToPath } from 'node:url';

import { buildElectronBundles } from './electron-bundles.ts';

await buildElectronBundles(fileURLToPath(new URL('../dist/electron/', import.meta.url)));
