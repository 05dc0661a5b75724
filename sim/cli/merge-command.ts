// `pliant merge SHARD_DIR... --out DIR`: joins the shard folders of an array job into the one
// dataset a single machine would have written from the same seed file.
import { resolve } from 'node:path';

import { mergeShards } from '../dataset/write/merge-shards.ts';
import { PLIANT_VERSION } from '../scenario/pliant-version.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';
import { shownPath } from './shown-path.ts';

export const mergeCommand: CliCommand = {
  name: 'merge',
  usage: [
    'Usage: pliant merge SHARD_DIR... --out DIR [--force]',
    '',
    'Checks that the shards come from one seed file, that every shard is there once and that',
    'their files match their checksums, then writes DIR: the same data files and checksums a',
    'single machine writes from that seed file.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('merge', args, { valued: ['--out'], switches: ['--force'] });
    const out = parsed.values.get('--out');
    if (out === undefined) throw new CliUsageError('--out DIR is required: the folder for the merged dataset');
    if (parsed.positionals.length === 0) throw new CliUsageError('give the shard folders to merge: pliant merge SHARD_DIR... --out DIR');
    const merged = await withCliFailures('', () =>
      mergeShards({
        shardDirs: parsed.positionals.map((p) => resolve(io.cwd, p)),
        outDir: resolve(io.cwd, out),
        force: parsed.switches.has('--force'),
        pliantVersion: PLIANT_VERSION,
      }),
    );
    io.stdout(`merged ${parsed.positionals.length} shards into ${shownPath(io.cwd, resolve(io.cwd, out))}: ${merged.ok} episodes recorded, ${merged.rejected} rejected, ${merged.dataFileCount} data files\n`);
    return 0;
  },
};
