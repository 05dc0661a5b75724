// chain-1024-wasm-vs-native: the chain-1024 case run by the JavaScript kernel, the WebAssembly
// kernel and the C build (native/chain_kernel.c, gcc -O3 -march=native -ffp-contract=off)
// alternately, five times each; medians and their ratios, per wall and per CPU second
// (alternating-comparison.ts). Without gcc the line still carries the JavaScript and
// WebAssembly throughputs and says why the C build is missing.
import type { ComparedBuild } from './alternating-comparison.ts';
import { compareAlternately } from './alternating-comparison.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { CHAIN_1024_STEPS, runChain1024 } from './chain-1024.ts';
import { buildNativeChainKernel, runNativeChainKernel } from './native-chain-kernel.ts';

export const WASM_COMPARISON_RUNS = 5;

function kernelBuild(kernel: 'js' | 'wasm'): ComparedBuild {
  return {
    name: kernel,
    run() {
      const r = runChain1024(kernel);
      return { springUpdatesPerS: r.springUpdates / r.seconds, seconds: r.seconds, cpuSeconds: r.cpuSeconds, checksum: r.checksum };
    },
  };
}

export const chain1024WasmVsNativeCase: BenchmarkCase = {
  name: 'chain-1024-wasm-vs-native',
  async run(): Promise<Record<string, number | string>> {
    const build = buildNativeChainKernel();
    if (!build.ok) return { ...compareAlternately([kernelBuild('js'), kernelBuild('wasm')], [['wasm', 'js']], WASM_COMPARISON_RUNS), native_skipped: build.reason };
    try {
      const native: ComparedBuild = { name: 'native', run: () => runNativeChainKernel(build.binaryPath, CHAIN_1024_STEPS) };
      const builds = [kernelBuild('js'), kernelBuild('wasm'), native];
      return { ...compareAlternately(builds, [['wasm', 'native'], ['js', 'native'], ['wasm', 'js']], WASM_COMPARISON_RUNS), compiler: build.compiler };
    } catch (error) {
      return { failed: (error as Error).message };
    } finally {
      build.dispose();
    }
  },
};
