// A summary of a dataset folder for a person at a terminal: episodes per split, the range of
// every sampled parameter, the space the files take and the episodes that were rejected. Works
// on unfinished folders too, from their completion records. The manifest is read as a stream,
// one record at a time, so its size does not matter.
import { readdir, readFile, stat } from 'node:fs/promises';
import { join } from 'node:path';

import { formatLabelNumber } from '../card/text-histogram.ts';
import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { readTextIfPresent } from '../formats/text-file.ts';
import { MANIFEST_FILE, SEED_FILE, WORK_DONE_FOLDER, WORK_FOLDER } from '../manifest/dataset-files.ts';
import type { EpisodeRecord, ManifestHead } from '../manifest/dataset-manifest.ts';
import type { EpisodeCompletion } from '../manifest/episode-completion.ts';
import { unitOfLabel } from '../manifest/label-units.ts';
import { readManifestStream } from '../manifest/manifest-stream.ts';

export interface DatasetInspection {
  dir: string;
  name: string;
  state: 'complete' | 'in progress';
  shard: { index: number; count: number } | null;
  episodeCount: number;
  listedEpisodes: number;
  splits: Array<{ split: string; ok: number; rejected: number }>;
  /**
   * Every label: `summary` for people; for programs, the range of a numeric label (min and max
   * over the listed episodes, null otherwise) and up to DISTINCT_SHOWN distinct values as
   * written in the manifest (null when there are more).
   */
  parameters: Array<{ pointer: string; unit: string; summary: string; episodes: number; min: number | null; max: number | null; distinctValues: string[] | null }>;
  sizes: Array<{ kind: string; files: number; bytes: number }>;
  /** The first MAX_LISTED_REJECTED rejected episodes. */
  rejected: Array<{ id: string; split: string; step: number; node: number; kind: string; cause: string }>;
  /** How many episodes were rejected in all. */
  rejectedCount: number;
}

async function completionsOf(dir: string): Promise<EpisodeRecord[]> {
  let names: string[];
  try {
    names = (await readdir(join(dir, WORK_DONE_FOLDER))).filter((n) => n.endsWith('.json')).sort();
  } catch {
    return [];
  }
  const records: EpisodeRecord[] = [];
  for (const name of names) {
    try {
      records.push((JSON.parse(await readFile(join(dir, WORK_DONE_FOLDER, name), 'utf8')) as EpisodeCompletion).record);
    } catch {
      // A record being written right now is skipped; it is counted on the next look.
    }
  }
  return records;
}

/** Beyond this many rejected episodes the inspection lists the first ones and counts the rest. */
export const MAX_LISTED_REJECTED = 1000;
const DISTINCT_SHOWN = 4;

/** The range (numbers) or the few distinct values (anything else) of each label, taken one episode at a time. */
class ParameterRanges {
  private readonly byPointer = new Map<string, { min: number; max: number; numeric: boolean; count: number; distinct: Set<string> }>();
  private readonly channelUnits = new Map<string, string>();

  add(episode: EpisodeRecord): void {
    for (const c of episode.controlChannels) if (!this.channelUnits.has(c.name)) this.channelUnits.set(c.name, c.unit);
    for (const [pointer, value] of Object.entries(episode.labels)) {
      let range = this.byPointer.get(pointer);
      if (!range) this.byPointer.set(pointer, (range = { min: Infinity, max: -Infinity, numeric: true, count: 0, distinct: new Set() }));
      range.count++;
      if (typeof value === 'number') {
        range.min = Math.min(range.min, value);
        range.max = Math.max(range.max, value);
      } else {
        range.numeric = false;
      }
      // One more than is shown is enough to know there are too many to show.
      if (range.distinct.size <= DISTINCT_SHOWN) range.distinct.add(typeof value === 'string' ? value : JSON.stringify(value));
    }
  }

  summary(): DatasetInspection['parameters'] {
    return [...this.byPointer].map(([pointer, range]) => {
      let summary: string;
      if (range.numeric && range.count > 0) {
        summary = range.min === range.max ? `${formatLabelNumber(range.min)} (fixed)` : `${formatLabelNumber(range.min)} to ${formatLabelNumber(range.max)}`;
      } else {
        summary = range.distinct.size <= DISTINCT_SHOWN ? [...range.distinct].join(', ') : `more than ${DISTINCT_SHOWN} distinct values`;
      }
      const numeric = range.numeric && range.count > 0;
      return {
        pointer,
        unit: unitOfLabel(pointer, this.channelUnits),
        summary,
        episodes: range.count,
        min: numeric ? range.min : null,
        max: numeric ? range.max : null,
        distinctValues: range.distinct.size <= DISTINCT_SHOWN ? [...range.distinct] : null,
      };
    });
  }
}

/** Everything the inspection takes from the episode records, gathered one record at a time. */
class EpisodeTally {
  readonly ranges = new ParameterRanges();
  readonly splits = new Map<string, { ok: number; rejected: number }>();
  readonly rejected: DatasetInspection['rejected'] = [];
  rejectedCount = 0;
  listed = 0;

  add(e: EpisodeRecord): void {
    this.listed++;
    this.ranges.add(e);
    const counts = this.splits.get(e.split) ?? { ok: 0, rejected: 0 };
    this.splits.set(e.split, counts);
    if (e.status === 'ok') {
      counts.ok++;
      return;
    }
    counts.rejected++;
    if (!e.rejection) return;
    this.rejectedCount++;
    if (this.rejected.length < MAX_LISTED_REJECTED) {
      this.rejected.push({ id: e.id, split: e.split, step: e.rejection.step, node: e.rejection.node, kind: e.rejection.kind, cause: e.rejection.likelyCause });
    }
  }
}

export async function inspectDataset(dir: string): Promise<DatasetInspection> {
  const info = await stat(dir).catch(() => null);
  if (!info) throw new DatasetRequestError(`${dir} does not exist; give the folder a Pliant run wrote`);
  if (!info.isDirectory()) throw new DatasetRequestError(`${dir} is a file; give the dataset folder that holds ${MANIFEST_FILE}`);
  const inProgress = await stat(join(dir, WORK_FOLDER)).then((s) => s.isDirectory(), () => false);
  const seedText = await readTextIfPresent(join(dir, SEED_FILE));
  const tally = new EpisodeTally();
  const manifestPath = join(dir, MANIFEST_FILE);
  let head: ManifestHead | null = null;
  const sizes = new Map<string, { files: number; bytes: number }>();
  const addSize = (kind: string, sizeBytes: number): void => {
    const entry = sizes.get(kind) ?? { files: 0, bytes: 0 };
    sizes.set(kind, entry);
    entry.files++;
    entry.bytes += sizeBytes;
  };
  const manifestThere = await stat(manifestPath).then(() => true, () => false);
  if (manifestThere) {
    const problems: string[] = [];
    try {
      for (const event of readManifestStream(manifestPath)) {
        if (event.kind === 'problem') problems.push(event.message);
        else if (event.kind === 'head') head = event.head;
        else if (event.kind === 'episode') tally.add(event.record);
        else if (event.kind === 'file') addSize(event.record.kind === 'episode-npz' ? 'episode NPZ' : 'split HDF5', event.record.sizeBytes);
        else if (event.kind === 'documents') for (const d of event.documents) addSize('documents and inputs', d.sizeBytes);
      }
    } catch (error) {
      if (!(error instanceof DatasetReadError)) throw error;
      problems.push(error.message);
    }
    if (problems.length > 0) {
      if (!inProgress) throw new DatasetRequestError(`${dir} holds no usable manifest: ${problems[0]}; run \`pliant verify ${dir}\` for details`);
      head = null;
    }
  } else if (!inProgress) {
    throw new DatasetRequestError(`${dir} holds no usable manifest: ${MANIFEST_FILE} is missing; run \`pliant verify ${dir}\` for details`);
  }
  const fromManifest = head !== null;
  if (!fromManifest) {
    const unfinished = new EpisodeTally();
    for (const record of await completionsOf(dir)) unfinished.add(record);
    return describe(dir, null, inProgress, seedText, unfinished, new Map());
  }
  return describe(dir, head, inProgress, seedText, tally, sizes);
}

function describe(dir: string, head: ManifestHead | null, inProgress: boolean, seedText: string | null, tally: EpisodeTally, sizes: Map<string, { files: number; bytes: number }>): DatasetInspection {
  const seed = seedText ? (JSON.parse(seedText) as { scenario?: { name?: string }; episodeCount?: number }) : {};
  // A finished manifest also lists the splits that drew no episode.
  const splitNames = [...new Set([...Object.keys(head?.splits ?? {}), ...tally.splits.keys()])];
  const order = ['episode NPZ', 'split HDF5', 'documents and inputs'];
  return {
    dir,
    name: head?.name ?? seed.scenario?.name ?? '',
    state: head && !inProgress ? 'complete' : 'in progress',
    shard: head?.shard ?? null,
    episodeCount: head?.episodeCount ?? seed.episodeCount ?? tally.listed,
    listedEpisodes: tally.listed,
    splits: splitNames.map((split) => ({ split, ...(tally.splits.get(split) ?? { ok: 0, rejected: 0 }) })),
    parameters: tally.ranges.summary(),
    sizes: order.filter((kind) => sizes.has(kind)).map((kind) => ({ kind, ...sizes.get(kind)! })),
    rejected: tally.rejected,
    rejectedCount: tally.rejectedCount,
  };
}
