// The shape of one `pliant` sub-command: its name, usage text and runner (its one-line summary
// is in the command table, sim/cli/commands.ts, so the help needs no command module).
// Runners return the process exit code; user mistakes are reported through CliUsageError, other
// expected failures through their own PliantError, and main.ts turns each kind into an exit code.
import { PliantError } from '../errors/pliant-error.ts';

export interface CliIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  /** True when stdout is a terminal (progress bars), false for pipes and files. */
  isTerminal: boolean;
  env: Record<string, string | undefined>;
  cwd: string;
}

export interface CliCommand {
  name: string;
  usage: string;
  run(args: string[], io: CliIo): Promise<number>;
}

/**
 * A mistake by the user (bad flag, bad file): printed as a message, never as a stack trace, exit
 * code 2. Only for the person's mistakes: a full disk or a refused permission is the machine's
 * state and keeps its own environment-kind error (exit code 1).
 */
export class CliUsageError extends PliantError {
  constructor(message: string) {
    super('user', 'usage', message);
    this.name = 'CliUsageError';
  }
}
