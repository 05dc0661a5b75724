// Writing speed of the data files, apart from the simulation, for each `export.compression`
// choice. korrin-tether episodes are simulated once, untimed, and kept in memory; then
//   export-npz   encodes every episode as its NPZ file and writes it as a run writes
//                episodes/<id>.npz (temporary name, flush, rename, folder flush);
//   export-hdf5  writes them all as one split HDF5 file (one group per episode) as the
//                finishing step writes <split>.h5, from the arrays in memory (the finishing
//                step also reads each episode's NPZ file back first; that is not timed here).
// mb_per_s is megabytes (10^6 bytes) of array data (the uncompressed bytes of the recorded
// arrays, without NPY headers) written per second on one thread; ratio is those bytes over the
// bytes of the files written. Each case runs three times into a fresh temporary folder; the
// median time is reported; export-npz lines also give encode_mb_per_s, the same bytes over the
// encoding time alone (in memory, before the file is written and flushed). One line per case
// and choice:
//   {"case":"export-npz","compression":"fast","mb_per_s":…,"ratio":…,"array_megabytes":…,"megabytes":…,"seconds":…,"episodes":…}
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { loadHdf5Library } from '../dataset/formats/hdf5-runtime.ts';
import { episodeNpzPath } from '../dataset/manifest/dataset-files.ts';
import { ensureFolder, writeDatasetFile } from '../dataset/write/dataset-file-writer.ts';
import { encodeEpisodeNpz } from '../dataset/write/episode-npz.ts';
import { produceEpisode } from '../dataset/write/episode-product.ts';
import { ReplayTable } from '../dataset/write/replay-inputs.ts';
import type { SplitEpisode } from '../dataset/write/split-hdf5.ts';
import { writeSplitHdf5 } from '../dataset/write/split-hdf5.ts';
import { EXPORT_COMPRESSIONS, type ExportCompression } from '../scenario/export-compression.ts';
import { withOverrides } from '../scenario/scenario-overrides.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { loadDemoScenario } from './demo-scenario.ts';
import { median } from './median.ts';

export const EXPORT_EPISODES = 60;
const REPEATS = 3;

export interface ExportRun {
  /** Bytes of the files written. */
  bytes: number;
  seconds: number;
  /** NPZ only: of `seconds`, the time spent encoding in memory (compression, CRC-32, ZIP records). */
  encodeSeconds?: number;
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

/** Bytes of array data the episodes hold, headers and attributes not counted. */
export function arrayBytes(episodes: readonly SplitEpisode[]): number {
  let bytes = 0;
  for (const episode of episodes) for (const array of episode.arrays) bytes += array.data.byteLength;
  return bytes;
}

export function exportNpz(episodes: readonly SplitEpisode[], outDir: string, compression: ExportCompression): ExportRun {
  const start = performance.now();
  let bytes = 0;
  let encodeMs = 0;
  for (const episode of episodes) {
    const encodeStart = performance.now();
    const npz = encodeEpisodeNpz(episode.arrays, compression);
    encodeMs += performance.now() - encodeStart;
    bytes += writeDatasetFile(outDir, episodeNpzPath(episode.id), npz).sizeBytes;
  }
  return { bytes, seconds: (performance.now() - start) / 1000, encodeSeconds: encodeMs / 1000 };
}

export async function exportHdf5(episodes: readonly SplitEpisode[], outDir: string, compression: ExportCompression): Promise<ExportRun> {
  ensureFolder(outDir);
  const path = join(outDir, 'train.h5');
  // Loading and compiling the WebAssembly library happens once per process, not per file.
  await loadHdf5Library();
  const start = performance.now();
  await writeSplitHdf5(path, { datasetName: 'korrin-tether', split: 'train', masterSeed: 'bench' }, episodes, compression);
  const seconds = (performance.now() - start) / 1000;
  return { bytes: statSync(path).size, seconds };
}

let prepared: SplitEpisode[] | undefined;

type ExportWriter = (episodes: readonly SplitEpisode[], outDir: string, compression: ExportCompression) => ExportRun | Promise<ExportRun>;

function exportCase(name: string, compression: ExportCompression, write: ExportWriter): BenchmarkCase {
  return {
    name,
    async run() {
      prepared ??= tetherEpisodes(EXPORT_EPISODES);
      const runs: ExportRun[] = [];
      for (let r = 0; r < REPEATS; r++) {
        const outDir = mkdtempSync(join(tmpdir(), `pliant-bench-${name}-`));
        try {
          runs.push(await write(prepared, outDir, compression));
        } finally {
          rmSync(outDir, { recursive: true, force: true });
        }
      }
      const seconds = median(runs.map((r) => r.seconds));
      const encodeSeconds = runs[0].encodeSeconds === undefined ? undefined : median(runs.map((r) => r.encodeSeconds!));
      const arrayMegabytes = arrayBytes(prepared) / 1e6;
      const megabytes = runs[0].bytes / 1e6;
      return {
        compression,
        mb_per_s: Number((arrayMegabytes / seconds).toPrecision(4)),
        ratio: Number((arrayMegabytes / megabytes).toPrecision(4)),
        array_megabytes: Number(arrayMegabytes.toPrecision(4)),
        megabytes: Number(megabytes.toPrecision(4)),
        seconds: Number(seconds.toPrecision(4)),
        ...(encodeSeconds === undefined ? {} : { encode_mb_per_s: Number((arrayMegabytes / encodeSeconds).toPrecision(4)), encode_seconds: Number(encodeSeconds.toPrecision(4)) }),
        episodes: prepared.length,
      };
    },
  };
}

export const exportNpzCases = EXPORT_COMPRESSIONS.map((c) => exportCase('export-npz', c, exportNpz));
export const exportHdf5Cases = EXPORT_COMPRESSIONS.map((c) => exportCase('export-hdf5', c, exportHdf5));
