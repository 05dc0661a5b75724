// `pliant bench`: runs the benchmark cases and prints one JSON object per line. Benchmarks
// measure; they are not tests and never fail on a time.
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { BENCHMARK_CASES } from '../bench/benchmark-cases.ts';
import { STEP_KERNELS } from '../core/step-kernel-choice.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';

export const benchCommand: CliCommand = {
  name: 'bench',
  usage: [
    'Usage: pliant bench [--case NAME]... [--kernel js|wasm]',
    '',
    'Runs the benchmark cases and prints one JSON object per line.',
    '--kernel picks the step kernel of chain-1024 and lattice-8x8x8 (default js); the -wasm and',
    '-vs-native cases name their kernels themselves. Both kernels give the same bits.',
    `Cases: ${[...new Set(BENCHMARK_CASES.map((c) => c.name))].join(', ')}`,
  ].join('\n'),
  async run(args, io) {
    const chosen: string[] = [];
    let kernel: StepKernel | undefined;
    for (let i = 0; i < args.length; i++) {
      if (args[i] === '--case' && args[i + 1] !== undefined) chosen.push(args[++i]);
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
      const result = await benchCase.run({ kernel });
      io.stdout(`${JSON.stringify({ case: benchCase.name, ...result })}\n`);
    }
    return 0;
  },
};
