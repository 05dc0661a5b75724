#!/usr/bin/env node
// Entry point of the `pliant` command: runs the prebuilt bundle of the CLI (sim/cli/cli-bundle.mjs;
// built on the first start after a change to its sources), or, where it cannot be built or
// PLIANT_CLI_TSX=1 asks for it, the TypeScript sources through the tsx loader.
// Kept as plain JavaScript so `npx pliant` works straight after `npm install`, with no build step.
import { pathToFileURL } from 'node:url';

import { bundledCliEntry, connectPrebuiltParts } from './cli-bundle.mjs';

const bundled = process.env.PLIANT_CLI_TSX === '1' ? undefined : await bundledCliEntry();
let runCli;
if (bundled !== undefined) {
  const bundle = await import(pathToFileURL(bundled).href);
  connectPrebuiltParts(bundle, bundled);
  ({ runCli } = bundle);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ runCli } = await import('./main.ts'));
}
process.exitCode = await runCli(process.argv.slice(2));
