// NPZ archives: read back by Debian NumPy (numpy.load) and Python's zipfile (member names,
// compression method, ZIP date and time, extra fields, CRC-32 per PKWARE's APPNOTE.TXT); our
// reader against numpy.savez and numpy.savez_compressed files; byte identity on rewrite.
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { type NamedArray,namedArray } from '../sim/dataset/formats/named-array.ts';
import { NPY_DESCR } from '../sim/dataset/formats/npy.ts';
import { encodeNpz, readNpzFile, writeNpzFile } from '../sim/dataset/formats/npz.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const folder = mkdtempSync(join(tmpdir(), 'pliant-npz-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const base64 = (view: ArrayBufferView) => Buffer.from(view.buffer, view.byteOffset, view.byteLength).toString('base64');

// One demo episode of the Korrin Bay eel-like swimmer: 4 time steps, 3 nodes.
const EPISODE: readonly NamedArray[] = [
  namedArray('time_s', [4], Float64Array.of(0, 0.01, 0.02, 0.03), { unit: 's' }),
  namedArray('node_positions_m', [4, 3, 3], Float32Array.from({ length: 36 }, (_, i) => Math.sin(i) * 0.4), { unit: 'm' }),
  namedArray('cell_material', [3], Uint8Array.of(0, 2, 1)),
  namedArray('spring_pairs', [2, 2], Int32Array.of(0, 1, 1, 2)),
  namedArray('tank_depth_m', [], Float64Array.of(2.75), { unit: 'm' }),
  namedArray('contacts', [0, 2], new Uint16Array(0)),
];

interface ZipMember {
  name: string;
  compressType: number;
  dateTime: number[];
  extra: string;
  unixMode: number;
  descr: string;
  shape: number[];
  data: string;
}

const READ_WITH_NUMPY_AND_ZIPFILE =
  'import base64, json, sys, zipfile, numpy as np\n' +
  'path = json.load(sys.stdin)\n' +
  'with zipfile.ZipFile(path) as z:\n' +
  '    assert z.testzip() is None, "CRC-32 mismatch"\n' +
  '    infos = z.infolist()\n' +
  'loaded = np.load(path)\n' +
  'out = []\n' +
  'for info in infos:\n' +
  '    a = loaded[info.filename[:-4]]\n' +
  '    out.append({"name": info.filename, "compressType": info.compress_type, "dateTime": list(info.date_time),\n' +
  '                "extra": info.extra.hex(), "unixMode": info.external_attr >> 16,\n' +
  '                "descr": a.dtype.str, "shape": list(a.shape), "data": base64.b64encode(a.tobytes()).decode()})\n' +
  'print(json.dumps({"keys": list(loaded.keys()), "members": out}))';

describe.runIf(python.available)('numpy.load and zipfile read our archives', () => {
  for (const compression of ['deflate', 'stored'] as const) {
    it(`${compression}: same names, dtypes, shapes and values; fixed ZIP time 1980-01-01 00:00:00; no extra fields`, () => {
      const path = join(folder, `episode-${compression}.npz`);
      writeNpzFile(path, EPISODE, { compression });
      const { keys, members } = runReferencePython<{ keys: string[]; members: ZipMember[] }>(READ_WITH_NUMPY_AND_ZIPFILE, path);
      expect(keys).toEqual(EPISODE.map((a) => a.name));
      EPISODE.forEach((array, i) => {
        const member = members[i];
        expect(member.name).toBe(`${array.name}.npy`);
        // APPNOTE.TXT 4.4.5: method 8 is deflate, 0 is stored.
        expect(member.compressType).toBe(compression === 'deflate' ? 8 : 0);
        expect(member.dateTime).toEqual([1980, 1, 1, 0, 0, 0]);
        expect(member.extra).toBe('');
        expect(member.unixMode).toBe(0o100644);
        expect(member.descr).toBe(NPY_DESCR[array.dtype]);
        expect(member.shape).toEqual(array.shape);
        expect(member.data).toBe(base64(array.data));
      });
    });
  }

  it('our reader reads numpy.savez and numpy.savez_compressed archives', () => {
    const expected = runReferencePython<Record<string, { descr: string; shape: number[]; data: string }>>(
      'import base64, json, sys, numpy as np\n' +
        'folder = json.load(sys.stdin)\n' +
        'arrays = {"fin_activation": np.linspace(0, 1, 5, dtype=np.float32), "segment_count": np.array(12, dtype=np.int16),\n' +
        '          "tether_positions_m": np.arange(12.0).reshape(4, 3)}\n' +
        'np.savez(f"{folder}/numpy-stored.npz", **arrays)\n' +
        'np.savez_compressed(f"{folder}/numpy-deflated.npz", **arrays)\n' +
        'print(json.dumps({k: {"descr": a.dtype.str, "shape": list(a.shape), "data": base64.b64encode(a.tobytes()).decode()} for k, a in arrays.items()}))',
      folder,
    );
    for (const file of ['numpy-stored.npz', 'numpy-deflated.npz']) {
      const arrays = readNpzFile(join(folder, file));
      expect(arrays.map((a) => a.name).sort(), file).toEqual(Object.keys(expected).sort());
      for (const array of arrays) {
        const reference = expected[array.name];
        expect(NPY_DESCR[array.dtype], `${file}:${array.name}`).toBe(reference.descr);
        expect(array.shape).toEqual(reference.shape);
        expect(base64(array.data)).toBe(reference.data);
      }
    }
  });
});

describe('byte identity on rewrite (common practice, no source: reproducible archives)', () => {
  it('the same arrays give the same bytes in other time zones and 2 s later (ZIP times have 2 s resolution)', async () => {
    const originalZone = process.env.TZ;
    try {
      process.env.TZ = 'UTC';
      const first = encodeNpz(EPISODE);
      process.env.TZ = 'Pacific/Kiritimati';
      // Node applies a changed TZ at once; check it did, or the comparison below would prove nothing.
      expect(new Date(2020, 0, 1).getTimezoneOffset()).toBe(-14 * 60);
      const second = encodeNpz(EPISODE);
      process.env.TZ = 'America/Adak';
      await new Promise((done) => setTimeout(done, 2100));
      const path = join(folder, 'rewrite.npz');
      writeNpzFile(path, EPISODE);
      expect(Buffer.from(second).equals(Buffer.from(first))).toBe(true);
      expect(readFileSync(path).equals(Buffer.from(first))).toBe(true);
      // The local header's DOS date and time fields (APPNOTE.TXT 4.4.6) are 1980-01-01 00:00:00.
      const header = new DataView(first.buffer, first.byteOffset);
      expect(header.getUint32(0, true)).toBe(0x04034b50);
      expect(header.getUint16(10, true)).toBe(0);
      expect(header.getUint16(12, true)).toBe((0 << 9) | (1 << 5) | 1);
    } finally {
      if (originalZone === undefined) delete process.env.TZ;
      else process.env.TZ = originalZone;
    }
  });

  it('changing a single value changes the bytes, and duplicate names are refused', () => {
    const changed = EPISODE.map((a) => (a.name === 'tank_depth_m' ? namedArray('tank_depth_m', [], Float64Array.of(2.76)) : a));
    expect(Buffer.from(encodeNpz(changed)).equals(Buffer.from(encodeNpz(EPISODE)))).toBe(false);
    expect(() => encodeNpz([EPISODE[0], EPISODE[0]])).toThrow("two arrays are named 'time_s'; NPZ member names must be distinct");
  });

  it('leaves only the final file in the folder', () => {
    const sub = mkdtempSync(join(folder, 'only-final-'));
    writeNpzFile(join(sub, 'episode_000001.npz'), EPISODE, { compression: 'stored' });
    expect(readdirSync(sub)).toEqual(['episode_000001.npz']);
  });
});
