// Reads a finished dataset folder for the app: its summary (names, split counts, formats, card,
// the arrays every episode carries), pages of its episode table and one episode's arrays. The
// manifest is the index: listing, sorting and filtering use its records only and never open a
// data file. A parsed manifest is kept while its file is unchanged (same size, time and inode),
// so paging through a large dataset parses and checks it once.
import { readFile, stat } from 'node:fs/promises';
import { basename, join } from 'node:path';

import { containedPath } from '../formats/contained-path.ts';
import { DatasetNotFoundError } from '../formats/dataset-not-found-error.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { say } from '../formats/run-words.ts';
import { CARD_FILE, MANIFEST_FILE, SEED_FILE } from '../manifest/dataset-files.ts';
import { readFolderState } from '../manifest/dataset-folder-state.ts';
import type { ArrayRecord, DatasetManifest, StoredDtype } from '../manifest/dataset-manifest.ts';
import type { EpisodeArraysRead } from './episode-array-reader.ts';
import { readEpisodeArrays } from './episode-array-reader.ts';
import type { EpisodeListPage, EpisodeListQuery } from './episode-listing.ts';
import { EpisodeListing } from './episode-listing.ts';

export interface ArraySummary {
  name: string;
  dtype: StoredDtype;
  /** One episode's shape; an extent that differs between episodes (nodes, springs, cells) is -1. */
  shape: number[];
  /** Smallest and largest extent of each axis over the episodes (equal where the shape has no -1). */
  minShape: number[];
  maxShape: number[];
  unit: string;
}

export interface DatasetSummaryRead {
  dir: string;
  /** The folder's name, with the shard when the folder holds one. */
  title: string;
  scenarioName: string;
  /** Episodes this folder lists (a shard lists only its own). */
  episodeCount: number;
  /** Listed episodes per split, every split of the scenario included. */
  splitCounts: Record<string, number>;
  formats: ('npz' | 'hdf5')[];
  seedFilePath: string | null;
  /** When the run that wrote the folder finished, as the manifest records it; "" if it does not. */
  createdAtIso: string;
  pliantVersion: string;
  cardMarkdown: string;
  arrays: ArraySummary[];
  labelKeys: string[];
}

/** Beyond this a manifest is not parsed in the app; `pliant inspect` summarises such folders. */
export const MAX_MANIFEST_BYTES = 512 * 1024 * 1024;
/** The card is for reading; a longer one is cut with a note. */
export const MAX_CARD_CHARS = 2 * 1024 * 1024;
const CACHED_DATASETS = 4;

interface CachedDataset {
  stamp: string;
  manifest: DatasetManifest;
  listing: EpisodeListing;
  summary: DatasetSummaryRead | null;
}

export class DatasetReader {
  private readonly cache = new Map<string, CachedDataset>();

  async summary(dir: string): Promise<DatasetSummaryRead> {
    const entry = await this.load(dir);
    entry.summary ??= await summarise(dir, entry);
    return entry.summary;
  }

  async episodes(dir: string, query: EpisodeListQuery): Promise<EpisodeListPage> {
    return (await this.load(dir)).listing.page(query);
  }

  /** The folder's checked manifest, parsed once while the file is unchanged. */
  async manifest(dir: string): Promise<DatasetManifest> {
    return (await this.load(dir)).manifest;
  }

  async episodeArrays(dir: string, episodeId: string): Promise<EpisodeArraysRead> {
    return readEpisodeArrays(dir, (await this.load(dir)).manifest, episodeId);
  }

  private async load(dir: string): Promise<CachedDataset> {
    const manifestPath = join(dir, MANIFEST_FILE);
    const info = await stat(manifestPath).catch(() => null);
    const cached = this.cache.get(dir);
    const stamp = info ? `${info.size}:${info.mtimeMs}:${info.ino}` : '';
    if (cached && info && cached.stamp === stamp) {
      // Most recently used last, so the oldest is dropped first.
      this.cache.delete(dir);
      this.cache.set(dir, cached);
      return cached;
    }
    if (info && info.size > MAX_MANIFEST_BYTES) {
      throw new DatasetRequestError(`${manifestPath} is ${info.size} bytes, more than the ${MAX_MANIFEST_BYTES} the app reads; summarise the folder with \`pliant inspect ${dir}\` instead`);
    }
    const folder = await stat(dir).catch(() => null);
    if (!folder) throw new DatasetNotFoundError(`${dir} does not exist; open the folder a Pliant export wrote`);
    const state = await readFolderState(dir);
    if (!state.manifest) {
      throw new DatasetRequestError(`${dir} is not a readable Pliant dataset: ${state.manifestProblems[0] ?? `${MANIFEST_FILE} is missing`}; ${say('verify-folder')} for every problem`);
    }
    const entry: CachedDataset = { stamp, manifest: state.manifest, listing: new EpisodeListing(state.manifest.episodes), summary: null };
    this.cache.delete(dir);
    this.cache.set(dir, entry);
    while (this.cache.size > CACHED_DATASETS) this.cache.delete(this.cache.keys().next().value!);
    return entry;
  }
}

async function summarise(dir: string, entry: CachedDataset): Promise<DatasetSummaryRead> {
  const { manifest, listing } = entry;
  const splitCounts: Record<string, number> = {};
  for (const split of Object.keys(manifest.splits)) splitCounts[split] = 0;
  for (const episode of manifest.episodes) splitCounts[episode.split] = (splitCounts[episode.split] ?? 0) + 1;
  const formats: ('npz' | 'hdf5')[] = [];
  if (manifest.files.some((f) => f.kind === 'episode-npz')) formats.push('npz');
  if (manifest.files.some((f) => f.kind === 'split-hdf5')) formats.push('hdf5');
  const seedPath = await containedPath(dir, SEED_FILE);
  const seedThere = await stat(seedPath).then((s) => s.isFile(), () => false);
  const finished = manifest.run.finishedAt;
  return {
    dir,
    title: manifest.shard ? `${basename(dir)} (shard ${manifest.shard.index}/${manifest.shard.count})` : basename(dir),
    scenarioName: manifest.name,
    episodeCount: manifest.episodes.length,
    splitCounts,
    formats,
    seedFilePath: seedThere ? seedPath : null,
    createdAtIso: typeof finished === 'string' ? finished : '',
    pliantVersion: manifest.pliantVersion,
    cardMarkdown: await readCard(dir),
    arrays: commonArrays(manifest),
    labelKeys: [...listing.labelKeys],
  };
}

async function readCard(dir: string): Promise<string> {
  // Outside the try: a card that links out of the folder is refused, not reported as missing.
  const path = await containedPath(dir, CARD_FILE);
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    return `(${CARD_FILE} is missing from this folder; run Verify to see what else is.)`;
  }
  return text.length > MAX_CARD_CHARS ? `${text.slice(0, MAX_CARD_CHARS)}\n\n(The card is longer than the app shows; open ${CARD_FILE} to read the rest.)\n` : text;
}

/**
 * The arrays every recorded episode carries, in the order of the first one's file, with the
 * extents they share; an extent that differs between episodes becomes -1.
 */
function commonArrays(manifest: DatasetManifest): ArraySummary[] {
  const perEpisode = new Map<string, Map<string, ArrayRecord>>();
  for (const file of manifest.files) {
    if (file.kind === 'episode-npz') {
      for (const id of file.episodes) if (!perEpisode.has(id)) perEpisode.set(id, new Map(file.arrays.map((a) => [a.name, a])));
      continue;
    }
    for (const array of file.arrays) {
      const slash = array.name.indexOf('/');
      if (slash < 0) continue;
      const id = array.name.slice(0, slash);
      const name = array.name.slice(slash + 1);
      let arrays = perEpisode.get(id);
      if (!arrays) perEpisode.set(id, (arrays = new Map()));
      if (!arrays.has(name)) arrays.set(name, { ...array, name });
    }
  }
  const episodes = [...perEpisode.values()];
  if (episodes.length === 0) return [];
  const result: ArraySummary[] = [];
  for (const first of episodes[0].values()) {
    const shape = [...first.shape];
    const minShape = [...first.shape];
    const maxShape = [...first.shape];
    let everywhere = true;
    for (const arrays of episodes) {
      const other = arrays.get(first.name);
      if (!other || other.shape.length !== shape.length) {
        everywhere = false;
        break;
      }
      for (let axis = 0; axis < shape.length; axis += 1) {
        const extent = other.shape[axis];
        if (extent !== shape[axis]) shape[axis] = -1;
        if (extent < minShape[axis]) minShape[axis] = extent;
        if (extent > maxShape[axis]) maxShape[axis] = extent;
      }
    }
    if (everywhere) result.push({ name: first.name, dtype: first.dtype, shape, minShape, maxShape, unit: first.unit });
  }
  return result;
}
