// `pliant verify DIR`: checks a dataset's manifest against its schema and every file against
// its SHA-256. Exit 0 when everything matches, 1 on any mismatch or missing file.
import { resolve } from 'node:path';

import { COMMAND_LINE_WORDS, wordRun } from '../dataset/formats/run-words.ts';
import { verifyDataset } from '../dataset/read/verify-dataset.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';

export const verifyCommand: CliCommand = {
  name: 'verify',
  usage: [
    'Usage: pliant verify DIR',
    '',
    'Checks DIR/manifest.json against its JSON Schema and every file it lists for presence,',
    'size and SHA-256. Exit status: 0 when all match, 1 on any problem.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('verify', args, { valued: [], switches: [] });
    if (parsed.positionals.length !== 1) throw new CliUsageError('give exactly one dataset folder: pliant verify DIR');
    const dir = parsed.positionals[0];
    const report = await withCliFailures('', () => verifyDataset(resolve(io.cwd, dir)));
    if (report.ok) {
      io.stdout(`${dir}: ok — ${report.verifiedFileCount} files match the manifest's SHA-256${report.episodeRecordsChecked ? ', and so do its episode records' : ''}; no unlisted files\n`);
      if (!report.episodeRecordsChecked) io.stdout('note: this manifest predates the checksum of its episode records, so labels and splits were not checked; `pliant reproduce` checks them against the seed file\n');
      return 0;
    }
    io.stderr(`${dir}: ${report.problemCount} problem${report.problemCount === 1 ? '' : 's'}\n${report.problems.map((p) => `  ${wordRun(p, COMMAND_LINE_WORDS)}`).join('\n')}\n`);
    return 1;
  },
};
