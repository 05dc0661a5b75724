// chain-1024-native: the chain-1024 case run by its plain C build (native/chain_kernel.c,
// gcc -O3 -march=native), the yardstick for the JavaScript kernel. Several runs, median kept.
import type { BenchmarkCase } from './benchmark-case.ts';
import { CHAIN_1024_STEPS } from './chain-1024.ts';
import { median } from './median.ts';
import { NATIVE_FLAGS, runNativeChainKernel, withNativeChainKernel } from './native-chain-kernel.ts';

export const NATIVE_RUNS = 5;

export const chain1024NativeCase: BenchmarkCase = {
  name: 'chain-1024-native',
  async run() {
    return withNativeChainKernel((binaryPath, compiler) => {
      const rates: number[] = [];
      const seconds: number[] = [];
      let checksum = NaN;
      for (let r = 0; r < NATIVE_RUNS; r++) {
        const run = runNativeChainKernel(binaryPath, CHAIN_1024_STEPS);
        rates.push(run.springUpdatesPerS);
        seconds.push(run.seconds);
        checksum = run.checksum;
      }
      return {
        spring_updates_per_s: Math.round(median(rates)),
        seconds: Number(median(seconds).toFixed(4)),
        checksum: Number(checksum.toPrecision(10)),
        runs: NATIVE_RUNS,
        statistic: 'median',
        compiler,
        flags: NATIVE_FLAGS.join(' '),
      };
    });
  },
};
