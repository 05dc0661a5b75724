// A mistake in what a calibration was given (the measurement's descriptor or table, a --fit
// pointer, a known value that does not fit the scenario): the message says what is wrong, where
// (file:line, column name or JSON pointer) and how to fix it. The command line prints it
// without a stack trace and exits with status 2.
import { PliantError } from '../../errors/pliant-error.ts';

export class CalibrationInputError extends PliantError {
  constructor(message: string) {
    super('user', 'calibration-input', message);
    this.name = 'CalibrationInputError';
  }
}
