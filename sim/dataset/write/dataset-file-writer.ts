// Writes one file of a dataset folder through a temporary name and a rename (atomic-file.ts), so
// a reader or a resumed run never finds half a file under its final name, and returns its
// manifest entry. Failures arrive as DatasetWriteError, which names the file and what to do.
// A file whose folder (episodes/, card/, …) is a link leading out of the dataset folder is
// refused before anything is written (contained-path.ts).
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';

import { writeFileAtomic, writeFileAtomicStreamed } from '../formats/atomic-file.ts';
import { containedPathSync } from '../formats/contained-path.ts';
import { toDatasetWriteError } from '../formats/dataset-write-error.ts';
import { sha256Hex,Sha256Stream } from '../formats/file-digest.ts';
import type { FileRecord } from '../manifest/dataset-manifest.ts';

export function ensureFolder(path: string): void {
  try {
    mkdirSync(path, { recursive: true });
  } catch (error) {
    throw toDatasetWriteError(error, path);
  }
}

export function writeDatasetFile(outDir: string, relativePath: string, data: Uint8Array | string): FileRecord {
  const bytes = typeof data === 'string' ? new TextEncoder().encode(data) : data;
  const path = containedPathSync(outDir, relativePath);
  ensureFolder(dirname(path));
  writeFileAtomic(path, bytes);
  return { path: relativePath, sha256: sha256Hex(bytes), sizeBytes: bytes.length };
}

/** Text is handed to the file system in pieces of about this many UTF-16 units. */
const STREAMED_PIECE_UNITS = 1 << 16;

/**
 * Writes a text file that `produce` makes piece by piece (a large manifest), encoding it as
 * UTF-8 on the way, so the whole text never has to be in memory; atomic like writeDatasetFile.
 */
export function writeDatasetTextStreamed(outDir: string, relativePath: string, produce: (emit: (text: string) => void) => void): FileRecord {
  const path = containedPathSync(outDir, relativePath);
  ensureFolder(dirname(path));
  const hash = new Sha256Stream();
  const encoder = new TextEncoder();
  let sizeBytes = 0;
  writeFileAtomicStreamed(path, (write) => {
    let pending = '';
    // Pieces are whole JSON tokens or more, so a flush never splits a surrogate pair.
    const flush = (): void => {
      if (pending === '') return;
      const bytes = encoder.encode(pending);
      pending = '';
      hash.update(bytes);
      sizeBytes += bytes.length;
      write(bytes);
    };
    produce((text) => {
      pending += text;
      if (pending.length >= STREAMED_PIECE_UNITS) flush();
    });
    flush();
  });
  return { path: relativePath, sha256: hash.hex(), sizeBytes };
}
