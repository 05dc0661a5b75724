// SHA-256 checksums (FIPS 180-4) of buffers and files, as lowercase hex, for the dataset
// manifest: anyone can check a regenerated file against the published digest.
import { createHash } from 'node:crypto';
import { closeSync, openSync, readSync } from 'node:fs';
import { DatasetReadError } from './dataset-read-error.ts';
import { systemErrorCode } from './read-file-bytes.ts';

const READ_CHUNK_BYTES = 1 << 20;

/** SHA-256 of one buffer, or of several buffers taken as one byte sequence. */
export function sha256Hex(content: Uint8Array | readonly Uint8Array[]): string {
  const hash = createHash('sha256');
  const chunks = content instanceof Uint8Array ? [content] : content;
  for (const chunk of chunks) hash.update(chunk);
  return hash.digest('hex');
}

/** SHA-256 of a file's bytes, read in 1 MiB pieces so large files need little memory. */
export function sha256FileHex(path: string): string {
  const hash = createHash('sha256');
  let fd: number;
  try {
    fd = openSync(path, 'r');
  } catch (error) {
    throw new DatasetReadError(path, '', `cannot open the file (${systemErrorCode(error)})`, 'check that it exists and is readable');
  }
  try {
    const buffer = new Uint8Array(READ_CHUNK_BYTES);
    for (;;) {
      const count = readSync(fd, buffer, 0, buffer.byteLength, null);
      if (count === 0) break;
      hash.update(buffer.subarray(0, count));
    }
  } catch (error) {
    throw new DatasetReadError(path, '', `reading failed (${systemErrorCode(error)})`, 'check the disk and try again');
  } finally {
    closeSync(fd);
  }
  return hash.digest('hex');
}

