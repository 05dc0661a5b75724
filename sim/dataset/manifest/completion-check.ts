// Checks the shape of what a resumed run reads back from its own work folder before trusting it:
// an episode's completion record (.pliant-work/done/<id>.json; the run plan's shard is checked
// beside the shard plan, write/shard-plan.ts). They are written by Pliant, but a folder may have been copied,
// edited or damaged since, and a record of the wrong shape would otherwise surface later as a
// stack trace, or point the finishing step at a file outside the episode's own names.
import { episodeNpzPath, episodePartPath } from './dataset-files.ts';
import type { EpisodeCompletion } from './episode-completion.ts';
import { manifestPieceProblems } from './manifest-check.ts';

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function isCount(value: unknown): value is number {
  return typeof value === 'number' && Number.isInteger(value) && value >= 0;
}

/** What is wrong with a parsed completion record of episode `expectedId`, or null when it is sound. */
export function completionProblem(value: unknown, expectedId: string): string | null {
  if (!isObject(value)) return 'it is not a JSON object';
  const record = value.record;
  if (!isObject(record)) return '/record is missing or not an object';
  if (record.id !== expectedId) return `/record/id is ${JSON.stringify(record.id)}, not ${JSON.stringify(expectedId)}`;
  // The finishing step fills in `files`; until then it is empty, so the record is checked
  // against the manifest's episode schema as it will stand then.
  if (!Array.isArray(record.files) || record.files.length > 0) return '/record/files is not the empty list a run leaves there';
  const asListed = { ...record, files: record.status === 'ok' ? [episodeNpzPath(expectedId)] : [] };
  const recordProblems = manifestPieceProblems('episode', asListed);
  if (recordProblems.length > 0) return `/record${recordProblems[0]}`;
  if (!Array.isArray(value.arrays)) return '/arrays is missing or not a list';
  for (let i = 0; i < value.arrays.length; i++) {
    const a: unknown = value.arrays[i];
    if (!isObject(a) || typeof a.name !== 'string' || typeof a.dtype !== 'string' || !Array.isArray(a.shape) || !a.shape.every(isCount)) {
      return `/arrays/${i} is not an array layout (name, dtype and a shape of whole numbers)`;
    }
  }
  const npz = value.npz;
  if (npz === null) return record.status === 'rejected' ? null : '/npz is null but the episode is not rejected';
  if (record.status === 'rejected') return '/npz names a file but the episode is rejected';
  if (!isObject(npz)) return '/npz is not an object or null';
  const own = [episodeNpzPath(expectedId), episodePartPath(expectedId)];
  if (!own.includes(npz.path as string)) return `/npz/path is ${JSON.stringify(npz.path)}, not one of the episode's own files (${own.join(', ')})`;
  if (typeof npz.sha256 !== 'string' || !/^[0-9a-f]{64}$/.test(npz.sha256)) return '/npz/sha256 is not 64 lower-case hexadecimal digits';
  if (!isCount(npz.sizeBytes)) return '/npz/sizeBytes is not a whole number of bytes';
  return null;
}

/** The completion record in `value` when it is sound, else null. */
export function asCompletion(value: unknown, expectedId: string): EpisodeCompletion | null {
  return completionProblem(value, expectedId) === null ? (value as EpisodeCompletion) : null;
}
