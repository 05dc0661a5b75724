// The user-facing error for a dataset or controls file that cannot be read or is not in the
// expected format: names the file and the place in it, what is wrong and how to fix it.
import { PliantError } from '../../errors/pliant-error.ts';
import { COMMAND_LINE_WORDS, wordRun } from './run-words.ts';

export class DatasetReadError extends PliantError {
  override readonly name = 'DatasetReadError';
  /** The file that was being read. */
  readonly path: string;
  /** The message with the run's settings in neutral form (run-words.ts), for a shell to word itself. */
  readonly neutralMessage: string;

  /**
   * @param path the file
   * @param where where in the file, e.g. 'header' or 'byte 10'; empty for the whole file
   * @param problem what is wrong
   * @param fix how to fix it
   */
  constructor(path: string, where: string, problem: string, fix: string) {
    const neutral = `${path}${where ? ` (${where})` : ''}: ${problem}; ${fix}`;
    super('environment', 'dataset-read', wordRun(neutral, COMMAND_LINE_WORDS));
    this.path = path;
    this.neutralMessage = neutral;
  }
}
