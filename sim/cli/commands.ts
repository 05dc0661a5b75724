// The table of `pliant` sub-commands: name and one-line summary here, the rest in each command's
// own file, loaded only when that command runs. `pliant --help` then reads no more than this
// table, and a command does not pay for the libraries of the others (ajv, h5wasm, three).
// Add new commands here.
import { PYTHON_LOADER_FILE_NAME } from '../dataset/card/python-loader-source.ts';
import type { CliCommand } from './command.ts';

export interface CommandEntry {
  name: string;
  summary: string;
  /** Imports the command's module; its usage text and runner live there. */
  load(): Promise<CliCommand>;
}

export const COMMANDS: readonly CommandEntry[] = [
  { name: 'validate', summary: 'check a scenario file and list every problem with line:column and JSON pointer', load: async () => (await import('./validate-command.ts')).validateCommand },
  { name: 'generate', summary: 'write a labelled, split, checksummed dataset (or one shard) from a scenario', load: async () => (await import('./generate-command.ts')).generateCommand },
  { name: 'merge', summary: 'join the shard folders of an array job into one dataset', load: async () => (await import('./merge-command.ts')).mergeCommand },
  { name: 'verify', summary: 'check a dataset folder: manifest schema and every SHA-256', load: async () => (await import('./verify-command.ts')).verifyCommand },
  { name: 'reproduce', summary: 'regenerate a dataset from its seed.json and compare it file by file', load: async () => (await import('./reproduce-command.ts')).reproduceCommand },
  { name: 'inspect', summary: 'summarise a dataset folder: splits, parameter ranges, sizes, rejected episodes', load: async () => (await import('./inspect-command.ts')).inspectCommand },
  { name: 'loader', summary: `print or write the Python loader for datasets (${PYTHON_LOADER_FILE_NAME}: NumPy, optional h5py and PyTorch)`, load: async () => (await import('./loader-command.ts')).loaderCommand },
  { name: 'baseline', summary: 'fit reference models (persistence, linear DMDc, grey-box) and write their predictions', load: async () => (await import('./baseline-command.ts')).baselineCommand },
  { name: 'score', summary: 'score a model\'s predicted trajectories against a dataset: score.json, REPORT.md, charts', load: async () => (await import('./score-command.ts')).scoreCommand },
  { name: 'calibrate', summary: 'fit a scenario\'s free parameters to a bench measurement and write a scenario around the fit', load: async () => (await import('./calibrate-command.ts')).calibrateCommand },
  { name: 'render', summary: 'draw one episode of a dataset as an animated GIF or a PNG sequence', load: async () => (await import('./render-command.ts')).renderCommand },
  { name: 'demo', summary: 'generate the Korrin Bay demo datasets (tether, fin, eel) and show how to load them', load: async () => (await import('./demo-command.ts')).demoCommand },
  { name: 'bench', summary: 'measure simulation and export throughput (one JSON line per case)', load: async () => (await import('./bench-command.ts')).benchCommand },
];
