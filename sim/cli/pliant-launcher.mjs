#!/usr/bin/env node
// Entry point of the `pliant` command: registers the TypeScript loader, then runs the CLI.
// Kept as plain JavaScript so `npx pliant` works straight after `npm install`, with no build.
import { register } from 'tsx/esm/api';

register();
const { runCli } = await import('./main.ts');
process.exitCode = await runCli(process.argv.slice(2));
