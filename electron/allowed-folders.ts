// The session's list of folders the person picked in a folder dialog, plus the app's bundled
// scenarios (read-only). Every path a request names is resolved here, symlinks included, and
// refused unless it lands inside one of them: the renderer is treated as untrusted, so a
// compromised page can reach no more of the disk than the person deliberately opened.
// In web mode the page itself confirms picks (there is no system dialog), so there every pick
// must also lie inside the root folder given when the server was started: a compromised page
// can then reach no more than that root. Picks last for the session only; nothing is
// remembered between starts.
import { realpath, stat } from 'node:fs/promises';
import { basename, dirname, isAbsolute, join, relative, resolve, sep } from 'node:path';

import type { FolderPurpose } from '../sim/bridge/bridge-contract.ts';
import { RequestError } from './request-error.ts';

export type PathAccess = 'read' | 'write';

export interface AllowedFolder {
  path: string;
  purpose: FolderPurpose;
}

export class AllowedFolders {
  private readonly picked: AllowedFolder[] = [];
  private readonly readOnlyRoots: string[];

  /**
   * `readOnlyRoots` and `confinedTo` must already be real paths (the caller resolves them once
   * at start). With `confinedTo` (web mode), no folder outside it can be allowed.
   */
  constructor(readOnlyRoots: readonly string[], readonly confinedTo: string | null = null) {
    this.readOnlyRoots = [...readOnlyRoots];
  }

  /** Adds a folder the person picked; returns its real path. */
  async allow(folderPath: string, purpose: FolderPurpose): Promise<string> {
    refuseUnsafeSpelling(folderPath);
    const real = await realpath(folderPath);
    this.refuseOutsideConfinement(folderPath, real);
    if (!(await stat(real)).isDirectory()) {
      throw new RequestError('path-refused', `${shown(folderPath)} is a file, not a folder. Pick a folder.`);
    }
    if (!this.picked.some((f) => f.path === real && f.purpose === purpose)) this.picked.push({ path: real, purpose });
    return real;
  }

  list(): readonly AllowedFolder[] {
    return this.picked;
  }

  /** Throws 'path-refused' when `real` (a real path) lies outside the web-mode root folder. */
  refuseOutsideConfinement(requested: string, real: string): void {
    // Pliant's own bundled examples may be browsed and opened wherever the root is: they are
    // read-only (resolve() refuses every write inside them), so they widen nothing a page could harm.
    if (this.confinedTo === null || isInside(this.confinedTo, real) || this.readOnlyRoots.some((root) => isInside(root, real))) return;
    throw new RequestError(
      'path-refused',
      `${shown(requested)} is outside ${shown(this.confinedTo)}, the root folder this web-mode server was started with. Pick a folder inside it, or stop the server and start it again with --root naming a folder that holds yours.`,
    );
  }

  /**
   * Resolves a requested path to a real absolute path inside an allowed folder, or throws
   * 'path-refused'. Writes are refused inside the bundled (read-only) folders even if the
   * person also picked one of them, so the app's own examples cannot be overwritten.
   */
  async resolve(requested: string, access: PathAccess): Promise<string> {
    refuseUnsafeSpelling(requested);
    const real = await realPathAllowingMissingTail(resolve(requested));
    // Picks are inside the root already; checked again so no path outside it is ever answered.
    const inPicked = this.picked.some((f) => isInside(f.path, real)) && (this.confinedTo === null || isInside(this.confinedTo, real));
    const inReadOnly = this.readOnlyRoots.some((root) => isInside(root, real));
    if (access === 'write' && inReadOnly) {
      throw new RequestError('path-refused', `${shown(requested)} is inside Pliant's bundled examples, which are read-only. Save a copy in a folder of yours instead.`);
    }
    if (!inPicked && !(access === 'read' && inReadOnly)) {
      throw new RequestError(
        'path-refused',
        `${shown(requested)} is outside the folders chosen in this session. Choose the folder that holds it with a folder dialog first, then try again.`,
      );
    }
    return real;
  }
}

/**
 * Refuses spellings that would make the path mean something other than it shows. ".." is refused
 * outright rather than normalised away, because a caller that sends it is either confused or
 * probing, and either way should hear about it.
 */
export function refuseUnsafeSpelling(requested: string): void {
  if (typeof requested !== 'string' || requested.length === 0) {
    throw new RequestError('path-refused', 'A path must be a non-empty string.');
  }
  if (requested.includes('\u0000')) {
    throw new RequestError('path-refused', 'The path contains a NUL character, which no file name may hold. Remove it.');
  }
  if (!isAbsolute(requested)) {
    throw new RequestError('path-refused', `${shown(requested)} is a relative path. Send the full path of a file in a folder you chose.`);
  }
  if (requested.split(/[\\/]+/).includes('..')) {
    throw new RequestError('path-refused', `${shown(requested)} contains "..". Send the full path without "..".`);
  }
}

/** True when `candidate` is `root` itself or lies below it (both real, absolute). */
export function isInside(root: string, candidate: string): boolean {
  const rel = relative(root, candidate);
  return rel === '' || (rel !== '..' && !rel.startsWith(`..${sep}`) && !isAbsolute(rel));
}

/**
 * realpath() of the deepest part of the path that exists, with the missing remainder appended:
 * a file about to be created has no real path yet, but its existing parent may be a symlink
 * that points somewhere else entirely.
 */
async function realPathAllowingMissingTail(absolute: string): Promise<string> {
  const tail: string[] = [];
  let current = absolute;
  for (;;) {
    try {
      const real = await realpath(current);
      return tail.length ? join(real, ...tail.reverse()) : real;
    } catch (error) {
      const code = (error as { code?: string }).code;
      if (code !== 'ENOENT' && code !== 'ENOTDIR') throw error;
      const parent = dirname(current);
      if (parent === current) throw error;
      tail.push(basename(current));
      current = parent;
    }
  }
}

/** Quotes a path for a message, shortened so a hostile 4 kB path does not flood the screen. */
export function shown(path: string): string {
  return JSON.stringify(path.length > 160 ? `${path.slice(0, 80)}…${path.slice(-60)}` : path);
}
