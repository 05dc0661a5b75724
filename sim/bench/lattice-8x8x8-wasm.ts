// lattice-8x8x8-wasm: the lattice-8x8x8 case (lattice-8x8x8.ts) stepped by the WebAssembly
// kernel. Same line as lattice-8x8x8 (same checksum, bit for bit).
import type { BenchmarkCase } from './benchmark-case.ts';
import { lattice8x8x8Case } from './lattice-8x8x8.ts';

export const lattice8x8x8WasmCase: BenchmarkCase = {
  name: 'lattice-8x8x8-wasm',
  run: () => lattice8x8x8Case.run({ kernel: 'wasm' }),
};
