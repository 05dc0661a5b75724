// Reads a replayed control table from .npy bytes: a 1-D array is one column, a 2-D array is
// rows × columns; every numeric dtype becomes float64, the unit the control signals use.
import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { decodeNpy } from '../formats/npy.ts';
import type { ReplayData } from './replay-inputs.ts';

export function readNpyTable(bytes: Uint8Array, path: string): ReplayData {
  const array = decodeNpy(bytes, path);
  if (array.shape.length !== 1 && array.shape.length !== 2) {
    throw new DatasetReadError(path, 'header', `the array has shape (${array.shape.join(', ')}); a control table must be 1-D (one column) or 2-D (rows × columns)`, 'save a table with one row per recorded step');
  }
  const rows = array.shape[0];
  const columns = array.shape.length === 2 ? array.shape[1] : 1;
  return { data: Float64Array.from(array.data as ArrayLike<number>), rows, columns };
}
