// A summary of a dataset folder for a person at a terminal: episodes per split, the range of
// every sampled parameter, the space the files take and the episodes that were rejected. Works
// on unfinished folders too, from their completion records.
import { readFile, readdir } from 'node:fs/promises';
import { join } from 'node:path';
import { readFolderState } from './dataset-folder-state.ts';
import type { EpisodeRecord } from './dataset-manifest.ts';
import type { EpisodeCompletion } from './episode-completion.ts';
import { WORK_DONE_FOLDER } from './dataset-files.ts';
import { formatLabelNumber } from './text-histogram.ts';
import { unitOfLabel } from './label-units.ts';
import { DatasetRequestError } from './dataset-request-error.ts';

export interface DatasetInspection {
  dir: string;
  name: string;
  state: 'complete' | 'in progress';
  shard: { index: number; count: number } | null;
  episodeCount: number;
  listedEpisodes: number;
  splits: Array<{ split: string; ok: number; rejected: number }>;
  parameters: Array<{ pointer: string; unit: string; summary: string }>;
  sizes: Array<{ kind: string; files: number; bytes: number }>;
  rejected: Array<{ id: string; split: string; step: number; node: number; kind: string; cause: string }>;
}

async function completionsOf(dir: string): Promise<EpisodeRecord[]> {
  let names: string[];
  try {
    names = (await readdir(join(dir, WORK_DONE_FOLDER))).filter((n) => n.endsWith('.json')).sort();
  } catch {
    return [];
  }
  const records: EpisodeRecord[] = [];
  for (const name of names) {
    try {
      records.push((JSON.parse(await readFile(join(dir, WORK_DONE_FOLDER, name), 'utf8')) as EpisodeCompletion).record);
    } catch {
      // A record being written right now is skipped; it is counted on the next look.
    }
  }
  return records;
}

function parameterSummary(episodes: EpisodeRecord[]): DatasetInspection['parameters'] {
  const pointers = [...new Set(episodes.flatMap((e) => Object.keys(e.labels)))];
  const channelUnits = new Map(episodes.flatMap((e) => e.controlChannels).map((c) => [c.name, c.unit]));
  return pointers.map((pointer) => {
    const values = episodes.filter((e) => pointer in e.labels).map((e) => e.labels[pointer]);
    const numbers = values.filter((v): v is number => typeof v === 'number');
    let summary: string;
    if (numbers.length === values.length && numbers.length > 0) {
      const min = Math.min(...numbers);
      const max = Math.max(...numbers);
      summary = min === max ? `${formatLabelNumber(min)} (fixed)` : `${formatLabelNumber(min)} to ${formatLabelNumber(max)}`;
    } else {
      const distinct = [...new Set(values.map((v) => (typeof v === 'string' ? v : JSON.stringify(v))))];
      summary = distinct.length <= 4 ? distinct.join(', ') : `${distinct.length} distinct values`;
    }
    return { pointer, unit: unitOfLabel(pointer, channelUnits), summary };
  });
}

export async function inspectDataset(dir: string): Promise<DatasetInspection> {
  const state = await readFolderState(dir);
  const manifest = state.manifest;
  if (!manifest && !state.inProgress) {
    throw new DatasetRequestError(`${dir} holds no usable manifest: ${state.manifestProblems[0]}; run \`pliant verify ${dir}\` for details`);
  }
  const episodes = manifest ? manifest.episodes : await completionsOf(dir);
  const seed = state.seedText ? (JSON.parse(state.seedText) as { scenario?: { name?: string }; episodeCount?: number }) : {};
  // A finished manifest also lists the splits that drew no episode.
  const splitNames = [...new Set([...Object.keys(manifest?.splits ?? {}), ...episodes.map((e) => e.split)])];
  const splits = splitNames.map((split) => {
    const members = episodes.filter((e) => e.split === split);
    const ok = members.filter((e) => e.status === 'ok').length;
    return { split, ok, rejected: members.length - ok };
  });
  const sizes: DatasetInspection['sizes'] = [];
  if (manifest) {
    const groups: Array<[string, Array<{ sizeBytes: number }>]> = [
      ['episode NPZ', manifest.files.filter((f) => f.kind === 'episode-npz')],
      ['split HDF5', manifest.files.filter((f) => f.kind === 'split-hdf5')],
      ['documents and inputs', manifest.documents],
    ];
    for (const [kind, files] of groups) if (files.length > 0) sizes.push({ kind, files: files.length, bytes: files.reduce((sum, f) => sum + f.sizeBytes, 0) });
  }
  return {
    dir,
    name: manifest?.name ?? seed.scenario?.name ?? '',
    state: manifest && !state.inProgress ? 'complete' : 'in progress',
    shard: manifest?.shard ?? null,
    episodeCount: manifest?.episodeCount ?? seed.episodeCount ?? episodes.length,
    listedEpisodes: episodes.length,
    splits,
    parameters: parameterSummary(episodes),
    sizes,
    rejected: episodes
      .filter((e) => e.status === 'rejected' && e.rejection)
      .map((e) => ({ id: e.id, split: e.split, step: e.rejection!.step, node: e.rejection!.node, kind: e.rejection!.kind, cause: e.rejection!.likelyCause })),
  };
}
