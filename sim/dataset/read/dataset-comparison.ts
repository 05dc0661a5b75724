// Compares a regenerated dataset folder with the original, file by file: every file the original's
// manifest lists is hashed in both folders (SHA-256, FIPS 180-4) and called identical, different
// or missing; files the regenerated folder has beyond those are extra. manifest.json is compared
// as JSON without its `run` member, the one part that differs between runs by design.
import { readdir } from 'node:fs/promises';
import { join } from 'node:path';
import { MANIFEST_FILE, WORK_FOLDER } from '../manifest/dataset-files.ts';
import { readFolderState } from '../manifest/dataset-folder-state.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { digestFile } from '../formats/file-digest.ts';

export type FileComparisonResult = 'identical' | 'different' | 'missing' | 'extra';

export interface FileComparison {
  /** Relative to the dataset folder, '/' separators. */
  file: string;
  result: FileComparisonResult;
}

export async function compareDatasetFolders(originalDir: string, regeneratedDir: string): Promise<FileComparison[]> {
  const original = await readFolderState(originalDir);
  if (!original.manifest) {
    throw new DatasetRequestError(`${originalDir} has no usable ${MANIFEST_FILE} (${original.manifestProblems[0] ?? 'missing'}), so there is nothing to compare against; open the folder the seed file came from`);
  }
  const regenerated = await readFolderState(regeneratedDir);
  const listed = [...original.manifest.documents, ...original.manifest.files];
  const comparisons: FileComparison[] = [];
  for (const record of listed) {
    const there = await hashOf(join(regeneratedDir, record.path));
    if (there === null) {
      comparisons.push({ file: record.path, result: 'missing' });
      continue;
    }
    // A file lost from the original still has its recorded digest to compare with.
    const originalDigest = (await hashOf(join(originalDir, record.path))) ?? record.sha256;
    comparisons.push({ file: record.path, result: there === originalDigest ? 'identical' : 'different' });
  }
  comparisons.push({
    file: MANIFEST_FILE,
    result: regenerated.manifestText === null ? 'missing' : regenerated.manifest && withoutRun(regenerated.manifest) === withoutRun(original.manifest) ? 'identical' : 'different',
  });
  const known = new Set([MANIFEST_FILE, ...listed.map((f) => f.path)]);
  for (const file of await filesBelow(regeneratedDir, '')) if (!known.has(file)) comparisons.push({ file, result: 'extra' });
  return comparisons;
}

function withoutRun(manifest: object): string {
  const { run: _run, ...rest } = manifest as { run?: unknown };
  return JSON.stringify(rest);
}

/** The file's SHA-256, null when it is not there; a file that is there but unreadable is an error, never "missing". */
async function hashOf(path: string): Promise<string | null> {
  const digest = await digestFile(path);
  if (digest.kind === 'hashed') return digest.sha256;
  if (digest.kind === 'missing') return null;
  throw new DatasetRequestError(`cannot read ${path} (${digest.reason}); check that it is a readable file`);
}

async function filesBelow(dir: string, prefix: string): Promise<string[]> {
  const found: string[] = [];
  for (const entry of await readdir(join(dir, prefix), { withFileTypes: true })) {
    const relative = prefix === '' ? entry.name : `${prefix}/${entry.name}`;
    if (relative === WORK_FOLDER) continue;
    if (entry.isDirectory()) found.push(...(await filesBelow(dir, relative)));
    else if (entry.isFile()) found.push(relative);
  }
  return found.sort();
}
