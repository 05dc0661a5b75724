// The last part of making a dataset folder, shared by `generate` and `merge`: once every episode
// has its NPZ file and completion record, assemble one HDF5 file per split (in episode-id order,
// so the bytes never depend on which episode finished first), then the card, then the manifest,
// and only then remove the work folder. Every step writes through a temporary name, and the
// whole step can be repeated after a crash and gives the same files.
import { rm } from 'node:fs/promises';
import { join } from 'node:path';
import type { DataFileRecord, DatasetManifest, EpisodeRecord, FileRecord, InputFileRecord } from './dataset-manifest.ts';
import type { EpisodeCompletion } from './episode-completion.ts';
import type { ArrayLayout } from './episode-outcome.ts';
import { describeArray } from './episode-array-catalogue.ts';
import { renderDatasetCard } from './dataset-card.ts';
import type { CardSource } from './dataset-card.ts';
import { CARD_FILE, MANIFEST_FILE, WORK_FOLDER, splitHdf5Path } from './dataset-files.ts';
import { writeDatasetFile } from './dataset-file-writer.ts';
import { decodeNpz } from './npz.ts';
import { writeSplitHdf5 } from './split-hdf5.ts';
import type { SplitEpisode } from './split-hdf5.ts';
import { sha256Hex } from './sha256.ts';
import type { SeedFile } from './seed-file.ts';
import type { ShardPlan } from './shard-plan.ts';
import type { GenerationListener } from './generation-progress.ts';
import { readFileBytes } from './read-file-bytes.ts';
import { toDatasetWriteError } from './dataset-write-error.ts';

export interface FinishRequest {
  outDir: string;
  seed: SeedFile;
  /** seed.json as written in the folder. */
  seedRecord: FileRecord;
  shard: ShardPlan | null;
  /** One per episode of the folder, ascending by index. */
  completions: EpisodeCompletion[];
  pliantVersion: string;
  run: Record<string, unknown>;
  onEvent?: GenerationListener;
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

async function assembleSplit(request: FinishRequest, split: string, members: EpisodeCompletion[]): Promise<DataFileRecord> {
  const path = splitHdf5Path(split);
  request.onEvent?.({ type: 'assemble', file: path });
  const episodes: SplitEpisode[] = members.map((completion) => {
    const npzPath = join(request.outDir, completion.npz!.path);
    return { id: completion.record.id, index: completion.record.index, arrays: decodeNpz(readFileBytes(npzPath), npzPath) };
  });
  const absolute = join(request.outDir, path);
  await writeSplitHdf5(absolute, { datasetName: request.seed.scenario.name, split, masterSeed: request.seed.masterSeed }, episodes);
  const bytes = readFileBytes(absolute);
  return {
    path,
    sha256: sha256Hex(bytes),
    sizeBytes: bytes.length,
    kind: 'split-hdf5',
    split,
    episodes: members.map((m) => m.record.id),
    arrays: members.flatMap((m) => describedArrays(m.arrays, `${m.record.id}/`)),
  };
}

export async function finishDataset(request: FinishRequest): Promise<DatasetManifest> {
  const { seed, shard, completions } = request;
  const format = seed.export.format;
  const keepNpz = keepsEpisodeNpz(format, shard);
  const ok = completions.filter((c) => c.record.status === 'ok');
  const splits = orderedSplits(seed, completions.map((c) => c.record.split));

  const files: DataFileRecord[] = [];
  if (keepNpz) {
    for (const c of ok) {
      files.push({ ...c.npz!, kind: 'episode-npz', split: c.record.split, episodes: [c.record.id], arrays: describedArrays(c.arrays, '') });
    }
  }
  const splitFile = new Map<string, string>();
  if (writesSplitHdf5(format, shard)) {
    for (const split of splits) {
      const members = ok.filter((c) => c.record.split === split);
      if (members.length === 0) continue;
      const record = await assembleSplit(request, split, members);
      files.push(record);
      splitFile.set(split, record.path);
    }
  }

  const episodes: EpisodeRecord[] = completions.map((c) => {
    if (c.record.status !== 'ok') return { ...c.record, files: [] };
    const held = [...(keepNpz ? [c.npz!.path] : []), ...(splitFile.has(c.record.split) ? [splitFile.get(c.record.split)!] : [])];
    return { ...c.record, files: held };
  });
  const splitCounts: DatasetManifest['splits'] = {};
  for (const split of splits) {
    const members = completions.filter((c) => c.record.split === split);
    splitCounts[split] = { ok: members.filter((m) => m.record.status === 'ok').length, rejected: members.filter((m) => m.record.status === 'rejected').length };
  }

  const source: CardSource = {
    manifestFormat: 1,
    pliantVersion: request.pliantVersion,
    name: seed.scenario.name,
    description: seed.scenario.description,
    masterSeed: seed.masterSeed,
    episodeCount: seed.episodeCount,
    shard: shard ? { index: shard.index, count: shard.count } : null,
    export: { format: seed.export.format, dtype: seed.export.dtype },
    splits: splitCounts,
    scenario: seed.scenario,
    episodes,
    files,
  };
  const card = writeDatasetFile(request.outDir, CARD_FILE, renderDatasetCard(source));
  const inputs: InputFileRecord[] = seed.inputs.map((i) => ({ path: i.path, sha256: i.sha256, sizeBytes: i.sizeBytes, kind: 'input', scenarioPath: i.scenarioPath }));
  const manifest: DatasetManifest = { ...source, documents: [request.seedRecord, card, ...inputs], run: request.run };
  writeDatasetFile(request.outDir, MANIFEST_FILE, `${JSON.stringify(manifest, null, 2)}\n`);
  try {
    await rm(join(request.outDir, WORK_FOLDER), { recursive: true, force: true });
  } catch (error) {
    throw toDatasetWriteError(error, join(request.outDir, WORK_FOLDER));
  }
  return manifest;
}

