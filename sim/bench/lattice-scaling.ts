// How the step's rate scales with the size of the reference block (lattice-8x8x8.ts, the same
// definition with 2 to 32 cells per side, 8 to 32,768 cells): ground contact, friction and
// actuation as there, sub-steps from the stability bound of each built block. Each size runs
// about LATTICE_SCALING_UPDATES spring updates (whole control intervals, at least one),
// JavaScript and WebAssembly kernels, the median of three runs, each after one untimed interval.
// One line per size and kernel:
//   {"case":"lattice-scaling","kernel":…,"cells":…,"springs":…,"model_kib":…,"steps":…,"spring_updates_per_s":…,"spring_updates_per_cpu_s":…,"relative_to_best":…}
// The chart is lattice-scaling.svg in the bench output folder (the last line's "chart").
import { Simulator } from '../core/simulator.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import { STEP_KERNELS } from '../core/step-kernel-choice.ts';
import type { MultiLineBenchmarkCase } from './benchmark-case.ts';
import { cpuSecondsSince } from './chain-1024.ts';
import type { ScalingPoint } from './chain-scaling.ts';
import { scalingCaseLines } from './chain-scaling.ts';
import { buildReferenceLattice, LATTICE_CONTROL_INTERVAL_S, latticeControl, latticeSubsteps, latticeWorld } from './lattice-8x8x8.ts';
import { median } from './median.ts';
import { typedArrayBytes } from './scaling-chart.ts';

export const LATTICE_SCALING_SIDES = [2, 4, 8, 16, 32] as const;
export const LATTICE_SCALING_UPDATES = 20_000_000;
const REPEATS = 3;

function measureLattice(side: number, kernel: StepKernel): ScalingPoint {
  const rates: number[] = [];
  const cpuRates: number[] = [];
  let springs = 0;
  let modelBytes = 0;
  let steps = 0;
  for (let r = 0; r < REPEATS; r++) {
    const model = buildReferenceLattice(side);
    const world = latticeWorld();
    const substeps = latticeSubsteps(model, world);
    springs = model.springCount;
    modelBytes = typedArrayBytes(model);
    const intervals = Math.max(1, Math.round(LATTICE_SCALING_UPDATES / (springs * substeps)));
    steps = intervals * substeps;
    const simulator = new Simulator(model, world, { kernel });
    const controls = new Float64Array(model.controlChannelCount);
    // Untimed: the first interval faults in fresh memory (the WebAssembly copy of a large model).
    simulator.setControls(controls);
    simulator.advanceInterval(LATTICE_CONTROL_INTERVAL_S, substeps);
    const cpuStart = process.cpuUsage();
    const start = performance.now();
    for (let t = 0; t < intervals; t++) {
      controls[0] = latticeControl(t);
      simulator.setControls(controls);
      simulator.advanceInterval(LATTICE_CONTROL_INTERVAL_S, substeps);
    }
    rates.push((springs * steps) / ((performance.now() - start) / 1000));
    cpuRates.push((springs * steps) / cpuSecondsSince(cpuStart));
  }
  return { kernel, size: side ** 3, springs, modelBytes, steps, springUpdatesPerS: median(rates), springUpdatesPerCpuS: median(cpuRates) };
}

export const latticeScalingCase: MultiLineBenchmarkCase = {
  name: 'lattice-scaling',
  async runLines(options = {}) {
    const points: ScalingPoint[] = [];
    for (const kernel of STEP_KERNELS) for (const side of LATTICE_SCALING_SIDES) points.push(measureLattice(side, kernel));
    return scalingCaseLines(points, { fileName: 'lattice-scaling.svg', title: 'Reference block: spring updates per CPU second against size', sizeLabel: 'lattice cells', sizeKey: 'cells' }, options);
  },
};
