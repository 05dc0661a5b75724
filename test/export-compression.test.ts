// The `export.compression` choice checked against outside references. For every choice the NPZ
// file loads with Debian's numpy.load and the split HDF5 file with h5py, array for array with
// the same bytes (SHA-256 of NumPy's tobytes against the typed arrays'), and Python's zipfile
// and h5py report the compression the choice states: ZIP_STORED or ZIP_DEFLATED members (ZIP
// application note, APPNOTE.TXT §4.4.5: method 0 stored, 8 deflated), and HDF5's gzip filter
// with the stated level, or none. The zlib header inside a deflated HDF5 chunk is not looked
// at; h5py's compression_opts reads the level from the filter pipeline message.
// A seed file written before the choice existed (test/support/seed-before-compression, made by
// this project's own earlier version, commit 2e0540c) still regenerates its six data files byte
// for byte, SHA-256 from Python's hashlib recorded with those files. The checker refuses an
// unknown choice at /export/compression, naming the choices.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { sha256Hex } from '../sim/dataset/formats/file-digest.ts';
import type { NamedArray } from '../sim/dataset/formats/named-array.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { manifestProblems } from '../sim/dataset/manifest/manifest-check.ts';
import { parseSeedFile } from '../sim/dataset/manifest/seed-file.ts';
import { writeDatasetFile } from '../sim/dataset/write/dataset-file-writer.ts';
import { encodeEpisodeNpz } from '../sim/dataset/write/episode-npz.ts';
import { writeSplitHdf5 } from '../sim/dataset/write/split-hdf5.ts';
import { checkScenarioText, checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { COMPRESSION_LEVELS, EXPORT_COMPRESSIONS } from '../sim/scenario/export-compression.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const OLD_SEED = join(ROOT, 'test/support/seed-before-compression');
const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-compression-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

function bytesOf(array: NamedArray): Uint8Array {
  return new Uint8Array(array.data.buffer, array.data.byteOffset, array.data.byteLength);
}

/**
 * One episode's worth of arrays: a float32 trajectory of 400 KiB (over the 256 KiB floor of
 * "fast" in HDF5) of smooth motion with a little hash noise, as simulated positions look, and
 * small arrays of other dtypes (an odd-length uint8 array, an empty one).
 */
function syntheticEpisode(): NamedArray[] {
  const steps = 1000;
  const nodes = 34;
  const positions = new Float32Array(steps * nodes * 3);
  for (let t = 0; t < steps; t++) {
    for (let n = 0; n < nodes; n++) {
      const i = (t * nodes + n) * 3;
      positions[i] = 0.1 * n + 0.02 * Math.sin(0.01 * t + n);
      positions[i + 1] = -0.05 * n * Math.cos(0.013 * t);
      positions[i + 2] = (((i * 2654435761) >>> 0) % 1000) * 1e-6;
    }
  }
  const edges = new Int32Array(2 * (nodes - 1));
  for (let e = 0; e < nodes - 1; e++) {
    edges[2 * e] = e;
    edges[2 * e + 1] = e + 1;
  }
  return [
    { name: 'positions', dtype: 'float32', shape: [steps, nodes, 3], data: positions },
    { name: 'edges', dtype: 'int32', shape: [nodes - 1, 2], data: edges },
    { name: 'edge_relation', dtype: 'uint8', shape: [nodes - 1], data: new Uint8Array(nodes - 1).fill(1) },
    { name: 'clamps', dtype: 'int32', shape: [0, 2], data: new Int32Array(0) },
  ];
}

interface PythonView {
  npzMembers: Record<string, { compressType: number; sha256: string; dtype: string; shape: number[] }>;
  h5Arrays: Record<string, { compression: string | null; level: number | null; chunked: boolean; sha256: string; dtype: string; shape: number[] }>;
}

const READ_BACK = `import hashlib, json, sys, zipfile
import numpy as np, h5py
spec = json.load(sys.stdin)
def digest(a):
    return hashlib.sha256(np.ascontiguousarray(a).tobytes()).hexdigest()
members = {}
with zipfile.ZipFile(spec["npz"]) as z:
    types = {i.filename[:-4]: i.compress_type for i in z.infolist()}
with np.load(spec["npz"]) as z:
    for k in z.files:
        a = z[k]
        members[k] = {"compressType": types[k], "sha256": digest(a), "dtype": a.dtype.str, "shape": list(a.shape)}
arrays = {}
with h5py.File(spec["h5"], "r") as f:
    for k, d in f["ep-000000"].items():
        a = d[()]
        arrays[k] = {"compression": d.compression, "level": d.compression_opts, "chunked": d.chunks is not None,
                     "sha256": digest(a), "dtype": a.dtype.str, "shape": list(a.shape)}
print(json.dumps({"npzMembers": members, "h5Arrays": arrays}))`;

const DTYPE_STR: Record<string, string> = { float32: '<f4', int32: '<i4', uint8: '|u1' };

describe('export.compression: every choice loads with NumPy and h5py and is the compression it states', () => {
  for (const choice of EXPORT_COMPRESSIONS) {
    it.runIf(python.available)(`${choice}: identical arrays through numpy.load and h5py, with the stated deflate levels`, async () => {
      const arrays = syntheticEpisode();
      const folder = join(work, `writer-${choice}`);
      const npz = writeDatasetFile(folder, 'ep-000000.npz', encodeEpisodeNpz(arrays, choice));
      const h5Path = join(folder, 'train.h5');
      await writeSplitHdf5(h5Path, { datasetName: 'korrin-test', split: 'train', masterSeed: '1' }, [{ id: 'ep-000000', index: 0, labels: {}, arrays }], choice);
      const view = runReferencePython<PythonView>(READ_BACK, { npz: join(folder, npz.path), h5: h5Path });
      const levels = COMPRESSION_LEVELS[choice];
      expect(Object.keys(view.npzMembers)).toEqual(arrays.map((a) => a.name));
      for (const array of arrays) {
        const want = { sha256: sha256Hex(bytesOf(array)), dtype: DTYPE_STR[array.dtype], shape: [...array.shape] };
        const member = view.npzMembers[array.name];
        expect({ sha256: member.sha256, dtype: member.dtype, shape: member.shape }).toEqual(want);
        // APPNOTE.TXT 4.4.5: compression method 0 = stored, 8 = deflated.
        expect(member.compressType).toBe(levels.npzDeflateLevel === 0 ? 0 : 8);
        const stored = view.h5Arrays[array.name];
        expect({ sha256: stored.sha256, dtype: stored.dtype, shape: stored.shape }).toEqual(want);
        const compressed = levels.hdf5DeflateLevel > 0 && array.data.byteLength >= levels.hdf5MinCompressedBytes && array.data.byteLength > 0;
        expect(stored.compression).toBe(compressed ? 'gzip' : null);
        expect(stored.level).toBe(compressed ? levels.hdf5DeflateLevel : null);
        expect(stored.chunked).toBe(compressed);
      }
      // The stated floor is what decides for "fast": the 400 KiB trajectory is compressed, the small arrays are not.
      if (choice === 'fast') expect([view.h5Arrays.positions.compression, view.h5Arrays.edges.compression]).toEqual(['gzip', null]);
    }, 60_000);
  }

  it('the choices are distinct files: "none" is larger than the deflated choices for the same arrays (deflate never expands much, stored adds nothing)', () => {
    const arrays = syntheticEpisode();
    const sizes = Object.fromEntries(EXPORT_COMPRESSIONS.map((c) => [c, encodeEpisodeNpz(arrays, c).byteLength]));
    const raw = arrays.reduce((sum, a) => sum + a.data.byteLength, 0);
    // Stored members hold the NPY file whole, header included (NEP 1), so the archive is larger than the raw data.
    expect(sizes.none).toBeGreaterThan(raw);
    expect(sizes.fast).toBeLessThan(sizes.none);
    expect(sizes.small).toBeLessThan(sizes.none);
  });
});

describe('export.compression in scenarios, seed files and manifests', () => {
  it('the checker fills "fast" when the key is left out and refuses an unknown choice at /export/compression, naming the choices', () => {
    const text = readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8');
    const checked = checkScenarioText(text, 'korrin-tether.json');
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    expect(checked.scenario.export.compression).toBe('fast');
    const wrong = checkScenarioValue({ ...checked.scenario, export: { ...checked.scenario.export, compression: 'tiny' } });
    expect(wrong.ok).toBe(false);
    if (wrong.ok) return;
    const problem = wrong.problems.find((p) => p.pointer === '/export/compression');
    expect(problem?.message).toContain('"fast", "small", "none"');
    expect(problem?.message).toContain('"tiny"');
  });

  it('a seed file without the key is read as "small"; one with the key keeps it', () => {
    const oldText = readFileSync(join(OLD_SEED, 'seed.json'), 'utf8');
    expect(JSON.parse(oldText).scenario.export).not.toHaveProperty('compression');
    expect(parseSeedFile(oldText, 'seed.json').scenario.export.compression).toBe('small');
    const withKey = JSON.parse(oldText);
    withKey.scenario.export.compression = 'none';
    withKey.export.compression = 'none';
    expect(parseSeedFile(JSON.stringify(withKey), 'seed.json').scenario.export.compression).toBe('none');
  });

  it.runIf(python.available)('a seed file written before the choice existed regenerates its episode files byte for byte (SHA-256 from hashlib) and its split files\' arrays', async () => {
    const out = join(work, 'old-seed-again');
    const result = await cli(['reproduce', join(OLD_SEED, 'seed.json'), '--out', out, '--workers', '1']);
    // The folder beside the old seed file holds only the seed file, so the comparison reports the rest missing; the data files are checked here.
    expect(result.stderr).not.toMatch(/\n\s+at /);
    const expected = readFileSync(join(OLD_SEED, 'data-files.sha256'), 'utf8').trim().split('\n').map((line) => line.split(/\s+/));
    expect(expected).toHaveLength(6);
    const digests = runReferencePython<Record<string, string>>(
      `import hashlib, json, os, sys
spec = json.load(sys.stdin)
print(json.dumps({p: hashlib.sha256(open(os.path.join(spec["dir"], p), "rb").read()).hexdigest() for p in spec["paths"]}))`,
      { dir: out, paths: expected.map(([, path]) => path) },
    );
    // The episode files come out byte for byte. The split HDF5 files have since gained each
    // episode's labels and the split's statistics as attributes, so their bytes differ from the
    // old ones; their arrays are checked instead, against the byte-identical NPZ files (h5py, NumPy).
    for (const [sha256, path] of expected) if (path.endsWith('.npz')) expect(digests[path], path).toBe(sha256);
    const arraysAgree = runReferencePython<{ compared: number; wrong: string[] }>(
      `import json, os, sys
import h5py, numpy as np
spec = json.load(sys.stdin)
compared, wrong = 0, []
for p in spec["paths"]:
    if not p.endswith(".h5"):
        continue
    with h5py.File(os.path.join(spec["dir"], p), "r") as f:
        for episode_id in f:
            with np.load(os.path.join(spec["dir"], "episodes", episode_id + ".npz")) as a:
                for name in a.files:
                    compared += 1
                    if not np.array_equal(a[name], f[episode_id][name][...]) or a[name].dtype != f[episode_id][name].dtype:
                        wrong.append(p + ":" + episode_id + "/" + name)
print(json.dumps({"compared": compared, "wrong": wrong}))`,
      { dir: out, paths: expected.map(([, path]) => path) },
    );
    expect(arraysAgree.wrong).toEqual([]);
    expect(arraysAgree.compared).toBeGreaterThan(10);
    const manifest = JSON.parse(readFileSync(join(out, 'manifest.json'), 'utf8')) as DatasetManifest;
    expect(manifest.export.compression).toBe('small');
    expect(manifest.export.levels).toEqual(COMPRESSION_LEVELS.small);
  }, 120_000);

  it.runIf(python.available)('the manifest and card record the choice; "none" writes stored NPZ members and unfiltered HDF5 arrays', async () => {
    const text = readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8');
    const checked = checkScenarioText(text, 'korrin-tether.json');
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const scenario = withOverrides(checked.scenario, { episodes: 2, format: 'both' });
    scenario.export.compression = 'none';
    const scenarioPath = join(work, 'none.json');
    writeFileSync(scenarioPath, JSON.stringify(scenario));
    const out = join(work, 'none-dataset');
    const made = await cli(['generate', scenarioPath, '--out', out, '--workers', '1']);
    expect(made.stderr).toBe('');
    expect(made.code).toBe(0);
    const manifestValue = JSON.parse(readFileSync(join(out, 'manifest.json'), 'utf8'));
    expect(manifestProblems(manifestValue)).toEqual([]);
    const manifest = manifestValue as DatasetManifest;
    expect(manifest.export).toEqual({ format: 'both', dtype: 'float32', compression: 'none', levels: COMPRESSION_LEVELS.none });
    expect(readFileSync(join(out, 'CARD.md'), 'utf8')).toContain('Compression "none": NPZ members stored uncompressed; HDF5 arrays contiguous, uncompressed');
    const npzFiles = manifest.files.filter((f) => f.kind === 'episode-npz').map((f) => join(out, f.path));
    const h5Files = manifest.files.filter((f) => f.kind === 'split-hdf5').map((f) => join(out, f.path));
    expect(npzFiles.length).toBeGreaterThan(0);
    const seen = runReferencePython<{ methods: number[]; filters: (string | null)[] }>(
      `import json, sys, zipfile
import h5py
spec = json.load(sys.stdin)
methods = sorted({i.compress_type for p in spec["npz"] for i in zipfile.ZipFile(p).infolist()})
filters = []
def visit(name, obj):
    if isinstance(obj, h5py.Dataset): filters.append(obj.compression)
for p in spec["h5"]:
    with h5py.File(p, "r") as f: f.visititems(visit)
print(json.dumps({"methods": methods, "filters": sorted(set(filters), key=str)}))`,
      { npz: npzFiles, h5: h5Files },
    );
    expect(seen).toEqual({ methods: [0], filters: [null] });
  }, 120_000);
});
