// One benchmark case: a name and a function that runs it and returns its measurements (one
// line, or several for the cases that measure a series of sizes).
import type { StepKernel } from '../core/step-kernel-choice.ts';

export interface BenchmarkOptions {
  /** `pliant bench --kernel`: the step kernel of the chain-1024 and lattice-8x8x8 lines (default js). */
  kernel?: StepKernel;
  /** `pliant bench --out`: where cases that draw a chart write it (default bench-output/ in the current folder). */
  outDir?: string;
}

export interface BenchmarkCase {
  name: string;
  run(options?: BenchmarkOptions): Promise<Record<string, number | string>>;
}

/** A case that prints several lines, one per measured size (the scaling cases). */
export interface MultiLineBenchmarkCase {
  name: string;
  runLines(options?: BenchmarkOptions): Promise<Array<Record<string, number | string>>>;
}
