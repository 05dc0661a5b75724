// The one comparison of two dataset folders, file by file, used by `pliant reproduce`, the app's
// reproduce job and its Compare button. Every file either folder's manifest lists is hashed in
// both (SHA-256, FIPS 180-4, streamed by file-digest.ts) and called identical or different, or
// missing or unreadable in one of them; manifest.json is compared without its `run` member, the
// one part that differs between runs by design; files the regenerated folder holds beyond those
// are "only in regenerated". Manifests are read as streams, so folders of any size compare in
// little memory.
import { readdir, stat } from 'node:fs/promises';
import { join } from 'node:path';

import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import type { FileDigest } from '../formats/file-digest.ts';
import { digestFile } from '../formats/file-digest.ts';
import { MANIFEST_FILE, WORK_FOLDER } from '../manifest/dataset-files.ts';
import { manifestDigestWithoutRun, readManifestStream } from '../manifest/manifest-stream.ts';

export type FileComparisonResult =
  | 'identical'
  | 'different'
  | 'missing in original'
  | 'missing in regenerated'
  | 'unreadable in original'
  | 'unreadable in regenerated'
  | 'only in regenerated';

export interface FileComparison {
  /** Relative to the dataset folder, '/' separators. */
  path: string;
  result: FileComparisonResult;
}

export interface FolderComparisonOptions {
  /**
   * Refuse an original folder without a readable manifest (the app's Compare button: there is
   * nothing to compare against). Off for a reproduction, whose seed file may have been copied
   * out of its folder: the regenerated files are then all "missing in original".
   */
  requireOriginalManifest?: boolean;
  /** The paths the regenerated folder's manifest lists, when the caller has just written them. */
  regeneratedListed?: Iterable<string>;
}

export async function compareDatasetFolders(originalDir: string, regeneratedDir: string, options: FolderComparisonOptions = {}): Promise<FileComparison[]> {
  const originalManifest = join(originalDir, MANIFEST_FILE);
  const regeneratedManifest = join(regeneratedDir, MANIFEST_FILE);
  const originalListed = await listedPaths(originalManifest);
  if (originalListed === null && (options.requireOriginalManifest ?? true)) {
    throw new DatasetRequestError(`${originalDir} has no readable ${MANIFEST_FILE}, so there is nothing to compare against; open the folder the seed file came from`);
  }
  const paths = [...(originalListed ?? [])];
  const known = new Set(paths);
  const regeneratedListed = options.regeneratedListed ?? (await listedPaths(regeneratedManifest)) ?? [];
  for (const path of [...regeneratedListed].sort()) {
    if (known.has(path)) continue;
    known.add(path);
    paths.push(path);
  }
  const comparisons: FileComparison[] = [];
  for (const path of paths) {
    comparisons.push({ path, result: compareDigests(await digestFile(join(originalDir, path)), await digestFile(join(regeneratedDir, path))) });
  }
  const a = manifestDigestWithoutRun(originalManifest);
  const b = manifestDigestWithoutRun(regeneratedManifest);
  comparisons.push({ path: MANIFEST_FILE, result: a === null ? 'missing in original' : b === null ? 'missing in regenerated' : a === b ? 'identical' : 'different' });
  known.add(MANIFEST_FILE);
  for (const path of await filesBelow(regeneratedDir, '')) if (!known.has(path)) comparisons.push({ path, result: 'only in regenerated' });
  return comparisons;
}

function compareDigests(original: FileDigest, regenerated: FileDigest): FileComparisonResult {
  if (original.kind === 'missing') return 'missing in original';
  if (original.kind === 'unreadable') return 'unreadable in original';
  if (regenerated.kind === 'missing') return 'missing in regenerated';
  if (regenerated.kind === 'unreadable') return 'unreadable in regenerated';
  return original.sha256 === regenerated.sha256 ? 'identical' : 'different';
}

/**
 * The documents a manifest lists, then its data files, each in the manifest's order (the order the
 * seed file's expected files are shown in); null when the manifest is absent or damaged.
 */
async function listedPaths(manifestPath: string): Promise<string[] | null> {
  if (!(await stat(manifestPath).then((s) => s.isFile(), () => false))) return null;
  const documents: string[] = [];
  const files: string[] = [];
  try {
    for (const event of readManifestStream(manifestPath)) {
      if (event.kind === 'file') files.push(event.record.path);
      else if (event.kind === 'documents') documents.push(...event.documents.map((d) => d.path));
    }
    return [...documents, ...files];
  } catch (error) {
    if (error instanceof DatasetReadError) return null;
    throw error;
  }
}

async function filesBelow(dir: string, prefix: string): Promise<string[]> {
  const found: string[] = [];
  let entries;
  try {
    entries = await readdir(join(dir, prefix), { withFileTypes: true });
  } catch {
    return found;
  }
  for (const entry of entries) {
    const relative = prefix === '' ? entry.name : `${prefix}/${entry.name}`;
    if (relative === WORK_FOLDER) continue;
    if (entry.isDirectory()) found.push(...(await filesBelow(dir, relative)));
    else if (entry.isFile()) found.push(relative);
  }
  return found.sort();
}
