// Keeps every file a dataset folder's reader opens, and every file a run writes, inside that
// folder once symbolic links are followed (the app's score and predictions readers use it too). Checking the folder itself is not enough: a CARD.md
// that links to a file elsewhere would be shown as the card, and an episodes/ that links
// elsewhere would have a resumed run write (and tidy up) files outside the folder. A link whose
// target stays inside the folder is harmless and allowed.
import { realpathSync } from 'node:fs';
import { realpath } from 'node:fs/promises';
import { basename, dirname, isAbsolute, join, relative, sep } from 'node:path';

import { DatasetRequestError } from './dataset-request-error.ts';

/** True when `candidate` is `root` itself or lies below it (both absolute). */
function isInside(root: string, candidate: string): boolean {
  const rel = relative(root, candidate);
  return rel === '' || (rel !== '..' && !rel.startsWith(`..${sep}`) && !isAbsolute(rel));
}

function missing(error: unknown): boolean {
  const code = (error as { code?: string }).code;
  return code === 'ENOENT' || code === 'ENOTDIR';
}

/**
 * The real path of `absolute`'s deepest existing part, with the missing rest appended: a file
 * about to be written has no real path yet, but a folder above it may be a link.
 */
function realPathSync(absolute: string): string {
  const tail: string[] = [];
  let current = absolute;
  for (;;) {
    try {
      return join(realpathSync.native(current), ...tail.reverse());
    } catch (error) {
      if (!missing(error) || dirname(current) === current) throw error;
      tail.push(basename(current));
      current = dirname(current);
    }
  }
}

async function realPathAsync(absolute: string): Promise<string> {
  const tail: string[] = [];
  let current = absolute;
  for (;;) {
    try {
      return join(await realpath(current), ...tail.reverse());
    } catch (error) {
      if (!missing(error) || dirname(current) === current) throw error;
      tail.push(basename(current));
      current = dirname(current);
    }
  }
}

function leadsOut(dir: string, relativePath: string, real: string): DatasetRequestError {
  return new DatasetRequestError(
    `${join(dir, relativePath)} is a symbolic link (or lies under one) that leads outside ${dir}, to ${real}; ` +
      'Pliant reads and writes only inside the folder, so replace the link with the file or folder itself',
  );
}

/**
 * `join(dir, relativePath)` when it stays inside `dir` after following links (or does not
 * exist yet below a part that does); otherwise a DatasetRequestError naming the link.
 */
export function containedPathSync(dir: string, relativePath: string): string {
  const path = join(dir, relativePath);
  const realDir = realPathSync(dir);
  const real = realPathSync(path);
  if (!isInside(realDir, real)) throw leadsOut(dir, relativePath, real);
  return path;
}

/** containedPathSync without blocking the caller's thread (the app's reader). */
export async function containedPath(dir: string, relativePath: string): Promise<string> {
  const path = join(dir, relativePath);
  const realDir = await realPathAsync(dir);
  const real = await realPathAsync(path);
  if (!isInside(realDir, real)) throw leadsOut(dir, relativePath, real);
  return path;
}
