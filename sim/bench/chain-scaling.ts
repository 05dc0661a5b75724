// How the step's rate scales with the size of the reference chain (chain-1024.ts, the same
// definition with 64 to 65,536 nodes): spring updates per second should stay flat while the
// model's arrays fit in the caches and drop once they do not. Each size runs about the same
// number of spring updates (CHAIN_SCALING_UPDATES), JavaScript and WebAssembly kernels, the
// median of three runs each, after a few untimed steps. One line per size and kernel:
//   {"case":"chain-scaling","kernel":…,"nodes":…,"springs":…,"model_kib":…,"steps":…,"spring_updates_per_s":…,"spring_updates_per_cpu_s":…,"relative_to_best":…}
// model_kib is the bytes of the model's typed arrays (positions, velocities, masses, springs…);
// relative_to_best compares the per-CPU-second rate with the best size of the same kernel. The
// smallest chains pay the per-step overhead on few springs, so they need not be the fastest.
// The chart (bench output folder, chain-scaling.svg; its path is the last line's "chart") plots
// the rate against log₂ nodes.
import { Simulator } from '../core/simulator.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import { STEP_KERNELS } from '../core/step-kernel-choice.ts';
import { defaultWorld } from '../core/world.ts';
import type { BenchmarkOptions, MultiLineBenchmarkCase } from './benchmark-case.ts';
import { buildReferenceChainBuilder, CHAIN_1024_DT_S, cpuSecondsSince } from './chain-1024.ts';
import { median } from './median.ts';
import { typedArrayBytes, writeScalingChart } from './scaling-chart.ts';

export const CHAIN_SCALING_NODES = [64, 256, 1024, 4096, 16_384, 65_536] as const;
/** Spring updates per run: some 0.3 to 1 s of JavaScript stepping on the development machine. */
export const CHAIN_SCALING_UPDATES = 20_000_000;
const REPEATS = 3;
const WARM_UP_STEPS = 4;

export interface ScalingPoint {
  kernel: StepKernel;
  size: number;
  springs: number;
  modelBytes: number;
  steps: number;
  springUpdatesPerS: number;
  /** Per CPU second of this process (cpuSecondsSince): less skewed by other work on a shared machine. */
  springUpdatesPerCpuS: number;
}

function measureChain(nodes: number, kernel: StepKernel): ScalingPoint {
  const rates: number[] = [];
  const cpuRates: number[] = [];
  let springs = 0;
  let modelBytes = 0;
  let steps = 0;
  for (let r = 0; r < REPEATS; r++) {
    const model = buildReferenceChainBuilder(nodes).build();
    springs = model.springCount;
    modelBytes = typedArrayBytes(model);
    steps = Math.max(1, Math.round(CHAIN_SCALING_UPDATES / springs));
    const simulator = new Simulator(model, defaultWorld(), { kernel });
    // Untimed: the first steps fault in fresh memory (the WebAssembly copy of a large model).
    simulator.advanceSteps(CHAIN_1024_DT_S, WARM_UP_STEPS);
    const cpuStart = process.cpuUsage();
    const start = performance.now();
    simulator.advanceSteps(CHAIN_1024_DT_S, steps);
    rates.push((springs * steps) / ((performance.now() - start) / 1000));
    cpuRates.push((springs * steps) / cpuSecondsSince(cpuStart));
  }
  return { kernel, size: nodes, springs, modelBytes, steps, springUpdatesPerS: median(rates), springUpdatesPerCpuS: median(cpuRates) };
}

/** The bench lines of a series of points; relative_to_best is the CPU-second rate over the best size's of the same kernel. */
export function scalingLines(points: readonly ScalingPoint[], sizeKey: string): Array<Record<string, number | string>> {
  return points.map((p) => {
    const best = Math.max(...points.filter((q) => q.kernel === p.kernel).map((q) => q.springUpdatesPerCpuS));
    return {
      kernel: p.kernel,
      [sizeKey]: p.size,
      springs: p.springs,
      model_kib: Math.round(p.modelBytes / 1024),
      steps: p.steps,
      spring_updates_per_s: Math.round(p.springUpdatesPerS),
      spring_updates_per_cpu_s: Math.round(p.springUpdatesPerCpuS),
      relative_to_best: Number((p.springUpdatesPerCpuS / best).toFixed(3)),
    };
  });
}

/** The lines of one scaling case, with the chart of both kernels' rates written beside them (its path on the last line). */
export function scalingCaseLines(points: readonly ScalingPoint[], chart: { fileName: string; title: string; sizeLabel: string; sizeKey: string }, options: BenchmarkOptions): Array<Record<string, number | string>> {
  const path = writeScalingChart({
    fileName: chart.fileName,
    title: chart.title,
    sizeLabel: chart.sizeLabel,
    valueLabel: 'million spring updates per CPU second',
    series: STEP_KERNELS.map((kernel) => {
      const mine = points.filter((p) => p.kernel === kernel);
      return { name: kernel === 'js' ? 'JavaScript kernel' : 'WebAssembly kernel', sizes: mine.map((p) => p.size), values: mine.map((p) => p.springUpdatesPerCpuS / 1e6) };
    }),
  }, options);
  const lines = scalingLines(points, chart.sizeKey);
  lines[lines.length - 1].chart = path;
  return lines;
}

export const chainScalingCase: MultiLineBenchmarkCase = {
  name: 'chain-scaling',
  async runLines(options = {}) {
    const points: ScalingPoint[] = [];
    for (const kernel of STEP_KERNELS) for (const nodes of CHAIN_SCALING_NODES) points.push(measureChain(nodes, kernel));
    return scalingCaseLines(points, { fileName: 'chain-scaling.svg', title: 'Reference chain: spring updates per CPU second against size', sizeLabel: 'chain nodes', sizeKey: 'nodes' }, options);
  },
};
