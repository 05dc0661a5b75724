// Writes a file so that its final name only ever shows complete content: the bytes go to a
// temporary name in the same folder, are flushed to disk, and are then renamed into place
// (a rename within one file system replaces the target in one step). On any failure the
// temporary file is removed and a DatasetWriteError says what happened.
import * as nodeFs from 'node:fs';
import { basename, dirname, join } from 'node:path';

import { toDatasetWriteError } from './dataset-write-error.ts';

/** The file-system calls the writer makes; tests pass a wrapper that fails on purpose (e.g. a full disk). */
export interface AtomicFileSystem {
  openSync(path: string, flags: string, mode?: number): number;
  writeSync(fd: number, buffer: Uint8Array, offset: number, length: number, position: number | null): number;
  fsyncSync(fd: number): void;
  closeSync(fd: number): void;
  renameSync(oldPath: string, newPath: string): void;
  unlinkSync(path: string): void;
}

export interface AtomicWriteOptions {
  /** Defaults to node:fs. */
  readonly fs?: AtomicFileSystem;
}

const NODE_FILE_SYSTEM: AtomicFileSystem = nodeFs;

let temporaryCounter = 0;

/** The hidden temporary name a write to `finalPath` uses; the pid and a counter keep parallel writers apart. */
export function temporaryPathFor(finalPath: string): string {
  temporaryCounter += 1;
  return join(dirname(finalPath), `.${basename(finalPath)}.partial-${process.pid}-${temporaryCounter}`);
}

/** True for the names `temporaryPathFor` produces, so a resumed run can clean up after a crash. */
export function isTemporaryName(fileName: string): boolean {
  return /^\..+\.partial-\d+-\d+$/.test(fileName);
}

/** Writes `content` (one buffer or several, written in order) to `finalPath` atomically. */
export function writeFileAtomic(
  finalPath: string,
  content: Uint8Array | readonly Uint8Array[],
  options: AtomicWriteOptions = {},
): void {
  const chunks = content instanceof Uint8Array ? [content] : content;
  replaceAtomically(finalPath, options, (fs, temporary) => {
    for (const chunk of chunks) writeFully(fs, temporary.fd!, chunk);
  });
}

/**
 * Writes a file whose content is produced piece by piece (the manifest of a large sweep), so
 * the whole content never has to be in memory at once: `fill` calls `write` with each piece in
 * order. Atomic like `writeFileAtomic`.
 */
export function writeFileAtomicStreamed(
  finalPath: string,
  fill: (write: (chunk: Uint8Array) => void) => void,
  options: AtomicWriteOptions = {},
): void {
  replaceAtomically(finalPath, options, (fs, temporary) => {
    fill((chunk) => writeFully(fs, temporary.fd!, chunk));
  });
}

/**
 * For writers that must be given a path (the HDF5 library opens files itself): reserves a
 * temporary file, lets `fill` write it by path, then flushes and renames it into place.
 * `fill` may throw a DatasetWriteError (kept as is) or any other error (wrapped).
 */
export function writeFileAtomicVia(
  finalPath: string,
  fill: (temporaryPath: string) => void,
  options: AtomicWriteOptions = {},
): void {
  replaceAtomically(finalPath, options, (fs, temporary) => {
    // Creating the file ourselves first (in replaceAtomically) gives a precise errno for an
    // unwritable or missing folder, which the library would report only as a generic failure.
    const fd = temporary.fd!;
    temporary.fd = undefined;
    fs.closeSync(fd);
    fill(temporary.path);
    temporary.fd = fs.openSync(temporary.path, 'r+');
  });
}

interface TemporaryFile {
  readonly path: string;
  /** Open while the writer holds it; undefined once closed, so a failure never closes it twice. */
  fd: number | undefined;
}

/** Creates the temporary file, lets `fill` complete it (leaving `fd` open on it), flushes it and renames it into place. */
function replaceAtomically(
  finalPath: string,
  options: AtomicWriteOptions,
  fill: (fs: AtomicFileSystem, temporary: TemporaryFile) => void,
): void {
  const fs = options.fs ?? NODE_FILE_SYSTEM;
  const temporary: TemporaryFile = { path: temporaryPathFor(finalPath), fd: undefined };
  let created = false;
  try {
    temporary.fd = fs.openSync(temporary.path, 'wx', 0o666);
    created = true;
    fill(fs, temporary);
    // Flush before the rename: otherwise a power cut can leave the new name pointing at a file
    // whose blocks were never written.
    fs.fsyncSync(temporary.fd!);
    const fd = temporary.fd!;
    temporary.fd = undefined;
    fs.closeSync(fd);
    fs.renameSync(temporary.path, finalPath);
  } catch (error) {
    discardTemporary(fs, temporary.fd, created ? temporary.path : undefined);
    throw toDatasetWriteError(error, finalPath);
  }
  syncFolder(fs, dirname(finalPath));
}

function writeFully(fs: AtomicFileSystem, fd: number, chunk: Uint8Array): void {
  let offset = 0;
  while (offset < chunk.byteLength) {
    const written = fs.writeSync(fd, chunk, offset, chunk.byteLength - offset, null);
    if (written <= 0) {
      // A write that makes no progress would loop for ever; treat it like the disk refusing data.
      throw Object.assign(new Error('the operating system accepted no bytes'), { code: 'EIO' });
    }
    offset += written;
  }
}

function discardTemporary(fs: AtomicFileSystem, fd: number | undefined, temporaryPath: string | undefined): void {
  if (fd !== undefined) {
    try {
      fs.closeSync(fd);
    } catch {
      // The write already failed; that error is the one worth reporting.
    }
  }
  if (temporaryPath !== undefined) {
    try {
      fs.unlinkSync(temporaryPath);
    } catch {
      // Nothing more can be done here; the name is hidden and `isTemporaryName` lets a later run remove it.
    }
  }
}

// Makes the rename itself durable. Not every platform can open or flush a folder (Windows
// cannot, some network file systems refuse), and the file content is already safe, so a
// refusal here is not an error.
function syncFolder(fs: AtomicFileSystem, folder: string): void {
  let fd: number | undefined;
  try {
    fd = fs.openSync(folder, 'r');
    fs.fsyncSync(fd);
  } catch {
    // Best effort, as explained above.
  } finally {
    if (fd !== undefined) {
      try {
        fs.closeSync(fd);
      } catch {
        // See above: folder flushing is best effort.
      }
    }
  }
}
