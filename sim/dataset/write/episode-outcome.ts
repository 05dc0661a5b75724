// One finished episode as the writer receives it: its manifest record, the layout of its arrays
// and the bytes of its NPZ file, ready to be written. Computing it is the whole cost of an
// episode (simulation and compression), so this is what worker threads do.
import type { StepKernel } from '../../core/step-kernel-choice.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import type { ArrayLayout, EpisodeRecord, ExportDtype, StoredDtype } from '../manifest/dataset-manifest.ts';
import { encodeEpisodeNpz } from './episode-npz.ts';
import { produceEpisode } from './episode-product.ts';
import type { ReplayTable } from './replay-inputs.ts';

export interface EpisodeOutcome {
  record: EpisodeRecord;
  /** Layout of the stored arrays; empty for a rejected episode. */
  arrays: ArrayLayout[];
  /** The episode's NPZ file; null for a rejected episode. */
  npz: Uint8Array | null;
}

export function computeEpisodeOutcome(scenario: Scenario, index: number, dtype: ExportDtype, replay: ReplayTable, kernel?: StepKernel): EpisodeOutcome {
  const product = produceEpisode(scenario, index, dtype, replay, kernel);
  if (product.arrays === null) return { record: product.record, arrays: [], npz: null };
  return {
    record: product.record,
    arrays: product.arrays.map((a) => ({ name: a.name, dtype: a.dtype as StoredDtype, shape: [...a.shape] })),
    npz: encodeEpisodeNpz(product.arrays, scenario.export.compression),
  };
}
