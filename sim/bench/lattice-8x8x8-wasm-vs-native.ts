// lattice-8x8x8-wasm-vs-native: the lattice-8x8x8 case run by the JavaScript kernel, the
// WebAssembly kernel and the C build of the same lattice kernel (native/lattice_kernel.c, the
// flags of the chain kernel) alternately, five times each; medians and their ratios, per wall
// and per CPU second (alternating-comparison.ts). Without gcc the line carries the JavaScript
// and WebAssembly throughputs and the reason.
import type { ComparedBuild } from './alternating-comparison.ts';
import { compareAlternately } from './alternating-comparison.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { WASM_COMPARISON_RUNS } from './chain-1024-wasm-vs-native.ts';
import { LATTICE_INTERVALS, runLattice8x8x8 } from './lattice-8x8x8.ts';
import { runNativeLatticeKernel, withNativeLatticeKernel } from './native-lattice-kernel.ts';

function kernelBuild(kernel: 'js' | 'wasm'): ComparedBuild {
  return {
    name: kernel,
    run() {
      const r = runLattice8x8x8(LATTICE_INTERVALS, kernel);
      return { springUpdatesPerS: (r.springs * r.steps) / r.seconds, seconds: r.seconds, cpuSeconds: r.cpuSeconds, checksum: r.checksum };
    },
  };
}

export const lattice8x8x8WasmVsNativeCase: BenchmarkCase = {
  name: 'lattice-8x8x8-wasm-vs-native',
  async run() {
    const line = withNativeLatticeKernel(LATTICE_INTERVALS, (binaryPath, modelPath, compiler) => {
      const native: ComparedBuild = { name: 'native', run: () => runNativeLatticeKernel(binaryPath, modelPath) };
      const builds = [kernelBuild('js'), kernelBuild('wasm'), native];
      return { ...compareAlternately(builds, [['wasm', 'native'], ['js', 'native'], ['wasm', 'js']], WASM_COMPARISON_RUNS), compiler };
    });
    if (typeof line.skipped === 'string') {
      return { ...compareAlternately([kernelBuild('js'), kernelBuild('wasm')], [['wasm', 'js']], WASM_COMPARISON_RUNS), native_skipped: line.skipped };
    }
    return line;
  },
};
