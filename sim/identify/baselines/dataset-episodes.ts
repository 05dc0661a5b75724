// Where the baselines get their episodes: a dataset folder's manifest, the ok episodes of the
// splits asked for, and each episode's arrays as an EpisodeTrajectory. `episodesOfSplits` is
// the one place that walks the manifest's episode list, so a streaming manifest reader can
// replace it without touching the fits.
import { COMMAND_LINE_WORDS, wordRun } from '../../dataset/formats/run-words.ts';
import { readFolderState } from '../../dataset/manifest/dataset-folder-state.ts';
import type { DatasetManifest, EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import { readEpisodeArrays } from '../../dataset/read/episode-array-reader.ts';
import { BaselineInputError } from './baseline-input-error.ts';
import { type EpisodeTrajectory,trajectoryFromArrays } from './episode-trajectory.ts';

export interface OpenDataset {
  dir: string;
  manifest: DatasetManifest;
}

export async function openDataset(dir: string): Promise<OpenDataset> {
  const state = await readFolderState(dir);
  if (!state.manifest) {
    throw new BaselineInputError(wordRun(`${dir} is not a finished dataset folder: ${state.manifestProblems.join('; ')}`, COMMAND_LINE_WORDS));
  }
  return { dir, manifest: state.manifest };
}

/** Ok episodes of the given splits, in index order. Every split named must exist in the dataset. */
export function episodesOfSplits(dataset: OpenDataset, splits: readonly string[]): EpisodeRecord[] {
  const known = Object.keys(dataset.manifest.splits);
  for (const split of splits) {
    if (!known.includes(split)) {
      throw new BaselineInputError(`${dataset.dir} has no split "${split}" (its splits: ${known.join(', ') || 'none'}); choose one of those with --split`);
    }
  }
  return dataset.manifest.episodes.filter((e) => e.status === 'ok' && splits.includes(e.split));
}

export async function loadTrajectory(dataset: OpenDataset, episode: EpisodeRecord): Promise<EpisodeTrajectory> {
  const read = await readEpisodeArrays(dataset.dir, dataset.manifest, episode.id);
  return trajectoryFromArrays(read.arrays, {
    id: episode.id,
    split: episode.split,
    file: `${dataset.dir}/${read.file}`,
    recordIntervalS: episode.simulation.recordIntervalS,
    substeps: episode.simulation.substeps,
  });
}
