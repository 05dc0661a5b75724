// A small tether dataset of the Korrin Bay test tank (invented demo values) for the score
// tests: 16 short episodes with varied part count, length and gravity, tethers of more than 5
// parts held out, generated once per suite through the command line, plus a writer for a
// persistence prediction (every row the recorded initial state) with the project's NPZ writer.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

import { runCli } from '../../sim/cli/main.ts';
import { namedArray } from '../../sim/dataset/formats/named-array.ts';
import { readNpzFile, writeNpzFile } from '../../sim/dataset/formats/npz.ts';
import type { DatasetManifest } from '../../sim/dataset/manifest/dataset-manifest.ts';

export function scoreScenario(): unknown {
  return {
    formatVersion: 1,
    name: 'korrin-tether-score-check',
    description: 'Korrin Bay test tank: a short tether for checking scores. Invented numbers for demonstration.',
    system: {
      kind: 'chain', partCount: { kind: 'integer', min: 3, max: 7 }, lengthM: { kind: 'uniform', min: 1.0, max: 2.0 },
      totalMassKg: 0.3, axialStiffnessN: 2000, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-driven', drivenAxes: ['x'],
    },
    world: { gravityMPerS2: [0, { kind: 'uniform', min: -10, max: -9 }, 0] },
    controls: { default: { kind: 'sinusoid', amplitude: 0.05, frequencyHz: { kind: 'uniform', min: 0.5, max: 1.5 } } },
    time: { recordIntervalS: 0.02, recordedSteps: 30 },
    initialState: { velocityNoiseMPerS: 0.01 },
    episodes: 16,
    seed: 31,
    splits: { fractions: { train: 0.4, validation: 0.2, test: 0.4 }, heldOut: [{ split: 'held-out', parameter: '/system/partCount', above: 5 }] },
  };
}

export interface CliOutcome {
  code: number;
  stdout: string;
  stderr: string;
}

export async function runPliant(args: string[], cwd: string): Promise<CliOutcome> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd });
  return { code, stdout, stderr };
}

/** Generates the dataset into work/name and returns its folder. */
export async function generateScoreDataset(work: string, name = 'tether'): Promise<string> {
  const scenarioPath = join(work, 'score-scenario.json');
  writeFileSync(scenarioPath, JSON.stringify(scoreScenario(), null, 2));
  const dir = join(work, name);
  const made = await runPliant(['generate', scenarioPath, '--out', dir, '--workers', '1', '--progress', 'none'], work);
  if (made.code !== 0) throw new Error(`generating the score fixture failed: ${made.stderr}`);
  return dir;
}

export function manifestOf(dir: string): DatasetManifest {
  return JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as DatasetManifest;
}

/** Persistence prediction of every recorded episode: every row of positions and velocities is row 0 (float64). */
export function writePersistencePredictions(dataset: string, out: string, withVelocities = true): void {
  mkdirSync(out, { recursive: true });
  for (const episode of manifestOf(dataset).episodes) {
    if (episode.status !== 'ok') continue;
    const arrays = readNpzFile(join(dataset, 'episodes', `${episode.id}.npz`));
    const held = ['positions', ...(withVelocities ? ['velocities'] : [])].map((name) => {
      const a = arrays.find((x) => x.name === name)!;
      const [rows, nodes] = a.shape;
      const data = new Float64Array(rows * nodes * 3);
      for (let t = 0; t < rows; t++) for (let j = 0; j < nodes * 3; j++) data[t * nodes * 3 + j] = a.data[j];
      return namedArray(name, [rows, nodes, 3], data);
    });
    writeNpzFile(join(out, `${episode.id}.npz`), held);
  }
}
