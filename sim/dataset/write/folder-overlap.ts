// Whether two folders are one, or one lies inside the other, after resolving symbolic links:
// a command that writes one folder from others (merge, reproduce) must refuse an output that
// would delete or overwrite its own input, before it touches anything.
import { realpathSync } from 'node:fs';
import { basename, dirname, join, relative, resolve, sep } from 'node:path';

/** The real path of `path`, or of its deepest existing ancestor joined with the rest when it does not exist yet. */
export function realPathOf(path: string): string {
  const absolute = resolve(path);
  try {
    return realpathSync(absolute);
  } catch {
    const parent = dirname(absolute);
    if (parent === absolute) return absolute;
    return join(realPathOf(parent), basename(absolute));
  }
}

export type FolderOverlap = 'same' | 'inside' | 'contains' | null;

/** How folder `a` relates to folder `b`: the same folder, inside it, containing it, or apart. */
export function folderOverlap(a: string, b: string): FolderOverlap {
  const realA = realPathOf(a);
  const realB = realPathOf(b);
  if (realA === realB) return 'same';
  const fromB = relative(realB, realA);
  if (fromB !== '' && !fromB.startsWith(`..${sep}`) && fromB !== '..' && !fromB.startsWith(sep)) return 'inside';
  const fromA = relative(realA, realB);
  if (fromA !== '' && !fromA.startsWith(`..${sep}`) && fromA !== '..' && !fromA.startsWith(sep)) return 'contains';
  return null;
}
