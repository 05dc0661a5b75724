// Episodes per second of the whole dataset pipeline — sample, simulate, encode, write with
// flushes and renames, then the finishing step (split HDF5 files where the format asks for them,
// card, manifest) — for each Korrin Bay demo scenario, at one and at two worker threads, in the
// scenario's own export format. The timed run is what `pliant generate` does, worker start-up
// included, into a fresh temporary folder that is removed afterwards. Lines:
//   {"case":"episodes-korrin-tether","workers":1,"episodes":…,"episodes_per_s":…,"seconds":…,"first_episode_s":…,"finish_s":…}
//   {"case":"episodes-korrin-tether","workers":2,…,"speedup":…}
// episodes_per_s is episodes over seconds, the whole run; first_episode_s is the time until the
// first episode was written (worker start-up shows here) and finish_s the time after the last
// one (the finishing step, which runs on one thread: for fin and eel, format "both", it is
// mostly writing the split HDF5 files). speedup is the two-worker rate over the one-worker rate
// of the same bench run. Both lines share the case name, so `--case episodes-korrin-tether` runs
// the pair.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { loadHdf5Library } from '../dataset/formats/hdf5-runtime.ts';
import { generateDataset } from '../dataset/write/generate-dataset.ts';
import { PLIANT_VERSION } from '../scenario/pliant-version.ts';
import { withOverrides } from '../scenario/scenario-overrides.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import type { DemoScenarioName } from './demo-scenario.ts';
import { DEMO_SCENARIO_NAMES, demoScenarioFolder, loadDemoScenario } from './demo-scenario.ts';

/** Episodes per run: each line takes seconds to tens of seconds on a two-core laptop. */
export const PIPELINE_EPISODES: Readonly<Record<DemoScenarioName, number>> = {
  'korrin-tether': 600,
  'korrin-fin': 64,
  'korrin-eel': 64,
};

export interface PipelineRun {
  episodes: number;
  seconds: number;
  firstEpisodeSeconds: number;
  finishSeconds: number;
}

/** Runs one sweep of `episodes` episodes of the named demo scenario and times it. */
export async function runPipeline(name: DemoScenarioName, episodes: number, workers: number): Promise<PipelineRun> {
  const scenario = withOverrides(loadDemoScenario(name), { episodes });
  const outDir = mkdtempSync(join(tmpdir(), `pliant-bench-${name}-`));
  try {
    // Loading the HDF5 library takes seconds once per process; it is not part of any one run.
    if (scenario.export.format !== 'npz') await loadHdf5Library();
    const start = performance.now();
    let firstWritten = Number.NaN;
    let lastWritten = Number.NaN;
    const result = await generateDataset({
      scenario,
      inputs: { kind: 'scenario', scenarioDir: demoScenarioFolder() },
      outDir,
      shard: null,
      workers,
      resume: false,
      force: false,
      pliantVersion: PLIANT_VERSION,
      onEvent: (event) => {
        if (event.type !== 'episode') return;
        lastWritten = performance.now();
        if (Number.isNaN(firstWritten)) firstWritten = lastWritten;
      },
    });
    const end = performance.now();
    if (result.status !== 'complete') throw new Error(`the ${name} sweep ended as "${result.status}" instead of complete`);
    return { episodes, seconds: (end - start) / 1000, firstEpisodeSeconds: (firstWritten - start) / 1000, finishSeconds: (end - lastWritten) / 1000 };
  } finally {
    rmSync(outDir, { recursive: true, force: true });
  }
}

/** One-worker rate of each scenario in this bench run, for the two-worker line's speed-up. */
const oneWorkerRate = new Map<DemoScenarioName, number>();

function pipelineCase(name: DemoScenarioName, workers: number): BenchmarkCase {
  return {
    name: `episodes-${name}`,
    async run() {
      const { episodes, seconds, firstEpisodeSeconds, finishSeconds } = await runPipeline(name, PIPELINE_EPISODES[name], workers);
      const rate = episodes / seconds;
      if (workers === 1) oneWorkerRate.set(name, rate);
      const base = oneWorkerRate.get(name);
      return {
        workers,
        episodes,
        episodes_per_s: Number(rate.toPrecision(4)),
        seconds: Number(seconds.toFixed(3)),
        first_episode_s: Number(firstEpisodeSeconds.toFixed(3)),
        finish_s: Number(finishSeconds.toFixed(3)),
        ...(workers > 1 && base !== undefined ? { speedup: Number((rate / base).toFixed(3)) } : {}),
      };
    },
  };
}

export const pipelineEpisodeCases: BenchmarkCase[] = DEMO_SCENARIO_NAMES.flatMap((name) => [pipelineCase(name, 1), pipelineCase(name, 2)]);
