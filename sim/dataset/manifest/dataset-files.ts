// The names of everything in a dataset folder (see LAYOUT.md), in one place so the writer, the
// merger, the verifier and the reader can never disagree about where a file lives.

export const SEED_FILE = 'seed.json';
export const MANIFEST_FILE = 'manifest.json';
export const CARD_FILE = 'CARD.md';
/** The card's SVG pictures, which CARD.md links (card-pictures.ts). */
export const CARD_PICTURES_FOLDER = 'card';
/** Per-episode NPZ files. */
export const EPISODES_FOLDER = 'episodes';
/** Copies of the files a scenario reads (replayed controls), so the seed file is self-contained. */
export const INPUTS_FOLDER = 'inputs';
/**
 * Work in progress: the run plan, one completion record per finished episode and intermediate
 * files. Removed when the dataset is complete; its presence means "resume me".
 */
export const WORK_FOLDER = '.pliant-work';
export const WORK_PLAN_FILE = `${WORK_FOLDER}/plan.json`;
export const WORK_DONE_FOLDER = `${WORK_FOLDER}/done`;
export const WORK_PARTS_FOLDER = `${WORK_FOLDER}/parts`;
/** Present while a run writes the folder: who holds it (see folder-lock.ts). */
export const LOCK_FILE = '.pliant-lock';

const SPLIT_NAME = /^[A-Za-z0-9][A-Za-z0-9_-]{0,63}$/;

/** Episode ids are zero-padded so that sorting them as text sorts them by index. */
export function episodeId(index: number, episodeCount: number): string {
  const width = Math.max(6, String(Math.max(0, episodeCount - 1)).length);
  return `ep-${String(index).padStart(width, '0')}`;
}

export function episodeNpzPath(id: string): string {
  return `${EPISODES_FOLDER}/${id}.npz`;
}

/** Intermediate per-episode file a split's HDF5 file is assembled from when NPZ is not kept. */
export function episodePartPath(id: string): string {
  return `${WORK_PARTS_FOLDER}/${id}.npz`;
}

export function episodeDonePath(id: string): string {
  return `${WORK_DONE_FOLDER}/${id}.json`;
}

export function splitHdf5Path(split: string): string {
  return `${split}.h5`;
}

/** Split names become file names; keep them to letters, digits, '-' and '_'. */
export function isUsableSplitName(split: string): boolean {
  return SPLIT_NAME.test(split);
}
