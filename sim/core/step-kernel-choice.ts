// Which implementation of the step a Simulator runs: the JavaScript kernel (the specification
// and the fallback) or its WebAssembly build (sim/core/wasm/), which performs the same
// operations in the same order and so produces the same bits. The choice never changes a
// result, so datasets and seed files do not record it. This file says whether WebAssembly can
// run at all; whether it implements a given model's passes is wasm/wasm-kernel-coverage.ts,
// which the Simulator asks next.
import { stepKernelModule } from './wasm/step-kernel-module.ts';

export type StepKernel = 'js' | 'wasm';

export const STEP_KERNELS: readonly StepKernel[] = ['js', 'wasm'];

/** The kernel to use: as asked, or by default WebAssembly where it can run, else JavaScript. */
export function resolveStepKernel(requested?: StepKernel): StepKernel {
  if (requested === 'js') return 'js';
  const wasm = stepKernelModule();
  if (requested === 'wasm' && !wasm.ok) throw new Error(`kernel "wasm" was asked for, but ${wasm.reason}; use kernel "js"`);
  return wasm.ok ? 'wasm' : 'js';
}
