// The one way Pliant takes the SHA-256 (FIPS 180-4) of a file or of bytes, as lowercase hex, for
// the manifest's checksums: anyone can check a regenerated file against the published digest.
// A file on disk is streamed in 1 MiB pieces, so
// a file of any size — a split HDF5 file of several GiB — is hashed in little memory, and the
// event loop gets a turn every 64 MiB. A file that is there but cannot be read (no
// permission, a folder in its place, an I/O error) is "unreadable" with the system's reason,
// never "missing": only ENOENT means missing. `verify`, `reproduce`, the app's comparison,
// `merge` and `--resume` all come here, and so does every other SHA-256 in Pliant (test/
// architecture-layering.test.ts checks that nothing else calls node:crypto's createHash).
import { createHash } from 'node:crypto';
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';

import { systemErrorCode } from './read-file-bytes.ts';

const READ_PIECE_BYTES = 1 << 20;
const YIELD_EVERY_BYTES = 64 << 20;
// One buffer for every file: a digest reads it only between its own awaits, and each read is
// hashed before the next await, so two digests running together never see each other's bytes.
const piece = new Uint8Array(READ_PIECE_BYTES);

export type FileDigest =
  | { kind: 'hashed'; sha256: string; sizeBytes: number }
  | { kind: 'missing' }
  /** `reason` is the errno code (EACCES, EISDIR, EIO, …) or "not a regular file". */
  | { kind: 'unreadable'; reason: string };

export async function digestFile(path: string): Promise<FileDigest> {
  // Synchronous calls, a turn of the event loop given every YIELD_EVERY_BYTES: a thread-pool
  // round trip per call would make checking 100,000 small episode files take minutes.
  let fd: number;
  try {
    // O_NONBLOCK so that opening a FIFO does not wait for a writer; open(2): it has no effect
    // on regular files.
    fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (error) {
    const code = systemErrorCode(error);
    return code === 'ENOENT' ? { kind: 'missing' } : { kind: 'unreadable', reason: code };
  }
  try {
    const info = fstatSync(fd);
    // A folder opens read-only on Linux (reading it fails with EISDIR); a FIFO or a device
    // could block or never end, so anything but a regular file is refused before reading.
    if (!info.isFile()) return { kind: 'unreadable', reason: info.isDirectory() ? 'EISDIR' : 'not a regular file' };
    const hash = createHash('sha256');
    let sizeBytes = 0;
    let sinceYield = 0;
    for (;;) {
      const bytesRead = readSync(fd, piece, 0, piece.byteLength, null);
      if (bytesRead === 0) break;
      hash.update(piece.subarray(0, bytesRead));
      sizeBytes += bytesRead;
      sinceYield += bytesRead;
      if (sinceYield >= YIELD_EVERY_BYTES) {
        sinceYield = 0;
        await new Promise<void>((resolve) => setImmediate(resolve));
      }
    }
    return { kind: 'hashed', sha256: hash.digest('hex'), sizeBytes };
  } catch (error) {
    return { kind: 'unreadable', reason: systemErrorCode(error) };
  } finally {
    closeSync(fd);
  }
}

/**
 * SHA-256 of a sequence fed piece by piece — bytes, or text taken as UTF-8 — for content that is
 * never whole in memory: a manifest written in pieces, the records parsed from one.
 */
export class Sha256Stream {
  private readonly hash = createHash('sha256');

  update(piece: Uint8Array | string): this {
    this.hash.update(piece);
    return this;
  }

  /** The digest as lowercase hex; the stream takes no more pieces after this. */
  hex(): string {
    return this.hash.digest('hex');
  }
}

/** SHA-256 of bytes already in memory (a file just encoded), or of several buffers taken as one byte sequence. */
export function sha256Hex(content: Uint8Array | readonly Uint8Array[]): string {
  const hash = createHash('sha256');
  const chunks = content instanceof Uint8Array ? [content] : content;
  for (const chunk of chunks) hash.update(chunk);
  return hash.digest('hex');
}

/** How a digest that is not a hash reads in a report, e.g. "missing file: x" / "unreadable file: x (EACCES)". */
export function describeUnhashed(digest: Exclude<FileDigest, { kind: 'hashed' }>, relativePath: string): string {
  return digest.kind === 'missing' ? `missing file: ${relativePath}` : `unreadable file: ${relativePath} (${digest.reason}); check its permissions and the disk`;
}
