// Start-up of the command line as a user sees it: wall time and peak resident memory of a fresh
// `node sim/cli/pliant-launcher.mjs` process for `pliant --help` and for `pliant validate
// scenarios/korrin-eel.json`, with a cold bundle cache (an empty cache folder: this start builds
// the bundle, sim/cli/cli-bundle.mjs), with a warm one (median of five starts), and through tsx
// (PLIANT_CLI_TSX=1, how every start ran before the bundle). Peak memory is getrusage's maximum,
// read inside the child by cli-start-probe.mjs with its CPU seconds (user + system, which other
// work on a shared machine inflates less than wall time; a cold start's excludes the esbuild
// process that builds the bundle). MB are 10^6 bytes. Line:
//   {"case":"cli-start","help_cold_s":…,"help_cold_cpu_s":…,"help_cold_peak_rss_mb":…, the same
//    for help_warm_ and help_tsx_, then validate_cold_, validate_warm_, validate_tsx_}
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { CHECKOUT_ROOT } from '../cli/cli-bundle.mjs';
import type { BenchmarkCase } from './benchmark-case.ts';
import { demoScenarioPath } from './demo-scenario.ts';
import { median } from './median.ts';

const LAUNCHER = fileURLToPath(new URL('../cli/pliant-launcher.mjs', import.meta.url));
const PROBE = new URL('./cli-start-probe.mjs', import.meta.url).href;
const WARM_STARTS = 5;

interface Start { seconds: number; cpuSeconds: number; peakMb: number }

function start(args: string[], cacheDir: string, tsx: boolean): Start {
  const probeFile = join(cacheDir, `.probe-${process.pid}`);
  const env = { ...process.env, PLIANT_CLI_CACHE: cacheDir, PLIANT_CLI_TSX: tsx ? '1' : '0', PLIANT_BENCH_PROBE_FILE: probeFile };
  const began = performance.now();
  const run = spawnSync(process.execPath, ['--import', PROBE, LAUNCHER, ...args], { env, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 1 << 22 });
  const seconds = (performance.now() - began) / 1000;
  if (run.status !== 0) throw new Error(`pliant ${args.join(' ')} failed in the cli-start bench (exit ${run.status ?? run.signal}): ${run.stderr.trim()}`);
  const probe = JSON.parse(readFileSync(probeFile, 'utf8')) as { maxRssKib: number; cpuS: number };
  rmSync(probeFile, { force: true });
  return { seconds, cpuSeconds: probe.cpuS, peakMb: (probe.maxRssKib * 1024) / 1e6 };
}

const round = (value: number, digits: number): number => Number(value.toFixed(digits));

/** Cold, warm (median) and tsx starts of `pliant ARGS`. */
function measure(args: string[], cacheDir: string): { cold: Start; warm: Start; tsx: Start } {
  rmSync(cacheDir, { recursive: true, force: true });
  mkdirSync(cacheDir, { recursive: true });
  const cold = start(args, cacheDir, false);
  const warmStarts = Array.from({ length: WARM_STARTS }, () => start(args, cacheDir, false));
  const tsx = start(args, cacheDir, true);
  return {
    cold,
    warm: { seconds: median(warmStarts.map((s) => s.seconds)), cpuSeconds: median(warmStarts.map((s) => s.cpuSeconds)), peakMb: median(warmStarts.map((s) => s.peakMb)) },
    tsx,
  };
}

export const cliStartCase: BenchmarkCase = {
  name: 'cli-start',
  async run() {
    // Inside the checkout, where the bundle finds node_modules; removed afterwards.
    const cacheDir = join(CHECKOUT_ROOT, 'node_modules', '.cache', `pliant-cli-bench-${process.pid}`);
    try {
      const help = measure(['--help'], cacheDir);
      const validate = measure(['validate', demoScenarioPath('korrin-eel')], cacheDir);
      const fields: Record<string, number> = {};
      for (const [name, measured] of [['help', help], ['validate', validate]] as const) {
        for (const state of ['cold', 'warm', 'tsx'] as const) {
          fields[`${name}_${state}_s`] = round(measured[state].seconds, 3);
          fields[`${name}_${state}_cpu_s`] = round(measured[state].cpuSeconds, 3);
          fields[`${name}_${state}_peak_rss_mb`] = round(measured[state].peakMb, 1);
        }
      }
      return fields;
    } finally {
      rmSync(cacheDir, { recursive: true, force: true });
    }
  },
};
