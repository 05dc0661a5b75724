// NPY files (NumPy Enhancement Proposal 1): one array per file, written exactly as numpy.save
// writes it (version 1.0, little-endian, C order), and read back from anything numpy.save
// produces for the dtypes Pliant uses (the command line replays user controls from .npy).
import { basename } from 'node:path';

import { type AtomicWriteOptions,writeFileAtomic } from './atomic-file.ts';
import { DatasetReadError } from './dataset-read-error.ts';
import {
  type ArrayDtype,
  checkNamedArray,
  dtypeByteSize,
  elementCount,
  type NamedArray,
  typedArrayOver,
} from './named-array.ts';
import { encodeNpyHeader, parseNpyHeader } from './npy-header.ts';
import { readFileBytes } from './read-file-bytes.ts';

/** NumPy's dtype.descr strings for little-endian data; one-byte types carry no byte order ('|'). */
export const NPY_DESCR: Readonly<Record<ArrayDtype, string>> = {
  float32: '<f4',
  float64: '<f8',
  int32: '<i4',
  uint32: '<u4',
  int16: '<i2',
  uint16: '<u2',
  int8: '|i1',
  uint8: '|u1',
};

const DTYPE_BY_KIND_AND_SIZE: Readonly<Record<string, ArrayDtype>> = {
  f4: 'float32',
  f8: 'float64',
  i4: 'int32',
  u4: 'uint32',
  i2: 'int16',
  u2: 'uint16',
  i1: 'int8',
  u1: 'uint8',
};

const HOST_IS_LITTLE_ENDIAN = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1;

/**
 * The file as buffers to be written in order: the header, then the data. On little-endian
 * machines (every platform Electron ships for) the data buffer is a view of the array, not a copy.
 */
export function encodeNpy(array: NamedArray): Uint8Array[] {
  checkNamedArray(array);
  const header = encodeNpyHeader(NPY_DESCR[array.dtype], array.shape);
  return [header, littleEndianBytes(array)];
}

/** The whole file in one buffer (for archive members). */
export function encodeNpyBytes(array: NamedArray): Uint8Array {
  const [header, data] = encodeNpy(array);
  const bytes = new Uint8Array(header.byteLength + data.byteLength);
  bytes.set(header, 0);
  bytes.set(data, header.byteLength);
  return bytes;
}

export function writeNpyFile(path: string, array: NamedArray, options: AtomicWriteOptions = {}): void {
  writeFileAtomic(path, encodeNpy(array), options);
}

function littleEndianBytes(array: NamedArray): Uint8Array {
  const { data } = array;
  const view = new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
  if (HOST_IS_LITTLE_ENDIAN || data.BYTES_PER_ELEMENT === 1) return view;
  const swapped = new Uint8Array(view);
  swapBytes(swapped, data.BYTES_PER_ELEMENT);
  return swapped;
}

function swapBytes(bytes: Uint8Array, size: number): void {
  for (let start = 0; start < bytes.length; start += size) {
    for (let a = start, b = start + size - 1; a < b; a += 1, b -= 1) {
      const t = bytes[a];
      bytes[a] = bytes[b];
      bytes[b] = t;
    }
  }
}

const CONVERT_FIX = 'convert it in NumPy, e.g. numpy.save(path, a.astype(numpy.float64))';

/**
 * Decodes an NPY file's bytes. `path` names the file in messages; the array is named after the
 * file (without '.npy') unless `name` is given. Data are copied, so `bytes` may be reused.
 */
export function decodeNpy(bytes: Uint8Array, path: string, name?: string): NamedArray {
  const header = parseNpyHeader(bytes, path);
  const match = /^([<>|=])([a-zA-Z])(\d+)$/.exec(header.descr);
  const dtype = match ? DTYPE_BY_KIND_AND_SIZE[`${match[2]}${match[3]}`] : undefined;
  if (match === null || dtype === undefined) {
    const kind = describeKind(header.descr);
    throw new DatasetReadError(path, 'header', `dtype '${header.descr}'${kind ? ` (${kind})` : ''} is not supported ` +
      '(Pliant reads float32, float64, int32, uint32, int16, uint16, int8 and uint8)', CONVERT_FIX);
  }
  const order = match[1];
  const size = dtypeByteSize(dtype);
  if (order === '=' || (order === '|' && size !== 1)) {
    throw new DatasetReadError(path, 'header', `dtype '${header.descr}' does not say its byte order`,
      "save it with an explicit order, e.g. numpy.save(path, a.astype('<f8'))");
  }
  if (header.fortranOrder && header.shape.length > 1) {
    throw new DatasetReadError(path, 'header', 'the array is stored in Fortran (column-major) order, which Pliant does not read',
      'save a C-ordered copy: numpy.save(path, numpy.ascontiguousarray(a))');
  }
  const count = elementCount(header.shape);
  const expectedBytes = count * size;
  const actualBytes = bytes.length - header.dataOffset;
  if (actualBytes < expectedBytes) {
    throw new DatasetReadError(path, `byte ${header.dataOffset}`,
      `the file is truncated: shape (${header.shape.join(', ')}) needs ${expectedBytes} data bytes but only ${actualBytes} follow the header`,
      'write the file again');
  }
  if (actualBytes > expectedBytes) {
    throw new DatasetReadError(path, `byte ${header.dataOffset + expectedBytes}`,
      `${actualBytes - expectedBytes} unexpected bytes follow the array data`, 'write the file again with numpy.save');
  }
  // Copying also gives the typed array the alignment it needs; the file buffer may start anywhere.
  // (new Uint8Array(view) copies; Buffer.prototype.slice would not.)
  const raw = new Uint8Array(bytes.subarray(header.dataOffset, header.dataOffset + expectedBytes));
  const fileIsLittleEndian = order !== '>';
  if (size > 1 && fileIsLittleEndian !== HOST_IS_LITTLE_ENDIAN) swapBytes(raw, size);
  return {
    name: name ?? basename(path).replace(/\.npy$/i, ''),
    dtype,
    shape: [...header.shape],
    data: typedArrayOver(dtype, raw.buffer, count),
  } as NamedArray;
}

export function readNpyFile(path: string, name?: string): NamedArray {
  const bytes = readFileBytes(path);
  return decodeNpy(bytes, path, name);
}

function describeKind(descr: string): string {
  const kind = descr.replace(/^[<>|=]/, '');
  if (kind === 'b1') return 'boolean';
  if (kind === 'f2') return 'float16';
  if (kind === 'i8' || kind === 'u8') return '64-bit integer';
  if (kind.startsWith('c')) return 'complex';
  if (kind === 'O') return 'Python objects';
  if (kind.startsWith('U') || kind.startsWith('S')) return 'text';
  return '';
}
