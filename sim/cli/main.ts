// The `pliant` command line: dispatches to sub-commands, prints help, and turns whatever a
// command throws into a message and exit code by its kind (exit-codes.ts): 2 for user mistakes,
// 1 for the machine's refusals, 70 and a stack trace only for genuine internal errors.
import { PLIANT_VERSION } from '../scenario/pliant-version.ts';
import { SAFETY_CAUTION } from '../scenario/safety-caution.ts';
import { didYouMean } from './closest-name.ts';
import type { CliIo } from './command.ts';
import { COMMANDS } from './commands.ts';
import { cliFailureOf, EXIT_CODE_BY_KIND } from './exit-codes.ts';

// The prebuilt command line hands its ahead-of-time scenario checker and its bundled episode
// worker in through these (sim/cli/cli-bundle.mjs).
export { usePrebuiltEpisodeWorker } from '../dataset/write/episode-worker-source.ts';
export { usePrebuiltScenarioChecker } from '../scenario/prebuilt-scenario-checker.ts';

export function defaultIo(): CliIo {
  return {
    stdout: (text) => process.stdout.write(text),
    stderr: (text) => process.stderr.write(text),
    isTerminal: Boolean(process.stdout.isTTY),
    env: process.env,
    cwd: process.cwd(),
  };
}

/** Columns of the help text, so it reads in an 80-column terminal (common practice, no source). */
const HELP_WIDTH = 78;

/** Breaks `text` between words into lines of at most `width` characters. */
function wrapWords(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (line !== '' && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else {
      line = line === '' ? word : `${line} ${word}`;
    }
  }
  if (line !== '') lines.push(line);
  return lines;
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
    ...wrapWords(`Exit status: 0 when done; ${EXIT_CODE_BY_KIND.user} for a mistake in the command or its inputs (the message says how to fix it); ${EXIT_CODE_BY_KIND.environment} when the machine or a file got in the way (a full disk, no permission, a damaged file); ${EXIT_CODE_BY_KIND.bug} for a bug in Pliant, with its trace to report.`, HELP_WIDTH),
    '',
    ...wrapWords(SAFETY_CAUTION, HELP_WIDTH),
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
  const entry = COMMANDS.find((c) => c.name === name);
  if (!entry) {
    io.stderr(`pliant: unknown command "${name}"${didYouMean(name, COMMANDS.map((c) => c.name))}. Commands: ${COMMANDS.map((c) => c.name).join(', ')}. Run \`pliant --help\`.\n`);
    return 2;
  }
  const command = await entry.load();
  if (rest.includes('--help') || rest.includes('-h')) {
    io.stdout(`${command.usage.trimEnd()}\n`);
    return 0;
  }
  try {
    return await command.run(rest, io);
  } catch (error) {
    const failure = cliFailureOf(error);
    io.stderr(`pliant ${command.name}: ${failure.text}`);
    return failure.exitCode;
  }
}
