// A dataset command that cannot be carried out as asked — a flag, the state of a folder, a seed
// file, a replay file — found before anything is written. The message says what, where and how
// to fix it; the command line prints only that and exits with 2. (Failed reads and writes on the
// way are DatasetReadError and DatasetWriteError.)
import { PliantError } from '../../errors/pliant-error.ts';
import { COMMAND_LINE_WORDS, wordRun } from './run-words.ts';

export class DatasetRequestError extends PliantError {
  /** The message with the run's settings in neutral form (run-words.ts), for a shell to word itself. */
  readonly neutralMessage: string;

  /** @param errorCode the stable code; subclasses name their particular refusal */
  constructor(message: string, errorCode = 'dataset-request') {
    super('user', errorCode, wordRun(message, COMMAND_LINE_WORDS));
    this.name = 'DatasetRequestError';
    this.neutralMessage = message;
  }
}
