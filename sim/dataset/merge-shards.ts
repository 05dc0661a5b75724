// Joins the shard folders of an array job into one dataset whose data files and checksums are
// those a single machine writes from the same seed file: the shards' NPZ files are copied
// unchanged (after checking their SHA-256), and the split HDF5 files, card and manifest are
// made by the same finishing step a single-machine run uses. Unlike `generate`, a merge holds
// every shard's manifest (and so every episode record) in memory while it works.
import { readdir, rm, stat } from 'node:fs/promises';
import { hostname } from 'node:os';
import { join, resolve } from 'node:path';
import { readFolderState } from './dataset-folder-state.ts';
import type { FolderState } from './dataset-folder-state.ts';
import { DatasetRequestError } from './dataset-request-error.ts';
import { readFileBytes } from './read-file-bytes.ts';
import { parseSeedFile } from './seed-file.ts';
import { MANIFEST_FILE, SEED_FILE, episodeNpzPath, episodePartPath } from './dataset-files.ts';
import type { DatasetManifest } from './dataset-manifest.ts';
import type { EpisodeCompletion } from './episode-completion.ts';
import { completionsInMemory, finishDataset, keepsEpisodeNpz } from './dataset-finish.ts';
import { writeDatasetFile } from './dataset-file-writer.ts';
import { checkFileRecord } from './verify-dataset.ts';
import { sha256Hex } from './sha256.ts';
import type { GenerationListener } from './generation-progress.ts';

export interface MergeRequest {
  shardDirs: string[];
  outDir: string;
  force: boolean;
  pliantVersion: string;
  onEvent?: GenerationListener;
}

interface Shard {
  state: FolderState;
  manifest: DatasetManifest;
}

async function readShard(dir: string): Promise<Shard> {
  const state = await readFolderState(dir);
  if (state.inProgress) throw new DatasetRequestError(`${dir} is not finished (it still holds .pliant-work); resume that shard's run with --resume, then merge`);
  if (!state.manifest) throw new DatasetRequestError(`${dir} is not a finished Pliant shard: ${state.manifestProblems[0]}`);
  if (state.seedText === null) throw new DatasetRequestError(`${dir} has no ${SEED_FILE}; it is not a Pliant shard`);
  if (!state.manifest.shard) throw new DatasetRequestError(`${dir} holds a whole dataset, not a shard; merge only folders written with --shard`);
  return { state, manifest: state.manifest };
}

async function ensureMergeTarget(outDir: string, force: boolean): Promise<void> {
  let entries: string[];
  try {
    if (!(await stat(outDir)).isDirectory()) throw new DatasetRequestError(`--out ${outDir} is a file, not a folder`);
    entries = await readdir(outDir);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw error;
    return;
  }
  if (entries.length === 0) return;
  if (!force) throw new DatasetRequestError(`--out ${outDir} is not empty; give an empty or new folder, or --force to replace what is there`);
  const state = await readFolderState(outDir);
  if (state.seedText === null && state.manifestText === null && !state.inProgress) {
    throw new DatasetRequestError(`--force: ${outDir} does not hold a Pliant dataset; refusing to delete it. Choose an empty or new --out folder`);
  }
  for (const name of entries) await rm(join(outDir, name), { recursive: true, force: true });
}

export async function mergeShards(request: MergeRequest): Promise<DatasetManifest> {
  const outDir = resolve(request.outDir);
  if (request.shardDirs.length === 0) throw new DatasetRequestError('give the shard folders to merge, e.g. `pliant merge shard-0 shard-1 --out all`');
  const shards: Shard[] = [];
  for (const dir of request.shardDirs) shards.push(await readShard(resolve(dir)));

  const first = shards[0];
  for (const s of shards.slice(1)) {
    if (s.state.seedText !== first.state.seedText) {
      throw new DatasetRequestError(`${s.state.dir}/${SEED_FILE} differs from ${first.state.dir}/${SEED_FILE}: the shards come from different seed files (or Pliant versions) and cannot be merged`);
    }
  }
  const count = first.manifest.shard!.count;
  const byIndex = new Map<number, Shard>();
  for (const s of shards) {
    const plan = s.manifest.shard!;
    if (plan.count !== count) throw new DatasetRequestError(`${s.state.dir} is shard ${plan.index}/${plan.count}, but ${first.state.dir} is one of ${count}; merge shards of one run`);
    if (byIndex.has(plan.index)) throw new DatasetRequestError(`shard ${plan.index}/${count} is given twice (${byIndex.get(plan.index)!.state.dir} and ${s.state.dir})`);
    byIndex.set(plan.index, s);
  }
  const missing = [...Array(count).keys()].filter((i) => !byIndex.has(i));
  if (missing.length > 0) throw new DatasetRequestError(`shard${missing.length === 1 ? '' : 's'} ${missing.map((i) => `${i}/${count}`).join(', ')} ${missing.length === 1 ? 'is' : 'are'} missing; give all ${count} shard folders`);
  const seed = parseSeedFile(first.state.seedText!, join(first.state.dir, SEED_FILE));

  // Check every shard's files before writing anything.
  for (const s of shards) {
    for (const record of [...s.manifest.documents, ...s.manifest.files]) {
      const problem = await checkFileRecord(s.state.dir, record);
      if (problem) throw new DatasetRequestError(`${s.state.dir}: ${problem}; run \`pliant verify ${s.state.dir}\` and regenerate that shard`);
    }
  }
  await ensureMergeTarget(outDir, request.force);

  const seedRecord = writeDatasetFile(outDir, SEED_FILE, first.state.seedText!);
  for (const input of seed.inputs) {
    const bytes = readFileBytes(join(first.state.dir, input.path));
    if (sha256Hex(bytes) !== input.sha256) throw new DatasetRequestError(`${join(first.state.dir, input.path)} does not match its SHA-256 in ${SEED_FILE}`);
    writeDatasetFile(outDir, input.path, bytes);
  }

  const keepNpz = keepsEpisodeNpz(seed.export.format, null);
  const completions: EpisodeCompletion[] = [];
  const records = shards.flatMap((s) => s.manifest.episodes.map((e) => ({ shard: s, episode: e })));
  records.sort((a, b) => a.episode.index - b.episode.index);
  for (const [position, { shard, episode }] of records.entries()) {
    if (episode.index !== position) throw new DatasetRequestError(`the shards do not hold episode ${position} exactly once; regenerate the shards from one seed file`);
    // Spreading keeps the members in their order, so the merged manifest matches a single run's.
    const ordered = { ...episode, files: [] as string[] };
    if (episode.status !== 'ok') {
      completions.push({ record: ordered, arrays: [], npz: null });
      continue;
    }
    const source = shard.manifest.files.find((f) => f.kind === 'episode-npz' && f.episodes.includes(episode.id));
    if (!source) throw new DatasetRequestError(`${shard.state.dir} lists episode ${episode.id} as ok but has no NPZ file for it`);
    const bytes = readFileBytes(join(shard.state.dir, source.path));
    const target = keepNpz ? episodeNpzPath(episode.id) : episodePartPath(episode.id);
    const npz = writeDatasetFile(outDir, target, bytes);
    completions.push({ record: ordered, arrays: source.arrays.map((a) => ({ name: a.name, dtype: a.dtype, shape: a.shape })), npz });
  }
  if (completions.length !== seed.episodeCount) throw new DatasetRequestError(`the shards hold ${completions.length} episodes, but the sweep has ${seed.episodeCount}`);

  await finishDataset({
    outDir,
    seed,
    seedRecord,
    shard: null,
    completions: completionsInMemory(completions),
    pliantVersion: first.manifest.pliantVersion,
    run: { kind: 'merge', mergedAt: new Date().toISOString(), host: hostname(), mergedBy: request.pliantVersion, shards: shards.map((s) => ({ dir: s.state.dir, shard: s.manifest.shard, run: s.manifest.run })) },
    onEvent: request.onEvent,
  });
  return JSON.parse(new TextDecoder().decode(readFileBytes(join(outDir, MANIFEST_FILE)))) as DatasetManifest;
}
