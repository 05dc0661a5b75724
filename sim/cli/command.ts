// The shape of one `pliant` sub-command: its name, usage text and runner (its one-line summary
// is in the command table, sim/cli/commands.ts, so the help needs no command module).
// Runners return the process exit code; user mistakes are reported through CliUsageError.

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

/** A mistake by the user (bad flag, bad file): printed as a message, never as a stack trace. */
export class CliUsageError extends Error {
  constructor(message: string, readonly exitCode = 2) {
    super(message);
    this.name = 'CliUsageError';
  }
}
