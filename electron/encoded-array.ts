// An episode array as the contract carries it: dtype, shape and unit with the element bytes in
// base64 (RFC 4648 section 4), little-endian and C order whatever machine the shell runs on.
import type { ArrayDtype, EncodedArray } from '../sim/bridge/bridge-contract.ts';

export interface ArrayForEncoding {
  name: string;
  dtype: ArrayDtype;
  shape: readonly number[];
  unit?: string;
  data: ArrayBufferView & { readonly BYTES_PER_ELEMENT: number };
}

const HOST_IS_LITTLE_ENDIAN = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1;

export function encodeArray(array: ArrayForEncoding): EncodedArray {
  const bytes = Buffer.from(array.data.buffer, array.data.byteOffset, array.data.byteLength);
  const width = array.data.BYTES_PER_ELEMENT;
  // Node also runs on big-endian hosts (s390x); there the bytes of each element are turned round on a copy.
  const littleEndian = HOST_IS_LITTLE_ENDIAN || width === 1 ? bytes : swapped(bytes, width);
  return { name: array.name, dtype: array.dtype, shape: [...array.shape], unit: array.unit ?? '1', base64: littleEndian.toString('base64') };
}

function swapped(bytes: Buffer, width: number): Buffer {
  const copy = Buffer.from(bytes);
  if (width === 2) copy.swap16();
  else if (width === 4) copy.swap32();
  else copy.swap64();
  return copy;
}
