// Reads a seed file for the app: the scenario it regenerates (as text the scenario editor and the
// preview take), the Pliant version that wrote it, its episode count, and, when the manifest
// beside it was written from this very seed file, every file a regeneration must reproduce with
// its SHA-256. The seed file is checked exactly as `pliant reproduce` checks it.
import { readFile, stat } from 'node:fs/promises';
import { dirname } from 'node:path';

import { DatasetNotFoundError } from '../formats/dataset-not-found-error.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { sha256Hex } from '../formats/file-digest.ts';
import { SEED_FILE } from '../manifest/dataset-files.ts';
import { readFolderState } from '../manifest/dataset-folder-state.ts';
import { parseSeedFile } from '../manifest/seed-file.ts';

export interface SeedSummaryRead {
  path: string;
  /** The resolved scenario inside the seed file, as JSON text. */
  scenarioText: string;
  pliantVersion: string;
  episodeCount: number;
  /** Empty when no manifest beside the seed file records this seed file's checksum. */
  expectedFiles: { file: string; sha256: string }[];
}

/** A seed file holds one scenario (at most 1 MiB of text) and a little more; anything far larger is not one. */
export const MAX_SEED_BYTES = 16 * 1024 * 1024;

export async function readSeedSummary(seedPath: string): Promise<SeedSummaryRead> {
  const info = await stat(seedPath).catch(() => null);
  if (!info) throw new DatasetNotFoundError(`${seedPath} does not exist; open the ${SEED_FILE} inside a dataset folder`);
  if (!info.isFile()) throw new DatasetRequestError(`${seedPath} is a folder; open the ${SEED_FILE} inside it`);
  if (info.size > MAX_SEED_BYTES) throw new DatasetRequestError(`${seedPath} is ${info.size} bytes, far more than a seed file holds; open the ${SEED_FILE} a Pliant run wrote`);
  const bytes = await readFile(seedPath);
  const seed = parseSeedFile(bytes.toString('utf8'), seedPath);
  return {
    path: seedPath,
    scenarioText: `${JSON.stringify(seed.scenario, null, 2)}\n`,
    pliantVersion: seed.pliantVersion,
    episodeCount: seed.episodeCount,
    expectedFiles: await expectedFiles(seedPath, sha256Hex(bytes)),
  };
}

/**
 * The manifest's documents and data files, but only if that manifest lists this seed file with
 * these very bytes: a seed file copied elsewhere, or edited, promises nothing about the files
 * that happen to lie beside it.
 */
async function expectedFiles(seedPath: string, seedSha256: string): Promise<SeedSummaryRead['expectedFiles']> {
  const manifest = (await readFolderState(dirname(seedPath))).manifest;
  if (!manifest) return [];
  const recorded = manifest.documents.find((d) => d.path === SEED_FILE);
  if (!recorded || recorded.sha256 !== seedSha256) return [];
  return [...manifest.documents, ...manifest.files].map((f) => ({ file: f.path, sha256: f.sha256 }));
}
