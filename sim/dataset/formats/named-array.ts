// A named, typed, shaped block of numbers with an optional unit and description: the single
// in-memory form that every dataset file writer (NPY, NPZ, HDF5) takes and every reader returns.
// Data are stored flat in C (row-major) order, the order NPY and HDF5 both use.

export type ArrayDtype = 'float32' | 'float64' | 'int32' | 'uint32' | 'int16' | 'uint16' | 'int8' | 'uint8';

export interface TypedArrayByDtype {
  float32: Float32Array;
  float64: Float64Array;
  int32: Int32Array;
  uint32: Uint32Array;
  int16: Int16Array;
  uint16: Uint16Array;
  int8: Int8Array;
  uint8: Uint8Array;
}

export type TypedArrayOf<D extends ArrayDtype> = TypedArrayByDtype[D];

export interface NamedArrayOf<D extends ArrayDtype> {
  /** Member name in NPZ (`<name>.npy`) and dataset name in HDF5; see `ARRAY_NAME_PATTERN`. */
  readonly name: string;
  readonly dtype: D;
  readonly shape: readonly number[];
  readonly data: TypedArrayOf<D>;
  /** SI unit of the values, e.g. 'm', 'm/s', 'Pa'; '1' for dimensionless. */
  readonly unit?: string;
  readonly description?: string;
}

/** A named array of any supported dtype; `dtype` and `data` always agree. */
export type NamedArray = { [D in ArrayDtype]: NamedArrayOf<D> }[ArrayDtype];

export const ARRAY_DTYPES: readonly ArrayDtype[] = ['float32', 'float64', 'int32', 'uint32', 'int16', 'uint16', 'int8', 'uint8'];

// Names end up as ZIP member names and HDF5 link names, so they stay within a portable file-name
// alphabet: no path separators, no leading dot (hidden files, '.' and '..').
export const ARRAY_NAME_PATTERN = /^[A-Za-z0-9_][A-Za-z0-9_.-]{0,199}$/;

const CONSTRUCTORS = {
  float32: Float32Array,
  float64: Float64Array,
  int32: Int32Array,
  uint32: Uint32Array,
  int16: Int16Array,
  uint16: Uint16Array,
  int8: Int8Array,
  uint8: Uint8Array,
} as const;

export function dtypeByteSize(dtype: ArrayDtype): number {
  return CONSTRUCTORS[dtype].BYTES_PER_ELEMENT;
}

/** A typed array of `dtype` over the first `count` elements of `buffer`, without copying. */
export function typedArrayOver(dtype: ArrayDtype, buffer: ArrayBuffer, count: number): SupportedTypedArray {
  return new CONSTRUCTORS[dtype](buffer, 0, count);
}

/** Number of elements an array of this shape holds (1 for a 0-d array). */
export function elementCount(shape: readonly number[]): number {
  let count = 1;
  for (const extent of shape) count *= extent;
  return count;
}

/** The dtype whose typed array `data` is, or undefined for other views (DataView, BigInt64Array, ...). */
export function dtypeOfTypedArray(data: ArrayBufferView): ArrayDtype | undefined {
  for (const dtype of ARRAY_DTYPES) {
    if (data.constructor === CONSTRUCTORS[dtype]) return dtype;
  }
  // Node's Buffer is a Uint8Array subclass and is safe to treat as uint8.
  if (data instanceof Uint8Array && !(data instanceof Uint8ClampedArray)) return 'uint8';
  return undefined;
}

export interface NamedArrayLabels {
  readonly unit?: string;
  readonly description?: string;
}

export type SupportedTypedArray = TypedArrayByDtype[ArrayDtype];

/** The dtype a typed-array type stands for (their toStringTag types tell them apart). */
export type DtypeOf<T extends SupportedTypedArray> = T extends Float32Array ? 'float32'
  : T extends Float64Array ? 'float64'
  : T extends Int32Array ? 'int32'
  : T extends Uint32Array ? 'uint32'
  : T extends Int16Array ? 'int16'
  : T extends Uint16Array ? 'uint16'
  : T extends Int8Array ? 'int8'
  : 'uint8';

/** The NamedArray type for data of type T; a union of typed arrays gives a union of NamedArrays. */
export type NamedArrayFor<T extends SupportedTypedArray> = T extends unknown ? NamedArrayOf<DtypeOf<T>> : never;

/** Builds a NamedArray, taking the dtype from the typed array so the two cannot disagree. */
export function namedArray<T extends SupportedTypedArray>(
  name: string,
  shape: readonly number[],
  data: T,
  labels: NamedArrayLabels = {},
): NamedArrayFor<T> {
  const dtype = dtypeOfTypedArray(data);
  if (dtype === undefined) throw new TypeError(`array '${name}': data must be one of ${ARRAY_DTYPES.join(', ')} typed arrays`);
  const result = { name, dtype, shape: [...shape], data, ...labels } as NamedArray;
  checkNamedArray(result);
  return result as NamedArrayFor<T>;
}

/**
 * Throws a RangeError naming the array if its name, dtype, shape or data length are inconsistent.
 * These are programming errors in the caller, not user errors, so they are plain errors.
 */
export function checkNamedArray(array: NamedArray): void {
  const label = `array '${array.name}'`;
  if (typeof array.name !== 'string' || !ARRAY_NAME_PATTERN.test(array.name)) {
    throw new RangeError(`${label}: the name must match ${ARRAY_NAME_PATTERN} (letters, digits, '_', '.', '-'; no leading '.' or '-')`);
  }
  if (!ARRAY_DTYPES.includes(array.dtype)) {
    throw new RangeError(`${label}: dtype '${String(array.dtype)}' is not one of ${ARRAY_DTYPES.join(', ')}`);
  }
  if (dtypeOfTypedArray(array.data) !== array.dtype) {
    throw new RangeError(`${label}: dtype is '${array.dtype}' but the data is a ${array.data.constructor.name}`);
  }
  for (const extent of array.shape) {
    if (!Number.isSafeInteger(extent) || extent < 0) {
      throw new RangeError(`${label}: shape [${array.shape.join(', ')}] must hold non-negative integers`);
    }
  }
  const count = elementCount(array.shape);
  if (count !== array.data.length) {
    throw new RangeError(`${label}: shape [${array.shape.join(', ')}] holds ${count} elements but the data has ${array.data.length}`);
  }
}

/**
 * The array with float64 data rounded to float32 (IEEE 754 round to nearest, ties to even, as
 * ECMAScript's Float32Array conversion does); arrays of any other dtype are returned unchanged.
 * Values beyond the float32 range become ±Infinity, as they do in NumPy's astype.
 */
export function toFloat32(array: NamedArray): NamedArray {
  if (array.dtype !== 'float64') return array;
  return { ...array, dtype: 'float32', data: new Float32Array(array.data) };
}

export type FloatPrecision = 'float32' | 'float64';

/** Applies the dataset's float precision setting: 'float32' rounds every float64 array, 'float64' keeps all. */
export function withFloatPrecision(arrays: readonly NamedArray[], precision: FloatPrecision): NamedArray[] {
  return precision === 'float32' ? arrays.map(toFloat32) : [...arrays];
}
