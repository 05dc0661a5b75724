// HDF5 dataset files: root attributes and arrays, and one group per episode (or any other
// unit) holding its arrays, each array carrying 'unit' and 'description' attributes. Written
// through h5wasm with file-format bounds of HDF5 1.8, so any HDF5 1.8 or later reader (h5py,
// MATLAB, HDFView) opens them. The same content gives the same bytes on every run: object
// time stamps are pinned (see hdf5-runtime.ts) and nothing else in the file depends on when or
// where it was written, only on the content and the h5wasm version pinned in package-lock.json.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { type AtomicWriteOptions,writeFileAtomicVia } from './atomic-file.ts';
import { DatasetWriteError, datasetWriteErrorFromErrno } from './dataset-write-error.ts';
import { type Hdf5Library,loadHdf5Library, runHdf5Calls } from './hdf5-runtime.ts';
import { ARRAY_NAME_PATTERN, type ArrayDtype, checkNamedArray, dtypeByteSize, type NamedArray } from './named-array.ts';
import { readFileBytes } from './read-file-bytes.ts';

/** Strings become UTF-8 strings, numbers float64 and bigints int64 scalars. */
export type Hdf5AttributeValue = string | number | bigint;
export type Hdf5Attributes = Readonly<Record<string, Hdf5AttributeValue>>;

export interface Hdf5Group {
  readonly name: string;
  readonly attributes?: Hdf5Attributes;
  readonly arrays: readonly NamedArray[];
}

export interface Hdf5Content {
  readonly attributes?: Hdf5Attributes;
  readonly arrays?: readonly NamedArray[];
  readonly groups?: readonly Hdf5Group[];
}

/**
 * Content whose groups are made one at a time while the file is written (a split of a large
 * sweep), so only one group's arrays are in memory at once. Each group is checked as it
 * arrives; the groups come in the order they are written.
 */
export interface Hdf5StreamedContent {
  readonly attributes?: Hdf5Attributes;
  readonly arrays?: readonly NamedArray[];
  readonly groups: Iterable<Hdf5Group>;
}

export interface Hdf5WriteOptions {
  /** 0 (default) stores arrays contiguously; 1-9 stores them in chunks compressed with deflate at that level. */
  readonly deflateLevel?: number;
  /** With a deflateLevel, arrays of fewer data bytes than this stay contiguous and uncompressed; default 0 (all are compressed). */
  readonly minCompressedBytes?: number;
  /** The instant written into every object header, seconds since 1970; default `HDF5_FIXED_TIME_S`. */
  readonly fixedTimeS?: number;
}

/** 1980-01-01T00:00:00Z, the same instant NPZ members carry. */
export const HDF5_FIXED_TIME_S = 315_532_800;

// h5wasm's type letters, as in Python's struct module.
const HDF5_DTYPE: Readonly<Record<ArrayDtype, string>> = {
  float32: '<f',
  float64: '<d',
  int32: '<i',
  uint32: '<I',
  int16: '<h',
  uint16: '<H',
  int8: '<b',
  uint8: '<B',
};

// Aim for chunks near 1 MiB: large enough for deflate to work well, small enough that reading
// one time step does not decompress the whole array.
const TARGET_CHUNK_BYTES = 1 << 20;

/** Writes the content to `path` atomically (temporary name, flush, rename). */
export async function writeHdf5File(path: string, content: Hdf5Content, options: Hdf5WriteOptions & AtomicWriteOptions = {}): Promise<void> {
  checkHdf5Content(content, options);
  const library = await loadHdf5Library();
  writeFileAtomicVia(path, (temporaryPath) => fillHdf5File(library, temporaryPath, content, options, path), options);
}

/**
 * Writes streamed content to `path` atomically. The file holds exactly the bytes writeHdf5File
 * writes for the same groups given as a list: the library sees the same calls in the same order.
 * An error from making or checking a group reaches the caller as it was thrown.
 */
export async function writeHdf5FileStreamed(path: string, content: Hdf5StreamedContent, options: Hdf5WriteOptions & AtomicWriteOptions = {}): Promise<void> {
  checkHdf5Options(options);
  checkRoot(content);
  const library = await loadHdf5Library();
  let failure: GroupFailure | undefined;
  try {
    writeFileAtomicVia(path, (temporaryPath) => {
      try {
        fillHdf5(library, temporaryPath, content, true, options, path);
      } catch (error) {
        if (error instanceof GroupFailure) failure = error;
        throw error;
      }
    }, options);
  } catch (error) {
    if (failure !== undefined) throw failure.cause;
    throw error;
  }
}

/** Carries an error thrown while making or checking a streamed group past the HDF5 failure handling. */
class GroupFailure extends Error {
  constructor(override readonly cause: unknown) {
    super(cause instanceof Error ? cause.message : String(cause));
  }
}

/**
 * The bytes of the HDF5 file for this content, for callers that store files their own way.
 * HDF5 can only write to a path, so this goes through a scratch file in the system's temporary folder.
 */
export async function encodeHdf5(content: Hdf5Content, options: Hdf5WriteOptions = {}): Promise<Uint8Array> {
  checkHdf5Content(content, options);
  const library = await loadHdf5Library();
  const scratchFolder = mkdtempSync(join(tmpdir(), 'pliant-hdf5-'));
  try {
    const scratchPath = join(scratchFolder, 'content.h5');
    fillHdf5File(library, scratchPath, content, options, scratchPath);
    return readFileBytes(scratchPath);
  } finally {
    rmSync(scratchFolder, { recursive: true, force: true });
  }
}

/**
 * Writes the content to `diskPath`, creating or truncating it; failures become a
 * DatasetWriteError about `reportPath` (the final name the user knows). For writers that manage
 * their own temporary files, and for tests.
 */
export function fillHdf5File(library: Hdf5Library, diskPath: string, content: Hdf5Content, options: Hdf5WriteOptions, reportPath: string): void {
  checkHdf5Content(content, options);
  fillHdf5(library, diskPath, { ...content, groups: content.groups ?? [] }, false, options, reportPath);
}

/** Writes the file; with `checkEachGroup` every group is checked (and may fail as a GroupFailure) just before it is written. */
function fillHdf5(library: Hdf5Library, diskPath: string, content: Hdf5StreamedContent, checkEachGroup: boolean, options: Hdf5WriteOptions, reportPath: string): void {
  const deflateLevel = options.deflateLevel ?? 0;
  const minCompressedBytes = options.minCompressedBytes ?? 0;
  const rootNames = checkEachGroup ? checkRoot(content) : new Set<string>();
  const run = runHdf5Calls(library, options.fixedTimeS ?? HDF5_FIXED_TIME_S, () => {
    const file = new library.File(resolve(diskPath), 'w', { libver: 'v108' });
    if (file.file_id < 0n) return -1;
    try {
      writeAttributes(file, content.attributes);
      for (const array of content.arrays ?? []) writeArray(file, array, deflateLevel, minCompressedBytes);
      const groups = content.groups[Symbol.iterator]();
      for (;;) {
        let group: Hdf5Group;
        try {
          const next = groups.next();
          if (next.done) break;
          group = next.value;
          if (checkEachGroup) checkGroup(group, rootNames);
        } catch (error) {
          throw new GroupFailure(error);
        }
        const handle = file.create_group(group.name);
        writeAttributes(handle, group.attributes);
        for (const array of group.arrays) writeArray(handle, array, deflateLevel, minCompressedBytes);
      }
    } catch (error) {
      // Release HDF5's handle so the half-written file can be removed, then report the first failure.
      file.close();
      throw error;
    }
    return file.close();
  });
  if (run.error instanceof GroupFailure) throw run.error;
  // h5wasm reports most failures only through HDF5's error stack and a negative status.
  if (run.error !== undefined || run.value === undefined || run.value < 0 || run.diagnostics.includes('HDF5-DIAG')) {
    throw hdf5Failure(run.diagnostics, run.error, reportPath);
  }
}

type Hdf5Node = InstanceType<Hdf5Library['Group']>;

function writeAttributes(node: Hdf5Node, attributes: Hdf5Attributes | undefined): void {
  for (const [name, value] of Object.entries(attributes ?? {})) {
    if (typeof value === 'string') node.create_attribute(name, value);
    else if (typeof value === 'bigint') node.create_attribute(name, BigInt64Array.of(value), [], '<q');
    else node.create_attribute(name, Float64Array.of(value), [], '<d');
  }
}

function writeArray(parent: Hdf5Node, array: NamedArray, deflateLevel: number, minCompressedBytes: number): void {
  const chunks = deflateLevel > 0 && array.data.byteLength >= minCompressedBytes ? chunkShape(array) : null;
  const dataset = parent.create_dataset({
    name: array.name,
    data: array.data,
    shape: [...array.shape],
    dtype: HDF5_DTYPE[array.dtype],
    ...(chunks ? { chunks, compression: 'gzip' as const, compression_opts: deflateLevel } : {}),
  });
  if (array.unit !== undefined) dataset.create_attribute('unit', array.unit);
  if (array.description !== undefined) dataset.create_attribute('description', array.description);
}

/** Whole rows of the first axis, as many as fit in about 1 MiB; null when the array cannot be chunked. */
function chunkShape(array: NamedArray): number[] | null {
  const { shape } = array;
  // HDF5 chunks need a rank of at least 1 and no zero extent.
  if (shape.length === 0 || shape.some((extent) => extent === 0)) return null;
  let rowBytes = dtypeByteSize(array.dtype);
  for (let axis = 1; axis < shape.length; axis += 1) rowBytes *= shape[axis];
  const rows = Math.max(1, Math.min(shape[0], Math.floor(TARGET_CHUNK_BYTES / rowBytes)));
  return [rows, ...shape.slice(1)];
}

const ERROR_MESSAGE_ERRNO: Readonly<Record<string, string>> = {
  'No space left on device': 'ENOSPC',
  'Disk quota exceeded': 'EDQUOT',
  'Permission denied': 'EACCES',
  'Read-only file system': 'EROFS',
  'No such file or directory': 'ENOENT',
};

// HDF5's lowest stack entry for an I/O failure reads "... error message = 'No space left on
// device' ...": that strerror text is the only trace of the errno that reaches JavaScript.
function hdf5Failure(diagnostics: string, error: unknown, reportPath: string): DatasetWriteError {
  const systemMessages = [...diagnostics.matchAll(/error message = '([^']*)'/g)].map((match) => match[1]);
  for (const message of systemMessages) {
    const errno = ERROR_MESSAGE_ERRNO[message];
    if (errno !== undefined) return datasetWriteErrorFromErrno(errno, reportPath, message);
  }
  const minors = [...diagnostics.matchAll(/minor: (.+)/g)].map((match) => match[1].trim());
  const detail = systemMessages[0] ?? minors.at(-1) ?? (error instanceof Error ? error.message : error !== undefined ? String(error) : 'HDF5 reported a failure');
  return datasetWriteErrorFromErrno(undefined, reportPath, `HDF5 could not write the file (${detail})`);
}

/** Throws a RangeError for content HDF5 would refuse or that would read back ambiguously. */
export function checkHdf5Content(content: Hdf5Content, options: Hdf5WriteOptions = {}): void {
  checkHdf5Options(options);
  const rootNames = checkRoot(content);
  for (const group of content.groups ?? []) checkGroup(group, rootNames);
}

function checkHdf5Options(options: Hdf5WriteOptions): void {
  const level = options.deflateLevel ?? 0;
  if (!Number.isInteger(level) || level < 0 || level > 9) throw new RangeError(`deflateLevel ${level} is not an integer from 0 to 9`);
  const minBytes = options.minCompressedBytes ?? 0;
  if (!Number.isSafeInteger(minBytes) || minBytes < 0) throw new RangeError(`minCompressedBytes ${minBytes} is not a whole number of bytes`);
  const time = options.fixedTimeS ?? HDF5_FIXED_TIME_S;
  // Object header time stamps are unsigned 32-bit seconds.
  if (!Number.isInteger(time) || time < 0 || time > 0xffffffff) throw new RangeError(`fixedTimeS ${time} is not a whole number of seconds from 0 to 2^32-1`);
}

/** Checks the root's attributes and arrays; returns the names they take, which groups must not reuse. */
function checkRoot(content: Pick<Hdf5Content, 'attributes' | 'arrays'>): Set<string> {
  const rootNames = new Set<string>();
  checkAttributes('/', content.attributes);
  for (const array of content.arrays ?? []) {
    checkNamedArray(array);
    claimName(rootNames, array.name, '/');
  }
  return rootNames;
}

function checkGroup(group: Hdf5Group, rootNames: Set<string>): void {
  if (!ARRAY_NAME_PATTERN.test(group.name)) throw new RangeError(`group '${group.name}': the name must match ${ARRAY_NAME_PATTERN}`);
  claimName(rootNames, group.name, '/');
  checkAttributes(`/${group.name}`, group.attributes);
  const names = new Set<string>();
  for (const array of group.arrays) {
    checkNamedArray(array);
    claimName(names, array.name, `/${group.name}`);
  }
}

function claimName(names: Set<string>, name: string, where: string): void {
  if (names.has(name)) throw new RangeError(`${where}: two members are named '${name}'`);
  names.add(name);
}

function checkAttributes(where: string, attributes: Hdf5Attributes | undefined): void {
  for (const [name, value] of Object.entries(attributes ?? {})) {
    if (name === '' || name.includes('/') || name === '.') throw new RangeError(`${where}: attribute name '${name}' is not allowed`);
    if (typeof value !== 'string' && typeof value !== 'number' && typeof value !== 'bigint') {
      throw new RangeError(`${where}: attribute '${name}' must be a string, number or bigint`);
    }
    if (typeof value === 'bigint' && BigInt.asIntN(64, value) !== value) {
      throw new RangeError(`${where}: attribute '${name}' does not fit a signed 64-bit integer`);
    }
  }
}
