// chain-1024-wasm: the chain-1024 case (chain-1024.ts) stepped by the WebAssembly kernel, one
// call for all 10,000 steps. Same line as chain-1024 (same checksum, bit for bit).
import type { BenchmarkCase } from './benchmark-case.ts';
import { chain1024Case } from './chain-1024.ts';

export const chain1024WasmCase: BenchmarkCase = {
  name: 'chain-1024-wasm',
  run: () => chain1024Case.run({ kernel: 'wasm' }),
};
