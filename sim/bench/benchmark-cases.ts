// Every case `pliant bench` runs, in order.
import type { BenchmarkCase, MultiLineBenchmarkCase } from './benchmark-case.ts';
import { calibrateTetherCase } from './calibrate-tether.ts';
import { chain1024Case } from './chain-1024.ts';
import { chain1024BendingWasmVsNativeCase } from './chain-1024-bending-wasm-vs-native.ts';
import { chain1024JsVsNativeCase } from './chain-1024-js-vs-native.ts';
import { chain1024NativeCase } from './chain-1024-native.ts';
import { chain1024WasmCase } from './chain-1024-wasm.ts';
import { chain1024WasmVsNativeCase } from './chain-1024-wasm-vs-native.ts';
import { chainScalingCase } from './chain-scaling.ts';
import { cliStartCase } from './cli-start.ts';
import { lattice8x8x8Case } from './lattice-8x8x8.ts';
import { lattice8x8x8WasmCase } from './lattice-8x8x8-wasm.ts';
import { lattice8x8x8WasmVsNativeCase } from './lattice-8x8x8-wasm-vs-native.ts';
import { latticeScalingCase } from './lattice-scaling.ts';
import { memoryScalingCase } from './memory-scaling.ts';
import { pipelineEpisodeCases } from './pipeline-episodes.ts';
import { exportHdf5Cases, exportNpzCases } from './pipeline-export.ts';
import { scoreThroughputCase } from './score-throughput.ts';
import { sweepMemoryCase } from './sweep-memory.ts';

export const BENCHMARK_CASES: Array<BenchmarkCase | MultiLineBenchmarkCase> = [
  chain1024Case,
  chain1024NativeCase,
  chain1024JsVsNativeCase,
  chain1024WasmCase,
  chain1024WasmVsNativeCase,
  chain1024BendingWasmVsNativeCase,
  lattice8x8x8Case,
  lattice8x8x8WasmCase,
  lattice8x8x8WasmVsNativeCase,
  ...pipelineEpisodeCases,
  ...exportNpzCases,
  ...exportHdf5Cases,
  sweepMemoryCase,
  scoreThroughputCase,
  calibrateTetherCase,
  cliStartCase,
  chainScalingCase,
  latticeScalingCase,
  memoryScalingCase,
];
