// Peak memory of a tether sweep against its episode count: the same child-process measurement
// as memory-korrin-tether (sweep-memory.ts: scenarios/korrin-tether.json, NPZ, two workers) at
// 100 and 1,000 episodes by default — a sweep streams its manifest and keeps no per-episode
// state, so the peak should not grow with the count. PLIANT_BENCH_MEMORY_SCALING_EPISODES
// gives other counts, e.g. 100,1000,10000,100000 (10,000 takes minutes, 100,000 about an hour
// on the development machine). One line per count:
// The child starts the CLI through tsx unless PLIANT_CLI_TSX=0 asks for the bundle the launcher
// runs (sweep-memory-child.mjs says why); "start" names which.
//   {"case":"memory-scaling","start":"tsx"|"bundle","episodes":…,"peak_rss_mb":…,"sweep_peak_rss_mb":…,"seconds":…,"episodes_per_s":…}
// The chart is memory-scaling.svg in the bench output folder (the last line's "chart").
import { MAX_EPISODES } from '../scenario/scenario-limits.ts';
import type { MultiLineBenchmarkCase } from './benchmark-case.ts';
import { demoScenarioPath } from './demo-scenario.ts';
import { sizesFromEnvironment, writeScalingChart } from './scaling-chart.ts';
import { measureSweepMemory } from './sweep-memory.ts';

export const MEMORY_SCALING_VARIABLE = 'PLIANT_BENCH_MEMORY_SCALING_EPISODES';
export const DEFAULT_MEMORY_SCALING_EPISODES = [100, 1000] as const;
const WORKERS = 2;
const megabytes = (bytes: number): number => Number((bytes / 1e6).toFixed(1));

export const memoryScalingCase: MultiLineBenchmarkCase = {
  name: 'memory-scaling',
  async runLines(options = {}) {
    const counts = sizesFromEnvironment(process.env, MEMORY_SCALING_VARIABLE, DEFAULT_MEMORY_SCALING_EPISODES, MAX_EPISODES);
    const lines: Array<Record<string, number | string>> = [];
    const peaks: number[] = [];
    const sweepPeaks: number[] = [];
    for (const episodes of counts) {
      const measured = measureSweepMemory({ scenarioPath: demoScenarioPath('korrin-tether'), episodes, workers: WORKERS, format: 'npz' });
      peaks.push(megabytes(measured.peakBytes));
      sweepPeaks.push(measured.sweepPeakBytes === null ? NaN : megabytes(measured.sweepPeakBytes));
      lines.push({
        start: process.env.PLIANT_CLI_TSX === '0' ? 'bundle' : 'tsx',
        episodes,
        workers: WORKERS,
        peak_rss_mb: megabytes(measured.peakBytes),
        ...(measured.sweepPeakBytes === null ? {} : { sweep_peak_rss_mb: megabytes(measured.sweepPeakBytes) }),
        seconds: Number(measured.seconds.toFixed(3)),
        episodes_per_s: Number((episodes / measured.seconds).toPrecision(4)),
      });
    }
    lines[lines.length - 1].chart = writeScalingChart({
      fileName: 'memory-scaling.svg',
      title: 'Tether sweep (2 workers, NPZ): peak resident memory against episodes',
      sizeLabel: 'episodes',
      valueLabel: 'peak resident MB',
      series: [
        { name: 'whole process', sizes: counts, values: peaks },
        { name: 'during the sweep', sizes: counts, values: sweepPeaks },
      ],
    }, options);
    return lines;
  },
};
