// The WebAssembly bench lines, the C build of the lattice kernel
// (sim/bench/native/lattice_kernel.c) and the C build of chain-1024-bending
// (native/chain_kernel.c with "bending", the hinge and clamp passes of bending-forces.ts). The C build steps the model file written by
// native-lattice-kernel.ts with the same operations in the same order, so by IEEE 754
// correct rounding of +, −, ×, ÷ and sqrt (IEEE 754-2008 §4.3, §5.4; gcc with
// -ffp-contract=off fuses nothing) its checksum must equal the JavaScript kernel's bit for bit,
// as must the WebAssembly kernel's (WebAssembly Core Specification 2.0 §4.3.3). Where gcc is
// missing the lines must say so and still carry the JavaScript and WebAssembly throughputs.
// No time is asserted; benchmarks measure.
import { describe, expect, it } from 'vitest';

import { compareAlternately } from '../sim/bench/alternating-comparison.ts';
import { runChain1024 } from '../sim/bench/chain-1024.ts';
import { buildChain1024Bending, runChain1024Bending } from '../sim/bench/chain-1024-bending.ts';
import { chain1024WasmCase } from '../sim/bench/chain-1024-wasm.ts';
import { runLattice8x8x8 } from '../sim/bench/lattice-8x8x8.ts';
import { lattice8x8x8WasmVsNativeCase } from '../sim/bench/lattice-8x8x8-wasm-vs-native.ts';
import { buildNativeChainKernel, buildNativeKernel, runNativeChainKernel } from '../sim/bench/native-chain-kernel.ts';
import { runNativeLatticeKernel, withNativeLatticeKernel } from '../sim/bench/native-lattice-kernel.ts';

const INTERVALS = 12;

describe('C build of the lattice-8x8x8 kernel', () => {
  it('reaches the JavaScript and WebAssembly checksums bit for bit, or reports that gcc is missing', () => {
    const js = runLattice8x8x8(INTERVALS, 'js');
    const wasm = runLattice8x8x8(INTERVALS, 'wasm');
    expect(Object.is(wasm.checksum, js.checksum)).toBe(true);
    const line = withNativeLatticeKernel(INTERVALS, (binaryPath, modelPath) => {
      const native = runNativeLatticeKernel(binaryPath, modelPath);
      return { checksum: native.checksum, rate: native.springUpdatesPerS };
    });
    if (typeof line.skipped === 'string') {
      expect(line.skipped).toMatch(/gcc not found on PATH; install it/);
      return;
    }
    expect(line.failed).toBeUndefined();
    // printf %.17g round-trips a double (C11 §7.21.6.1 with DECIMAL_DIG ≥ 17; from memory).
    expect(Object.is(line.checksum, js.checksum)).toBe(true);
    expect(line.rate as number).toBeGreaterThan(0);
  });

  it('refuses a file that is not a lattice model file', () => {
    const build = buildNativeKernel(new URL('../sim/bench/native/lattice_kernel.c', import.meta.url).pathname, 'lattice_kernel');
    if (!build.ok) return expect(build.reason).toMatch(/gcc not found/);
    try {
      expect(() => runNativeLatticeKernel(build.binaryPath, build.binaryPath)).toThrow(/not a lattice model file/);
    } finally {
      build.dispose();
    }
  });
});

describe('chain-1024-bending: JavaScript, WebAssembly and the C build with "bending" reach one checksum bit for bit', () => {
  it('has the hinges and clamp it names, runs WebAssembly when asked, and all three builds agree', () => {
    const model = buildChain1024Bending();
    expect([model.hingeCount, model.clampCount]).toEqual([1022, 1]);
    const js = runChain1024Bending('js');
    const wasm = runChain1024Bending('wasm');
    expect(wasm.kernel).toBe('wasm');
    expect(Object.is(wasm.checksum, js.checksum)).toBe(true);
    // The bending passes change the motion, so the case measures them (chain-1024 ends on 408.1644).
    expect(js.checksum).not.toBe(runChain1024('js').checksum);
    const build = buildNativeChainKernel();
    if (!build.ok) return expect(build.reason).toMatch(/gcc not found on PATH; install it/);
    try {
      expect(Object.is(runNativeChainKernel(build.binaryPath, 10_000, 'bending').checksum, js.checksum)).toBe(true);
      expect(Object.is(runNativeChainKernel(build.binaryPath, 10_000).checksum, runChain1024('js').checksum)).toBe(true);
    } finally {
      build.dispose();
    }
  });
});

describe('WebAssembly bench lines', () => {
  it('chain-1024-wasm names its kernel and ends on the chain-1024 checksum 408.1644 (project issue)', async () => {
    const line = await chain1024WasmCase.run();
    expect(line.kernel).toBe('wasm');
    expect((line.checksum as number).toPrecision(6)).toBe('408.164');
  });

  it('lattice-8x8x8-wasm-vs-native reports medians, ratios and one checksum for all three builds', async () => {
    const line = await lattice8x8x8WasmVsNativeCase.run();
    expect(line.same_checksum).toBe('yes');
    expect(line.statistic).toBe('median');
    for (const key of ['js_spring_updates_per_s', 'wasm_spring_updates_per_s', 'wasm_over_js', 'cpu_wasm_over_js']) expect(line[key] as number).toBeGreaterThan(0);
    if (line.native_skipped === undefined) {
      for (const key of ['native_spring_updates_per_s', 'wasm_over_native', 'js_over_native', 'cpu_wasm_over_native']) expect(line[key] as number).toBeGreaterThan(0);
    }
  });

  it('the alternating comparison takes medians per build and ratios of the medians (arithmetic, no source needed)', () => {
    const rates = { a: [3, 1, 2], b: [10, 30, 20] };
    const calls = { a: 0, b: 0 };
    // Each run: 1 s of wall time, of which the process had the CPU for 0.5 s (a) or 0.25 s (b).
    const build = (name: 'a' | 'b', checksum: number) => ({ name, run: () => ({ springUpdatesPerS: rates[name][calls[name]++], seconds: 1, cpuSeconds: name === 'a' ? 0.5 : 0.25, checksum }) });
    const line = compareAlternately([build('a', 1), build('b', 1)], [['a', 'b']], 3);
    expect(line).toEqual({
      a_spring_updates_per_s: 2, b_spring_updates_per_s: 20, a_over_b: 0.1,
      a_cpu_spring_updates_per_s: 4, b_cpu_spring_updates_per_s: 80, cpu_a_over_b: 0.05,
      runs: 3, statistic: 'median', same_checksum: 'yes',
    });
    calls.a = 0;
    calls.b = 0;
    expect(compareAlternately([build('a', 1), build('b', 2)], [], 3).same_checksum).toBe('no');
  });
});
