// Reads a manifest.json of any size one piece at a time: the head members, then each episode
// record, then each file record, then the documents and the run. Nothing holds the whole file,
// so memory does not grow with the number of episodes (a sweep may ask for 10^8). Each piece is
// checked against its part of MANIFEST_SCHEMA as it arrives; a piece that fails is reported with
// its JSON pointer and left out, and reading goes on. A split HDF5 file's record lists every
// episode and array of its split, so those two lists are walked item by item too.
//
// The format is unchanged: this reads exactly what dataset-finish.ts writes (and any other
// layout of the same JSON). `readFolderState` stays for the small readers of ordinary folders.
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { join } from 'node:path';

import { DatasetReadError } from '../formats/dataset-read-error.ts';
import { Sha256Stream } from '../formats/file-digest.ts';
import type { JsonPath } from '../formats/json-stream-scanner.ts';
import { JsonStreamError, scanJsonStream } from '../formats/json-stream-scanner.ts';
import { systemErrorCode } from '../formats/read-file-bytes.ts';
import { MANIFEST_FILE } from './dataset-files.ts';
import type { ArrayRecord, DataFileRecord, EpisodeRecord, FileRecord, InputFileRecord, ManifestHead } from './dataset-manifest.ts';
import { EPISODE_RECORDS_DIGEST_MEMBER } from './episode-records-digest.ts';
import { manifestPieceProblems } from './manifest-check.ts';

/** A file record as streamed: lists longer than KEPT_LIST_ITEMS are given item by item only (null here). */
export interface StreamedFileRecord extends FileRecord {
  kind: DataFileRecord['kind'];
  split: string;
  episodes: string[] | null;
  arrays: ArrayRecord[] | null;
  episodeCount: number;
  arrayCount: number;
}

export type ManifestEvent =
  /** Once, before the first episode: every member that precedes `episodes`. */
  | { kind: 'head'; head: ManifestHead }
  | { kind: 'episode'; position: number; record: EpisodeRecord }
  /** Each id of a file record's `episodes`, with the members of that record read so far. */
  | { kind: 'file-episode'; position: number; file: Partial<StreamedFileRecord>; id: string }
  | { kind: 'file'; position: number; record: StreamedFileRecord }
  | { kind: 'documents'; documents: (FileRecord | InputFileRecord)[] }
  | { kind: 'run'; run: Record<string, unknown> }
  /** The SHA-256 the writer recorded over the episode records (episodeRecordsDigest). */
  | { kind: 'episode-digest'; sha256: string }
  /** A piece that does not satisfy the schema, or a member out of place; it is left out. */
  | { kind: 'problem'; message: string };

/** Lists of a file record up to this many items are also kept on the record. */
export const KEPT_LIST_ITEMS = 4096;
/** The largest single piece (a head member, one record) read as one value. */
export const MAX_MANIFEST_PIECE_BYTES = 64 * 1024 * 1024;
const MAX_PIECE_DEPTH = 64;

const HEAD_MEMBERS = ['manifestFormat', 'pliantVersion', 'name', 'description', 'masterSeed', 'episodeCount', 'shard', 'export', 'splits', 'normalisation', 'scenario'] as const;
const TOP_MEMBERS = new Set<string>([...HEAD_MEMBERS, 'episodes', EPISODE_RECORDS_DIGEST_MEMBER, 'files', 'documents', 'run']);

function walked(path: JsonPath): boolean {
  if (path.length === 0) return true;
  if (path.length === 1) return path[0] === 'episodes' || path[0] === 'files';
  if (path[0] !== 'files') return false;
  if (path.length === 2) return true;
  return path.length === 3 && (path[2] === 'episodes' || path[2] === 'arrays');
}

function pointer(path: JsonPath): string {
  return path.map((p) => `/${String(p).replaceAll('~', '~0').replaceAll('/', '~1')}`).join('');
}

/** A file's bytes, read through one descriptor that is closed when the reading stops. */
class FileSource {
  private readonly fd: number;
  constructor(readonly path: string) {
    try {
      this.fd = openSync(path, 'r');
    } catch (error) {
      throw new DatasetReadError(path, '', `cannot open the file (${systemErrorCode(error)})`, 'check that it exists and is readable');
    }
    if (!fstatSync(this.fd).isFile()) {
      closeSync(this.fd);
      throw new DatasetReadError(path, '', 'is not a regular file', `replace it with the ${MANIFEST_FILE} the run wrote`);
    }
  }
  read(into: Uint8Array): number {
    try {
      return readSync(this.fd, into, 0, into.byteLength, null);
    } catch (error) {
      throw new DatasetReadError(this.path, '', `reading failed (${systemErrorCode(error)})`, 'check the disk and try again');
    }
  }
  close(): void {
    closeSync(this.fd);
  }
}

interface FileInProgress {
  position: number;
  members: Record<string, unknown>;
  episodes: string[];
  arrays: ArrayRecord[];
  episodeCount: number;
  arrayCount: number;
  firstEpisode: unknown;
  firstArray: unknown;
  sawEpisodes: boolean;
  sawArrays: boolean;
}

/**
 * The manifest at `manifestPath`, piece by piece. Malformed JSON, a piece over the size or depth
 * limit, or a failed read ends the reading with a DatasetReadError naming the file and line.
 */
export function* readManifestStream(manifestPath: string): Generator<ManifestEvent> {
  const source = new FileSource(manifestPath);
  const head: Record<string, unknown> = {};
  let headGiven = false;
  let file: FileInProgress | null = null;
  const seen = new Set<string>();
  // A piece's problems are "/member: message" or "/: message" for the piece itself.
  const problems = (pieceProblems: string[], at: JsonPath | string): ManifestEvent[] => {
    if (pieceProblems.length === 0) return pieceProblems as [];
    const prefix = typeof at === 'string' ? at : pointer(at);
    return pieceProblems.map((p) => ({ kind: 'problem', message: `${MANIFEST_FILE} ${p.startsWith('/: ') ? `${prefix || '/'}${p.slice(1)}` : `${prefix}${p}`}` }));
  };
  function* giveHead(): Generator<ManifestEvent> {
    if (headGiven) return;
    headGiven = true;
    const found = problems(manifestPieceProblems('head', head), '');
    yield* found;
    yield { kind: 'head', head: head as unknown as ManifestHead };
  }
  try {
    for (const event of scanJsonStream(source, walked, { maxValueBytes: MAX_MANIFEST_PIECE_BYTES, maxDepth: MAX_PIECE_DEPTH })) {
      const { path } = event;
      if (path.length === 0) {
        if (event.kind === 'value') {
          yield { kind: 'problem', message: `${MANIFEST_FILE} /: must be object` };
        } else if (event.kind === 'close') {
          yield* giveHead();
          for (const member of ['episodes', 'files', 'documents', 'run']) {
            if (!seen.has(member)) yield { kind: 'problem', message: `${MANIFEST_FILE} /: must have required property '${member}'` };
          }
        }
        continue;
      }
      const top = path[0] as string;
      if (path.length === 1) {
        if (event.kind === 'close') continue;
        seen.add(top);
        if (!TOP_MEMBERS.has(top)) {
          yield { kind: 'problem', message: `${MANIFEST_FILE} /: must NOT have additional properties ("${top}")` };
          continue;
        }
        if ((HEAD_MEMBERS as readonly string[]).includes(top)) {
          if (headGiven) yield { kind: 'problem', message: `${MANIFEST_FILE} /${top}: comes after the episode records; Pliant writes every head member first` };
          else if (event.kind === 'value') head[top] = event.value;
          continue;
        }
        if (top === 'episodes' || top === 'files') {
          yield* giveHead();
          if (event.kind === 'value') yield { kind: 'problem', message: `${MANIFEST_FILE} /${top}: must be array` };
          else if (event.container !== 'array') yield { kind: 'problem', message: `${MANIFEST_FILE} /${top}: must be array` };
          continue;
        }
        if (event.kind !== 'value') continue;
        yield* giveHead();
        if (top === EPISODE_RECORDS_DIGEST_MEMBER) {
          if (typeof event.value === 'string' && /^[0-9a-f]{64}$/.test(event.value)) yield { kind: 'episode-digest', sha256: event.value };
          else yield { kind: 'problem', message: `${MANIFEST_FILE} /${top}: must be a SHA-256 in 64 lower-case hexadecimal digits` };
        } else if (top === 'documents') {
          const found = problems(manifestPieceProblems('documents', event.value), '/documents');
          if (found.length > 0) yield* found;
          else yield { kind: 'documents', documents: event.value as (FileRecord | InputFileRecord)[] };
        } else {
          const found = problems(manifestPieceProblems('run', event.value), '/run');
          if (found.length > 0) yield* found;
          else yield { kind: 'run', run: event.value as Record<string, unknown> };
        }
        continue;
      }
      if (top === 'episodes') {
        if (event.kind !== 'value') continue;
        const position = path[1] as number;
        const found = problems(manifestPieceProblems('episode', event.value), path);
        if (found.length > 0) yield* found;
        else yield { kind: 'episode', position, record: event.value as EpisodeRecord };
        continue;
      }
      // A file record: /files/N, /files/N/member, /files/N/episodes/M, /files/N/arrays/M.
      const position = path[1] as number;
      if (path.length === 2) {
        if (event.kind === 'value') {
          const found = problems(manifestPieceProblems('file', event.value), path);
          if (found.length > 0) yield* found;
          else yield { kind: 'file', position, record: keptFile(event.value as DataFileRecord) };
          continue;
        }
        if (event.kind === 'open') {
          file = { position, members: {}, episodes: [], arrays: [], episodeCount: 0, arrayCount: 0, firstEpisode: undefined, firstArray: undefined, sawEpisodes: false, sawArrays: false };
          continue;
        }
        const done = file!;
        file = null;
        // The record is checked with its lists cut to their first item; every item was checked on its own.
        const checked = { ...done.members };
        if (done.sawEpisodes) checked.episodes = done.episodeCount > 0 ? [done.firstEpisode] : [];
        if (done.sawArrays) checked.arrays = done.arrayCount > 0 ? [done.firstArray] : [];
        const found = problems(manifestPieceProblems('file', checked), path);
        if (found.length > 0) {
          yield* found;
          continue;
        }
        const members = done.members as unknown as FileRecord & { kind: DataFileRecord['kind']; split: string };
        yield {
          kind: 'file',
          position,
          record: {
            path: members.path,
            sha256: members.sha256,
            sizeBytes: members.sizeBytes,
            kind: members.kind,
            split: members.split,
            episodes: done.episodeCount <= KEPT_LIST_ITEMS ? done.episodes : null,
            arrays: done.arrayCount <= KEPT_LIST_ITEMS ? done.arrays : null,
            episodeCount: done.episodeCount,
            arrayCount: done.arrayCount,
          },
        };
        continue;
      }
      const current = file!;
      const member = path[2] as string;
      if (path.length === 3) {
        if (event.kind === 'value') current.members[member] = event.value;
        else if (member === 'episodes') current.sawEpisodes = true;
        else if (member === 'arrays') current.sawArrays = true;
        continue;
      }
      if (event.kind !== 'value') continue;
      if (member === 'episodes') {
        const found = problems(manifestPieceProblems('episode-id', event.value), path);
        if (found.length > 0) {
          yield* found;
          continue;
        }
        const id = event.value as string;
        if (current.episodeCount === 0) current.firstEpisode = id;
        current.episodeCount++;
        if (current.episodes.length < KEPT_LIST_ITEMS + 1) current.episodes.push(id);
        yield { kind: 'file-episode', position, file: current.members as Partial<StreamedFileRecord>, id };
      } else {
        const found = problems(manifestPieceProblems('array', event.value), path);
        if (found.length > 0) {
          yield* found;
          continue;
        }
        if (current.arrayCount === 0) current.firstArray = event.value;
        current.arrayCount++;
        if (current.arrays.length < KEPT_LIST_ITEMS + 1) current.arrays.push(event.value as ArrayRecord);
      }
    }
  } catch (error) {
    if (error instanceof JsonStreamError) throw new DatasetReadError(manifestPath, `line ${error.line}`, `not valid JSON: ${error.problem}`, 'regenerate the folder, or restore the manifest the run wrote');
    throw error;
  } finally {
    source.close();
  }
}
function keptFile(record: DataFileRecord): StreamedFileRecord {
  return { ...record, episodeCount: record.episodes.length, arrayCount: record.arrays.length };
}

/** Only the members before the episode records: cheap whatever the manifest's size. */
export function readManifestHead(manifestPath: string): { head: ManifestHead | null; problems: string[] } {
  const problems: string[] = [];
  for (const event of readManifestStream(manifestPath)) {
    if (event.kind === 'problem') problems.push(event.message);
    if (event.kind === 'head') return { head: problems.length === 0 ? event.head : null, problems };
  }
  return { head: null, problems };
}

/** Calls `visit` with every episode record of the folder's manifest, in file order; returns the schema problems met. */
export function forEachManifestEpisode(dir: string, visit: (record: EpisodeRecord, position: number) => void): string[] {
  const problems: string[] = [];
  for (const event of readManifestStream(join(dir, MANIFEST_FILE))) {
    if (event.kind === 'episode') visit(event.record, event.position);
    else if (event.kind === 'problem') problems.push(event.message);
  }
  return problems;
}

/**
 * SHA-256 over every value of the manifest but `run`, each with its path: two manifests with
 * the same digest say the same outside `run`, whatever their size. Null when the file is absent
 * or not valid JSON.
 */
export function manifestDigestWithoutRun(manifestPath: string): string | null {
  let source: FileSource;
  try {
    source = new FileSource(manifestPath);
  } catch {
    return null;
  }
  const hash = new Sha256Stream();
  try {
    for (const event of scanJsonStream(source, walked, { maxValueBytes: MAX_MANIFEST_PIECE_BYTES, maxDepth: MAX_PIECE_DEPTH })) {
      if (event.path[0] === 'run') continue;
      hash.update(event.kind === 'value' ? JSON.stringify([event.path, event.value]) : JSON.stringify([event.path, event.kind]));
      hash.update('\n');
    }
  } catch (error) {
    if (error instanceof JsonStreamError) return null;
    throw error;
  } finally {
    source.close();
  }
  return hash.hex();
}
