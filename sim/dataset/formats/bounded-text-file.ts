// Reads a file a user pointed at only when it is a regular file of a sane size, so a link
// to /dev/zero, a named pipe or a multi-gigabyte file gets a plain refusal instead of an
// endless read or V8's "Invalid string length". The size is checked before reading and again
// while reading (a file may grow, and some special files report size 0).
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';

import { DatasetRequestError } from './dataset-request-error.ts';

export const MiB = 1024 * 1024;

/** The stable error code of a folder given where a file was asked for. */
export const PATH_IS_FOLDER_CODE = 'path-is-folder';

/**
 * The UTF-8 text of the file at `path`, at most `maxBytes` long (see readBoundedBytes).
 */
export function readBoundedText(path: string, maxBytes: number, what: string): string {
  const bytes = readBoundedBytes(path, maxBytes, what);
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
}

/**
 * The bytes of the file at `path`, at most `maxBytes` long. `what` names the file in
 * messages ("the scenario file x.json"). Missing files and read errors are thrown as they come
 * (callers word ENOENT themselves); a file of the wrong type or size is a DatasetRequestError.
 */
export function readBoundedBytes(path: string, maxBytes: number, what: string): Uint8Array {
  const fd = openSync(path, 'r');
  try {
    const info = fstatSync(fd);
    if (info.isDirectory()) throw new DatasetRequestError(`${what} is a folder; give a file`, PATH_IS_FOLDER_CODE);
    if (!info.isFile()) throw new DatasetRequestError(`${what} is not a regular file (a device, pipe or socket); give the file itself`);
    if (info.size > maxBytes) throw new DatasetRequestError(`${what} is ${sizeText(info.size)}, more than the ${sizeText(maxBytes)} Pliant reads for it; check that it is the file you meant`);
    // One byte more than allowed, so reading it proves the file is too long.
    let buffer = Buffer.alloc(Math.min(maxBytes, Math.max(info.size, 64 * 1024)) + 1);
    let filled = 0;
    for (;;) {
      if (filled === buffer.length) {
        if (filled > maxBytes) throw new DatasetRequestError(`${what} is more than the ${sizeText(maxBytes)} Pliant reads for it; check that it is the file you meant`);
        const grown = Buffer.alloc(Math.min(maxBytes + 1, 2 * buffer.length));
        buffer.copy(grown, 0, 0, filled);
        buffer = grown;
      }
      const n = readSync(fd, buffer, filled, buffer.length - filled, null);
      if (n === 0) break;
      filled += n;
    }
    return buffer.subarray(0, filled);
  } finally {
    closeSync(fd);
  }
}

function sizeText(bytes: number): string {
  return bytes >= MiB ? `${(bytes / MiB).toFixed(bytes >= 10 * MiB ? 0 : 1)} MiB` : `${bytes} bytes`;
}
