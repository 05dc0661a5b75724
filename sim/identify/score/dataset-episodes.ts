// The scorer's one way into a dataset: its manifest, the records of the episodes of chosen
// splits, and one episode's arrays at a time. Kept in one place so a streaming manifest reader
// can replace the parsed manifest (for manifests beyond what JSON.parse holds) without touching
// the metrics.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';
import { sha256Hex } from '../../dataset/formats/file-digest.ts';
import type { NamedArray } from '../../dataset/formats/named-array.ts';
import { say } from '../../dataset/formats/run-words.ts';
import { MANIFEST_FILE } from '../../dataset/manifest/dataset-files.ts';
import { readFolderState } from '../../dataset/manifest/dataset-folder-state.ts';
import type { DataFileRecord, DatasetManifest, EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import { readEpisodeArrays } from '../../dataset/read/episode-array-reader.ts';

export interface ScoredDataset {
  dir: string;
  manifest: DatasetManifest;
  /** SHA-256 of manifest.json and of seed.json as they are on disk. */
  manifestSha256: string;
  seedSha256: string | null;
  /** Split names in the manifest's order. */
  splitNames: string[];
}

export async function openScoredDataset(dir: string): Promise<ScoredDataset> {
  const state = await readFolderState(dir);
  if (!state.manifest) {
    const why = state.manifestProblems.slice(0, 5).join('; ');
    throw new DatasetRequestError(`${dir} is not a finished dataset folder: ${why}. Give a dataset folder whose run has finished, and ${say('verify-folder')}`);
  }
  const manifestBytes = readFileSync(join(dir, MANIFEST_FILE));
  return {
    dir,
    manifest: state.manifest,
    manifestSha256: sha256Hex(manifestBytes),
    seedSha256: state.seedText === null ? null : sha256Hex(new TextEncoder().encode(state.seedText)),
    splitNames: Object.keys(state.manifest.splits),
  };
}

/**
 * Every episode record of the dataset, rejected ones too, in index order: the one place the
 * scorer touches the manifest's episode list, to be swapped for a streaming manifest reader.
 */
export async function* allEpisodeRecords(dataset: ScoredDataset): AsyncGenerator<EpisodeRecord> {
  yield* dataset.manifest.episodes;
}

/** Records of the recorded (status "ok") episodes of `splits`, in index order. */
export async function* episodeRecordsOfSplits(dataset: ScoredDataset, splits: ReadonlySet<string>): AsyncGenerator<EpisodeRecord> {
  for await (const episode of allEpisodeRecords(dataset)) {
    if (episode.status === 'ok' && splits.has(episode.split)) yield episode;
  }
}

/** Ids of every recorded episode and of every rejected one, to tell an extra prediction from one of another split. */
export async function episodeIdsByStatus(dataset: ScoredDataset): Promise<{ ok: Map<string, string>; rejected: Set<string> }> {
  const ok = new Map<string, string>();
  const rejected = new Set<string>();
  for await (const episode of allEpisodeRecords(dataset)) {
    if (episode.status === 'ok') ok.set(episode.id, episode.split);
    else rejected.add(episode.id);
  }
  return { ok, rejected };
}

const filesByPath = new WeakMap<DatasetManifest, Map<string, DataFileRecord>>();

/** The episode's recorded arrays, checked against the manifest (and its SHA-256 for NPZ files). */
export async function recordedArrays(dataset: ScoredDataset, episode: EpisodeRecord): Promise<NamedArray[]> {
  let files = filesByPath.get(dataset.manifest);
  if (!files) {
    files = new Map(dataset.manifest.files.map((f) => [f.path, f]));
    filesByPath.set(dataset.manifest, files);
  }
  // The reader looks the episode and its files up by scanning the lists it is given; handing it
  // just this episode's entries keeps a 10,000-episode score linear instead of quadratic.
  const own = episode.files.map((p) => files.get(p)).filter((f): f is DataFileRecord => f !== undefined);
  const read = await readEpisodeArrays(dataset.dir, { ...dataset.manifest, episodes: [episode], files: own }, episode.id);
  return read.arrays;
}

