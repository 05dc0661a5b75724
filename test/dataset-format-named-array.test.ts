// NamedArray helpers: float64 → float32 rounding and element counts checked against Debian
// NumPy (astype(numpy.float32), ndarray.size); the consistency checks follow our own rules.
import { describe, expect, it } from 'vitest';

import {
  checkNamedArray,
  elementCount,
  type NamedArray,
  namedArray,
  toFloat32,
  withFloatPrecision,
} from '../sim/dataset/formats/named-array.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

const base64 = (view: ArrayBufferView) => Buffer.from(view.buffer, view.byteOffset, view.byteLength).toString('base64');

describe.runIf(python.available)('float64 → float32 against NumPy astype(numpy.float32)', () => {
  it('rounds like NumPy, including ties, subnormals, overflow, signed zero and NaN', () => {
    const values = Float64Array.of(
      1 / 3, // ordinary rounding
      16777217, // 2^24 + 1: a tie, rounds to even (16777216)
      16777219, // 2^24 + 3: a tie, rounds to even (16777220)
      1e-40, // float32 subnormal
      1e-50, // below the smallest float32 subnormal: rounds to 0
      3.5e38, // above the float32 maximum: becomes Infinity
      -3.5e38,
      -0,
      Number.NaN,
      0.7071067811865476, // a Korrin Bay fin gain of sqrt(1/2)
    );
    const converted = toFloat32(namedArray('fin_gain', [values.length], values, { unit: '1' }));
    const reference = runReferencePython<string>(
      'import base64, json, sys, numpy as np\n' +
        'a = np.frombuffer(base64.b64decode(json.load(sys.stdin)), dtype="<f8")\n' +
        'print(json.dumps(base64.b64encode(a.astype(np.float32).astype("<f4").tobytes()).decode()))',
      base64(values),
    );
    expect(converted.dtype).toBe('float32');
    expect(converted.unit).toBe('1');
    expect(base64(converted.data)).toBe(reference);
  });

  it('element counts of 0-d, empty and 3-d shapes equal NumPy ndarray.size', () => {
    const shapes = [[], [0], [7], [0, 3], [2, 3, 4]];
    const reference = runReferencePython<number[]>(
      'import json, sys, numpy as np\nprint(json.dumps([int(np.empty(tuple(s)).size) for s in json.load(sys.stdin)]))',
      shapes,
    );
    expect(shapes.map(elementCount)).toEqual(reference);
  });
});

describe('precision setting and consistency checks (common practice, no source)', () => {
  it("'float32' converts only float64 arrays; 'float64' keeps everything", () => {
    const arrays: NamedArray[] = [
      namedArray('tether_positions_m', [2], Float64Array.of(0.1, 0.2), { unit: 'm' }),
      namedArray('cell_material', [2], Uint8Array.of(1, 2)),
    ];
    const single = withFloatPrecision(arrays, 'float32');
    expect(single.map((a) => a.dtype)).toEqual(['float32', 'uint8']);
    expect(single[1]).toBe(arrays[1]);
    expect(single[0].data).toEqual(Float32Array.of(0.1, 0.2));
    expect(withFloatPrecision(arrays, 'float64')).toEqual(arrays);
  });

  it('namedArray takes the dtype from the typed array', () => {
    expect(namedArray('eel_joint_angle_rad', [3], Float32Array.of(0, 0.1, 0.2)).dtype).toBe('float32');
    expect(namedArray('spring_index', [1], Uint32Array.of(4)).dtype).toBe('uint32');
  });

  it('refuses a shape that does not match the data, a bad name and a dtype that disagrees with the data', () => {
    expect(() => namedArray('tether_positions_m', [2, 3], new Float64Array(5)))
      .toThrow("array 'tether_positions_m': shape [2, 3] holds 6 elements but the data has 5");
    expect(() => namedArray('../escape', [1], new Float64Array(1))).toThrow(/the name must match/);
    expect(() => namedArray('fin/activation', [1], new Float64Array(1))).toThrow(/the name must match/);
    expect(() => namedArray('negative', [-1], new Float64Array(0))).toThrow(/non-negative integers/);
    const mismatched = { name: 'x', dtype: 'float32', shape: [1], data: new Float64Array(1) } as unknown as NamedArray;
    expect(() => checkNamedArray(mismatched)).toThrow("array 'x': dtype is 'float32' but the data is a Float64Array");
  });
});
