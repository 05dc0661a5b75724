// A predictions folder that cannot be scored as given: not a folder, a file that is not an
// episode's prediction, a missing or extra episode, a wrong shape or a non-finite value. The
// message names the file (and array, and first bad element) and says how to fix it; the command
// line prints only the message and exits with 2, because the fix is on the user's side.
import { PliantError } from '../../errors/pliant-error.ts';

export class PredictionsError extends PliantError {
  constructor(message: string) {
    super('user', 'predictions-invalid', message);
    this.name = 'PredictionsError';
  }
}
