// `pliant bench`: runs the benchmark cases and prints one JSON object per line. Benchmarks
// measure; they are not tests and never fail on a time.
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { BENCHMARK_CASES } from '../bench/benchmark-cases.ts';

export const benchCommand: CliCommand = {
  name: 'bench',
  summary: 'measure simulation and export throughput (one JSON line per case)',
  usage: [
    'Usage: pliant bench [--case NAME]...',
    '',
    'Runs the benchmark cases and prints one JSON object per line.',
    `Cases: ${[...new Set(BENCHMARK_CASES.map((c) => c.name))].join(', ')}`,
  ].join('\n'),
  async run(args, io) {
    const chosen: string[] = [];
    for (let i = 0; i < args.length; i++) {
      if (args[i] === '--case' && args[i + 1] !== undefined) chosen.push(args[++i]);
      else throw new CliUsageError(`unknown option "${args[i]}"; see \`pliant bench --help\``);
    }
    for (const name of chosen) {
      if (!BENCHMARK_CASES.some((c) => c.name === name)) {
        throw new CliUsageError(`unknown case "${name}"; cases: ${BENCHMARK_CASES.map((c) => c.name).join(', ')}`);
      }
    }
    for (const benchCase of BENCHMARK_CASES) {
      if (chosen.length > 0 && !chosen.includes(benchCase.name)) continue;
      const result = await benchCase.run();
      io.stdout(`${JSON.stringify({ case: benchCase.name, ...result })}\n`);
    }
    return 0;
  },
};
