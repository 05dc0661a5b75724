// chain-1024-js-vs-native: throughput of the JavaScript kernel over its C build on this
// machine. The two are run alternately, several times each, so that other load on a shared
// laptop falls on both alike; the ratio is of the two medians. It also states whether the two
// builds ended on the same checksum bit for bit, which they should (same roundings).
import type { BenchmarkCase } from './benchmark-case.ts';
import { CHAIN_1024_STEPS, runChain1024 } from './chain-1024.ts';
import { median } from './median.ts';
import { runNativeChainKernel, withNativeChainKernel } from './native-chain-kernel.ts';

export const COMPARISON_RUNS = 5;

export const chain1024JsVsNativeCase: BenchmarkCase = {
  name: 'chain-1024-js-vs-native',
  async run() {
    return withNativeChainKernel((binaryPath) => {
      const jsRates: number[] = [];
      const nativeRates: number[] = [];
      let sameChecksum = true;
      for (let r = 0; r < COMPARISON_RUNS; r++) {
        const js = runChain1024();
        const native = runNativeChainKernel(binaryPath, CHAIN_1024_STEPS);
        jsRates.push(js.springUpdates / js.seconds);
        nativeRates.push(native.springUpdatesPerS);
        if (js.checksum !== native.checksum) sameChecksum = false;
      }
      const jsMedian = median(jsRates);
      const nativeMedian = median(nativeRates);
      return {
        js_over_native: Number((jsMedian / nativeMedian).toFixed(3)),
        js_spring_updates_per_s: Math.round(jsMedian),
        native_spring_updates_per_s: Math.round(nativeMedian),
        runs: COMPARISON_RUNS,
        statistic: 'median',
        same_checksum: sameChecksum ? 'yes' : 'no',
      };
    });
  },
};
