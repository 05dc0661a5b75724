// Peak resident memory of a whole `pliant generate` sweep, measured in a fresh child process
// (sweep-memory-child.mjs), because a process's peak can only be read from inside it and must
// not include what the bench itself holds. The bench case runs scenarios/korrin-tether.json as
// an NPZ sweep on two workers; memory must not grow with the number of episodes, and the
// project's target is under 300 MB for 10,000 episodes. The default count keeps the case to
// tens of seconds; PLIANT_BENCH_MEMORY_EPISODES=10000 runs the full sweep (several minutes).
// MB here are 10^6 bytes. Line:
//   {"case":"memory-korrin-tether","episodes":…,"workers":2,"peak_rss_mb":…,"sweep_peak_rss_mb":…,"seconds":…,"episodes_per_s":…}
// peak_rss_mb covers the whole process from start-up; sweep_peak_rss_mb (Linux only) covers the
// sweep after the scenario has been loaded and checked.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { CliUsageError } from '../cli/command.ts';
import { MAX_EPISODES } from '../scenario/scenario-limits.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { demoScenarioPath } from './demo-scenario.ts';

const CHILD = fileURLToPath(new URL('./sweep-memory-child.mjs', import.meta.url));

export const MEMORY_EPISODES_VARIABLE = 'PLIANT_BENCH_MEMORY_EPISODES';
export const DEFAULT_MEMORY_EPISODES = 1000;
const MEMORY_WORKERS = 2;

export interface SweepMemoryRequest {
  scenarioPath: string;
  episodes: number;
  workers: number;
  format: 'npz' | 'hdf5' | 'both';
}

export interface SweepMemory {
  /** Peak resident bytes of the whole child process. */
  peakBytes: number;
  /** Peak resident bytes from just after the scenario check to the end; null where the high-water mark cannot be reset. */
  sweepPeakBytes: number | null;
  seconds: number;
}

interface ChildReport {
  code: number;
  seconds: number;
  peakKib: number;
  sweepPeakKib: number | null;
}

/** Runs the sweep in a child process into a temporary folder (removed afterwards) and returns its peak memory. */
export function measureSweepMemory(request: SweepMemoryRequest): SweepMemory {
  const outDir = mkdtempSync(join(tmpdir(), 'pliant-bench-memory-'));
  try {
    const run = spawnSync(process.execPath, [
      CHILD, request.scenarioPath,
      '--out', join(outDir, 'sweep'),
      '--episodes', String(request.episodes),
      '--format', request.format,
      '--workers', String(request.workers),
      '--progress', 'none',
    ], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 1 << 20 });
    const lastLine = run.stdout?.trim().split('\n').at(-1) ?? '';
    let report: ChildReport | undefined;
    try {
      report = JSON.parse(lastLine) as ChildReport;
    } catch {
      report = undefined;
    }
    if (run.status !== 0 || report === undefined || report.code !== 0) {
      throw new Error(`the measured sweep of ${request.scenarioPath} failed (exit ${run.status ?? run.signal}): ${run.stderr?.trim() || lastLine || 'no output'}`);
    }
    return {
      peakBytes: report.peakKib * 1024,
      sweepPeakBytes: report.sweepPeakKib === null ? null : report.sweepPeakKib * 1024,
      seconds: report.seconds,
    };
  } finally {
    rmSync(outDir, { recursive: true, force: true });
  }
}

/** The episode count from PLIANT_BENCH_MEMORY_EPISODES, or the default. */
export function memoryEpisodes(env: Record<string, string | undefined>): number {
  return episodeCountFromEnvironment(env, MEMORY_EPISODES_VARIABLE, DEFAULT_MEMORY_EPISODES);
}

/** A benchmark's episode count from an environment variable, or its default. */
export function episodeCountFromEnvironment(env: Record<string, string | undefined>, variable: string, fallback: number): number {
  const text = env[variable];
  if (text === undefined || text === '') return fallback;
  const count = Number(text);
  if (!/^[1-9][0-9]*$/.test(text) || count > MAX_EPISODES) {
    throw new CliUsageError(`${variable}="${text}" is not a whole number of episodes from 1 to ${MAX_EPISODES}; unset it for ${fallback} or give e.g. 10000`);
  }
  return count;
}

const megabytes = (bytes: number): number => Number((bytes / 1e6).toFixed(1));

export const sweepMemoryCase: BenchmarkCase = {
  name: 'memory-korrin-tether',
  async run() {
    const episodes = memoryEpisodes(process.env);
    const measured = measureSweepMemory({ scenarioPath: demoScenarioPath('korrin-tether'), episodes, workers: MEMORY_WORKERS, format: 'npz' });
    return {
      episodes,
      workers: MEMORY_WORKERS,
      peak_rss_mb: megabytes(measured.peakBytes),
      ...(measured.sweepPeakBytes === null ? {} : { sweep_peak_rss_mb: megabytes(measured.sweepPeakBytes) }),
      seconds: Number(measured.seconds.toFixed(3)),
      episodes_per_s: Number((episodes / measured.seconds).toPrecision(4)),
    };
  },
};
