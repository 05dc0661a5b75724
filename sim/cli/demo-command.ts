// `pliant demo`: generates the Korrin Bay demo datasets (tether, fin, eel) from scenarios/ into
// one folder and prints where they are and how to open them in Python. Re-running it finishes
// or keeps what is already there.
import { readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

import { generateDataset } from '../dataset/write/generate-dataset.ts';
import { PLIANT_VERSION } from '../scenario/pliant-version.ts';
import { SAFETY_CAUTION } from '../scenario/safety-caution.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';
import { progressOption, workersOption } from './generate-options.ts';
import { ProgressDisplay } from './progress-display.ts';
import { loadScenarioFile, reportingScenarioProblems } from './scenario-file.ts';
import { shownPath } from './shown-path.ts';

const DEMO_SCENARIOS = fileURLToPath(new URL('../../scenarios/', import.meta.url));

export const demoCommand: CliCommand = {
  name: 'demo',
  usage: [
    'Usage: pliant demo [--out DIR] [--workers W] [--progress bar|json|none]',
    '',
    'Generates every scenario in scenarios/ (the Korrin Bay test tank demos) into DIR/<name>',
    '(default datasets/demo). Finished datasets are kept; interrupted ones are resumed.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('demo', args, { valued: ['--out', '--workers', '--progress'], switches: [] });
    if (parsed.positionals.length > 0) throw new CliUsageError(`unexpected argument "${parsed.positionals[0]}"; see \`pliant demo --help\``);
    const outRoot = resolve(io.cwd, parsed.values.get('--out') ?? 'datasets/demo');
    const workers = workersOption(parsed);
    const progress = progressOption(parsed, io);
    const files = readdirSync(DEMO_SCENARIOS).filter((name) => name.endsWith('.json')).sort();
    const written: string[] = [];
    for (const file of files) {
      const load = await loadScenarioFile(join(DEMO_SCENARIOS, file), io.cwd);
      if (!load.ok) {
        io.stderr(`${load.report}\n`);
        return 2;
      }
      const scenario = load.loaded.scenario;
      const outDir = join(outRoot, scenario.name);
      io.stdout(`${scenario.name}: ${scenario.episodes} episodes → ${shownPath(io.cwd, outDir)}\n`);
      const display = new ProgressDisplay(progress, io.stdout);
      const code = await withCliFailures(file, () =>
        reportingScenarioProblems(io, load.loaded, async () => {
          const result = await generateDataset({
            scenario,
            inputs: { kind: 'scenario', scenarioDir: load.loaded.directory },
            outDir,
            shard: null,
            workers,
            resume: true,
            force: false,
            pliantVersion: PLIANT_VERSION,
            onEvent: display.onEvent,
            runInfo: { command: ['pliant', 'demo', ...args] },
          });
          io.stdout(`  ${result.status === 'already-complete' ? 'already there' : 'done'}: ${result.ok} recorded, ${result.rejected} rejected\n`);
          return 0;
        }),
      );
      if (code !== 0) return code;
      written.push(outDir);
    }
    const first = written[0];
    io.stdout([
      '',
      `Demo datasets are in ${shownPath(io.cwd, outRoot)}. Each folder has CARD.md (what is in it), manifest.json and seed.json.`,
      'Load one in Python (NumPy; h5py for the .h5 files):',
      '',
      `  cd ${shownPath(io.cwd, first)}`,
      '  python3 -c "import json, numpy as np; m = json.load(open(\'manifest.json\')); e = next(x for x in m[\'episodes\'] if x[\'status\'] == \'ok\'); a = np.load(\'episodes/\' + e[\'id\'] + \'.npz\'); print(e[\'id\'], a[\'positions\'].shape)"',
      '',
      `Caution: ${SAFETY_CAUTION}`,
      '',
    ].join('\n'));
    return 0;
  },
};
