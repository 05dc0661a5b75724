// HDF5 files: read back by Debian h5py (groups, dataset dtypes, shapes, values, attributes,
// compression); byte identity across runs written at different times, with the object header
// time stamps checked by the HDF5 File Format Specification's layout of version 2 object
// headers; a full disk reported in one clear line without HDF5's error stack.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { DatasetWriteError } from '../sim/dataset/formats/dataset-write-error.ts';
import { loadHdf5Library } from '../sim/dataset/formats/hdf5-runtime.ts';
import { encodeHdf5, fillHdf5File, HDF5_FIXED_TIME_S, type Hdf5Content,writeHdf5File } from '../sim/dataset/formats/hdf5-writer.ts';
import { type NamedArray,namedArray } from '../sim/dataset/formats/named-array.ts';
import { NPY_DESCR } from '../sim/dataset/formats/npy.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const folder = mkdtempSync(join(tmpdir(), 'pliant-hdf5-test-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const REPO = resolve(import.meta.dirname, '..');
const base64 = (view: ArrayBufferView) => Buffer.from(view.buffer, view.byteOffset, view.byteLength).toString('base64');

function episode(index: number): NamedArray[] {
  const steps = 3 + index;
  return [
    namedArray('time_s', [steps], Float64Array.from({ length: steps }, (_, i) => i * 0.005), { unit: 's', description: 'time of each recorded step' }),
    namedArray('tether_positions_m', [steps, 4, 3], Float32Array.from({ length: steps * 12 }, (_, i) => Math.cos(i + index) * 1.5),
      { unit: 'm', description: 'rover tether node positions in the Korrin Bay tank frame' }),
    namedArray('fin_activation', [steps, 2], Float64Array.from({ length: steps * 2 }, (_, i) => (i % 5) / 4 - 0.5), { unit: '1' }),
    namedArray('spring_pairs', [3, 2], Int32Array.of(0, 1, 1, 2, 2, -3)),
    namedArray('spring_count', [], Uint32Array.of(4_000_000_000)),
    namedArray('segment_offset', [2], Int16Array.of(-32768, 32767)),
    namedArray('cell_count', [2], Uint16Array.of(0, 65535)),
    namedArray('contact_sign', [3], Int8Array.of(-128, 0, 127)),
    namedArray('cell_material', [2, 2, 2], Uint8Array.of(0, 1, 2, 3, 4, 5, 6, 255)),
    namedArray('contacts', [0, 2], new Float32Array(0)),
  ];
}

const CONTENT: Hdf5Content = {
  attributes: { title: 'Korrin Bay test tank — tether and swimmer demo', gravity_m_per_s2: 9.81, master_seed: 1_099_511_627_783n },
  arrays: [namedArray('tank_depth_m', [], Float64Array.of(2.75), { unit: 'm' })],
  groups: [
    { name: 'episode_000000', attributes: { split: 'train', youngs_modulus_pa: 2.5e5 }, arrays: episode(0) },
    { name: 'episode_000001', attributes: { split: 'train', part_count: 12n }, arrays: episode(1) },
  ],
};

const DATASET_COUNT = 1 + CONTENT.groups!.reduce((sum, group) => sum + group.arrays.length, 0);
const OBJECT_COUNT = 1 + CONTENT.groups!.length + DATASET_COUNT;

// The content as JSON, for a second Node process that writes the same file independently.
function contentAsJson(content: Hdf5Content): string {
  return JSON.stringify(content, (_, value: unknown) => {
    if (typeof value === 'bigint') return { bigint: value.toString() };
    if (ArrayBuffer.isView(value)) return { base64: base64(value) };
    return value;
  });
}

const CHILD_SCRIPT = `
import { readFileSync } from 'node:fs';
import { HDF5_FIXED_TIME_S, fillHdf5File, writeHdf5File } from ${JSON.stringify(join(REPO, 'sim/dataset/formats/hdf5-writer.ts'))};
import { loadHdf5Library } from ${JSON.stringify(join(REPO, 'sim/dataset/formats/hdf5-runtime.ts'))};
import { DatasetWriteError } from ${JSON.stringify(join(REPO, 'sim/dataset/formats/dataset-write-error.ts'))};
const [mode, contentPath, target] = process.argv.slice(2);
const TYPED = { float32: Float32Array, float64: Float64Array, int32: Int32Array, uint32: Uint32Array,
  int16: Int16Array, uint16: Uint16Array, int8: Int8Array, uint8: Uint8Array };
const content = JSON.parse(readFileSync(contentPath, 'utf8'), (key, value) => {
  if (value && typeof value === 'object' && 'bigint' in value) return BigInt(value.bigint);
  if (value && typeof value === 'object' && 'dtype' in value && value.data && 'base64' in value.data) {
    const bytes = Buffer.from(value.data.base64, 'base64');
    const copy = new Uint8Array(bytes);
    return { ...value, data: new TYPED[value.dtype](copy.buffer, 0, copy.byteLength / TYPED[value.dtype].BYTES_PER_ELEMENT) };
  }
  return value;
});
if (mode === 'write') {
  await writeHdf5File(target, content);
} else {
  try {
    fillHdf5File(await loadHdf5Library(), '/dev/full', content, {}, target);
    console.log(JSON.stringify({ written: true }));
  } catch (error) {
    console.log(JSON.stringify({ isWriteError: error instanceof DatasetWriteError, failure: error.failure, message: error.message }));
  }
}
`;

function runChild(mode: 'write' | 'full', target: string): { stdout: string; stderr: string } {
  const scriptPath = join(folder, 'child-writer.mjs');
  const contentPath = join(folder, 'content.json');
  writeFileSync(scriptPath, CHILD_SCRIPT);
  writeFileSync(contentPath, contentAsJson(CONTENT));
  const result = spawnSync(process.execPath, ['--import', 'tsx', scriptPath, mode, contentPath, target], { cwd: REPO, encoding: 'utf8', timeout: 120_000 });
  if (result.status !== 0) throw new Error(`child writer failed (${result.status}): ${result.stderr}`);
  return { stdout: result.stdout, stderr: result.stderr };
}

interface H5Attribute { type: string; value: string | number }
interface H5Dataset { descr: string; shape: number[]; data: string; attrs: Record<string, H5Attribute>; compression: string | null; compressionOpts: number | null; chunks: number[] | null }
interface H5Walk { root: Record<string, H5Attribute>; groups: Record<string, Record<string, H5Attribute>>; datasets: Record<string, H5Dataset> }

const WALK_WITH_H5PY =
  'import base64, json, sys, h5py, numpy as np\n' +
  'def attrs(obj):\n' +
  '    out = {}\n' +
  '    for k in obj.attrs:\n' +
  '        v = obj.attrs[k]\n' +
  '        out[k] = {"type": v.dtype.str, "value": v.item()} if isinstance(v, np.generic) else {"type": "str", "value": v}\n' +
  '    return out\n' +
  'groups, datasets = {}, {}\n' +
  'def visit(name, obj):\n' +
  '    if isinstance(obj, h5py.Dataset):\n' +
  '        a = np.asarray(obj[()])\n' +
  '        datasets["/" + name] = {"descr": obj.dtype.str, "shape": list(obj.shape), "data": base64.b64encode(a.tobytes()).decode(),\n' +
  '            "attrs": attrs(obj), "compression": obj.compression, "compressionOpts": obj.compression_opts,\n' +
  '            "chunks": list(obj.chunks) if obj.chunks else None}\n' +
  '    else:\n' +
  '        groups["/" + name] = attrs(obj)\n' +
  'with h5py.File(json.load(sys.stdin), "r") as f:\n' +
  '    f.visititems(visit)\n' +
  '    print(json.dumps({"root": attrs(f), "groups": groups, "datasets": datasets}))';

function expectAttributes(actual: Record<string, H5Attribute>, expected: Record<string, string | number | bigint>): void {
  expect(Object.keys(actual).sort()).toEqual(Object.keys(expected).sort());
  for (const [name, value] of Object.entries(expected)) {
    if (typeof value === 'string') expect(actual[name], name).toEqual({ type: 'str', value });
    else if (typeof value === 'bigint') expect(actual[name], name).toEqual({ type: '<i8', value: Number(value) });
    else expect(actual[name], name).toEqual({ type: '<f8', value });
  }
}

function expectDataset(actual: H5Dataset | undefined, array: NamedArray, where: string): void {
  expect(actual, where).toBeDefined();
  expect(actual!.descr, where).toBe(NPY_DESCR[array.dtype]);
  expect(actual!.shape, where).toEqual(array.shape);
  expect(actual!.data, where).toBe(base64(array.data));
  const labels: Record<string, string> = {};
  if (array.unit !== undefined) labels.unit = array.unit;
  if (array.description !== undefined) labels.description = array.description;
  expectAttributes(actual!.attrs, labels);
}

describe.runIf(python.available)('h5py reads our files', () => {
  it('contiguous: groups, dataset dtypes, shapes, values and attributes match', async () => {
    const path = join(folder, 'split-train.h5');
    await writeHdf5File(path, CONTENT);
    const walk = runReferencePython<H5Walk>(WALK_WITH_H5PY, path);
    expectAttributes(walk.root, CONTENT.attributes!);
    expect(Object.keys(walk.groups).sort()).toEqual(['/episode_000000', '/episode_000001']);
    expect(Object.keys(walk.datasets)).toHaveLength(DATASET_COUNT);
    expectDataset(walk.datasets['/tank_depth_m'], CONTENT.arrays![0], '/tank_depth_m');
    for (const group of CONTENT.groups!) {
      expectAttributes(walk.groups[`/${group.name}`], group.attributes!);
      for (const array of group.arrays) {
        const where = `/${group.name}/${array.name}`;
        expectDataset(walk.datasets[where], array, where);
        expect(walk.datasets[where].compression, where).toBeNull();
      }
    }
  });

  it('deflate level 4: h5py reports gzip level 4 with chunks of whole rows, and the values are unchanged', async () => {
    const path = join(folder, 'split-train-deflate.h5');
    await writeHdf5File(path, CONTENT, { deflateLevel: 4 });
    const walk = runReferencePython<H5Walk>(WALK_WITH_H5PY, path);
    const positions = walk.datasets['/episode_000001/tether_positions_m'];
    expect(positions.compression).toBe('gzip');
    expect(positions.compressionOpts).toBe(4);
    expect(positions.chunks).toEqual([4, 4, 3]);
    for (const group of CONTENT.groups!) {
      for (const array of group.arrays) expectDataset(walk.datasets[`/${group.name}/${array.name}`], array, array.name);
    }
    // 0-d and empty arrays cannot be chunked in HDF5 and stay contiguous.
    expect(walk.datasets['/episode_000000/spring_count'].compression).toBeNull();
    expect(walk.datasets['/episode_000000/contacts'].compression).toBeNull();
  });
});

// HDF5 File Format Specification 3.0, IV.A.1.b (from memory): a version 2 object header starts
// with "OHDR", version 2 and a flags byte; when flag bit 5 is set, four 32-bit little-endian
// times follow (access, modification, change, birth).
function objectHeaderTimes(bytes: Buffer): number[][] {
  const times: number[][] = [];
  for (let at = bytes.indexOf('OHDR'); at >= 0; at = bytes.indexOf('OHDR', at + 4)) {
    expect(bytes[at + 4]).toBe(2);
    if ((bytes[at + 5] & 0x20) === 0) continue;
    times.push([0, 1, 2, 3].map((k) => bytes.readUInt32LE(at + 6 + 4 * k)));
  }
  return times;
}

describe('byte identity across runs (common practice, no source: reproducible files)', () => {
  it('the same content written twice in this process 1.2 s apart, and once more by a fresh Node process, gives identical bytes', async () => {
    const first = join(folder, 'first.h5');
    const second = join(folder, 'second.h5');
    const third = join(folder, 'third.h5');
    await writeHdf5File(first, CONTENT);
    // Other content in between, so leftovers in the library's memory would show.
    await writeHdf5File(join(folder, 'other.h5'), { groups: [{ name: 'episode_000009', arrays: episode(3) }] });
    await new Promise((done) => setTimeout(done, 1200));
    await writeHdf5File(second, CONTENT);
    runChild('write', third);
    const bytes = readFileSync(first);
    expect(readFileSync(second).equals(bytes)).toBe(true);
    expect(readFileSync(third).equals(bytes)).toBe(true);
    expect(Buffer.from(await encodeHdf5(CONTENT)).equals(bytes)).toBe(true);
  });

  it('every object header carries the pinned time, which alone decides those bytes', async () => {
    const pinned = readFileSync(await writeAndPath('pinned.h5', HDF5_FIXED_TIME_S));
    const times = objectHeaderTimes(pinned);
    // One header per object: the root group, each episode group and each dataset.
    expect(times).toHaveLength(OBJECT_COUNT);
    for (const stamps of times) expect(stamps).toEqual([HDF5_FIXED_TIME_S, HDF5_FIXED_TIME_S, HDF5_FIXED_TIME_S, HDF5_FIXED_TIME_S]);
    const later = readFileSync(await writeAndPath('later.h5', HDF5_FIXED_TIME_S + 1));
    expect(later.equals(pinned)).toBe(false);
    expect(objectHeaderTimes(later).flat().every((t) => t === HDF5_FIXED_TIME_S + 1)).toBe(true);
    expect(later.length).toBe(pinned.length);
  });
});

async function writeAndPath(name: string, fixedTimeS: number): Promise<string> {
  const path = join(folder, name);
  await writeHdf5File(path, CONTENT, { fixedTimeS });
  return path;
}

describe('write failures (errno meanings per POSIX; messages are ours)', () => {
  it('a full disk (Linux /dev/full) becomes one clear line, with no HDF5 error stack on standard error', () => {
    expect(existsSync('/dev/full'), 'this check needs Linux /dev/full').toBe(true);
    const target = join(folder, 'split-test.h5');
    const { stdout, stderr } = runChild('full', target);
    expect(JSON.parse(stdout)).toEqual({
      isWriteError: true,
      failure: 'disk-full',
      message: `the disk is full while writing ${target}; free space and run again with --resume`,
    });
    expect(stderr).not.toContain('HDF5-DIAG');
    expect(existsSync(target)).toBe(false);
  });

  it('the same in this process: fillHdf5File reports ENOSPC for the final name', async () => {
    const library = await loadHdf5Library();
    const target = join(folder, 'split-validation.h5');
    let caught: unknown;
    try {
      fillHdf5File(library, '/dev/full', CONTENT, {}, target);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(DatasetWriteError);
    expect((caught as DatasetWriteError).errno).toBe('ENOSPC');
    expect((caught as DatasetWriteError).path).toBe(target);
  });

  it('a missing output folder is named, and nothing is created', async () => {
    const target = join(folder, 'no-such-folder', 'split-train.h5');
    await expect(writeHdf5File(target, CONTENT)).rejects.toThrow(
      `cannot write ${target}: the folder ${join(folder, 'no-such-folder')} does not exist; create it or choose another output folder`,
    );
    expect(existsSync(join(folder, 'no-such-folder'))).toBe(false);
  });

  it('a successful write leaves only the final file', async () => {
    const sub = mkdtempSync(join(folder, 'only-final-'));
    await writeHdf5File(join(sub, 'split-train.h5'), CONTENT);
    expect(readdirSync(sub)).toEqual(['split-train.h5']);
  });
});
