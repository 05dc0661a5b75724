// Export throughput: megabytes (10^6 bytes) of data files written per second, for each data
// format, apart from the simulation. korrin-tether episodes are simulated once, untimed; then
//   export-npz   encodes every episode as its NPZ file (deflate level 6, numpy.savez_compressed's
//                layout) and writes it as a run writes episodes/<id>.npz (temporary name, flush,
//                rename, folder flush);
//   export-hdf5  writes them all as one split HDF5 file (one group per episode, deflate level 4
//                in chunks) as the finishing step writes <split>.h5, from the arrays in memory
//                (the finishing step also reads each episode's NPZ file back first).
// Each is run three times into a fresh temporary folder; the median time is reported. Lines:
//   {"case":"export-npz","mb_per_s":…,"megabytes":…,"seconds":…,"episodes":…}
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureFolder, writeDatasetFile } from '../dataset/dataset-file-writer.ts';
import { episodeNpzPath } from '../dataset/dataset-files.ts';
import { encodeEpisodeNpz } from '../dataset/episode-npz.ts';
import { produceEpisode } from '../dataset/episode-product.ts';
import { ReplayTable } from '../dataset/replay-inputs.ts';
import { loadHdf5Library } from '../dataset/hdf5-runtime.ts';
import { writeSplitHdf5 } from '../dataset/split-hdf5.ts';
import type { SplitEpisode } from '../dataset/split-hdf5.ts';
import { withOverrides } from '../scenario/scenario-overrides.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { loadDemoScenario } from './demo-scenario.ts';
import { median } from './median.ts';

export const EXPORT_EPISODES = 100;
const REPEATS = 3;

export interface ExportRun {
  bytes: number;
  seconds: number;
}

/** The first `count` korrin-tether episodes that are recorded, with their arrays. */
export function tetherEpisodes(count: number): SplitEpisode[] {
  const scenario = withOverrides(loadDemoScenario('korrin-tether'), { episodes: count });
  const episodes: SplitEpisode[] = [];
  for (let index = 0; index < count; index++) {
    const product = produceEpisode(scenario, index, scenario.export.dtype, new ReplayTable());
    if (product.arrays !== null) episodes.push({ id: product.record.id, index, labels: product.record.labels, arrays: product.arrays });
  }
  return episodes;
}

export function exportNpz(episodes: readonly SplitEpisode[], outDir: string): ExportRun {
  const start = performance.now();
  let bytes = 0;
  for (const episode of episodes) bytes += writeDatasetFile(outDir, episodeNpzPath(episode.id), encodeEpisodeNpz(episode.arrays)).sizeBytes;
  return { bytes, seconds: (performance.now() - start) / 1000 };
}

export async function exportHdf5(episodes: readonly SplitEpisode[], outDir: string): Promise<ExportRun> {
  ensureFolder(outDir);
  const path = join(outDir, 'train.h5');
  // Loading and compiling the WebAssembly library happens once per process, not per file.
  await loadHdf5Library();
  const start = performance.now();
  await writeSplitHdf5(path, { datasetName: 'korrin-tether', split: 'train', masterSeed: 'bench' }, episodes);
  const seconds = (performance.now() - start) / 1000;
  return { bytes: statSync(path).size, seconds };
}

let prepared: SplitEpisode[] | undefined;

function exportCase(name: string, run: (episodes: readonly SplitEpisode[], outDir: string) => ExportRun | Promise<ExportRun>): BenchmarkCase {
  return {
    name,
    async run() {
      prepared ??= tetherEpisodes(EXPORT_EPISODES);
      const runs: ExportRun[] = [];
      for (let r = 0; r < REPEATS; r++) {
        const outDir = mkdtempSync(join(tmpdir(), `pliant-bench-${name}-`));
        try {
          runs.push(await run(prepared, outDir));
        } finally {
          rmSync(outDir, { recursive: true, force: true });
        }
      }
      const seconds = median(runs.map((r) => r.seconds));
      const megabytes = runs[0].bytes / 1e6;
      return {
        mb_per_s: Number((megabytes / seconds).toPrecision(4)),
        megabytes: Number(megabytes.toPrecision(4)),
        seconds: Number(seconds.toFixed(3)),
        episodes: prepared.length,
      };
    },
  };
}

export const exportNpzCase = exportCase('export-npz', exportNpz);
export const exportHdf5Case = exportCase('export-hdf5', exportHdf5);
