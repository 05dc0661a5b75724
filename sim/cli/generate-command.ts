// `pliant generate SCENARIO --out DIR`: samples, simulates and writes a labelled, split,
// checksummed dataset (or one shard of it), resumable after any interruption.
import { resolve } from 'node:path';

import { CARD_FILE } from '../dataset/manifest/dataset-files.ts';
import type { GenerateResult } from '../dataset/write/generate-dataset.ts';
import { generateDataset } from '../dataset/write/generate-dataset.ts';
import type { ShardPlan } from '../dataset/write/shard-plan.ts';
import { SHARD_COUNT_VARIABLE } from '../dataset/write/shard-plan.ts';
import { PLIANT_VERSION } from '../scenario/pliant-version.ts';
import { withOverrides } from '../scenario/scenario-overrides.ts';
import type { CliCommand, CliIo } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { withCliFailures } from './dataset-failure.ts';
import { overrideOptions, progressOption, shardOption, workersOption } from './generate-options.ts';
import { stopOnInterrupt } from './interrupt-stop.ts';
import type { ProgressMode } from './progress-display.ts';
import { ProgressDisplay } from './progress-display.ts';
import { loadScenarioFile, reportingScenarioProblems } from './scenario-file.ts';
import { shownPath } from './shown-path.ts';

export const generateCommand: CliCommand = {
  name: 'generate',
  usage: [
    'Usage: pliant generate SCENARIO --out DIR [--episodes N] [--seed S] [--workers W]',
    '                       [--shard I/N | --shard auto [--shard-count N]] [--format npz|hdf5|both]',
    '                       [--resume] [--force] [--progress bar|json|none]',
    '',
    'Samples every episode of SCENARIO, simulates it and writes DIR (see sim/dataset/LAYOUT.md):',
    '  seed.json, manifest.json, CARD.md, episodes/<id>.npz and/or <split>.h5.',
    '',
    '  --out DIR          folder to write; must be new or empty unless --resume or --force',
    '  --episodes N       override the scenario\'s episode count',
    '  --seed S           override the master seed (0 to 2^64 - 1)',
    '  --format F         npz (one file per episode), hdf5 (one file per split) or both',
    '  --workers W        worker threads (default: all cores); never changes the output',
    '  --shard I/N        compute only episodes whose index % N == I (for array jobs); merge with `pliant merge`',
    '  --shard auto       take I and N from SLURM_ARRAY_TASK_ID/SLURM_ARRAY_TASK_COUNT, or from',
    `                     JOB_COMPLETION_INDEX with --shard-count N or ${SHARD_COUNT_VARIABLE} (Kubernetes Indexed Jobs)`,
    '  --resume           finish an interrupted run in DIR, keeping finished episodes',
    '  --force            replace the Pliant dataset already in DIR',
    '  --progress P       bar (default on a terminal), json (one object per line) or none',
    '',
    'Unstable episodes are listed as rejected in the manifest, with the reason, and get no files.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('generate', args, {
      valued: ['--out', '--episodes', '--seed', '--workers', '--shard', '--shard-count', '--format', '--progress'],
      switches: ['--resume', '--force'],
    });
    if (parsed.positionals.length !== 1) throw new CliUsageError('give exactly one scenario file: pliant generate SCENARIO --out DIR');
    const outDir = parsed.values.get('--out');
    if (outDir === undefined) throw new CliUsageError('--out DIR is required: the folder to write the dataset into');
    if (parsed.switches.has('--resume') && parsed.switches.has('--force')) throw new CliUsageError('give --resume or --force, not both');
    const workers = workersOption(parsed);
    const progress = progressOption(parsed, io);
    const overrides = overrideOptions(parsed);
    const plan = await withCliFailures('scenario', async () => shardOption(parsed, io));

    const [scenarioPath] = parsed.positionals;
    const load = await loadScenarioFile(scenarioPath, io.cwd);
    if (!load.ok) {
      io.stderr(`${load.report}\n`);
      return 2;
    }
    const loaded = load.loaded;
    const display = new ProgressDisplay(progress, io.stdout);
    const stop = stopOnInterrupt(io);
    try {
      return await withCliFailures(loaded.displayName, () =>
        reportingScenarioProblems(io, loaded, async () => {
          const result = await generateDataset({
            scenario: withOverrides(loaded.scenario, overrides),
            inputs: { kind: 'scenario', scenarioDir: loaded.directory },
            outDir: resolve(io.cwd, outDir),
            shard: plan,
            workers,
            resume: parsed.switches.has('--resume'),
            force: parsed.switches.has('--force'),
            pliantVersion: PLIANT_VERSION,
            onEvent: display.onEvent,
            shouldStop: stop.requested,
            runInfo: { command: ['pliant', 'generate', ...args] },
          });
          return reportResult(io, result, progress, plan);
        }),
      );
    } finally {
      stop.release();
    }
  },
};

function reportResult(io: CliIo, result: GenerateResult, progress: ProgressMode, plan: ShardPlan | null): number {
  const where = shownPath(io.cwd, result.outDir);
  if (result.status === 'stopped') {
    io.stderr(`stopped after ${result.ok + result.rejected} episodes; run the same command with --resume to finish ${where}\n`);
    return 130;
  }
  if (progress !== 'json') {
    const what = result.status === 'already-complete' ? 'already complete' : 'wrote';
    io.stdout(`${what} ${where}: ${result.ok} episodes recorded, ${result.rejected} rejected${plan && plan.count > 1 ? ` (shard ${plan.index}/${plan.count})` : ''}; see ${where}/${CARD_FILE}\n`);
  }
  return 0;
}
