// The compiled WebAssembly step kernel, shared by every WasmStepper of this thread. Compiled
// synchronously on first use from the bytes embedded in step-kernel-bytes.ts, so it works the
// same in the CLI, in worker threads and in a page's Web Worker, and nothing is read or fetched.
// Synchronous compilation is fine off a page's main thread (browsers limit it to small modules
// there); Pliant steps in workers only. WebAssembly is reached through globalThis with a
// minimal local type, because the environment-free core is type-checked without DOM or Node
// types. Where it is missing or refused (a Content-Security-Policy without 'wasm-unsafe-eval'),
// `stepKernelModule()` says why and the simulator keeps to the JavaScript kernel.
import { bytesFromBase64 } from './base64-bytes.ts';
import { STEP_KERNEL_BASE64 } from './step-kernel-bytes.ts';

export interface WasmMemoryLike {
  readonly buffer: ArrayBuffer;
}

/** The exports of the kernel (sim/core/wasm/assembly/step-kernel.ts); offsets are bytes. */
export interface StepKernelExports {
  setNodeLayout(count: number, x: number, v: number, m: number, invM: number, volume: number, f: number): void;
  setSpringLayout(count: number, table: number): void;
  setHingeLayout(count: number, table: number): void;
  setClampLayout(count: number, table: number): void;
  setPanelLayout(count: number, nodesPerPanel: number, nodes: number, widthM: number): void;
  setHandleLayout(count: number, nodes: number, forces: number): void;
  setDrivenLayout(count: number, nodes: number, start: number, target: number, velocity: number): void;
  setWorld(
    gx: number, gy: number, gz: number, drag: number, buoyantDensity: number,
    ground: number, heightM: number, muS: number, muK: number,
    fluid: number, cn: number, ct: number, fx: number, fy: number, fz: number,
  ): void;
  step(dtS: number): void;
  advanceSteps(dtS: number, count: number): void;
  advanceInterval(intervalS: number, substeps: number): void;
}

interface WebAssemblyApi {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: object) => { exports: Record<string, unknown> };
  Memory: new (descriptor: { initial: number; maximum?: number }) => WasmMemoryLike;
}

export const WASM_PAGE_BYTES = 65536;

type Compiled = { ok: true; api: WebAssemblyApi; module: object } | { ok: false; reason: string };
let compiled: Compiled | undefined;

/** Compiles the kernel once per thread; the outcome, good or bad, is kept. */
export function stepKernelModule(): Compiled {
  if (compiled !== undefined) return compiled;
  const api = (globalThis as unknown as { WebAssembly?: WebAssemblyApi }).WebAssembly;
  if (api === undefined || typeof api.Module !== 'function') {
    compiled = { ok: false, reason: 'this JavaScript environment has no WebAssembly' };
    return compiled;
  }
  try {
    compiled = { ok: true, api, module: new api.Module(bytesFromBase64(STEP_KERNEL_BASE64)) };
  } catch (error) {
    compiled = { ok: false, reason: `WebAssembly is refused here (${error instanceof Error ? error.message : String(error)}); a Content-Security-Policy needs 'wasm-unsafe-eval' in script-src` };
  }
  return compiled;
}

/** A fresh instance of the kernel over a fresh memory of `pages` 64 KiB pages (never grown). */
export function instantiateStepKernel(pages: number): { kernel: StepKernelExports; memory: WasmMemoryLike } {
  const module = stepKernelModule();
  if (!module.ok) throw new Error(`the WebAssembly step kernel cannot run: ${module.reason}`);
  const memory = new module.api.Memory({ initial: pages, maximum: pages });
  const instance = new module.api.Instance(module.module, { env: { memory } });
  return { kernel: instance.exports as unknown as StepKernelExports, memory };
}
