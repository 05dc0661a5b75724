// A baseline cannot be fitted or run as asked because of its inputs: a dataset without the
// split it needs, an episode whose arrays have the wrong shape or hold NaN, a model file that
// is not one. The message names the file, the episode or JSON pointer, and how to fix it; the
// command line prints it and exits with 2.
import { PliantError } from '../../errors/pliant-error.ts';

export class BaselineInputError extends PliantError {
  constructor(message: string) {
    super('user', 'baseline-input', message);
    this.name = 'BaselineInputError';
  }
}
