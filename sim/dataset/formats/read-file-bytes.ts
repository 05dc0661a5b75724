// Reads a whole dataset or controls file into memory, turning operating-system failures into a
// DatasetReadError that names the file and says what to check.
import { readFileSync } from 'node:fs';

import { DatasetReadError } from './dataset-read-error.ts';

export function readFileBytes(path: string): Uint8Array {
  try {
    return readFileSync(path);
  } catch (error) {
    throw new DatasetReadError(path, '', `cannot read the file (${systemErrorCode(error)})`, 'check the path and that the file is readable');
  }
}

/** The errno code of a system error (ENOENT, EACCES, ...), or the error's text for anything else. */
export function systemErrorCode(error: unknown): string {
  const code = (error as { code?: unknown } | null)?.code;
  if (typeof code === 'string') return code;
  return error instanceof Error ? error.message : String(error);
}
