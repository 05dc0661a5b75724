// The DatasetReader seam filled with the dataset pipeline's reader (sim/dataset/read/dataset-reader.ts):
// summaries and episode pages from the manifest, one episode's arrays from its NPZ file or HDF5
// group, and verification by the same code as `pliant verify`, run in a worker thread.
import { stat } from 'node:fs/promises';

import { compareDatasetFolders } from '../sim/dataset/read/dataset-comparison.ts';
import { readDatasetOverview } from '../sim/dataset/read/dataset-overview.ts';
import { DatasetReader as SimDatasetReader } from '../sim/dataset/read/dataset-reader.ts';
import { shown } from './allowed-folders.ts';
import { inAppWords } from './app-run-words.ts';
import { translateDatasetError } from './dataset-error-translation.ts';
import { encodeArray } from './encoded-array.ts';
import { RequestError } from './request-error.ts';
import type { DatasetReader } from './request-services.ts';
import { createWorkerVerifier } from './verify-in-worker.ts';

export interface SimDatasetReaderOptions {
  /** Worker entry that runs one verification (sim/dataset/jobs/app-worker-urls.ts). */
  verifyWorkerUrl: URL;
}

export function createSimDatasetReader(options: SimDatasetReaderOptions): DatasetReader {
  const reader = new SimDatasetReader();
  const verifyFolder = createWorkerVerifier(options.verifyWorkerUrl);
  const translated = async <T>(work: () => Promise<T>): Promise<T> => {
    try {
      return await work();
    } catch (error) {
      throw translateDatasetError(error);
    }
  };

  return {
    summary: (dir) =>
      translated(async () => {
        const s = await reader.summary(dir);
        const overview = await readDatasetOverview(dir, await reader.manifest(dir));
        return {
          path: s.dir,
          title: s.title,
          scenarioName: s.scenarioName,
          episodeCount: s.episodeCount,
          splitCounts: s.splitCounts,
          formats: s.formats,
          seedFilePath: s.seedFilePath,
          createdAtIso: s.createdAtIso,
          toolVersion: s.pliantVersion,
          cardMarkdown: s.cardMarkdown,
          arrays: s.arrays.map((a) => ({ name: a.name, dtype: a.dtype, shape: a.shape, extentRanges: a.shape.map((_, axis) => [a.minShape[axis], a.maxShape[axis]] as [number, number]), unit: a.unit })),
          labelKeys: s.labelKeys,
          controlChannels: overview.controlChannels,
          controlChannelsVary: overview.controlChannelsVary,
          sizeBytes: overview.sizeBytes,
        };
      }),

    episodes: (dir, query) =>
      translated(async () => {
        const page = await reader.episodes(dir, query);
        return { total: page.total, offset: page.offset, rows: page.rows.map((r) => ({ episodeId: r.id, split: r.split, labels: r.labels })) };
      }),

    episodeArrays: (dir, episodeId) =>
      translated(async () => {
        const read = await reader.episodeArrays(dir, episodeId);
        return { episodeId: read.episode.id, arrays: read.arrays.map(encodeArray), controlChannels: read.episode.controlChannels.map((c) => ({ ...c })) };
      }),

    verify: (dir) =>
      translated(async () => {
        // Checked here so a wrong path is answered at once, without starting a worker.
        const info = await stat(dir).catch(() => null);
        if (!info) throw new RequestError('not-found', `${shown(dir)} does not exist. Open the dataset folder a Pliant export wrote.`);
        if (!info.isDirectory()) throw new RequestError('invalid-dataset', `${shown(dir)} is a file. Open the dataset folder that holds manifest.json.`);
        const report = await verifyFolder(dir);
        return { ok: report.ok, checkedFiles: report.checkedFiles, problems: report.problems.map((p) => ({ ...p, message: inAppWords(p.message) })) };
      }),

    // Streamed hashing in the main process: each chunk is short work between reads, so requests
    // keep being answered while a large folder is compared.
    compare: (originalDir, regeneratedDir) => translated(async () => ({ comparisons: (await compareDatasetFolders(originalDir, regeneratedDir)).map(({ path, result }) => ({ file: path, result })) })),
  };
}
