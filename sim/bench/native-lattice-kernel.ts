// The plain C build of the lattice-8x8x8 kernel (native/lattice_kernel.c). The lattice is built
// here, by the same TypeScript builder the case uses, and handed to the C program as one binary
// model file (format in the C source's header) next to the compiled binary, so both sides step
// exactly the same model with the same controls. Compiled with the flags of the chain kernel.
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { buildLattice8x8x8, LATTICE_CONTROL_INTERVAL_S,latticeControl, latticeSubsteps, latticeWorld } from './lattice-8x8x8.ts';
import type { BenchLine, NativeRun } from './native-chain-kernel.ts';
import { buildNativeKernel, parseNativeLine, withNativeKernel } from './native-chain-kernel.ts';

const SOURCE_PATH = fileURLToPath(new URL('./native/lattice_kernel.c', import.meta.url));

/** The model file of the case for `intervals` control intervals; returns its bytes. */
export function latticeModelFile(intervals: number): Uint8Array {
  const model = buildLattice8x8x8();
  const world = latticeWorld();
  const substeps = latticeSubsteps(model, world);
  const channels = model.controlChannelCount;
  const controls = new Float64Array(intervals * channels);
  for (let t = 0; t < intervals; t++) controls[t * channels] = latticeControl(t);
  const buoyant = world.fluid.enabled && world.fluid.buoyancy ? world.fluid.densityKgPerM3 : 0;
  if (world.fluid.enabled || model.handleNodes.length > 0 || model.drivenNodes.length > 0) {
    throw new Error('the C lattice kernel has no fluid drag, handles or driven nodes; the lattice-8x8x8 case has changed');
  }
  const parts: ArrayBufferView[] = [
    new TextEncoder().encode('PLK1'),
    Int32Array.of(model.nodeCount, model.springCount, model.actuationEntryCount, channels, intervals, substeps, world.ground.enabled ? 1 : 0),
    Float64Array.of(LATTICE_CONTROL_INTERVAL_S, ...world.gravityMPerS2, world.airDragPerS, buoyant, world.ground.heightM, world.ground.staticFriction, world.ground.kineticFriction),
    model.positionM, model.velocityMPerS, model.massKg, model.inverseMassPerKg, model.nodeVolumeM3,
    model.springNodeA, model.springNodeB,
    model.baseRestLengthM, model.stiffnessNPerM, model.dampingNsPerM,
    model.actuationSpring, Uint32Array.from(model.actuationChannel), model.actuationGain,
    controls,
  ];
  const total = parts.reduce((sum, p) => sum + p.byteLength, 0);
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const p of parts) {
    bytes.set(new Uint8Array(p.buffer, p.byteOffset, p.byteLength), at);
    at += p.byteLength;
  }
  return bytes;
}

/** Runs the compiled kernel on a model file once and parses the line it prints. */
export function runNativeLatticeKernel(binaryPath: string, modelPath: string): NativeRun {
  const run = spawnSync(binaryPath, [modelPath], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`the C build of lattice-8x8x8 (${binaryPath}) exited with ${run.status}: ${run.stderr.trim()}`);
  return parseNativeLine(run.stdout);
}

/** Builds the C kernel and the model file, hands both paths to `measure`, removes them again. */
export function withNativeLatticeKernel(intervals: number, measure: (binaryPath: string, modelPath: string, compiler: string) => BenchLine): BenchLine {
  return withNativeKernel(buildNativeKernel(SOURCE_PATH, 'lattice_kernel'), (binaryPath, compiler) => {
    const modelPath = join(dirname(binaryPath), 'lattice-8x8x8.model');
    writeFileSync(modelPath, latticeModelFile(intervals));
    return measure(binaryPath, modelPath, compiler);
  });
}
