// The record a run leaves for each finished episode in .pliant-work/done/: its manifest record,
// the layout of its arrays and the checksum of its NPZ file. It is written only after the
// episode's file is complete under its final name, so a run killed at any moment knows exactly
// which episodes it can keep; `--resume` trusts a record only if the file still matches it.
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { EpisodeRecord, FileRecord } from './dataset-manifest.ts';
import type { ArrayLayout } from './episode-outcome.ts';
import { sha256Hex } from './sha256.ts';

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
  let completion: EpisodeCompletion;
  try {
    completion = JSON.parse(Buffer.from(text).toString('utf8')) as EpisodeCompletion;
  } catch {
    return null;
  }
  if (completion?.record?.id !== expectedId) return null;
  if (completion.record.status === 'rejected') return completion.npz === null ? completion : null;
  if (!completion.npz) return null;
  const bytes = await readIfPresent(join(outDir, completion.npz.path));
  if (bytes === null || bytes.length !== completion.npz.sizeBytes || sha256Hex(bytes) !== completion.npz.sha256) return null;
  return completion;
}
