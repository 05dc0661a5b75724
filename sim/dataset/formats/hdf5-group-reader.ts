// Reads the arrays of one group of an HDF5 file (an episode's group in a split's .h5 file) back
// into NamedArrays, through the same h5wasm library the writer uses. Only the named datasets of
// the group are read, so showing one episode of a large split does not decompress the others.
import { resolve } from 'node:path';

import { DatasetReadError } from './dataset-read-error.ts';
import type { Hdf5Library } from './hdf5-runtime.ts';
import { loadHdf5Library, runHdf5Calls } from './hdf5-runtime.ts';
import { HDF5_FIXED_TIME_S } from './hdf5-writer.ts';
import type { ArrayDtype, NamedArray } from './named-array.ts';
import { dtypeOfTypedArray } from './named-array.ts';

type Hdf5Dataset = InstanceType<Hdf5Library['Dataset']>;

/** The element types our writer stores, told apart by HDF5's class, size and sign. */
function dtypeOf(metadata: Hdf5Dataset['metadata']): ArrayDtype | null {
  if (!metadata.littleEndian && metadata.size > 1) return null;
  // HDF5 type classes: 0 integer, 1 floating point (HDF5 File Format Specification, datatype message).
  if (metadata.type === 1) return metadata.size === 4 ? 'float32' : metadata.size === 8 ? 'float64' : null;
  if (metadata.type !== 0) return null;
  const bySize: Record<number, [ArrayDtype, ArrayDtype]> = { 1: ['int8', 'uint8'], 2: ['int16', 'uint16'], 4: ['int32', 'uint32'] };
  const pair = bySize[metadata.size];
  return pair ? (metadata.signed ? pair[0] : pair[1]) : null;
}

/**
 * The datasets `names` of group `groupName` in the HDF5 file at `path`, in the order asked for.
 * Any dataset that is missing or of a type Pliant does not write is a DatasetReadError naming
 * the file and the dataset.
 */
export async function readHdf5GroupArrays(path: string, groupName: string, names: readonly string[]): Promise<NamedArray[]> {
  const library = await loadHdf5Library();
  const run = runHdf5Calls(library, HDF5_FIXED_TIME_S, () => {
    const file = new library.File(resolve(path), 'r');
    if (file.file_id < 0n) return null;
    try {
      const arrays: NamedArray[] = [];
      for (const name of names) {
        const entity = file.get(`${groupName}/${name}`);
        if (!(entity instanceof library.Dataset)) {
          throw new DatasetReadError(path, `/${groupName}/${name}`, 'the dataset is missing', 'run Verify on the dataset folder; regenerate it from its seed.json if the file is damaged');
        }
        const dtype = dtypeOf(entity.metadata);
        const data = entity.value;
        if (dtype === null || !ArrayBuffer.isView(data) || dtypeOfTypedArray(data) !== dtype) {
          throw new DatasetReadError(path, `/${groupName}/${name}`, 'the dataset has an element type Pliant does not write', 'open the file a Pliant export wrote');
        }
        arrays.push({ name, dtype, shape: [...(entity.shape ?? [])], data } as NamedArray);
      }
      return arrays;
    } finally {
      file.close();
    }
  });
  if (run.error instanceof DatasetReadError) throw run.error;
  if (run.error !== undefined || run.value === null || run.value === undefined) {
    const minors = [...run.diagnostics.matchAll(/minor: (.+)/g)].map((match) => match[1].trim());
    const detail = minors.at(-1) ?? (run.error instanceof Error ? run.error.message : 'HDF5 could not open it');
    throw new DatasetReadError(path, '', `the file cannot be read as HDF5 (${detail})`, 'run Verify on the dataset folder; regenerate it from its seed.json if the file is damaged');
  }
  return run.value;
}
