// One benchmark case: a name and a function that runs it and returns its measurements.
import type { StepKernel } from '../core/step-kernel-choice.ts';

export interface BenchmarkOptions {
  /** `pliant bench --kernel`: the step kernel of the chain-1024 and lattice-8x8x8 lines (default js). */
  kernel?: StepKernel;
}

export interface BenchmarkCase {
  name: string;
  run(options?: BenchmarkOptions): Promise<Record<string, number | string>>;
}
