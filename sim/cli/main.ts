// The `pliant` command line: dispatches to sub-commands, prints help, and turns user mistakes
// into plain messages with exit code 2 (a stack trace only for genuine internal errors).
import { COMMANDS } from './commands.ts';
import { CliUsageError } from './command.ts';
import type { CliIo } from './command.ts';
import { PLIANT_VERSION } from './version.ts';
import { didYouMean } from './closest-name.ts';

export function defaultIo(): CliIo {
  return {
    stdout: (text) => process.stdout.write(text),
    stderr: (text) => process.stderr.write(text),
    isTerminal: Boolean(process.stdout.isTTY),
    env: process.env,
    cwd: process.cwd(),
  };
}

export function helpText(): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length));
  const lines = COMMANDS.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`);
  return [
    `pliant ${PLIANT_VERSION}: mass-spring and voxel soft-body datasets that reproduce bit for bit`,
    '',
    'Usage: pliant <command> [options]',
    '',
    'Commands:',
    ...lines,
    '',
    'Run `pliant <command> --help` for the options of one command.',
    '',
    'Simulated data does not replace hardware testing: bring controllers trained on it up on',
    'hardware with conservative limits and under your lab\'s own safety rules.',
    '',
  ].join('\n');
}

export async function runCli(argv: string[], io: CliIo = defaultIo()): Promise<number> {
  const [name, ...rest] = argv;
  // With no command there is nothing to run: the help goes to stderr and the status is a usage
  // error's, so a script that forgot its command does not pass (common practice, no source).
  if (name === undefined) {
    io.stderr(helpText());
    return 2;
  }
  if (name === '--help' || name === '-h' || name === 'help') {
    io.stdout(helpText());
    return 0;
  }
  if (name === '--version' || name === '-V') {
    io.stdout(`${PLIANT_VERSION}\n`);
    return 0;
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) {
    io.stderr(`pliant: unknown command "${name}"${didYouMean(name, COMMANDS.map((c) => c.name))}. Commands: ${COMMANDS.map((c) => c.name).join(', ')}. Run \`pliant --help\`.\n`);
    return 2;
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    io.stdout(`${command.usage.trimEnd()}\n`);
    return 0;
  }
  try {
    return await command.run(rest, io);
  } catch (error) {
    if (error instanceof CliUsageError) {
      io.stderr(`pliant ${command.name}: ${error.message}\n`);
      return error.exitCode;
    }
    throw error;
  }
}
