// Makes (or finishes) a dataset folder from a checked scenario: every episode of this shard is
// computed, written as an NPZ file under a temporary name and renamed, and only then marked done
// in .pliant-work/done/. A run killed at any moment leaves a folder that `resume` completes to
// exactly the bytes an uninterrupted run writes. See LAYOUT.md for the folder and the policies.
// While it runs it keeps only which episodes are done; their records stay on disk until the
// finishing step reads them back one at a time, so memory does not grow with the sweep.
import { readdirSync, rmSync } from 'node:fs';
import { readdir, rm, stat } from 'node:fs/promises';
import { hostname } from 'node:os';
import { join, resolve } from 'node:path';

import type { Scenario } from '../../scenario/scenario-types.ts';
import { isTemporaryName } from '../formats/atomic-file.ts';
import { containedPathSync } from '../formats/contained-path.ts';
import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { toDatasetWriteError } from '../formats/dataset-write-error.ts';
import { say } from '../formats/run-words.ts';
import { readTextIfPresent } from '../formats/text-file.ts';
import {
  CARD_FILE,
  CARD_PICTURES_FOLDER,
  episodeDonePath,
  episodeId,
  episodeNpzPath,
  episodePartPath,
  EPISODES_FOLDER,
  INPUTS_FOLDER,
  LOCK_FILE,
  MANIFEST_FILE,
  SEED_FILE,
  WORK_DONE_FOLDER,
  WORK_FOLDER,
  WORK_PARTS_FOLDER,
  WORK_PLAN_FILE,
} from '../manifest/dataset-files.ts';
import { isUsableSplitName } from '../manifest/dataset-files.ts';
import type { EpisodeCompletion } from '../manifest/episode-completion.ts';
import { readCompletion, readTrustedCompletion, renderCompletion } from '../manifest/episode-completion.ts';
import { readManifestHead, readManifestStream } from '../manifest/manifest-stream.ts';
import { makeSeedFile, renderSeedFile } from '../manifest/seed-file.ts';
import { ensureFolder, writeDatasetFile } from './dataset-file-writer.ts';
import { finishDataset, keepsEpisodeNpz } from './dataset-finish.ts';
import type { InputSource } from './dataset-inputs.ts';
import { gatherInputs } from './dataset-inputs.ts';
import type { EpisodeOutcome } from './episode-outcome.ts';
import { computeEpisodes } from './episode-pool.ts';
import { lockFolder } from './folder-lock.ts';
import type { GenerationListener } from './generation-progress.ts';
import { rejectedEpisodeLimit, RejectionLimitError, rejectionLimitMessage } from './rejection-limit.ts';
import type { ShardPlan } from './shard-plan.ts';
import { planShard, shardEpisodes } from './shard-plan.ts';

export interface GenerateRequest {
  /** Checked scenario, with command-line overrides already applied. */
  scenario: Scenario;
  inputs: InputSource;
  outDir: string;
  /** null for the whole sweep; a count of 1 is the same. */
  shard: ShardPlan | null;
  workers: number;
  resume: boolean;
  force: boolean;
  pliantVersion: string;
  onEvent?: GenerationListener;
  /** Checked between episodes; a stopped run can be resumed. */
  shouldStop?: () => boolean;
  /** Extra facts for the manifest's `run` member (e.g. the command line). */
  runInfo?: Record<string, unknown>;
}

export interface GenerateResult {
  status: 'complete' | 'stopped' | 'already-complete';
  outDir: string;
  ok: number;
  rejected: number;
  /** Paths of the documents and data files the manifest lists; null when the run stopped early or the folder was already complete. */
  listedPaths: string[] | null;
}

interface WorkPlan {
  shard: ShardPlan | null;
}

/** The entries a Pliant dataset folder may hold at its top level; --force removes only these. */
const OWN_TOP_LEVEL = new Set([SEED_FILE, MANIFEST_FILE, CARD_FILE, CARD_PICTURES_FOLDER, EPISODES_FOLDER, INPUTS_FOLDER, WORK_FOLDER]);

function isOwnEntry(name: string): boolean {
  return OWN_TOP_LEVEL.has(name) || name.endsWith('.h5') || isTemporaryName(name);
}

async function folderEntries(path: string): Promise<string[] | null> {
  let info;
  try {
    info = await stat(path);
  } catch {
    return null;
  }
  if (!info.isDirectory()) throw new DatasetRequestError(`${say('out')} ${path} is a file, not a folder; choose a folder name`);
  return readdir(path);
}

/** The shard a finished folder's manifest records; its head is read, never the whole file. */
function manifestShard(manifestPath: string): ShardPlan | null {
  const { head, problems } = readManifestHead(manifestPath);
  if (!head) throw new DatasetRequestError(`${say('resume:')} ${problems[0] ?? `${manifestPath} has no head`}; ${say('start-over')}, or ${say('other-out')}`);
  return head.shard;
}

/** The shard the run plan of an interrupted run records; a damaged plan is reported, naming the file. */
function recordedPlanShard(planText: string, planPath: string): ShardPlan | null {
  let parsed: unknown;
  try {
    parsed = JSON.parse(planText);
  } catch (error) {
    throw new DatasetReadError(planPath, '', `the run plan is not valid JSON (${error instanceof Error ? error.message : String(error)})`, `delete it and resume again (the run writes it anew), or ${say('start-over')}`);
  }
  const shard = planShard(parsed);
  if (typeof shard === 'string') {
    throw new DatasetReadError(planPath, '', `the run plan is not one Pliant writes: ${shard}`, `delete it and resume again (the run writes it anew), or ${say('start-over')}`);
  }
  return shard;
}

function samePlan(a: ShardPlan | null, b: ShardPlan | null): boolean {
  return (a?.index ?? null) === (b?.index ?? null) && (a?.count ?? null) === (b?.count ?? null);
}

function describeShard(shard: ShardPlan | null): string {
  return shard ? `shard ${shard.index}/${shard.count}` : 'the whole sweep';
}

/** Normalises "shard 0 of 1" to the whole sweep, so both spellings make the same folder. */
function effectiveShard(shard: ShardPlan | null): ShardPlan | null {
  return shard && shard.count > 1 ? shard : null;
}

/** Deletes the hidden temporary files of writes a killed run left half done. */
function removeTemporaryFiles(outDir: string): void {
  const folders = ['', CARD_PICTURES_FOLDER, EPISODES_FOLDER, INPUTS_FOLDER, WORK_FOLDER, WORK_DONE_FOLDER, WORK_PARTS_FOLDER];
  // Every folder first, so a link leading out of the dataset is refused before anything is deleted or read.
  for (const folder of folders) containedPathSync(outDir, folder);
  for (const folder of folders) {
    let names: string[];
    try {
      names = readdirSync(join(outDir, folder));
    } catch {
      continue;
    }
    for (const name of names) {
      if (!isTemporaryName(name)) continue;
      try {
        rmSync(join(outDir, folder, name), { force: true });
      } catch (error) {
        throw toDatasetWriteError(error, join(outDir, folder, name));
      }
    }
  }
}

export async function generateDataset(request: GenerateRequest): Promise<GenerateResult> {
  const scenario = request.scenario;
  const outDir = resolve(request.outDir);
  const shard = effectiveShard(request.shard);
  const startedAt = new Date().toISOString();

  // Everything that can be refused is checked before the folder is touched.
  if (!Number.isInteger(request.workers) || request.workers < 1) throw new DatasetRequestError(`${say('workers')} ${request.workers} must be a whole number of at least 1`);
  const inputs = await gatherInputs(scenario, request.inputs);
  const seed = makeSeedFile(scenario, inputs.seedInputs, request.pliantVersion);
  const seedText = renderSeedFile(seed);
  if ((await folderEntries(outDir)) === null) ensureFolder(outDir);
  // Held until the run ends, however it ends: two runs writing one folder would rename files over each other.
  const command = request.runInfo?.command;
  const lock = lockFolder(outDir, Array.isArray(command) ? command.slice(0, 2).join(' ') : 'a Pliant run');
  try {
    return await generateLocked(request, outDir, shard, startedAt, inputs, seed, seedText);
  } finally {
    lock.release();
  }
}

async function generateLocked(
  request: GenerateRequest,
  outDir: string,
  shard: ShardPlan | null,
  startedAt: string,
  inputs: Awaited<ReturnType<typeof gatherInputs>>,
  seed: ReturnType<typeof makeSeedFile>,
  seedText: string,
): Promise<GenerateResult> {
  const scenario = request.scenario;
  const entries = (await folderEntries(outDir))!.filter((name) => name !== LOCK_FILE);
  let resuming = false;
  if (entries !== null && entries.length > 0) {
    if (request.resume) {
      const existing = await readTextIfPresent(containedPathSync(outDir, SEED_FILE));
      // seed.json is the first thing a run writes; without it only a run killed at its very
      // start can have left Pliant's own entries, and starting afresh finishes that.
      if (existing === null && entries.some((name) => !isOwnEntry(name))) {
        throw new DatasetRequestError(`${say('resume:')} ${outDir} is not empty and has no ${SEED_FILE}, so it is not a Pliant dataset; ${say('other-out')}`);
      }
      if (existing !== null && existing !== seedText) {
        throw new DatasetRequestError(`${say('resume:')} ${join(outDir, SEED_FILE)} describes a different dataset (other scenario, overrides or Pliant version); resume with the same scenario and settings, or ${say('start-over')}`);
      }
      const planText = await readTextIfPresent(containedPathSync(outDir, WORK_PLAN_FILE));
      // The manifest is read as a stream: a finished folder's may be larger than any string.
      const manifestPath = containedPathSync(outDir, MANIFEST_FILE);
      const manifestThere = entries.includes(MANIFEST_FILE);
      const recorded: ShardPlan | null | undefined = planText !== null
        ? recordedPlanShard(planText, join(outDir, WORK_PLAN_FILE))
        : manifestThere ? manifestShard(manifestPath) : undefined;
      if (recorded !== undefined && !samePlan(recorded, shard)) {
        throw new DatasetRequestError(`${say('resume:')} ${outDir} holds ${describeShard(recorded)}, but this run asks for ${describeShard(shard)}; ${say('same-shard')}`);
      }
      if (manifestThere && planText === null && !entries.includes(WORK_FOLDER)) {
        let ok = 0;
        let listed = 0;
        for (const event of readManifestStream(manifestPath)) {
          if (event.kind !== 'episode') continue;
          listed++;
          if (event.record.status === 'ok') ok++;
        }
        return { status: 'already-complete', outDir, ok, rejected: listed - ok, listedPaths: null };
      }
      resuming = true;
    } else if (request.force) {
      const foreign = entries.filter((name) => !isOwnEntry(name));
      if (foreign.length > 0) {
        throw new DatasetRequestError(`${say('force:')} ${outDir} holds files that Pliant did not write (${foreign.slice(0, 3).join(', ')}${foreign.length > 3 ? ', …' : ''}); ${say('other-out')}`);
      }
      for (const name of entries) {
        try {
          await rm(join(outDir, name), { recursive: true, force: true });
        } catch (error) {
          throw toDatasetWriteError(error, join(outDir, name));
        }
      }
    } else {
      throw new DatasetRequestError(`${say('out')} ${outDir} is not empty; ${say('resume-or-replace')}`);
    }
  }
  for (const r of scenario.splits.heldOut) {
    if (!isUsableSplitName(r.split)) throw new DatasetRequestError(`split name "${r.split}" cannot be a file name; use letters, digits, '-' and '_'`);
  }

  ensureFolder(outDir);
  if (resuming) removeTemporaryFiles(outDir);
  const seedRecord = writeDatasetFile(outDir, SEED_FILE, seedText);
  for (const copy of inputs.copies) writeDatasetFile(outDir, copy.path, copy.bytes);
  writeDatasetFile(outDir, WORK_PLAN_FILE, `${JSON.stringify({ shard } satisfies WorkPlan)}\n`);

  const indices = shardEpisodes(shard ?? { index: 0, count: 1 }, scenario.episodes);
  const keepNpz = keepsEpisodeNpz(scenario.export.format, shard);
  // Indices whose completion record is on disk; the records themselves are read back at the end.
  const done = new Set<number>();
  let rejected = 0;
  if (resuming) {
    for (const index of indices) {
      const id = episodeId(index, scenario.episodes);
      const trusted = await readTrustedCompletion(outDir, episodeDonePath(id), id);
      if (!trusted) continue;
      done.add(index);
      if (trusted.record.status === 'rejected') rejected++;
    }
  }
  const todo = indices.filter((i) => !done.has(i));
  // More rejections than this and the run stops: the sweep could no longer meet the limit.
  const rejectedLimit = rejectedEpisodeLimit(scenario, indices.length);
  const overLimit = (): boolean => rejected > rejectedLimit;
  request.onEvent?.({ type: 'start', total: indices.length, alreadyDone: done.size, workers: request.workers, outDir });

  const write = async (outcome: EpisodeOutcome): Promise<void> => {
    const id = outcome.record.id;
    let npz = null;
    if (outcome.npz) npz = writeDatasetFile(outDir, keepNpz ? episodeNpzPath(id) : episodePartPath(id), outcome.npz);
    const completion: EpisodeCompletion = { record: outcome.record, arrays: outcome.arrays, npz };
    // The completion record goes last: it claims the file above is whole.
    writeDatasetFile(outDir, episodeDonePath(id), renderCompletion(completion));
    done.add(outcome.record.index);
    if (outcome.record.status === 'rejected') rejected++;
    request.onEvent?.({
      type: 'episode',
      id,
      index: outcome.record.index,
      status: outcome.record.status,
      done: done.size,
      total: indices.length,
      rejected,
      ...(outcome.record.rejection ? { reason: outcome.record.rejection.message } : {}),
    });
  };
  const shouldStop = (): boolean => overLimit() || (request.shouldStop?.() ?? false);
  if (!overLimit()) await computeEpisodes({ scenario, dtype: scenario.export.dtype, replay: inputs.table, workers: request.workers, indices: todo, onOutcome: write, shouldStop });
  if (overLimit()) {
    const finishedSoFar = indices.filter((i) => done.has(i)).map((index) => {
      const id = episodeId(index, scenario.episodes);
      const record = readCompletion(outDir, episodeDonePath(id), id).record;
      return { labels: record.labels, rejected: record.status === 'rejected' };
    });
    throw new RejectionLimitError(rejectionLimitMessage(scenario, indices.length, finishedSoFar, outDir));
  }
  if (done.size < indices.length) {
    return { status: 'stopped', outDir, ok: done.size - rejected, rejected, listedPaths: null };
  }

  const finished = await finishDataset({
    outDir,
    seed,
    seedRecord,
    shard,
    completions: {
      count: indices.length,
      at: (position) => {
        const id = episodeId(indices[position], scenario.episodes);
        return readCompletion(outDir, episodeDonePath(id), id);
      },
    },
    pliantVersion: request.pliantVersion,
    run: {
      kind: 'generate',
      startedAt,
      finishedAt: new Date().toISOString(),
      host: hostname(),
      platform: `${process.platform}-${process.arch}`,
      node: process.version,
      workers: request.workers,
      resumed: resuming,
      ...request.runInfo,
    },
    onEvent: request.onEvent,
  });
  request.onEvent?.({ type: 'finish', total: indices.length, ok: finished.ok, rejected: finished.rejected, outDir });
  return { status: 'complete', outDir, ok: finished.ok, rejected: finished.rejected, listedPaths: finished.listedPaths };
}

