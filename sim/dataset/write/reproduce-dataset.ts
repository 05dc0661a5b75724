// Regenerates a dataset from its seed.json into a new folder and compares the two file by file
// (bytes, by SHA-256): the proof that a dataset is what its seed file says it is.
import { stat } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';

import { MiB, readBoundedText } from '../formats/bounded-text-file.ts';
import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { sha256Hex } from '../formats/file-digest.ts';
import { MANIFEST_FILE, SEED_FILE } from '../manifest/dataset-files.ts';
import { readManifestHead, readManifestStream } from '../manifest/manifest-stream.ts';
import { parseSeedFile } from '../manifest/seed-file.ts';
import type { FileComparison } from '../read/dataset-comparison.ts';
import { compareDatasetFolders } from '../read/dataset-comparison.ts';
import type { GenerateResult } from './generate-dataset.ts';
import { generateDataset } from './generate-dataset.ts';
import type { GenerationListener } from './generation-progress.ts';

/** A seed file holds the resolved scenario and the run's settings, never the episodes. */
const MAX_SEED_FILE_BYTES = 64 * MiB;

export interface ReproduceRequest {
  seedPath: string;
  outDir: string;
  workers: number;
  force: boolean;
  pliantVersion: string;
  onEvent?: GenerationListener;
  shouldStop?: () => boolean;
}

export interface ReproduceReport {
  generated: GenerateResult;
  /** Pliant version that wrote the seed file; bytes may differ when it is not this one. */
  seedVersion: string;
  /** The folder comparison (read/dataset-comparison.ts) of the original and the regenerated folder. */
  comparisons: FileComparison[];
  identical: boolean;
  /**
   * The seed file against the SHA-256 the original manifest recorded for it: `matches` is null
   * when there is no original manifest (or it lists no seed file) to check against.
   */
  seedFile: { sha256: string; recordedSha256: string | null; matches: boolean | null };
}

/** Why a reproduction cannot match when the seed file was edited, and what to do. */
export function seedEditedWords(seedFile: ReproduceReport['seedFile']): string {
  return `seed.json does not match the SHA-256 the dataset's manifest.json recorded for it (recorded ${seedFile.recordedSha256!.slice(0, 12)}…, now ${seedFile.sha256.slice(0, 12)}…): it was edited after the run, so the regeneration follows the edited recipe and cannot reproduce the dataset; restore the seed.json the run wrote to reproduce it`;
}

/** The SHA-256 the manifest's documents record for seed.json, or null. */
function recordedSeedDigest(manifestPath: string): string | null {
  try {
    for (const event of readManifestStream(manifestPath)) {
      if (event.kind !== 'documents') continue;
      return event.documents.find((d) => d.path === SEED_FILE)?.sha256 ?? null;
    }
  } catch (error) {
    // A damaged original manifest is reported by the comparison, not here.
    if (!(error instanceof DatasetReadError)) throw error;
  }
  return null;
}

export async function reproduceDataset(request: ReproduceRequest): Promise<ReproduceReport> {
  const seedPath = resolve(request.seedPath);
  let seedText: string;
  try {
    seedText = readBoundedText(seedPath, MAX_SEED_FILE_BYTES, request.seedPath);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw error;
    throw new DatasetRequestError(`cannot read ${request.seedPath}; give the seed.json of a dataset folder`);
  }
  const seed = parseSeedFile(seedText, request.seedPath);
  const originalDir = dirname(seedPath);
  const originalManifest = join(originalDir, MANIFEST_FILE);
  const originalThere = await stat(originalManifest).then(() => true, () => false);
  // Only the head is read here; the manifest may be larger than any string.
  let originalHead = null;
  try {
    if (originalThere) originalHead = readManifestHead(originalManifest).head;
  } catch (error) {
    // A damaged original manifest is reported by the comparison below, not here.
    if (!(error instanceof DatasetReadError)) throw error;
  }
  if (resolve(request.outDir) === originalDir) throw new DatasetRequestError('--out must be a different folder from the one holding the seed file');
  const generated = await generateDataset({
    scenario: seed.scenario,
    inputs: { kind: 'seed', seedDir: originalDir, seedName: request.seedPath, inputs: seed.inputs },
    outDir: request.outDir,
    // A shard's seed file regenerates that shard.
    shard: originalHead?.shard ?? null,
    workers: request.workers,
    resume: false,
    force: request.force,
    pliantVersion: request.pliantVersion,
    onEvent: request.onEvent,
    shouldStop: request.shouldStop,
    runInfo: { command: ['pliant', 'reproduce', request.seedPath], reproducing: originalDir },
  });
  const seedSha256 = sha256Hex(new TextEncoder().encode(seedText));
  const recordedSha256 = originalThere ? recordedSeedDigest(originalManifest) : null;
  const seedFile = { sha256: seedSha256, recordedSha256, matches: recordedSha256 === null ? null : recordedSha256 === seedSha256 };
  if (generated.status === 'stopped') return { generated, seedVersion: seed.pliantVersion, comparisons: [], identical: false, seedFile };
  const comparisons = await compareDatasetFolders(originalDir, generated.outDir, { requireOriginalManifest: false, regeneratedListed: generated.listedPaths ?? undefined });
  return { generated, seedVersion: seed.pliantVersion, comparisons, identical: comparisons.every((c) => c.result === 'identical'), seedFile };
}
