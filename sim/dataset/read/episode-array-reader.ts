// Reads one recorded episode's arrays back from a dataset folder, for the app to play and plot:
// from the episode's NPZ file when the export kept one, otherwise from its group in the split's
// HDF5 file. The manifest decides which arrays there are, their order, dtype, shape and unit;
// what the file holds must agree with it, so a damaged or swapped file is reported rather than
// shown as if it were the episode.
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';

import { containedPath } from '../formats/contained-path.ts';
import { DatasetNotFoundError } from '../formats/dataset-not-found-error.ts';
import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { sha256Hex } from '../formats/file-digest.ts';
import { readHdf5GroupArrays } from '../formats/hdf5-group-reader.ts';
import type { NamedArray } from '../formats/named-array.ts';
import { decodeNpz } from '../formats/npz.ts';
import type { ArrayRecord, DataFileRecord, DatasetManifest, EpisodeRecord } from '../manifest/dataset-manifest.ts';

export interface EpisodeArraysRead {
  episode: EpisodeRecord;
  /** The data file the arrays came from, relative to the dataset folder. */
  file: string;
  /** In manifest order, each with the manifest's unit. */
  arrays: NamedArray[];
}

const FIX = 'run Verify on the dataset folder; regenerate it from its seed.json if a file is damaged';

/** The manifest's array records of `episodeId` inside `file` (HDF5 names carry the "<id>/" prefix). */
function recordsIn(file: DataFileRecord, episodeId: string): ArrayRecord[] {
  if (file.kind === 'episode-npz') return file.arrays;
  const prefix = `${episodeId}/`;
  return file.arrays.filter((a) => a.name.startsWith(prefix)).map((a) => ({ ...a, name: a.name.slice(prefix.length) }));
}

export async function readEpisodeArrays(dir: string, manifest: DatasetManifest, episodeId: string): Promise<EpisodeArraysRead> {
  const episode = manifest.episodes.find((e) => e.id === episodeId);
  if (!episode) throw new DatasetNotFoundError(`the dataset has no episode "${episodeId}"; pick one from its episode list`);
  if (episode.status === 'rejected') {
    const why = episode.rejection ? `: ${episode.rejection.message}` : '';
    throw new DatasetNotFoundError(`episode ${episodeId} was rejected${why}. A rejected episode has no data files; its record in manifest.json says what went wrong`);
  }
  const files = episode.files
    .map((path) => manifest.files.find((f) => f.path === path))
    .filter((f): f is DataFileRecord => f !== undefined);
  // One small NPZ file is far cheaper to open than a whole split's HDF5 file.
  const file = files.find((f) => f.kind === 'episode-npz') ?? files.find((f) => f.kind === 'split-hdf5');
  if (!file) throw new DatasetReadError(join(dir, 'manifest.json'), `episode ${episodeId}`, 'the manifest names no data file for this episode', FIX);
  const records = recordsIn(file, episodeId);
  const path = await containedPath(dir, file.path);
  const arrays = file.kind === 'episode-npz'
    ? await readNpzChecked(path, file)
    : await readHdf5GroupArrays(path, episodeId, records.map((r) => r.name));
  const byName = new Map(arrays.map((a) => [a.name, a]));
  const ordered = records.map((record) => {
    const array = byName.get(record.name);
    if (!array) throw new DatasetReadError(path, record.name, 'the array the manifest lists is missing', FIX);
    if (array.dtype !== record.dtype || array.shape.length !== record.shape.length || array.shape.some((n, i) => n !== record.shape[i])) {
      throw new DatasetReadError(path, record.name,
        `the file holds ${array.dtype} [${array.shape.join(', ')}] but the manifest says ${record.dtype} [${record.shape.join(', ')}]`, FIX);
    }
    return { ...array, unit: record.unit, description: record.meaning } as NamedArray;
  });
  return { episode, file: file.path, arrays: ordered };
}

/** An episode's NPZ file is small, so its checksum is checked on every read: playback never shows a damaged file. */
async function readNpzChecked(path: string, record: DataFileRecord): Promise<NamedArray[]> {
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (error) {
    const code = (error as { code?: string }).code ?? 'unreadable';
    throw new DatasetReadError(path, '', `the file cannot be read (${code})`, FIX);
  }
  if (bytes.length !== record.sizeBytes || sha256Hex(bytes) !== record.sha256) {
    throw new DatasetReadError(path, '', 'the file does not match its SHA-256 in manifest.json', FIX);
  }
  return decodeNpz(bytes, path);
}
