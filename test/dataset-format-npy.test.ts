// NPY files: our bytes checked against the layout rules of NumPy Enhancement Proposal 1
// ("A simple file format for NumPy arrays") and numpy/lib/format.py, against numpy.save's own
// bytes and numpy.load (Debian NumPy), and our reader against files numpy.save wrote.
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { DatasetReadError } from '../sim/dataset/formats/dataset-read-error.ts';
import { type NamedArray,namedArray } from '../sim/dataset/formats/named-array.ts';
import { decodeNpy, encodeNpyBytes, NPY_DESCR, readNpyFile, writeNpyFile } from '../sim/dataset/formats/npy.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const folder = mkdtempSync(join(tmpdir(), 'pliant-npy-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const bytesOf = (view: ArrayBufferView) => new Uint8Array(view.buffer, view.byteOffset, view.byteLength);
const base64 = (view: ArrayBufferView) => Buffer.from(bytesOf(view)).toString('base64');

// Demo values from the Korrin Bay test tank, with the edge values of each dtype mixed in.
const CASES: readonly NamedArray[] = [
  namedArray('tank_depth_m', [], Float64Array.of(2.75), { unit: 'm' }),
  namedArray('fin_activation', [5], Float32Array.of(0, 0.25, -1, Number.POSITIVE_INFINITY, -0)),
  namedArray('tether_node_index', [2, 3, 4], Int32Array.from({ length: 24 }, (_, i) => (i - 12) * 178_956_970)),
  namedArray('spring_count', [3], Uint32Array.of(0, 1, 0xffffffff)),
  namedArray('eel_segment_offset', [2, 2], Int16Array.of(-32768, -1, 0, 32767)),
  namedArray('cell_count', [4], Uint16Array.of(0, 1, 512, 65535)),
  namedArray('contact_sign', [3], Int8Array.of(-128, 0, 127)),
  namedArray('cell_material', [0], new Uint8Array(0)),
  namedArray('tether_positions_m', [0, 3], new Float64Array(0), { unit: 'm' }),
  namedArray('swimmer_speed_m_per_s', [7], Float64Array.of(0, 0.01, 0.1, 1e-300, -1e300, Number.NaN, 5e-324)),
];

function shapeText(shape: readonly number[]): string {
  return shape.length === 1 ? `(${shape[0]},)` : `(${shape.join(', ')})`;
}

describe('layout by the rules of NEP 1 and numpy/lib/format.py', () => {
  for (const array of CASES) {
    it(`${array.dtype} shape [${array.shape.join(', ')}]`, () => {
      const bytes = encodeNpyBytes(array);
      // NEP 1: the magic string "\x93NUMPY", then major and minor version bytes (1, 0).
      expect([...bytes.subarray(0, 6)]).toEqual([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59]);
      expect([bytes[6], bytes[7]]).toEqual([1, 0]);
      // NEP 1: HEADER_LEN is a little-endian unsigned short.
      const headerLength = bytes[8] | (bytes[9] << 8);
      const dataStart = 10 + headerLength;
      // format.py: ARRAY_ALIGN = 64, so the data starts at a multiple of 64 (NEP 1 asks for 16).
      expect(dataStart % 64).toBe(0);
      const header = Buffer.from(bytes.subarray(10, dataStart)).toString('latin1');
      // NEP 1: the header is an ASCII Python literal dict, padded with spaces and ended by '\n'.
      expect(header.endsWith('\n')).toBe(true);
      const match = /^\{'descr': '([^']+)', 'fortran_order': (True|False), 'shape': \(([^)]*)\), \} *\n$/.exec(header);
      expect(match, header).not.toBeNull();
      expect(match![1]).toBe(NPY_DESCR[array.dtype]);
      expect(match![2]).toBe('False');
      // A Python 1-tuple needs its trailing comma: '(5,)'.
      expect(`(${match![3]})`).toBe(shapeText(array.shape));
      // The data follow in C order and little-endian byte order, element for element.
      const data = new DataView(bytes.buffer, bytes.byteOffset + dataStart);
      expect(data.byteLength).toBe(array.data.byteLength);
      const size = array.data.BYTES_PER_ELEMENT;
      for (let i = 0; i < array.data.length; i += 1) {
        const value = readLittleEndian(data, i * size, array.dtype);
        expect(Object.is(value, array.data[i]) || (Number.isNaN(value) && Number.isNaN(array.data[i]))).toBe(true);
      }
    });
  }
});

function readLittleEndian(view: DataView, offset: number, dtype: NamedArray['dtype']): number {
  switch (dtype) {
    case 'float32': return view.getFloat32(offset, true);
    case 'float64': return view.getFloat64(offset, true);
    case 'int32': return view.getInt32(offset, true);
    case 'uint32': return view.getUint32(offset, true);
    case 'int16': return view.getInt16(offset, true);
    case 'uint16': return view.getUint16(offset, true);
    case 'int8': return view.getInt8(offset);
    case 'uint8': return view.getUint8(offset);
  }
}

describe.runIf(python.available)('against Debian NumPy', () => {
  it('our bytes equal numpy.save of the same array, byte for byte', () => {
    const reference = runReferencePython<string[]>(
      'import base64, io, json, sys, numpy as np\n' +
        'out = []\n' +
        'for c in json.load(sys.stdin):\n' +
        '    a = np.frombuffer(base64.b64decode(c["data"]), dtype=c["descr"]).reshape(c["shape"])\n' +
        '    f = io.BytesIO(); np.save(f, a); out.append(base64.b64encode(f.getvalue()).decode())\n' +
        'print(json.dumps(out))',
      CASES.map((a) => ({ descr: NPY_DESCR[a.dtype], shape: a.shape, data: base64(a.data) })),
    );
    CASES.forEach((array, i) => expect(Buffer.from(encodeNpyBytes(array)).toString('base64'), array.name).toBe(reference[i]));
  });

  it('numpy.load reads our files with the same dtype, shape and values', () => {
    const paths = CASES.map((array) => {
      const path = join(folder, `${array.name}.npy`);
      writeNpyFile(path, array);
      return path;
    });
    const loaded = runReferencePython<{ descr: string; shape: number[]; data: string; first: number | null }[]>(
      'import base64, json, math, sys, numpy as np\n' +
        'out = []\n' +
        'for p in json.load(sys.stdin):\n' +
        '    a = np.load(p)\n' +
        '    first = a.flat[0].item() if a.size else None\n' +
        '    first = None if isinstance(first, float) and not math.isfinite(first) else first\n' +
        '    out.append({"descr": a.dtype.str, "shape": list(a.shape), "data": base64.b64encode(a.tobytes()).decode(), "first": first})\n' +
        'print(json.dumps(out))',
      paths,
    );
    CASES.forEach((array, i) => {
      expect(loaded[i].descr, array.name).toBe(NPY_DESCR[array.dtype]);
      expect(loaded[i].shape, array.name).toEqual(array.shape);
      expect(loaded[i].data, array.name).toBe(base64(array.data));
      if (array.data.length > 0 && Number.isFinite(array.data[0])) expect(loaded[i].first).toBe(array.data[0]);
    });
    // Only the final files remain; no temporary names are left behind.
    expect(readdirSync(folder).sort()).toEqual(CASES.map((a) => `${a.name}.npy`).sort());
  });

  it('our reader reads numpy.save files of every supported dtype, big-endian data and format versions 2.0 and 3.0', () => {
    const written = runReferencePython<{ name: string; descr: string; shape: number[]; littleEndian: string; values: number[] }[]>(
      'import base64, json, sys, numpy as np\n' +
        'from numpy.lib import format as fmt\n' +
        'folder = json.load(sys.stdin)\n' +
        'arrays = {\n' +
        '  "f4": np.linspace(-1, 1, 6, dtype=np.float32).reshape(2, 3),\n' +
        '  "f8": np.array(9.81),\n' +
        '  "i4": np.arange(-4, 20, dtype=np.int32).reshape(2, 3, 4),\n' +
        '  "u4": np.array([0, 7, 2**32 - 1], dtype=np.uint32),\n' +
        '  "i2": np.array([-32768, 32767], dtype=np.int16),\n' +
        '  "u2": np.array([[1, 2], [3, 65535]], dtype=np.uint16),\n' +
        '  "i1": np.array([-128, 127], dtype=np.int8),\n' +
        '  "u1": np.zeros((0, 4), dtype=np.uint8),\n' +
        '  "big_f8": np.array([0.5, -2.25, 1e-300], dtype=">f8"),\n' +
        '  "big_i2": np.array([[-2, 300]], dtype=">i2"),\n' +
        '  "fortran_1d": np.asfortranarray(np.array([1.0, 2.0])),\n' +
        '}\n' +
        'out = []\n' +
        'for name, a in arrays.items():\n' +
        '    np.save(f"{folder}/{name}.npy", a)\n' +
        '    le = a.astype(a.dtype.newbyteorder("<"))\n' +
        '    out.append({"name": name, "descr": a.dtype.str, "shape": list(a.shape), "littleEndian": base64.b64encode(le.tobytes()).decode(), "values": le.ravel().tolist()})\n' +
        'for version in [(2, 0), (3, 0)]:\n' +
        '    a = np.array([1.5, 2.5, 3.5])\n' +
        '    name = f"v{version[0]}"\n' +
        '    with open(f"{folder}/{name}.npy", "wb") as f:\n' +
        '        fmt.write_array(f, a, version=version)\n' +
        '    out.append({"name": name, "descr": a.dtype.str, "shape": list(a.shape), "littleEndian": base64.b64encode(a.tobytes()).decode(), "values": a.tolist()})\n' +
        'print(json.dumps(out))',
      folder,
    );
    for (const reference of written) {
      const array = readNpyFile(join(folder, `${reference.name}.npy`));
      expect(array.name).toBe(reference.name);
      expect(NPY_DESCR[array.dtype].slice(1), reference.name).toBe(reference.descr.slice(1));
      expect(array.shape, reference.name).toEqual(reference.shape);
      expect(base64(array.data), reference.name).toBe(reference.littleEndian);
      expect([...array.data], reference.name).toEqual(reference.values);
    }
  });

  it('refuses what numpy.save can write but Pliant does not read, saying how to convert', () => {
    runReferencePython(
      'import json, sys, numpy as np\n' +
        'folder = json.load(sys.stdin)\n' +
        'np.save(f"{folder}/fortran.npy", np.asfortranarray(np.ones((2, 3))))\n' +
        'np.save(f"{folder}/flags.npy", np.array([True, False]))\n' +
        'np.save(f"{folder}/ticks.npy", np.array([1, 2], dtype=np.int64))\n' +
        'np.save(f"{folder}/half.npy", np.array([1, 2], dtype=np.float16))\n' +
        'np.save(f"{folder}/record.npy", np.zeros(2, dtype=[("x", "<f8"), ("y", "<i4")]))\n' +
        'np.save(f"{folder}/objects.npy", np.array([{"a": 1}], dtype=object))\n' +
        'print("null")',
      folder,
    );
    const refusal = (name: string) => {
      try {
        readNpyFile(join(folder, `${name}.npy`));
      } catch (error) {
        expect(error).toBeInstanceOf(DatasetReadError);
        return (error as Error).message;
      }
      throw new Error(`${name}.npy was read`);
    };
    expect(refusal('fortran')).toBe(`${join(folder, 'fortran.npy')} (header): the array is stored in Fortran (column-major) order, ` +
      'which Pliant does not read; save a C-ordered copy: numpy.save(path, numpy.ascontiguousarray(a))');
    expect(refusal('flags')).toMatch(/\(header\): dtype '\|b1' \(boolean\) is not supported .*; convert it in NumPy/);
    expect(refusal('ticks')).toMatch(/dtype '<i8' \(64-bit integer\) is not supported/);
    expect(refusal('half')).toMatch(/dtype '<f2' \(float16\) is not supported/);
    expect(refusal('record')).toMatch(/structured \(record\) dtype.*save each field as its own array/);
    expect(refusal('objects')).toMatch(/dtype '\|O' \(Python objects\) is not supported/);
  });
});

describe('damaged files (common practice, no source)', () => {
  it('a truncated file and a file that is not NPY give messages naming the file and the place', () => {
    const whole = encodeNpyBytes(CASES[2]);
    expect(() => decodeNpy(whole.subarray(0, whole.length - 1), 'tether.npy'))
      .toThrow('tether.npy (byte 128): the file is truncated: shape (2, 3, 4) needs 96 data bytes but only 95 follow the header; write the file again');
    const text = join(folder, 'notes.npy');
    writeFileSync(text, 'Korrin Bay tank log\n');
    expect(() => readNpyFile(text)).toThrow(`${text} (bytes 0-5): this is not an NPY file (it does not start with "\\x93NUMPY"); write the file with numpy.save`);
    const broken = Buffer.from(encodeNpyBytes(CASES[0]));
    broken.write("{'descr': '<f8', 'fortran_order': False, 'shape': (1, 2 }", 10, 'latin1');
    expect(() => decodeNpy(broken, 'depth.npy')).toThrow(/^depth\.npy \(header, character \d+\): expected ',' or '\)'/);
  });
});
