// `pliant bench`: runs the benchmark cases and prints one JSON object per line. Benchmarks
// measure; they are not tests and never fail on a time.
import { resolve } from 'node:path';

import { BENCHMARK_CASES } from '../bench/benchmark-cases.ts';
import { DEFAULT_BENCH_OUT_DIR } from '../bench/scaling-chart.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import { STEP_KERNELS } from '../core/step-kernel-choice.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';

export const benchCommand: CliCommand = {
  name: 'bench',
  usage: [
    'Usage: pliant bench [--case NAME]... [--kernel js|wasm] [--out DIR]',
    '',
    'Runs the benchmark cases and prints one JSON object per line.',
    '--out is where the scaling cases write their charts (default bench-output/ here).',
    '--kernel picks the step kernel of chain-1024 and lattice-8x8x8 (default js); the -wasm and',
    '-vs-native cases name their kernels themselves. Both kernels give the same bits.',
    `Cases: ${[...new Set(BENCHMARK_CASES.map((c) => c.name))].join(', ')}`,
  ].join('\n'),
  async run(args, io) {
    const chosen: string[] = [];
    let kernel: StepKernel | undefined;
    let outDir = resolve(io.cwd, DEFAULT_BENCH_OUT_DIR);
    for (let i = 0; i < args.length; i++) {
      if (args[i] === '--case' && args[i + 1] !== undefined) chosen.push(args[++i]);
      else if (args[i] === '--out' && args[i + 1] !== undefined) outDir = resolve(io.cwd, args[++i]);
      else if (args[i] === '--kernel' && args[i + 1] !== undefined) {
        const value = args[++i];
        if (!(STEP_KERNELS as readonly string[]).includes(value)) throw new CliUsageError(`--kernel must be ${STEP_KERNELS.join(' or ')}, got "${value}"`);
        kernel = value as StepKernel;
      } else throw new CliUsageError(`unknown option "${args[i]}"; see \`pliant bench --help\``);
    }
    for (const name of chosen) {
      if (!BENCHMARK_CASES.some((c) => c.name === name)) {
        throw new CliUsageError(`unknown case "${name}"; cases: ${BENCHMARK_CASES.map((c) => c.name).join(', ')}`);
      }
    }
    for (const benchCase of BENCHMARK_CASES) {
      if (chosen.length > 0 && !chosen.includes(benchCase.name)) continue;
      const lines = 'runLines' in benchCase ? await benchCase.runLines({ kernel, outDir }) : [await benchCase.run({ kernel, outDir })];
      for (const line of lines) io.stdout(`${JSON.stringify({ case: benchCase.name, ...line })}\n`);
    }
    return 0;
  },
};
