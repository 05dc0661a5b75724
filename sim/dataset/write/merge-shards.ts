// Joins the shard folders of an array job into one dataset whose data files and checksums are
// those a single machine writes from the same seed file: the shards' NPZ files are copied
// unchanged (after checking their SHA-256), and the split HDF5 files, card and manifest are
// made by the same finishing step a single-machine run uses. The shards' manifests are read as
// streams and each episode is kept as a completion record on disk, as a generate run keeps it,
// so a merge's memory does not grow with the number of episodes.
import { readdir, rm, stat } from 'node:fs/promises';
import { hostname } from 'node:os';
import { join, resolve } from 'node:path';

import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { sha256Hex } from '../formats/file-digest.ts';
import { readFileBytes } from '../formats/read-file-bytes.ts';
import { readTextIfPresent } from '../formats/text-file.ts';
import { episodeDonePath, episodeId, episodeNpzPath, episodePartPath,LOCK_FILE, MANIFEST_FILE, SEED_FILE, WORK_FOLDER } from '../manifest/dataset-files.ts';
import type { EpisodeRecord, ManifestHead } from '../manifest/dataset-manifest.ts';
import type { EpisodeCompletion } from '../manifest/episode-completion.ts';
import { readCompletion, renderCompletion } from '../manifest/episode-completion.ts';
import type { ManifestEvent, StreamedFileRecord } from '../manifest/manifest-stream.ts';
import { readManifestHead, readManifestStream } from '../manifest/manifest-stream.ts';
import { parseSeedFile } from '../manifest/seed-file.ts';
import { checkFileRecord } from '../read/verify-dataset.ts';
import { ensureFolder, writeDatasetFile } from './dataset-file-writer.ts';
import { finishDataset, keepsEpisodeNpz } from './dataset-finish.ts';
import { lockFolder } from './folder-lock.ts';
import { folderOverlap } from './folder-overlap.ts';
import type { GenerationListener } from './generation-progress.ts';

export interface MergeRequest {
  shardDirs: string[];
  outDir: string;
  force: boolean;
  pliantVersion: string;
  onEvent?: GenerationListener;
}

interface Shard {
  dir: string;
  seedText: string;
  manifestPath: string;
  head: ManifestHead;
  run: Record<string, unknown>;
}

export interface MergeResult {
  ok: number;
  rejected: number;
  dataFileCount: number;
}

async function readShard(dir: string): Promise<Shard> {
  const info = await stat(dir).catch(() => null);
  if (!info) throw new DatasetRequestError(`${dir} does not exist; give the shard folders a \`pliant generate … --shard I/N\` run wrote`);
  if (!info.isDirectory()) throw new DatasetRequestError(`${dir} is a file; give the shard folder that holds ${MANIFEST_FILE}`);
  if (await stat(join(dir, WORK_FOLDER)).then((s) => s.isDirectory(), () => false)) {
    throw new DatasetRequestError(`${dir} is not finished (it still holds .pliant-work); resume that shard's run with --resume, then merge`);
  }
  const manifestPath = join(dir, MANIFEST_FILE);
  if (!(await stat(manifestPath).then(() => true, () => false))) throw new DatasetRequestError(`${dir} is not a finished Pliant shard: ${MANIFEST_FILE} is missing`);
  const { head, problems } = readManifestHead(manifestPath);
  if (!head) throw new DatasetRequestError(`${dir} is not a finished Pliant shard: ${problems[0]}`);
  const seedText = await readTextIfPresent(join(dir, SEED_FILE));
  if (seedText === null) throw new DatasetRequestError(`${dir} has no ${SEED_FILE}; it is not a Pliant shard`);
  if (!head.shard) throw new DatasetRequestError(`${dir} holds a whole dataset, not a shard; merge only folders written with --shard`);
  return { dir, seedText, manifestPath, head, run: {} };
}

/** The shard's manifest, every piece checked; a problem refuses the merge. */
function* shardEvents(shard: Shard): Generator<ManifestEvent> {
  for (const event of readManifestStream(shard.manifestPath)) {
    if (event.kind === 'problem') throw new DatasetRequestError(`${shard.dir} is not a usable shard: ${event.message}; run \`pliant verify ${shard.dir}\``);
    yield event;
  }
}

function* shardEpisodes(shard: Shard): Generator<EpisodeRecord> {
  for (const event of shardEvents(shard)) if (event.kind === 'episode') yield event.record;
}

function* shardNpzFiles(shard: Shard): Generator<StreamedFileRecord> {
  for (const event of shardEvents(shard)) if (event.kind === 'file' && event.record.kind === 'episode-npz') yield event.record;
}

async function ensureMergeTarget(outDir: string, force: boolean): Promise<void> {
  let entries: string[];
  try {
    if (!(await stat(outDir)).isDirectory()) throw new DatasetRequestError(`--out ${outDir} is a file, not a folder`);
    entries = (await readdir(outDir)).filter((name) => name !== LOCK_FILE);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw error;
    return;
  }
  if (entries.length === 0) return;
  if (!force) throw new DatasetRequestError(`--out ${outDir} is not empty; give an empty or new folder, or --force to replace what is there`);
  if (!entries.includes(SEED_FILE) && !entries.includes(MANIFEST_FILE) && !entries.includes(WORK_FOLDER)) {
    throw new DatasetRequestError(`--force: ${outDir} does not hold a Pliant dataset; refusing to delete it. Choose an empty or new --out folder`);
  }
  for (const name of entries) await rm(join(outDir, name), { recursive: true, force: true });
}

export async function mergeShards(request: MergeRequest): Promise<MergeResult> {
  const outDir = resolve(request.outDir);
  if (request.shardDirs.length === 0) throw new DatasetRequestError('give the shard folders to merge, e.g. `pliant merge shard-0 shard-1 --out all`');
  // Before anything is read or written: --force would delete an input that the output is, holds or lies in.
  for (const dir of request.shardDirs) {
    const overlap = folderOverlap(outDir, dir);
    if (overlap === null) continue;
    const how = overlap === 'same' ? 'is the shard folder' : overlap === 'inside' ? 'lies inside the shard folder' : 'contains the shard folder';
    throw new DatasetRequestError(`--out ${outDir} ${how} ${resolve(dir)} (after following links); merging there would overwrite the shard. Choose a new folder outside every shard`);
  }
  const shards: Shard[] = [];
  for (const dir of request.shardDirs) shards.push(await readShard(resolve(dir)));

  const first = shards[0];
  for (const s of shards.slice(1)) {
    if (s.seedText !== first.seedText) {
      throw new DatasetRequestError(`${s.dir}/${SEED_FILE} differs from ${first.dir}/${SEED_FILE}: the shards come from different seed files (or Pliant versions) and cannot be merged`);
    }
  }
  const count = first.head.shard!.count;
  const byIndex = new Map<number, Shard>();
  for (const s of shards) {
    const plan = s.head.shard!;
    if (plan.count !== count) throw new DatasetRequestError(`${s.dir} is shard ${plan.index}/${plan.count}, but ${first.dir} is one of ${count}; merge shards of one run`);
    if (byIndex.has(plan.index)) throw new DatasetRequestError(`shard ${plan.index}/${count} is given twice (${byIndex.get(plan.index)!.dir} and ${s.dir})`);
    byIndex.set(plan.index, s);
  }
  const missing = [...Array(count).keys()].filter((i) => !byIndex.has(i));
  if (missing.length > 0) throw new DatasetRequestError(`shard${missing.length === 1 ? '' : 's'} ${missing.map((i) => `${i}/${count}`).join(', ')} ${missing.length === 1 ? 'is' : 'are'} missing; give all ${count} shard folders`);
  const seed = parseSeedFile(first.seedText, join(first.dir, SEED_FILE));

  // Check every shard's files before writing anything (one pass over each manifest).
  for (const s of shards) {
    for (const event of shardEvents(s)) {
      const records = event.kind === 'file' ? [event.record] : event.kind === 'documents' ? event.documents : [];
      for (const record of records) {
        const problem = await checkFileRecord(s.dir, record);
        if (problem) throw new DatasetRequestError(`${s.dir}: ${problem}; run \`pliant verify ${s.dir}\` and regenerate that shard`);
      }
      if (event.kind === 'run') s.run = event.run;
    }
  }
  const outInfo = await stat(outDir).catch(() => null);
  if (outInfo && !outInfo.isDirectory()) throw new DatasetRequestError(`--out ${outDir} is a file, not a folder`);
  if (!outInfo) ensureFolder(outDir);
  // Locked before --force deletes anything, so a merge never deletes what another run is writing.
  const lock = lockFolder(outDir, 'pliant merge');
  try {
    await ensureMergeTarget(outDir, request.force);
    return await mergeLocked(request, outDir, shards, first, seed);
  } finally {
    lock.release();
  }
}

async function mergeLocked(request: MergeRequest, outDir: string, shards: Shard[], first: Shard, seed: ReturnType<typeof parseSeedFile>): Promise<MergeResult> {

  const seedRecord = writeDatasetFile(outDir, SEED_FILE, first.seedText);
  for (const input of seed.inputs) {
    const bytes = readFileBytes(join(first.dir, input.path));
    if (sha256Hex(bytes) !== input.sha256) throw new DatasetRequestError(`${join(first.dir, input.path)} does not match its SHA-256 in ${SEED_FILE}`);
    writeDatasetFile(outDir, input.path, bytes);
  }

  // Each episode becomes a completion record in the work folder, as in a generate run, and the
  // finishing step reads them back one at a time: a merge's memory does not grow with the sweep
  // beyond one byte per episode (which were seen).
  const keepNpz = keepsEpisodeNpz(seed.export.format, null);
  const seen = new Uint8Array(seed.episodeCount);
  for (const shard of shards) {
    const files = shardNpzFiles(shard);
    try {
      for (const episode of shardEpisodes(shard)) {
        if (!(episode.index < seed.episodeCount) || seen[episode.index]) throw new DatasetRequestError(`the shards do not hold episode ${episode.index} exactly once; regenerate the shards from one seed file`);
        seen[episode.index] = 1;
        // Spreading keeps the members in their order, so the merged manifest matches a single run's.
        const ordered = { ...episode, files: [] as string[] };
        let completion: EpisodeCompletion;
        if (episode.status !== 'ok') {
          completion = { record: ordered, arrays: [], npz: null };
        } else {
          // A shard lists its NPZ files in episode order, one per recorded episode.
          const next = files.next();
          const source = next.done ? null : next.value;
          if (!source || source.episodes?.length !== 1 || source.episodes[0] !== episode.id || !source.arrays) {
            throw new DatasetRequestError(`${shard.dir} lists episode ${episode.id} as ok but its NPZ file is not the next one its manifest lists; run \`pliant verify ${shard.dir}\` and regenerate that shard`);
          }
          const bytes = readFileBytes(join(shard.dir, source.path));
          const target = keepNpz ? episodeNpzPath(episode.id) : episodePartPath(episode.id);
          const npz = writeDatasetFile(outDir, target, bytes);
          completion = { record: ordered, arrays: source.arrays.map((a) => ({ name: a.name, dtype: a.dtype, shape: a.shape })), npz };
        }
        writeDatasetFile(outDir, episodeDonePath(episode.id), renderCompletion(completion));
      }
    } finally {
      files.return(undefined);
    }
  }
  const held = seen.reduce((sum, s) => sum + s, 0);
  if (held !== seed.episodeCount) throw new DatasetRequestError(`the shards hold ${held} episodes, but the sweep has ${seed.episodeCount}`);

  const finished = await finishDataset({
    outDir,
    seed,
    seedRecord,
    shard: null,
    completions: {
      count: seed.episodeCount,
      at: (position) => {
        const id = episodeId(position, seed.episodeCount);
        return readCompletion(outDir, episodeDonePath(id), id);
      },
    },
    pliantVersion: first.head.pliantVersion,
    run: { kind: 'merge', mergedAt: new Date().toISOString(), host: hostname(), mergedBy: request.pliantVersion, shards: shards.map((s) => ({ dir: s.dir, shard: s.head.shard, run: s.run })) },
    onEvent: request.onEvent,
  });
  return { ok: finished.ok, rejected: finished.rejected, dataFileCount: finished.dataFileCount };
}
