// The kernel choice is safe by construction: the Simulator runs WebAssembly only where
// sim/core/wasm/wasm-kernel-coverage.ts says it implements every pass the model, world and
// options need, and otherwise the JavaScript kernel, the specification. Checked here: a model,
// world or option the kernel does not know falls back (and the fallback's bits are the
// JavaScript kernel's, compared as binary64 bit patterns); a pass marked as not ported falls
// back exactly for the models that use it; every call the JavaScript step makes is registered
// as a pass. The reference is the JavaScript step itself (sim/core/simulator.ts).
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';

import { describe, expect, it } from 'vitest';

import { buildLattice8x8x8, latticeWorld } from '../sim/bench/lattice-8x8x8.ts';
import type { Model } from '../sim/core/model.ts';
import { Simulator } from '../sim/core/simulator.ts';
import type { StepPass } from '../sim/core/wasm/wasm-kernel-coverage.ts';
import { STEP_PASSES, wasmKernelCoverage } from '../sim/core/wasm/wasm-kernel-coverage.ts';
import type { World } from '../sim/core/world.ts';
import { defaultWorld } from '../sim/core/world.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';

const ROOT = resolve(import.meta.dirname, '..');

const CHAIN: ChainParameters = {
  partCount: 12, lengthM: 0.6, totalMassKg: 0.1, axialStiffnessN: 300, secondNeighbourSpringRatio: 0, dampingRatio: 0.2,
  diameterM: 0.01, anchor: 'top-pinned', originM: [0, 0.5, 0], directionUnit: [1, -0.3, 0.1], forceHandles: [], forceAxes: [], drivenAxes: [],
};
const BENT: ChainParameters = { ...CHAIN, bendingStiffnessNm2: 2e-3, bendingDampingRatio: 0.1, clampedEnds: ['top'] };

function stepped(model: Model, world: World, options: ConstructorParameters<typeof Simulator>[2]): { kernel: string; reason: string | null; x: BigUint64Array } {
  const simulator = new Simulator(model, world, options);
  simulator.setControls(new Float64Array(Math.max(1, model.controlChannelCount)));
  for (let t = 0; t < 10; t++) simulator.advanceInterval(0.01, 20);
  return { kernel: simulator.kernel, reason: simulator.kernelFallbackReason, x: new BigUint64Array(model.positionM.slice().buffer) };
}

describe('WebAssembly kernel coverage', () => {
  it('claims every field of the models and worlds Pliant builds (else the kernel would never run)', () => {
    expect(wasmKernelCoverage(buildChain(CHAIN).model, defaultWorld())).toEqual({ ok: true });
    expect(wasmKernelCoverage(buildLattice8x8x8(), latticeWorld())).toEqual({ ok: true });
    expect(wasmKernelCoverage(buildChain(CHAIN).model, defaultWorld(), { kernel: 'wasm' })).toEqual({ ok: true });
  });

  it('a model field no pass claims (the data of a pass not registered) falls back to JavaScript, with the same bits', () => {
    const plain = stepped(buildChain(BENT).model, defaultWorld(), { kernel: 'js' });
    const extended = { ...buildChain(BENT).model, obstacleCount: 1 } as Model;
    const fallback = stepped(extended, defaultWorld(), { kernel: 'wasm' });
    expect(fallback.kernel).toBe('js');
    expect(fallback.reason).toContain('"obstacleCount"');
    expect(fallback.x).toEqual(plain.x);
  });

  it('a world field no pass claims falls back, at the top level and inside ground or fluid', () => {
    const tidal = { ...defaultWorld(), tideHeightM: 0.2 } as World;
    expect(wasmKernelCoverage(buildChain(CHAIN).model, tidal)).toEqual({ ok: false, reason: expect.stringContaining('"tideHeightM"') });
    const wavy = defaultWorld();
    (wavy.fluid as unknown as Record<string, unknown>).waveHeightM = 0.1;
    expect(wasmKernelCoverage(buildChain(CHAIN).model, wavy)).toEqual({ ok: false, reason: expect.stringContaining('"fluid.waveHeightM"') });
    expect(stepped(buildChain(CHAIN).model, tidal, {}).kernel).toBe('js');
  });

  it('obstacles and the energy ledger run in JavaScript, and only where they are used', () => {
    const model = buildChain(CHAIN).model;
    const boulder: World = { ...defaultWorld(), obstacles: [{ shape: 'sphere', centerM: [0, -2, 0], halfSizeM: [0, 0, 0], radiusM: 0.3, halfLengthM: 0, axis: 1, staticFriction: 0.5, kineticFriction: 0.4 }] };
    expect(wasmKernelCoverage(model, boulder)).toEqual({ ok: false, reason: expect.stringContaining('obstacle contact') });
    expect(wasmKernelCoverage(model, defaultWorld())).toEqual({ ok: true });
    const booked = new Simulator(model, defaultWorld(), { kernel: 'wasm', ledger: { recordForces: false } });
    expect(booked.kernel).toBe('js');
    expect(booked.kernelFallbackReason).toContain('energy ledger');
    expect(booked.ledger).not.toBeNull();
  });

  it('a Simulator option the kernel does not implement falls back; an absent one does not', () => {
    const model = buildChain(CHAIN).model;
    const options = { kernel: 'wasm', energyLedger: true } as unknown as ConstructorParameters<typeof Simulator>[2];
    const simulator = new Simulator(model, defaultWorld(), options);
    expect(simulator.kernel).toBe('js');
    expect(simulator.kernelFallbackReason).toContain('"energyLedger"');
    expect(wasmKernelCoverage(model, defaultWorld(), { energyLedger: undefined })).toEqual({ ok: true });
  });

  it('a pass marked as not ported falls back exactly for the models that use it', () => {
    const unported: StepPass[] = STEP_PASSES.map((p) => (p.jsFunction.includes('accumulateBendingForces') ? { ...p, inWasmKernel: false } : p));
    const withHinges = buildChain(BENT).model;
    const without = buildChain(CHAIN).model;
    expect(withHinges.hingeCount).toBeGreaterThan(0);
    expect(wasmKernelCoverage(withHinges, defaultWorld(), {}, unported)).toEqual({ ok: false, reason: expect.stringContaining('hinge bending') });
    expect(wasmKernelCoverage(without, defaultWorld(), {}, unported)).toEqual({ ok: true });
  });

  it('every function the JavaScript step and interval call is registered as a pass (a new pass must be added to STEP_PASSES)', () => {
    const source = readFileSync(resolve(ROOT, 'sim/core/simulator.ts'), 'utf8');
    const registered = STEP_PASSES.map((p) => p.jsFunction).join(' ');
    for (const signature of ['step(dtS: number): void', 'advanceInterval(intervalS: number, substeps: number): void']) {
      const start = source.indexOf(`\n  ${signature} {\n`);
      expect(start, `Simulator.${signature} not found in simulator.ts`).toBeGreaterThan(0);
      const body = source.slice(start, source.indexOf('\n  }\n', start));
      // The WebAssembly branch and the clock are not passes.
      const javascriptBranch = body.split('\n').slice(1).filter((line) => !line.includes('this.wasm') && !line.includes('this.timeS')).join('\n');
      const called = [...javascriptBranch.matchAll(/\b([A-Za-z_]\w*)\(/g)].map((m) => m[1]).filter((name) => !['if', 'for', 'while'].includes(name));
      expect(called.length).toBeGreaterThanOrEqual(2);
      for (const name of new Set(called)) expect(registered, `${name} is called by Simulator.${signature} but no STEP_PASSES row names it`).toContain(name);
    }
  });
});
