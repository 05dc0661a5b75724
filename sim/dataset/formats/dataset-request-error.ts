// A dataset command that cannot be carried out as asked — a flag, the state of a folder, a seed
// file, a replay file — found before anything is written. The message says what, where and how
// to fix it; the command line prints only that and exits with 2. (Failed reads and writes on the
// way are DatasetReadError and DatasetWriteError.)
import { PliantError } from '../../errors/pliant-error.ts';

export class DatasetRequestError extends PliantError {
  /** @param errorCode the stable code; subclasses name their particular refusal */
  constructor(message: string, errorCode = 'dataset-request') {
    super('user', errorCode, message);
    this.name = 'DatasetRequestError';
  }
}
