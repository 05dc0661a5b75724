// Reads what a dataset folder holds before a command trusts it: its seed.json text, its manifest
// (checked against the schema) and whether a run is still in progress there.
import { stat } from 'node:fs/promises';
import { join } from 'node:path';

import { containedPath } from '../formats/contained-path.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { say } from '../formats/run-words.ts';
import { readTextIfPresent } from '../formats/text-file.ts';
import { MANIFEST_FILE, SEED_FILE, WORK_FOLDER } from './dataset-files.ts';
import type { DatasetManifest } from './dataset-manifest.ts';
import { manifestProblems } from './manifest-check.ts';

export interface FolderState {
  dir: string;
  seedText: string | null;
  manifestText: string | null;
  /** The parsed manifest when it parses and satisfies the schema. */
  manifest: DatasetManifest | null;
  /** Why the manifest is not usable, one line each (empty when it is). */
  manifestProblems: string[];
  inProgress: boolean;
}

export async function readFolderState(dir: string): Promise<FolderState> {
  let info;
  try {
    info = await stat(dir);
  } catch {
    throw new DatasetRequestError(`${dir} does not exist; give the folder a Pliant run wrote`);
  }
  if (!info.isDirectory()) throw new DatasetRequestError(`${dir} is a file; give the dataset folder that holds ${MANIFEST_FILE}`);
  const seedText = await readTextIfPresent(await containedPath(dir, SEED_FILE));
  const manifestText = await readTextIfPresent(await containedPath(dir, MANIFEST_FILE));
  let inProgress: boolean;
  try {
    inProgress = (await stat(join(dir, WORK_FOLDER))).isDirectory();
  } catch {
    inProgress = false;
  }
  let manifest: DatasetManifest | null = null;
  let problems: string[] = [];
  if (manifestText === null) {
    problems = [`${MANIFEST_FILE} is missing${inProgress ? `: the run that writes this folder has not finished; ${say('finish-unfinished')}` : ''}`];
  } else {
    let parsed: unknown;
    try {
      parsed = JSON.parse(manifestText);
    } catch (error) {
      problems = [`${MANIFEST_FILE} is not valid JSON: ${error instanceof Error ? error.message : String(error)}`];
    }
    if (problems.length === 0) {
      problems = manifestProblems(parsed).map((p) => `${MANIFEST_FILE} ${p}`);
      if (problems.length === 0) manifest = parsed as DatasetManifest;
    }
  }
  return { dir, seedText, manifestText, manifest, manifestProblems: problems, inProgress };
}
