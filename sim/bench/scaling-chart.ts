// Writes the chart of a scaling case (rate or memory against problem size) as an SVG file into
// the bench output folder, with sim/plots' line chart. Sizes grow by factors of 2 to 10, so the
// x axis is their base-2 logarithm (the line chart's x axis is linear).
import { mkdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

import type { ChartSeries } from '../plots/svg-line-chart.ts';
import { renderLineChart } from '../plots/svg-line-chart.ts';
import type { BenchmarkOptions } from './benchmark-case.ts';

export const DEFAULT_BENCH_OUT_DIR = 'bench-output';

export interface ScalingChart {
  fileName: string;
  title: string;
  sizeLabel: string;
  valueLabel: string;
  series: Array<{ name: string; sizes: readonly number[]; values: readonly number[] }>;
}

/** The chart's path, after writing it into options.outDir (default bench-output/ here). */
export function writeScalingChart(chart: ScalingChart, options: BenchmarkOptions = {}): string {
  const dir = resolve(options.outDir ?? DEFAULT_BENCH_OUT_DIR);
  mkdirSync(dir, { recursive: true });
  const series: ChartSeries[] = chart.series.map((s) => ({ name: s.name, x: s.sizes.map(Math.log2), y: s.values, style: 'line+points' }));
  const svg = renderLineChart({ title: chart.title, xLabel: `log₂ ${chart.sizeLabel}`, yLabel: chart.valueLabel, series });
  const path = join(dir, chart.fileName);
  writeFileSync(path, svg);
  return path;
}

/** Bytes of every typed array in `value`'s own members: the model's arrays, a bound on what a step reads and writes. */
export function typedArrayBytes(value: object): number {
  let bytes = 0;
  for (const member of Object.values(value)) if (ArrayBuffer.isView(member)) bytes += member.byteLength;
  return bytes;
}

/** Sizes from a comma-separated environment variable, or the defaults. */
export function sizesFromEnvironment(env: Record<string, string | undefined>, variable: string, fallback: readonly number[], max: number): number[] {
  const text = env[variable];
  if (text === undefined || text === '') return [...fallback];
  const sizes = text.split(',').map((t) => t.trim());
  if (sizes.some((t) => !/^[1-9][0-9]*$/.test(t) || Number(t) > max)) {
    throw new Error(`${variable}="${text}" must be whole numbers from 1 to ${max}, separated by commas; unset it for ${fallback.join(',')}`);
  }
  return sizes.map(Number);
}
