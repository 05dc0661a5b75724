// The last part of making a dataset folder, shared by `generate` and `merge`: once every episode
// has its NPZ file and completion record, assemble one HDF5 file per split (in episode-id order,
// so the bytes never depend on which episode finished first), then the card's pictures (card/),
// then the card, then the manifest, and only then remove the work folder. Every step writes
// through a temporary name, and the whole step can be repeated after a crash and gives the same
// files.
//
// Memory stays flat in the number of episodes: episode records are taken from the completion
// source one at a time (a generate run reads them back from .pliant-work/done/), a split's HDF5
// file is written one episode group at a time, and manifest.json is written member by member.
// What is kept for the whole sweep is a few numbers per episode (split positions and the
// scalar labels the card's histograms need).
import { rm } from 'node:fs/promises';
import { join } from 'node:path';

import { COMPRESSION_LEVELS } from '../../scenario/export-compression.ts';
import type { SheetEpisode } from '../card/card-contact-sheet.ts';
import { SHEET_EPISODES, sheetEpisode } from '../card/card-contact-sheet.ts';
import { renderCardPictures } from '../card/card-pictures.ts';
import { CardTally } from '../card/card-tally.ts';
import { renderDatasetCard } from '../card/dataset-card.ts';
import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { toDatasetWriteError } from '../formats/dataset-write-error.ts';
import { digestFile } from '../formats/file-digest.ts';
import { decodeNpz } from '../formats/npz.ts';
import { readFileBytes } from '../formats/read-file-bytes.ts';
import { say } from '../formats/run-words.ts';
import { StreamedList, writeStreamedJson } from '../formats/streamed-json.ts';
import type { ColumnMoments } from '../manifest/column-moments.ts';
import { combineMoments } from '../manifest/column-moments.ts';
import { CARD_FILE, CARD_PICTURES_FOLDER, MANIFEST_FILE, splitHdf5Path,WORK_FOLDER } from '../manifest/dataset-files.ts';
import type { ArrayLayout, ColumnStatistics, DataFileRecord, DatasetManifest, EpisodeRecord, FileRecord, InputFileRecord, ManifestHead, NormalisedArrayName } from '../manifest/dataset-manifest.ts';
import { NORMALISED_ARRAYS } from '../manifest/dataset-manifest.ts';
import { describeArray } from '../manifest/episode-array-catalogue.ts';
import type { EpisodeCompletion } from '../manifest/episode-completion.ts';
import { EPISODE_RECORDS_DIGEST_MEMBER, EpisodeRecordsDigest } from '../manifest/episode-records-digest.ts';
import type { SeedFile } from '../manifest/seed-file.ts';
import { writeDatasetFile, writeDatasetTextStreamed } from './dataset-file-writer.ts';
import type { GenerationListener } from './generation-progress.ts';
import type { ShardPlan } from './shard-plan.ts';
import type { SplitEpisode } from './split-hdf5.ts';
import { writeSplitHdf5 } from './split-hdf5.ts';

/** The episodes of the folder being finished, ascending by index, handed out one at a time. */
export interface CompletionSource {
  readonly count: number;
  /** The completion at `position` (0-based, in index order); it may be read from disk on every call. */
  at(position: number): EpisodeCompletion;
}

/** A completion source over records already in memory (a merge, which reads them from the shards' manifests). */
export function completionsInMemory(completions: readonly EpisodeCompletion[]): CompletionSource {
  return { count: completions.length, at: (position) => completions[position] };
}

export interface FinishRequest {
  outDir: string;
  seed: SeedFile;
  /** seed.json as written in the folder. */
  seedRecord: FileRecord;
  shard: ShardPlan | null;
  /** One per episode of the folder, ascending by index. */
  completions: CompletionSource;
  pliantVersion: string;
  run: Record<string, unknown>;
  onEvent?: GenerationListener;
}

/** What a finished folder holds, without the manifest's per-episode records. */
export interface FinishedDataset {
  ok: number;
  rejected: number;
  /** Paths of the documents and data files manifest.json lists, in its order. */
  listedPaths: string[];
  /** How many data files manifest.json lists. */
  dataFileCount: number;
}

export function keepsEpisodeNpz(format: SeedFile['export']['format'], shard: ShardPlan | null): boolean {
  // A shard always keeps its NPZ files: they are what `merge` assembles the split files from.
  return shard !== null || format !== 'hdf5';
}

export function writesSplitHdf5(format: SeedFile['export']['format'], shard: ShardPlan | null): boolean {
  return shard === null && format !== 'npz';
}

function describedArrays(layouts: ArrayLayout[], prefix: string): DataFileRecord['arrays'] {
  return layouts.map((a) => {
    const d = describeArray(a.name);
    return { name: `${prefix}${a.name}`, dtype: a.dtype, shape: a.shape, unit: d.unit, meaning: d.meaning };
  });
}

/** Split names in a fixed order: the fraction splits as the scenario lists them, then held-out ones, then any others by name. */
export function orderedSplits(seed: SeedFile, present: Iterable<string>): string[] {
  const declared = [...Object.keys(seed.scenario.splits.fractions), ...seed.scenario.splits.heldOut.map((r) => r.split)];
  const others = [...new Set(present)].filter((name) => !declared.includes(name)).sort();
  return [...new Set([...declared, ...others])];
}

/** A split file's record as it is written: its id and array lists are made again from the completions. */
type SplitFileRecord = Omit<DataFileRecord, 'episodes' | 'arrays'> & { episodes: StreamedList; arrays: StreamedList };

/**
 * Per split, the moments of each normalised array, combined in the order the episodes come
 * (index order), so a single run, a resumed one and a merge of shards agree bit for bit. An
 * array whose column count changes within a split (control channels that vary) is dropped.
 */
class SplitMoments {
  private readonly bySplit = new Map<string, Map<NormalisedArrayName, ColumnMoments | null>>();

  add(record: EpisodeRecord): void {
    if (record.status !== 'ok' || record.arrayMoments === undefined) return;
    let arrays = this.bySplit.get(record.split);
    if (arrays === undefined) this.bySplit.set(record.split, (arrays = new Map()));
    for (const name of NORMALISED_ARRAYS) {
      const episode = record.arrayMoments[name];
      if (episode === undefined) continue;
      if (!arrays.has(name)) {
        arrays.set(name, episode);
        continue;
      }
      const sofar = arrays.get(name)!;
      arrays.set(name, sofar === null ? null : combineMoments(sofar, episode));
    }
  }

  statistics(splits: readonly string[]): NonNullable<DatasetManifest['normalisation']> {
    const out: NonNullable<DatasetManifest['normalisation']> = {};
    for (const split of splits) {
      const arrays = this.bySplit.get(split);
      if (arrays === undefined) continue;
      const entry: Partial<Record<NormalisedArrayName, ColumnStatistics>> = {};
      for (const [name, m] of arrays) {
        if (m === null) continue;
        entry[name] = { count: m.count, mean: m.mean, std: m.m2.map((v) => Math.sqrt(v / m.count)), min: m.min, max: m.max };
      }
      out[split] = entry;
    }
    return out;
  }
}

/** One pass over every episode: the card's tally, and per split its counts and the positions of its recorded episodes. */
interface SweepSummary {
  tally: CardTally;
  splits: string[];
  counts: DatasetManifest['splits'];
  okPositions: Map<string, number[]>;
  normalisation: NonNullable<DatasetManifest['normalisation']>;
}

function summarise(request: FinishRequest): SweepSummary {
  const tally = new CardTally();
  const okPositions = new Map<string, number[]>();
  const rejectedCount = new Map<string, number>();
  const moments = new SplitMoments();
  for (let p = 0; p < request.completions.count; p++) {
    const { record } = request.completions.at(p);
    tally.add(record);
    moments.add(record);
    if (!okPositions.has(record.split)) okPositions.set(record.split, []);
    if (record.status === 'ok') okPositions.get(record.split)!.push(p);
    else rejectedCount.set(record.split, (rejectedCount.get(record.split) ?? 0) + 1);
  }
  const splits = orderedSplits(request.seed, okPositions.keys());
  const counts: DatasetManifest['splits'] = {};
  for (const split of splits) counts[split] = { ok: okPositions.get(split)?.length ?? 0, rejected: rejectedCount.get(split) ?? 0 };
  return { tally, splits, counts, okPositions, normalisation: moments.statistics(splits) };
}

function* splitEpisodes(request: FinishRequest, positions: readonly number[]): Generator<SplitEpisode> {
  for (const p of positions) {
    const completion = request.completions.at(p);
    const npzPath = join(request.outDir, completion.npz!.path);
    yield { id: completion.record.id, index: completion.record.index, labels: completion.record.labels, arrays: decodeNpz(readFileBytes(npzPath), npzPath) };
  }
}

/** The contact sheet's episodes: the first recorded one of each split, in split order, read from its episode file. */
function contactSheetEpisodes(request: FinishRequest, summary: SweepSummary): SheetEpisode[] {
  const episodes: SheetEpisode[] = [];
  for (const split of summary.splits) {
    if (episodes.length >= SHEET_EPISODES) break;
    const first = summary.okPositions.get(split)?.[0];
    if (first === undefined) continue;
    const completion = request.completions.at(first);
    const npzPath = join(request.outDir, completion.npz!.path);
    const episode = sheetEpisode(completion.record.id, split, decodeNpz(readFileBytes(npzPath), npzPath));
    if (episode !== null) episodes.push(episode);
  }
  return episodes;
}

async function assembleSplit(request: FinishRequest, split: string, positions: readonly number[], normalisation: unknown): Promise<SplitFileRecord> {
  const path = splitHdf5Path(split);
  request.onEvent?.({ type: 'assemble', file: path });
  const absolute = join(request.outDir, path);
  await writeSplitHdf5(absolute, { datasetName: request.seed.scenario.name, split, masterSeed: request.seed.masterSeed, normalisation }, splitEpisodes(request, positions), request.seed.scenario.export.compression);
  const { completions } = request;
  const digest = await digestFile(absolute);
  if (digest.kind !== 'hashed') throw new DatasetReadError(absolute, '', `the file just written cannot be read back (${digest.kind === 'missing' ? 'ENOENT' : digest.reason})`, `check the disk and ${say('run-again-resuming')}`);
  return {
    path,
    sha256: digest.sha256,
    sizeBytes: digest.sizeBytes,
    kind: 'split-hdf5',
    split,
    episodes: new StreamedList(function* () {
      for (const p of positions) yield completions.at(p).record.id;
    }),
    arrays: new StreamedList(function* () {
      for (const p of positions) {
        const { record, arrays } = completions.at(p);
        yield* describedArrays(arrays, `${record.id}/`);
      }
    }),
  };
}

export async function finishDataset(request: FinishRequest): Promise<FinishedDataset> {
  const { seed, shard, completions } = request;
  const format = seed.export.format;
  const keepNpz = keepsEpisodeNpz(format, shard);
  const summary = summarise(request);
  const { tally } = summary;

  const splitFiles: SplitFileRecord[] = [];
  const splitFile = new Map<string, string>();
  if (writesSplitHdf5(format, shard)) {
    for (const split of summary.splits) {
      const positions = summary.okPositions.get(split) ?? [];
      if (positions.length === 0) continue;
      const record = await assembleSplit(request, split, positions, summary.normalisation[split]);
      splitFiles.push(record);
      splitFile.set(split, record.path);
    }
  }

  const head: ManifestHead = {
    manifestFormat: 1,
    pliantVersion: request.pliantVersion,
    name: seed.scenario.name,
    description: seed.scenario.description,
    masterSeed: seed.masterSeed,
    episodeCount: seed.episodeCount,
    shard: shard ? { index: shard.index, count: shard.count } : null,
    export: {
      format: seed.export.format,
      dtype: seed.export.dtype,
      compression: seed.scenario.export.compression,
      levels: { ...COMPRESSION_LEVELS[seed.scenario.export.compression] },
    },
    splits: summary.counts,
    normalisation: summary.normalisation,
    scenario: seed.scenario,
  };
  const pictures = renderCardPictures({
    tally,
    heldOut: seed.scenario.splits.heldOut,
    splits: summary.splits,
    sheetEpisodes: contactSheetEpisodes(request, summary),
  });
  // A picture an earlier, interrupted finish wrote that this one does not would be unlisted.
  try {
    await rm(join(request.outDir, CARD_PICTURES_FOLDER), { recursive: true, force: true });
  } catch (error) {
    throw toDatasetWriteError(error, join(request.outDir, CARD_PICTURES_FOLDER));
  }
  const pictureRecords = pictures.map((p) => writeDatasetFile(request.outDir, p.path, p.text));
  const card = writeDatasetFile(request.outDir, CARD_FILE, renderDatasetCard({
    ...head,
    tally,
    episodeNpz: keepNpz && tally.ok > 0,
    splitFiles: splitFiles.map((f) => ({ path: f.path, split: f.split })),
    pictures: pictures.map((p) => ({ path: p.path, alt: p.alt })),
  }));
  const inputs: InputFileRecord[] = seed.inputs.map((i) => ({ path: i.path, sha256: i.sha256, sizeBytes: i.sizeBytes, kind: 'input', scenarioPath: i.scenarioPath }));
  const documents = [request.seedRecord, card, ...pictureRecords, ...inputs];
  const listedPaths = documents.map((d) => d.path);

  function* episodeRecords(): Generator<EpisodeRecord> {
    for (let p = 0; p < completions.count; p++) {
      const { record, npz } = completions.at(p);
      if (record.status !== 'ok') {
        yield { ...record, files: [] };
        continue;
      }
      const held = [...(keepNpz ? [npz!.path] : []), ...(splitFile.has(record.split) ? [splitFile.get(record.split)!] : [])];
      yield { ...record, files: held };
    }
  }
  function* fileRecords(): Generator<DataFileRecord | SplitFileRecord> {
    if (keepNpz) {
      for (let p = 0; p < completions.count; p++) {
        const c = completions.at(p);
        if (c.record.status !== 'ok') continue;
        listedPaths.push(c.npz!.path);
        yield { ...c.npz!, kind: 'episode-npz', split: c.record.split, episodes: [c.record.id], arrays: describedArrays(c.arrays, '') };
      }
    }
    for (const f of splitFiles) {
      listedPaths.push(f.path);
      yield f;
    }
  }
  // A first pass over the records for their digest, which is written right after them.
  const digest = new EpisodeRecordsDigest();
  for (const record of episodeRecords()) digest.add(record);
  // The members in the order JSON.stringify gave them when the manifest was one object.
  const manifest = {
    ...head,
    episodes: new StreamedList(episodeRecords),
    [EPISODE_RECORDS_DIGEST_MEMBER]: digest.hex(),
    files: new StreamedList(fileRecords),
    documents,
    run: request.run,
  };
  writeDatasetTextStreamed(request.outDir, MANIFEST_FILE, (emit) => {
    writeStreamedJson(manifest, emit);
    emit('\n');
  });
  try {
    await rm(join(request.outDir, WORK_FOLDER), { recursive: true, force: true });
  } catch (error) {
    throw toDatasetWriteError(error, join(request.outDir, WORK_FOLDER));
  }
  return { ok: tally.ok, rejected: tally.rejected, listedPaths, dataFileCount: listedPaths.length - documents.length };
}
