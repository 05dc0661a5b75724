// The record a run leaves for each finished episode in .pliant-work/done/: its manifest record,
// the layout of its arrays and the checksum of its NPZ file. It is written only after the
// episode's file is complete under its final name, so a run killed at any moment knows exactly
// which episodes it can keep; `--resume` trusts a record only if the file still matches it.
// The finishing step reads the records back from here one at a time rather than keeping every
// episode's record (and its labels) in memory for the whole run.
import { readFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';

import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { digestFile } from '../formats/file-digest.ts';
import { systemErrorCode } from '../formats/read-file-bytes.ts';
import { say } from '../formats/run-words.ts';
import { asCompletion, completionProblem } from './completion-check.ts';
import type { ArrayLayout, EpisodeRecord, FileRecord } from './dataset-manifest.ts';

export interface EpisodeCompletion {
  record: EpisodeRecord;
  arrays: ArrayLayout[];
  /** The episode's NPZ file (in episodes/ or among the work parts); null when rejected. */
  npz: FileRecord | null;
}

export function renderCompletion(completion: EpisodeCompletion): string {
  return `${JSON.stringify(completion)}\n`;
}

async function readIfPresent(path: string): Promise<Uint8Array | null> {
  try {
    return await readFile(path);
  } catch {
    return null;
  }
}

/**
 * The completion at `path` if it is whole, names the expected episode and its NPZ file is
 * still there with the recorded checksum; otherwise null (the episode is computed again).
 */
export async function readTrustedCompletion(outDir: string, path: string, expectedId: string): Promise<EpisodeCompletion | null> {
  const text = await readIfPresent(join(outDir, path));
  if (text === null) return null;
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(text).toString('utf8'));
  } catch {
    return null;
  }
  // A record of the wrong shape is not trusted: that episode is computed again.
  const completion = asCompletion(parsed, expectedId);
  if (completion === null) return null;
  if (completion.record.status === 'rejected') return completion;
  if (!completion.npz) return null;
  const digest = await digestFile(join(outDir, completion.npz.path));
  if (digest.kind !== 'hashed' || digest.sizeBytes !== completion.npz.sizeBytes || digest.sha256 !== completion.npz.sha256) return null;
  return completion;
}

/**
 * The completion record at `path` (relative to `outDir`) of an episode this run already
 * trusts, read back for the finishing step. A record that vanished or was damaged since is
 * reported with the way out: run again with --resume, which recomputes that episode.
 */
export function readCompletion(outDir: string, path: string, expectedId: string): EpisodeCompletion {
  const absolute = join(outDir, path);
  let text: string;
  try {
    text = readFileSync(absolute, 'utf8');
  } catch (error) {
    throw new DatasetReadError(absolute, '', `the completion record of episode ${expectedId} cannot be read (${systemErrorCode(error)})`, `${say('run-again-resuming')} to recompute that episode`);
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (error) {
    throw new DatasetReadError(absolute, '', `the completion record of episode ${expectedId} is not valid JSON (${error instanceof Error ? error.message : String(error)})`, `${say('run-again-resuming')} to recompute that episode`);
  }
  const problem = completionProblem(parsed, expectedId);
  if (problem !== null) {
    throw new DatasetReadError(absolute, '', `the completion record of episode ${expectedId} is not one Pliant writes: ${problem}`, `${say('run-again-resuming')} to recompute that episode`);
  }
  return parsed as EpisodeCompletion;
}
