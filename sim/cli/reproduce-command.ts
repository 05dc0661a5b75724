// `pliant reproduce DIR/seed.json --out DIR2`: regenerates a dataset from its seed file and
// reports, file by file, whether the new bytes are identical. Exit 1 on any difference.
import { resolve } from 'node:path';

import { MANIFEST_FILE } from '../dataset/manifest/dataset-files.ts';
import { reproduceDataset, seedEditedWords } from '../dataset/write/reproduce-dataset.ts';
import { PLIANT_VERSION } from '../scenario/pliant-version.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';
import { progressOption, workersOption } from './generate-options.ts';
import { stopOnInterrupt } from './interrupt-stop.ts';
import { ProgressDisplay } from './progress-display.ts';

export const reproduceCommand: CliCommand = {
  name: 'reproduce',
  usage: [
    'Usage: pliant reproduce DIR/seed.json --out DIR2 [--workers W] [--force] [--progress bar|json|none]',
    '',
    'Regenerates the dataset the seed file describes into DIR2, then compares every file the',
    'two manifests list, byte for byte. Exit status: 0 when all are identical, 1 otherwise.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('reproduce', args, { valued: ['--out', '--workers', '--progress'], switches: ['--force'] });
    if (parsed.positionals.length !== 1) throw new CliUsageError('give exactly one seed file: pliant reproduce DIR/seed.json --out DIR2');
    const out = parsed.values.get('--out');
    if (out === undefined) throw new CliUsageError('--out DIR2 is required: the folder to regenerate into');
    const workers = workersOption(parsed);
    const progress = progressOption(parsed, io);
    const display = new ProgressDisplay(progress, io.stdout);
    const stop = stopOnInterrupt(io);
    const seedPath = parsed.positionals[0];
    let report;
    try {
      report = await withCliFailures(seedPath, () =>
        reproduceDataset({
          seedPath: resolve(io.cwd, seedPath),
          outDir: resolve(io.cwd, out),
          workers,
          force: parsed.switches.has('--force'),
          pliantVersion: PLIANT_VERSION,
          onEvent: display.onEvent,
          shouldStop: stop.requested,
        }),
      );
    } finally {
      stop.release();
    }
    if (report.generated.status === 'stopped') {
      io.stderr('stopped before the regeneration finished; nothing was compared\n');
      return 130;
    }
    if (report.seedVersion !== PLIANT_VERSION) {
      io.stdout(`note: the seed file was written by Pliant ${report.seedVersion}, this is ${PLIANT_VERSION}\n`);
    }
    const seedEdited = report.seedFile.matches === false;
    if (seedEdited) io.stdout(`${seedEditedWords(report.seedFile)}\n`);
    // The manifest is compared without its `run` member, which differs between runs by design.
    const shown = report.comparisons.map((c) => ({ path: c.path === MANIFEST_FILE ? `${MANIFEST_FILE} (all but "run")` : c.path, result: c.result }));
    const width = Math.max(...shown.map((c) => c.path.length));
    for (const c of shown) io.stdout(`${c.path.padEnd(width)}  ${c.result}\n`);
    const different = report.comparisons.filter((c) => c.result !== 'identical').length;
    io.stdout(different === 0 ? `all ${report.comparisons.length} files identical\n` : `${different} of ${report.comparisons.length} files differ${seedEdited ? ' (the seed file was edited: see above)' : ''}\n`);
    return different === 0 ? 0 : 1;
  },
};
