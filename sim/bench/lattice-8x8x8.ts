// The lattice-8x8x8 case: a block of 8 × 8 × 8 voxel cells (1 cm each) resting on the ground
// plane under gravity, like the fin-material test blocks on the floor of the Korrin Bay test
// tank (invented demo data): the lower four layers passive, the upper four actuated on one
// channel by u = sin(2π·f·t), so the block pumps up and down while ground contact and Coulomb
// friction act on its base. Fixed by definition; sub-steps come from the stability bound of
// the built model (a deterministic function of it), so the checksum is reproducible.
import type { Model } from '../core/model.ts';
import { Simulator } from '../core/simulator.ts';
import { autoSubsteps, stabilityBound } from '../core/stability-bound.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import type { World } from '../core/world.ts';
import { defaultWorld } from '../core/world.ts';
import type { LatticeMaterial, MaterialMap3D } from '../systems/lattice.ts';
import { buildLattice } from '../systems/lattice.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { cpuSecondsSince } from './chain-1024.ts';

export const LATTICE_CELLS_PER_SIDE = 8;
export const LATTICE_CELL_M = 0.01;
export const LATTICE_ACTUATION_HZ = 2;
export const LATTICE_CONTROL_INTERVAL_S = 0.005;
/** Two actuation periods. */
export const LATTICE_INTERVALS = 200;

const LATTICE_MATERIALS: LatticeMaterial[] = [
  { name: 'passive fin base', youngsModulusPa: 1e5, densityKgPerM3: 1070, dampingRatio: 0.1, actuatorChannel: null, actuationStrainMax: 0 },
  { name: 'actuated fin layer', youngsModulusPa: 1e5, densityKgPerM3: 1070, dampingRatio: 0.1, actuatorChannel: 0, actuationStrainMax: 0.1 },
];

export function buildLattice8x8x8(): Model {
  return buildReferenceLattice(LATTICE_CELLS_PER_SIDE);
}

/** The reference block's definition with `n` cells per side instead of 8 (the scaling case). */
export function buildReferenceLattice(n: number): Model {
  // Layers [y][z][x], bottom first: material 1 below half height, material 2 above.
  const map: MaterialMap3D = Array.from({ length: n }, (_, y) =>
    Array.from({ length: n }, () => Array.from({ length: n }, () => (y < n / 2 ? 1 : 2))));
  return buildLattice({ cellSizeM: LATTICE_CELL_M, materialMap: map, materials: LATTICE_MATERIALS, base: 'free', originM: [0, 0, 0] }).model;
}

export function latticeWorld(): World {
  const world = defaultWorld();
  world.ground = { enabled: true, heightM: 0, staticFriction: 0.6, kineticFriction: 0.5 };
  return world;
}

export interface LatticeRun {
  nodes: number;
  springs: number;
  steps: number;
  dtS: number;
  seconds: number;
  /** CPU seconds of the process over the run (see cpuSecondsSince). */
  cpuSeconds: number;
  checksum: number;
  /** Lowest node height at the end, m (the ground plane is at 0). */
  lowestYM: number;
}

/** The case's sub-steps per control interval, from the stability bound of the built model. */
export function latticeSubsteps(model: Model, world: World): number {
  return autoSubsteps(LATTICE_CONTROL_INTERVAL_S, stabilityBound(model, world.airDragPerS));
}

/** The actuation of interval t: a zero-order hold of the sinusoid sampled at the interval's middle. */
export function latticeControl(t: number): number {
  return Math.sin(2 * Math.PI * LATTICE_ACTUATION_HZ * (t + 0.5) * LATTICE_CONTROL_INTERVAL_S);
}

/** Runs `intervals` control intervals (default: the case's two periods) with the given kernel (default js). */
export function runLattice8x8x8(intervals = LATTICE_INTERVALS, kernel: StepKernel = 'js'): LatticeRun {
  const model = buildLattice8x8x8();
  const world = latticeWorld();
  const substeps = latticeSubsteps(model, world);
  const simulator = new Simulator(model, world, { kernel });
  const controls = new Float64Array(model.controlChannelCount);
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  for (let t = 0; t < intervals; t++) {
    controls[0] = latticeControl(t);
    simulator.setControls(controls);
    simulator.advanceInterval(LATTICE_CONTROL_INTERVAL_S, substeps);
  }
  const seconds = (performance.now() - start) / 1000;
  const cpuSeconds = cpuSecondsSince(cpuStart);
  let checksum = 0;
  let lowestYM = Infinity;
  const x = model.positionM;
  for (let i = 0; i < x.length; i++) checksum += x[i];
  for (let i = 1; i < x.length; i += 3) lowestYM = Math.min(lowestYM, x[i]);
  return { nodes: model.nodeCount, springs: model.springCount, steps: intervals * substeps, dtS: LATTICE_CONTROL_INTERVAL_S / substeps, seconds, cpuSeconds, checksum, lowestYM };
}

export const lattice8x8x8Case: BenchmarkCase = {
  name: 'lattice-8x8x8',
  async run(options = {}) {
    const kernel = options.kernel ?? 'js';
    const run = runLattice8x8x8(LATTICE_INTERVALS, kernel);
    return {
      kernel,
      spring_updates_per_s: Math.round((run.springs * run.steps) / run.seconds),
      seconds: Number(run.seconds.toFixed(4)),
      nodes: run.nodes,
      springs: run.springs,
      steps: run.steps,
      dt_s: Number(run.dtS.toPrecision(6)),
      checksum: Number(run.checksum.toPrecision(10)),
    };
  },
};
