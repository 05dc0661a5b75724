// NPZ files: a ZIP archive of `<name>.npy` members, the layout numpy.savez and
// numpy.savez_compressed write and numpy.load reads. The same arrays always give the same bytes:
// members keep the order given, every member carries the fixed time 1980-01-01 00:00:00 (the
// earliest ZIP time), Unix mode 0644 and no extra fields, and deflate output depends only on
// the input, the level and the fflate version pinned in package-lock.json.
//
// Compression: 'deflate' (default, level 6, what numpy.savez_compressed gives) or 'stored'
// (no compression, what numpy.savez gives; fastest, and float trajectories rarely shrink much).
// The archive is built in memory and has no ZIP64 records, so it must stay under 4 GiB.
import { unzipSync, type Zippable,zipSync } from 'fflate';

import { PliantError } from '../../errors/pliant-error.ts';
import { type AtomicWriteOptions,writeFileAtomic } from './atomic-file.ts';
import { DatasetReadError } from './dataset-read-error.ts';
import { DatasetWriteError } from './dataset-write-error.ts';
import type { NamedArray } from './named-array.ts';
import { decodeNpy, encodeNpyBytes } from './npy.ts';
import { readFileBytes } from './read-file-bytes.ts';

export type NpzCompression = 'deflate' | 'stored';

export interface NpzOptions {
  readonly compression?: NpzCompression;
  /** 1 (fastest) to 9 (smallest); only for 'deflate'. Default 6. */
  readonly deflateLevel?: 1 | 2 | 3 | 4 | 5 | 6 | 7 | 8 | 9;
}

export const NPZ_DEFAULT_DEFLATE_LEVEL = 6;

// Built from local-time parts because the ZIP header stores local date and time fields: this
// way every time zone writes the same bytes.
function fixedMemberTime(): Date {
  return new Date(1980, 0, 1, 0, 0, 0);
}

const UNIX_HOST = 3;
const REGULAR_FILE_0644 = (0o100644 << 16) >>> 0;

// Without ZIP64, sizes and offsets are 32-bit fields.
const ZIP32_LIMIT_BYTES = 0xffffffff;

/** The arrays do not fit one NPZ file without ZIP64; writeNpzFile turns it into a DatasetWriteError naming the file. */
export class NpzTooLargeError extends PliantError {
  constructor(totalBytes: number) {
    super('user', 'npz-too-large', `the arrays add up to ${totalBytes} bytes, 4 GiB or more, beyond what an NPZ file without ZIP64 holds`);
    this.name = 'NpzTooLargeError';
  }
}

/** Encodes the arrays as an NPZ archive; names must be distinct. */
export function encodeNpz(arrays: readonly NamedArray[], options: NpzOptions = {}): Uint8Array {
  const compression = options.compression ?? 'deflate';
  const level = compression === 'stored' ? 0 : options.deflateLevel ?? NPZ_DEFAULT_DEFLATE_LEVEL;
  if (!Number.isInteger(level) || level < 0 || level > 9) throw new RangeError(`deflateLevel ${level} is not an integer from 1 to 9`);
  const members: Zippable = {};
  let totalBytes = 0;
  for (const array of arrays) {
    const memberName = `${array.name}.npy`;
    if (Object.hasOwn(members, memberName)) throw new RangeError(`two arrays are named '${array.name}'; NPZ member names must be distinct`);
    const bytes = encodeNpyBytes(array);
    totalBytes += bytes.byteLength;
    if (totalBytes >= ZIP32_LIMIT_BYTES) throw new NpzTooLargeError(totalBytes);
    members[memberName] = bytes;
  }
  return zipSync(members, { level, mtime: fixedMemberTime(), os: UNIX_HOST, attrs: REGULAR_FILE_0644 });
}

/** Writes an NPZ file atomically; see `encodeNpz`. */
export function writeNpzFile(path: string, arrays: readonly NamedArray[], options: NpzOptions & AtomicWriteOptions = {}): void {
  let bytes: Uint8Array;
  try {
    bytes = encodeNpz(arrays, options);
  } catch (error) {
    if (error instanceof NpzTooLargeError) {
      throw new DatasetWriteError('too-large', path,
        `cannot write ${path}: ${error.message}; put fewer episodes in each file or choose the HDF5 format`);
    }
    throw error;
  }
  writeFileAtomic(path, bytes, options);
}

/** Decodes an NPZ archive into its arrays, in archive order; `path` names the file in messages. */
export function decodeNpz(bytes: Uint8Array, path: string): NamedArray[] {
  let members: Record<string, Uint8Array>;
  try {
    members = unzipSync(bytes);
  } catch (error) {
    throw new DatasetReadError(path, '', `this is not a readable ZIP archive (${error instanceof Error ? error.message : String(error)})`,
      'write it with numpy.savez or numpy.savez_compressed');
  }
  const arrays: NamedArray[] = [];
  for (const [memberName, memberBytes] of Object.entries(members)) {
    if (memberName.endsWith('/')) continue;
    if (!memberName.endsWith('.npy')) {
      throw new DatasetReadError(path, `member ${memberName}`, 'the archive holds a member that is not an .npy file',
        'keep only arrays in the archive');
    }
    arrays.push(decodeNpy(memberBytes, `${path}:${memberName}`, memberName.slice(0, -'.npy'.length)));
  }
  return arrays;
}

export function readNpzFile(path: string): NamedArray[] {
  const bytes = readFileBytes(path);
  return decodeNpz(bytes, path);
}
