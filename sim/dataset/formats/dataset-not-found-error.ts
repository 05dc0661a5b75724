// Something a reader was asked for is not in the dataset: a folder that is not there, an episode
// id the manifest does not list, an episode that was rejected and so has no files. Kept apart
// from DatasetReadError (a file that is there but wrong) so the app can tell the person "not
// found" rather than "damaged". The message says what is missing and what to do instead.
import { PliantError } from '../../errors/pliant-error.ts';

export class DatasetNotFoundError extends PliantError {
  constructor(message: string) {
    super('user', 'dataset-not-found', message);
    this.name = 'DatasetNotFoundError';
  }
}
