// `pliant loader [--out PATH]`: prints the Python loader shipped with Pliant (pliant_data.py),
// or writes it to PATH, so a dataset folder drops straight into a NumPy or PyTorch training loop.
import { existsSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

import { PYTHON_LOADER_FILE_NAME, pythonLoaderSource } from '../dataset/card/python-loader-source.ts';
import { writeFileAtomic } from '../dataset/formats/atomic-file.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';

export const loaderCommand: CliCommand = {
  name: 'loader',
  usage: [
    'Usage: pliant loader [--out PATH]',
    '',
    `Prints ${PYTHON_LOADER_FILE_NAME}, a one-file Python module that lists a dataset's episodes per`,
    'split, loads them from NPZ (or the split HDF5 files, with h5py), cuts history/horizon windows,',
    'pads and masks batches of different node counts, normalises with per-split statistics and,',
    'when torch is importable, offers a PyTorch Dataset. It needs only NumPy.',
    '',
    `  --out PATH   write the module to PATH (a folder gets PATH/${PYTHON_LOADER_FILE_NAME}) instead of printing it`,
    '',
    'Example:  pliant loader --out .   then in Python:  import pliant_data',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('loader', args, { valued: ['--out'], switches: [] });
    if (parsed.positionals.length > 0) throw new CliUsageError(`pliant loader takes no folder or file (got "${parsed.positionals[0]}"); to write the module give --out PATH`);
    const source = pythonLoaderSource();
    const out = parsed.values.get('--out');
    if (out === undefined) {
      io.stdout(source);
      return 0;
    }
    let target = resolve(io.cwd, out);
    if (existsSync(target) && statSync(target).isDirectory()) target = join(target, PYTHON_LOADER_FILE_NAME);
    await withCliFailures('', async () => writeFileAtomic(target, new TextEncoder().encode(source)));
    io.stdout(`wrote ${target} (${Buffer.byteLength(source)} bytes); import it as pliant_data from the folder it is in\n`);
    return 0;
  },
};
