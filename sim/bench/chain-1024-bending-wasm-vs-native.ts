// chain-1024-bending-wasm-vs-native: the chain-1024-bending case (chain-1024-bending.ts) run by
// the JavaScript kernel, the WebAssembly kernel and the C build (native/chain_kernel.c with
// "bending") alternately, five times each; medians and ratios per wall and per CPU second, as
// chain-1024-wasm-vs-native. Without gcc the line carries JavaScript and WebAssembly and says why.
import type { ComparedBuild } from './alternating-comparison.ts';
import { compareAlternately } from './alternating-comparison.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { CHAIN_1024_STEPS } from './chain-1024.ts';
import { runChain1024Bending } from './chain-1024-bending.ts';
import { WASM_COMPARISON_RUNS } from './chain-1024-wasm-vs-native.ts';
import { buildNativeChainKernel, runNativeChainKernel } from './native-chain-kernel.ts';

function kernelBuild(kernel: 'js' | 'wasm'): ComparedBuild {
  return {
    name: kernel,
    run() {
      const r = runChain1024Bending(kernel);
      // A fallback would make this JavaScript against itself; the line must not say wasm then.
      if (r.kernel !== kernel) throw new Error(`chain-1024-bending asked for kernel ${kernel} but ran ${r.kernel}`);
      return { springUpdatesPerS: r.springUpdates / r.seconds, seconds: r.seconds, cpuSeconds: r.cpuSeconds, checksum: r.checksum };
    },
  };
}

export const chain1024BendingWasmVsNativeCase: BenchmarkCase = {
  name: 'chain-1024-bending-wasm-vs-native',
  async run(): Promise<Record<string, number | string>> {
    const build = buildNativeChainKernel();
    try {
      if (!build.ok) return { ...compareAlternately([kernelBuild('js'), kernelBuild('wasm')], [['wasm', 'js']], WASM_COMPARISON_RUNS), native_skipped: build.reason };
      const native: ComparedBuild = { name: 'native', run: () => runNativeChainKernel(build.binaryPath, CHAIN_1024_STEPS, 'bending') };
      const builds = [kernelBuild('js'), kernelBuild('wasm'), native];
      return { ...compareAlternately(builds, [['wasm', 'native'], ['js', 'native'], ['wasm', 'js']], WASM_COMPARISON_RUNS), compiler: build.compiler };
    } catch (error) {
      return { failed: (error as Error).message };
    } finally {
      if (build.ok) build.dispose();
    }
  },
};
