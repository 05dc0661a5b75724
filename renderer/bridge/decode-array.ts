// Turns an EncodedArray from dataset.episodeArrays (base64 of little-endian, C-order bytes) into
// a typed array the viewer can use directly, without copying element by element.
import type { ArrayDtype, EncodedArray } from '../../sim/bridge/bridge-contract.ts';

export type DecodedArray = Float64Array | Float32Array | Int32Array | Uint32Array | Int16Array | Uint16Array | Int8Array | Uint8Array;

const BYTES_PER_ELEMENT: Readonly<Record<ArrayDtype, number>> = {
  float64: 8, float32: 4, int32: 4, uint32: 4, int16: 2, uint16: 2, int8: 1, uint8: 1,
};

const HOST_IS_LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** RFC 4648 section 4 base64 to bytes. */
export function base64ToBytes(base64: string): Uint8Array {
  const binary = atob(base64);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i += 1) bytes[i] = binary.charCodeAt(i);
  return bytes;
}

export function decodeArray(encoded: EncodedArray): DecodedArray {
  const width = BYTES_PER_ELEMENT[encoded.dtype];
  if (width === undefined) throw new Error(`Array "${encoded.name}" has an element type Pliant does not know: ${String(encoded.dtype)}.`);
  if (width > 1 && !HOST_IS_LITTLE_ENDIAN) throw new Error('This computer stores numbers big-endian; Pliant reads datasets only on little-endian machines.');
  const bytes = base64ToBytes(encoded.base64);
  const count = encoded.shape.reduce((product, n) => product * n, 1);
  if (bytes.length !== count * width) {
    throw new Error(`Array "${encoded.name}" should hold ${count} ${encoded.dtype} values (${count * width} bytes) for shape [${encoded.shape.join(', ')}], but carries ${bytes.length} bytes.`);
  }
  // A fresh Uint8Array starts at offset 0 of its own buffer, so every element width is aligned.
  const buffer = bytes.buffer;
  switch (encoded.dtype) {
    case 'float64': return new Float64Array(buffer, 0, count);
    case 'float32': return new Float32Array(buffer, 0, count);
    case 'int32': return new Int32Array(buffer, 0, count);
    case 'uint32': return new Uint32Array(buffer, 0, count);
    case 'int16': return new Int16Array(buffer, 0, count);
    case 'uint16': return new Uint16Array(buffer, 0, count);
    case 'int8': return new Int8Array(buffer, 0, count);
    case 'uint8': return bytes;
  }
}
