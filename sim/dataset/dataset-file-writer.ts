// Writes one file of a dataset folder through a temporary name and a rename (atomic-file.ts), so
// a reader or a resumed run never finds half a file under its final name, and returns its
// manifest entry. Failures arrive as DatasetWriteError, which names the file and what to do.
import { mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { writeFileAtomic } from './atomic-file.ts';
import { sha256Hex } from './sha256.ts';
import type { FileRecord } from './dataset-manifest.ts';
import { toDatasetWriteError } from './dataset-write-error.ts';

export function ensureFolder(path: string): void {
  try {
    mkdirSync(path, { recursive: true });
  } catch (error) {
    throw toDatasetWriteError(error, path);
  }
}

export function writeDatasetFile(outDir: string, relativePath: string, data: Uint8Array | string): FileRecord {
  const bytes = typeof data === 'string' ? new TextEncoder().encode(data) : data;
  const path = join(outDir, relativePath);
  ensureFolder(dirname(path));
  writeFileAtomic(path, bytes);
  return { path: relativePath, sha256: sha256Hex(bytes), sizeBytes: bytes.length };
}
