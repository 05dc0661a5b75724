// The command line's one mapping from an error's kind (sim/errors/pliant-error.ts) to the exit
// status and what is printed. A user's mistake exits with 2 and an environment failure (full
// disk, no permission, a damaged file) with 1, as the command line has always done; both print
// only the message. A bug exits with 70, EX_SOFTWARE of BSD's sysexits.h ("an internal software
// error has been detected"), and prints its stack trace so it can be reported.
import { reportOf } from '../errors/error-report.ts';
import type { ErrorKind } from '../errors/pliant-error.ts';

export const EXIT_CODE_BY_KIND: Readonly<Record<ErrorKind, number>> = {
  user: 2,
  environment: 1,
  bug: 70,
};

export interface CliFailure {
  exitCode: number;
  /** What goes to stderr after "pliant COMMAND: ", ending in a newline. */
  text: string;
}

export function cliFailureOf(error: unknown): CliFailure {
  const report = reportOf(error);
  const exitCode = EXIT_CODE_BY_KIND[report.kind];
  if (report.kind !== 'bug') return { exitCode, text: `${report.message}\n` };
  const trace = error instanceof Error && error.stack ? error.stack : String(error);
  return { exitCode, text: `internal error, a bug in Pliant (please report it with this trace):\n${trace}\n` };
}
