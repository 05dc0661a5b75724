// The user-facing error for a dataset or controls file that cannot be read or is not in the
// expected format: names the file and the place in it, what is wrong and how to fix it.
import { PliantError } from '../../errors/pliant-error.ts';

export class DatasetReadError extends PliantError {
  override readonly name = 'DatasetReadError';
  /** The file that was being read. */
  readonly path: string;

  /**
   * @param path the file
   * @param where where in the file, e.g. 'header' or 'byte 10'; empty for the whole file
   * @param problem what is wrong
   * @param fix how to fix it
   */
  constructor(path: string, where: string, problem: string, fix: string) {
    super('environment', 'dataset-read', `${path}${where ? ` (${where})` : ''}: ${problem}; ${fix}`);
    this.path = path;
  }
}
