// Writes a predictions folder, the contract between any model and `pliant score`: one
// `<episode id>.npz` per predicted episode holding `positions` (T+1, N, 3) m and `velocities`
// (T+1, N, 3) m/s, and `predictions.json` ({"predictionsFormat": 1, "model", "description"})
// written last, so a folder without it is unfinished. NPZ bytes are deterministic (npz.ts).
import { mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';

import { writeFileAtomic } from '../../dataset/formats/atomic-file.ts';
import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';
import { namedArray } from '../../dataset/formats/named-array.ts';
import { writeNpzFile } from '../../dataset/formats/npz.ts';

export const PREDICTIONS_FILE = 'predictions.json';
export const PREDICTIONS_FORMAT = 1;

/**
 * Makes `dir` ready: creates it, or empties an earlier predictions folder (one holding only
 * predictions.json and .npz files). Any other non-empty folder is refused.
 */
export function preparePredictionsFolder(dir: string): void {
  let entries: string[];
  try {
    if (!statSync(dir).isDirectory()) throw new DatasetRequestError(`${dir} is a file; give --out a folder for the predictions`);
    entries = readdirSync(dir);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw error;
    mkdirSync(dir, { recursive: true });
    return;
  }
  if (entries.length === 0) return;
  // An unfinished run leaves NPZ files without predictions.json; that folder is ours too.
  const ours = entries.every((name) => name === PREDICTIONS_FILE || name.endsWith('.npz'));
  if (!ours) {
    throw new DatasetRequestError(`${dir} already holds files that are not predictions; give --out a new or empty folder`);
  }
  for (const name of entries) rmSync(join(dir, name));
}

export function writePredictedEpisode(dir: string, episodeId: string, steps: number, nodeCount: number, positionM: Float64Array, velocityMPerS: Float64Array): void {
  const shape = [steps + 1, nodeCount, 3];
  writeNpzFile(join(dir, `${episodeId}.npz`), [
    namedArray('positions', shape, positionM, { unit: 'm' }),
    namedArray('velocities', shape, velocityMPerS, { unit: 'm/s' }),
  ]);
}

export function writePredictionsDescription(dir: string, model: string, description: string): void {
  const document = { predictionsFormat: PREDICTIONS_FORMAT, model, description };
  writeFileAtomic(join(dir, PREDICTIONS_FILE), new TextEncoder().encode(`${JSON.stringify(document, null, 2)}\n`));
}
