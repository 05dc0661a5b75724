// One HDF5 file per split: a group per episode (named by its id, in id order) holding the same
// arrays as the episode's NPZ file, each with 'unit' and 'description' attributes from the
// catalogue, and the episode's index and split as group attributes. The groups are built from
// the episodes' NPZ bytes after all of them exist, so the file never depends on the order in
// which episodes finished, on the worker count or on sharding.
import { writeHdf5File } from './hdf5-writer.ts';
import type { Hdf5Group } from './hdf5-writer.ts';
import type { NamedArray } from './named-array.ts';
import { describeArray } from './episode-array-catalogue.ts';

export interface SplitEpisode {
  id: string;
  index: number;
  arrays: NamedArray[];
}

export interface SplitHdf5Header {
  datasetName: string;
  split: string;
  masterSeed: string;
}

/** Deflate inside HDF5 chunks, which h5py reads without extra filters. */
const HDF5_DEFLATE_LEVEL = 4;

export async function writeSplitHdf5(path: string, header: SplitHdf5Header, episodes: readonly SplitEpisode[]): Promise<void> {
  const groups: Hdf5Group[] = [...episodes]
    .sort((a, b) => a.index - b.index)
    .map((episode) => ({
      name: episode.id,
      attributes: { episode_index: BigInt(episode.index), split: header.split },
      arrays: episode.arrays.map((array) => {
        const d = describeArray(array.name);
        return { ...array, unit: d.unit, description: d.meaning };
      }),
    }));
  await writeHdf5File(
    path,
    {
      attributes: { dataset: header.datasetName, split: header.split, master_seed: header.masterSeed, layout: 'one group per episode, named by episode id; see manifest.json' },
      groups,
    },
    { deflateLevel: HDF5_DEFLATE_LEVEL },
  );
}
