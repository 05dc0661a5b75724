// Maps the raw path of a request for a renderer file (as it arrived, still percent-encoded) to a
// real file inside the built renderer folder, or says why not. Shared by the desktop app protocol
// and the web-mode server so both refuse traversal the same way.
//
// The raw path is decoded segment by segment and any "." or ".." segment is refused, whether it
// came spelled plainly or encoded (%2e%2e, %2E%2E, ..%2f); it is not handed to a URL parser first,
// because that would quietly resolve the dots and hide the attempt. Symlinks are resolved and the
// result must still lie inside the folder.
import { realpath, stat } from 'node:fs/promises';
import { join } from 'node:path';

import { isInside } from './allowed-folders.ts';

export type StaticLookup =
  | { ok: true; filePath: string }
  | { ok: false; status: 400 | 403 | 404; reason: string };

export const ENTRY_FILE = 'index.html';

/** `rootReal` must already be a real path. */
export async function resolveStaticFile(rootReal: string, rawPath: string): Promise<StaticLookup> {
  if (!rawPath.startsWith('/')) return { ok: false, status: 400, reason: 'The path must start with "/".' };
  const rawSegments = rawPath === '/' ? [ENTRY_FILE] : rawPath.slice(1).split('/');
  const segments: string[] = [];
  for (const raw of rawSegments) {
    let segment: string;
    try {
      segment = decodeURIComponent(raw);
    } catch {
      return { ok: false, status: 400, reason: 'The path has a broken %-escape.' };
    }
    if (segment === '' || segment === '.' || segment === '..') {
      return { ok: false, status: 400, reason: 'The path has an empty, "." or ".." part.' };
    }
    // eslint-disable-next-line no-control-regex -- NUL in a path part is refused on purpose.
    if (/[\\/\u0000]/.test(segment)) {
      return { ok: false, status: 400, reason: 'A part of the path holds a slash, backslash or NUL.' };
    }
    // Dot files are never part of a renderer build; refusing them keeps stray editor or env files private.
    if (segment.startsWith('.')) return { ok: false, status: 404, reason: 'No such file.' };
    segments.push(segment);
  }

  let real: string;
  try {
    real = await realpath(join(rootReal, ...segments));
  } catch {
    return { ok: false, status: 404, reason: 'No such file.' };
  }
  if (!isInside(rootReal, real)) return { ok: false, status: 403, reason: 'That file is outside the app folder.' };
  const info = await stat(real);
  if (!info.isFile()) return { ok: false, status: 404, reason: 'No such file.' };
  return { ok: true, filePath: real };
}
