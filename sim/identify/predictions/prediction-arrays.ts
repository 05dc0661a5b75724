// Reads one episode's prediction file and checks it against the episode it predicts: a
// `positions` array (T+1, N, 3) and optionally `velocities` of the same shape, float32 or
// float64, every value finite (other arrays in the file are ignored). Anything else is refused with the file, the array and the first
// offending element named, so a team can find the bug in its own export.
import { readFileSync } from 'node:fs';

import { DatasetReadError } from '../../dataset/formats/dataset-read-error.ts';
import type { NamedArray } from '../../dataset/formats/named-array.ts';
import { decodeNpz } from '../../dataset/formats/npz.ts';
import { PredictionsError } from './predictions-error.ts';

export type FloatData = Float32Array | Float64Array;

export interface PredictionArrays {
  /** (T+1)·N·3 values, row-major: positions[t][i][k] at (t·N + i)·3 + k, m. */
  positionsM: FloatData;
  /** Same layout, m/s; null when the file has no `velocities`. */
  velocitiesMPerS: FloatData | null;
}

export interface ExpectedShape {
  episodeId: string;
  /** T+1 */
  rows: number;
  /** N */
  nodes: number;
}

function checkedFloatArray(path: string, array: NamedArray, expected: ExpectedShape): FloatData {
  const want = `(${expected.rows}, ${expected.nodes}, 3)`;
  const fix = `write ${array.name} of episode ${expected.episodeId} with shape ${want}: row 0 the recorded initial state, then one row per recorded step`;
  if (array.dtype !== 'float32' && array.dtype !== 'float64') {
    throw new PredictionsError(`${path}: array "${array.name}" is ${array.dtype}; it must be float32 or float64 (numpy.asarray(x, dtype=numpy.float64))`);
  }
  const shape = array.shape;
  if (shape.length !== 3 || shape[0] !== expected.rows || shape[1] !== expected.nodes || shape[2] !== 3) {
    throw new PredictionsError(`${path}: array "${array.name}" has shape (${shape.join(', ')}) but episode ${expected.episodeId} has ${expected.rows} rows of ${expected.nodes} nodes; ${fix}`);
  }
  const data = array.data as FloatData;
  for (let j = 0; j < data.length; j++) {
    // One comparison per value; only a bad value pays for the index arithmetic.
    if (!Number.isFinite(data[j])) {
      const k = j % 3;
      const i = Math.floor(j / 3) % expected.nodes;
      const t = Math.floor(j / (3 * expected.nodes));
      throw new PredictionsError(`${path}: array "${array.name}" holds ${data[j]} at [${t}, ${i}, ${k}] (row ${t}, node ${i}, coordinate ${'xyz'[k]}); every predicted value must be finite — end the rollout's row with the last finite state or fix the model`);
    }
  }
  return data;
}

export function readPredictionArrays(path: string, expected: ExpectedShape): PredictionArrays {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (error) {
    throw new PredictionsError(`${path} cannot be read (${(error as { code?: string }).code ?? String(error)}); check that the file exists and is readable`);
  }
  let arrays: NamedArray[];
  try {
    arrays = decodeNpz(bytes, path);
  } catch (error) {
    // The decoder words dataset files; a bad prediction file is the user's to fix, not a damaged dataset.
    if (error instanceof DatasetReadError) throw new PredictionsError(error.message);
    throw error;
  }
  const byName = new Map(arrays.map((a) => [a.name, a]));
  const positions = byName.get('positions');
  if (!positions) {
    const held = arrays.map((a) => a.name).join(', ') || 'nothing';
    throw new PredictionsError(`${path}: no array "positions" (the file holds ${held}); save the predicted positions as numpy.savez(path, positions=…)`);
  }
  const velocities = byName.get('velocities');
  return {
    positionsM: checkedFloatArray(path, positions, expected),
    velocitiesMPerS: velocities ? checkedFloatArray(path, velocities, expected) : null,
  };
}
