// One HDF5 file per split: a group per episode (named by its id, in id order) holding the same
// arrays as the episode's NPZ file, each with 'unit' and 'description' attributes from the
// catalogue, and the episode's index, split and labels (as JSON) as group attributes; the file
// carries the split's normalisation statistics (as JSON) beside its name and seed. The groups are built from
// the episodes' NPZ bytes after all of them exist, so the file never depends on the order in
// which episodes finished, on the worker count or on sharding. Episodes are read and written
// one at a time, so a split of any size needs the memory of one episode, not of the split.
import { COMPRESSION_LEVELS, type ExportCompression } from '../../scenario/export-compression.ts';
import type { LabelValue } from '../../scenario/sampled-episode.ts';
import type { Hdf5Group } from '../formats/hdf5-writer.ts';
import { writeHdf5FileStreamed } from '../formats/hdf5-writer.ts';
import type { NamedArray } from '../formats/named-array.ts';
import { describeArray } from '../manifest/episode-array-catalogue.ts';

export interface SplitEpisode {
  id: string;
  index: number;
  arrays: NamedArray[];
  /** The episode's sampled values, as in its manifest record; written as the group's `labels` attribute. */
  labels: Record<string, LabelValue>;
}

export interface SplitHdf5Header {
  datasetName: string;
  split: string;
  masterSeed: string;
  /** The split's normalisation statistics, as in the manifest; written as the file's `normalisation` attribute. */
  normalisation?: unknown;
}

function* episodeGroups(header: SplitHdf5Header, episodes: Iterable<SplitEpisode>): Generator<Hdf5Group> {
  let previous = -1;
  for (const episode of episodes) {
    // Streamed episodes cannot be sorted here, and the file's bytes depend on the group order.
    if (episode.index <= previous) throw new RangeError(`episodes of split ${header.split} must come in ascending index order (${episode.index} after ${previous})`);
    previous = episode.index;
    yield {
      name: episode.id,
      // JSON keeps every label exactly, whatever its type; HDF5 attribute names cannot hold the
      // pointers' slashes, so one attribute holds them all.
      attributes: { episode_index: BigInt(episode.index), split: header.split, labels: JSON.stringify(episode.labels) },
      arrays: episode.arrays.map((array) => {
        const d = describeArray(array.name);
        return { ...array, unit: d.unit, description: d.meaning };
      }),
    };
  }
}

/**
 * `episodes` are made (e.g. read from their NPZ files) as they are written, in ascending index
 * order. Compressed choices use HDF5's gzip filter, which h5py reads without extra plugins.
 */
export async function writeSplitHdf5(path: string, header: SplitHdf5Header, episodes: Iterable<SplitEpisode>, compression: ExportCompression): Promise<void> {
  await writeHdf5FileStreamed(
    path,
    {
      attributes: {
        dataset: header.datasetName,
        split: header.split,
        master_seed: header.masterSeed,
        layout: 'one group per episode, named by episode id; see manifest.json',
        ...(header.normalisation !== undefined ? { normalisation: JSON.stringify(header.normalisation) } : {}),
      },
      groups: episodeGroups(header, episodes),
    },
    { deflateLevel: COMPRESSION_LEVELS[compression].hdf5DeflateLevel, minCompressedBytes: COMPRESSION_LEVELS[compression].hdf5MinCompressedBytes },
  );
}
