// Reads a small text file that may legitimately be absent (a seed file or plan of a folder that
// is being checked), telling "not there" apart from "there".
import { readFile } from 'node:fs/promises';

export async function readTextIfPresent(path: string): Promise<string | null> {
  try {
    return await readFile(path, 'utf8');
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw error;
  }
}
