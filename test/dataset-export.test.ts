// Written datasets checked against outside references: Debian's NumPy and h5py load every NPZ
// and HDF5 file with the dtypes and shapes the manifest lists and the values of the in-memory
// run bit for bit; Python's hashlib gives the manifest's SHA-256 values; ajv (a JSON Schema
// 2020-12 implementation) accepts the manifest against its schema; numpy.histogram gives the
// card's histogram counts; the card's Python snippets run against the folder.
// The labels are checked with Newton's second law and Hooke's law: for a float64 chain recorded
// at every sub-step, semi-implicit Euler (v' = v + dt·F(x, v)/m, x' = x + dt·v'; Hairer, Lubich
// & Wanner, Geometric Numerical Integration, §I.1) means m·Δv/Δt must equal the spring forces
// k·(L − L0) along each spring plus axial damping c·(Δv·n), gravity m·g and the recorded handle
// forces, all recomputed in NumPy from the stored arrays. Stiffness and damping labels follow
// k = EA/ℓ for a bar (Gere & Goodno, Mechanics of Materials) and c = 2ζ√(kμ) with μ the
// reduced mass of the two ends (the damping ratio of a two-body oscillator, e.g. Thomson &
// Dahleh, Theory of Vibration with Applications).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import Ajv2020 from 'ajv/dist/2020.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { sha256Hex } from '../sim/dataset/formats/file-digest.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { MANIFEST_SCHEMA } from '../sim/dataset/manifest/manifest-schema.ts';
import { produceEpisode } from '../sim/dataset/write/episode-product.ts';
import { generateDataset } from '../sim/dataset/write/generate-dataset.ts';
import { ReplayTable } from '../sim/dataset/write/replay-inputs.ts';
import { checkScenarioText, checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { REFERENCE_PYTHON, referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-export-'));

function checked(value: unknown): Scenario {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

function demoScenario(file: string, overrides: { episodes: number; format: 'npz' | 'hdf5' | 'both' }): Scenario {
  const result = checkScenarioText(readFileSync(join(ROOT, 'scenarios', file), 'utf8'), file);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return withOverrides(result.scenario, overrides);
}

/** A short tether piece pulled at its tip, recorded at every sub-step in float64 (Korrin Bay demo values). */
function newtonScenario(): Scenario {
  return checked({
    formatVersion: 1,
    name: 'korrin-tether-newton',
    description: 'Korrin Bay test tank: a short piece of the rover tether, pinned at the top and pulled at its tip.',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 4, max: 7 },
      lengthM: 1,
      totalMassKg: { kind: 'uniform', min: 0.4, max: 0.8 },
      axialStiffnessN: { kind: 'uniform', min: 50, max: 150 },
      secondNeighbourSpringRatio: 0.1,
      dampingRatio: { kind: 'uniform', min: 0.02, max: 0.2 },
      diameterM: 0.01,
      anchor: 'top-pinned',
      directionUnit: [1, -1, 0],
      forceHandles: [-1],
      forceAxes: ['x', 'y'],
    },
    world: { gravityMPerS2: [0, { kind: 'uniform', min: -10, max: -9 }, 0] },
    controls: { default: { kind: 'band-limited', cutoffHz: 5, std: 0.5, componentCount: 6 } },
    time: { recordIntervalS: 0.001, recordedSteps: 300, substeps: 1 },
    initialState: { velocityNoiseMPerS: 0.05 },
    episodes: 3,
    seed: 11,
    export: { format: 'both', dtype: 'float64' },
  });
}

const fin = demoScenario('korrin-fin.json', { episodes: 4, format: 'both' });
const newton = newtonScenario();
const finDir = join(work, 'fin');
const newtonDir = join(work, 'newton');
let finManifest: DatasetManifest;
let newtonManifest: DatasetManifest;

async function generate(scenario: Scenario, outDir: string): Promise<DatasetManifest> {
  const result = await generateDataset({
    scenario,
    inputs: { kind: 'scenario', scenarioDir: join(ROOT, 'scenarios') },
    outDir,
    shard: null,
    workers: 1,
    resume: false,
    force: false,
    pliantVersion: '0.1.0',
  });
  expect(result.status).toBe('complete');
  return JSON.parse(readFileSync(join(outDir, 'manifest.json'), 'utf8')) as DatasetManifest;
}

beforeAll(async () => {
  finManifest = await generate(fin, finDir);
  newtonManifest = await generate(newton, newtonDir);
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

/** Python that loads an array by manifest name from an NPZ or HDF5 file. */
const PY_LOADER = `
import hashlib, json, sys
import numpy as np
import h5py

def arrays_of(folder, record):
    path = folder + "/" + record["path"]
    if record["kind"] == "episode-npz":
        with np.load(path) as f:
            for a in record["arrays"]:
                yield a, f[a["name"]]
    else:
        with h5py.File(path, "r") as f:
            for a in record["arrays"]:
                yield a, f[a["name"]][...]
`;

describe.runIf(python.available)('exported files in Debian NumPy and h5py', () => {
  it('each HDF5 episode group carries its labels, and each split file its statistics, as the manifest has them (read with h5py)', () => {
    const result = runReferencePython<{ groups: number; wrong: string[] }>(`
import json, sys
import h5py
args = json.load(sys.stdin)
manifest = json.load(open(args["dir"] + "/manifest.json"))
labels = {e["id"]: e["labels"] for e in manifest["episodes"]}
groups, wrong = 0, []
for record in manifest["files"]:
    if record["kind"] != "split-hdf5":
        continue
    with h5py.File(args["dir"] + "/" + record["path"], "r") as f:
        stats = f.attrs["normalisation"]
        stats = json.loads(stats.decode() if isinstance(stats, bytes) else stats)
        if stats != manifest["normalisation"][record["split"]]:
            wrong.append(record["path"] + ": normalisation differs from the manifest's")
        for episode_id in record["episodes"]:
            groups += 1
            text = f[episode_id].attrs["labels"]
            if json.loads(text.decode() if isinstance(text, bytes) else text) != labels[episode_id]:
                wrong.append(record["path"] + ":" + episode_id + ": labels differ from the manifest's")
print(json.dumps({"groups": groups, "wrong": wrong}))
`, { dir: finDir });
    expect(result.wrong).toEqual([]);
    expect(result.groups).toBe(finManifest.episodes.filter((e) => e.status === 'ok').length);
  });

  it('every NPZ member and HDF5 dataset has the dtype and shape the manifest lists', () => {
    for (const [dir, manifest] of [[finDir, finManifest], [newtonDir, newtonManifest]] as const) {
      const result = runReferencePython<{ checked: number; wrong: string[] }>(`${PY_LOADER}
args = json.load(sys.stdin)
manifest = json.load(open(args["dir"] + "/manifest.json"))
checked, wrong = 0, []
for record in manifest["files"]:
    for a, data in arrays_of(args["dir"], record):
        checked += 1
        if str(data.dtype) != a["dtype"] or list(data.shape) != a["shape"]:
            wrong.append(f'{record["path"]}:{a["name"]} is {data.dtype}{list(data.shape)}, manifest says {a["dtype"]}{a["shape"]}')
print(json.dumps({"checked": checked, "wrong": wrong}))
`, { dir });
      expect(result.wrong).toEqual([]);
      expect(result.checked).toBe(manifest.files.reduce((n, f) => n + f.arrays.length, 0));
      expect(manifest.files.some((f) => f.kind === 'split-hdf5')).toBe(true);
      expect(manifest.files.some((f) => f.kind === 'episode-npz')).toBe(true);
    }
  });

  it('holds the values of the in-memory run bit for bit, in NPZ and HDF5 alike (hashlib over NumPy bytes)', () => {
    for (const [dir, scenario, manifest] of [[finDir, fin, finManifest], [newtonDir, newton, newtonManifest]] as const) {
      const expected: Record<string, Record<string, { sha256: string; first: number }>> = {};
      for (const record of manifest.episodes) {
        const product = produceEpisode(scenario, record.index, scenario.export.dtype, new ReplayTable());
        expect(product.record.labels).toEqual(record.labels);
        expected[record.id] = {};
        for (const array of product.arrays ?? []) {
          const bytes = new Uint8Array(array.data.buffer, array.data.byteOffset, array.data.byteLength);
          expected[record.id][array.name] = { sha256: sha256Hex(bytes), first: array.data.length > 0 ? Number(array.data[0]) : 0 };
        }
      }
      const found = runReferencePython<Record<string, Record<string, { sha256: string; first: number }>>>(`${PY_LOADER}
args = json.load(sys.stdin)
manifest = json.load(open(args["dir"] + "/manifest.json"))
out = {}
for record in manifest["files"]:
    for a, data in arrays_of(args["dir"], record):
        episode, name = (a["name"].split("/") if "/" in a["name"] else (record["episodes"][0], a["name"]))
        entry = {"sha256": hashlib.sha256(np.ascontiguousarray(data).tobytes()).hexdigest(), "first": float(data.flat[0]) if data.size else 0.0}
        out[record["kind"] + ":" + episode + ":" + name] = entry
print(json.dumps(out))
`, { dir });
      let compared = 0;
      for (const [id, arrays] of Object.entries(expected)) {
        for (const [name, value] of Object.entries(arrays)) {
          for (const kind of ['episode-npz', 'split-hdf5']) {
            expect(found[`${kind}:${id}:${name}`], `${kind} ${id} ${name}`).toEqual(value);
            compared++;
          }
        }
      }
      expect(compared).toBeGreaterThan(20);
    }
  });

  it('lists SHA-256 values that hashlib.sha256 reproduces for every file', () => {
    const records = [...finManifest.files, ...finManifest.documents].map((f) => ({ path: f.path, sha256: f.sha256, size: f.sizeBytes }));
    const found = runReferencePython<Record<string, [string, number]>>(`
import hashlib, json, sys, os
args = json.load(sys.stdin)
print(json.dumps({r["path"]: [hashlib.sha256(open(args["dir"] + "/" + r["path"], "rb").read()).hexdigest(), os.path.getsize(args["dir"] + "/" + r["path"])] for r in args["records"]}))
`, { dir: finDir, records });
    expect(records.length).toBeGreaterThan(6);
    for (const r of records) expect(found[r.path], r.path).toEqual([r.sha256, r.size]);
  });

  it('Newton\'s second law with Hooke springs, axial damping, gravity and the recorded handle forces holds at every step of the float64 chain', () => {
    const result = runReferencePython<{ episodes: number; worstForce: number; scale: number; worstPosition: number }>(`
import json, sys
import numpy as np
args = json.load(sys.stdin)
manifest = json.load(open(args["dir"] + "/manifest.json"))
worst_force, scale, worst_position, episodes = 0.0, 0.0, 0.0, 0
for e in manifest["episodes"]:
    if e["status"] != "ok":
        continue
    episodes += 1
    a = np.load(args["dir"] + "/episodes/" + e["id"] + ".npz")
    x, v, u = a["positions"], a["velocities"], a["controls"]
    dt = float(a["time"][1] - a["time"][0])
    m, pinned = a["node_features"][:, 0], a["node_features"][:, 1] > 0
    i, j = a["edges"][:, 0], a["edges"][:, 1]
    k, c, rest = a["edge_stiffness"], a["edge_damping"], a["edge_rest_length"]
    g = np.array([e["labels"]["/world/gravityMPerS2/%d" % n] for n in range(3)])
    free = ~pinned
    for t in range(len(u)):
        d = x[t, j] - x[t, i]
        length = np.linalg.norm(d, axis=1)
        n = d / length[:, None]
        dv = np.einsum("ij,ij->i", v[t, j] - v[t, i], n)
        f = (k * (length - rest) + c * dv)[:, None] * n
        force = m[:, None] * g
        np.add.at(force, i, f)
        np.add.at(force, j, -f)
        # The one handle is the node flagged as such; each channel pushes it along the axis its name ends with.
        handle = int(np.flatnonzero(a["node_features"][:, 3] > 0)[0])
        for ch in e["controlChannels"]:
            force[handle, "xyz".index(ch["name"][-1])] += u[t, ch["index"]]
        ma = m[:, None] * (v[t + 1] - v[t]) / dt
        worst_force = max(worst_force, float(np.abs(ma[free] - force[free]).max()))
        scale = max(scale, float(np.abs(force[free]).max()))
        worst_position = max(worst_position, float(np.abs(x[t + 1][free] - x[t][free] - dt * v[t + 1][free]).max()))
print(json.dumps({"episodes": episodes, "worstForce": worst_force, "scale": scale, "worstPosition": worst_position}))
`, { dir: newtonDir });
    expect(result.episodes).toBe(3);
    expect(result.scale).toBeGreaterThan(0.1);
    // Rounding only: the same sums in another order.
    expect(result.worstForce).toBeLessThan(1e-9 * result.scale);
    expect(result.worstPosition).toBeLessThan(1e-12);
  });

  it('stores stiffness k = EA/ℓ (bending k·ratio over 2ℓ) and damping c = 2ζ√(kμ) as the labels say', () => {
    const result = runReferencePython<{ springs: number; worst: number }>(`
import json, sys
import numpy as np
args = json.load(sys.stdin)
manifest = json.load(open(args["dir"] + "/manifest.json"))
worst, springs = 0.0, 0
for e in manifest["episodes"]:
    L = e["labels"]
    a = np.load(args["dir"] + "/episodes/" + e["id"] + ".npz")
    parts = L["/system/partCount"]
    seg = L["/system/lengthM"] / parts
    k_axial = L["/system/axialStiffnessN"] / seg
    m = a["node_features"][:, 0]
    for (i, j), rel, k, c, rest in zip(a["edges"], a["edge_relation"], a["edge_stiffness"], a["edge_damping"], a["edge_rest_length"]):
        springs += 1
        k_expected = k_axial if rel == 0 else k_axial * L["/system/secondNeighbourSpringRatio"]
        rest_expected = seg * (j - i)
        mu = m[i] * m[j] / (m[i] + m[j])
        c_expected = 2 * L["/system/dampingRatio"] * np.sqrt(k_expected * mu)
        worst = max(worst, abs(k / k_expected - 1), abs(c / c_expected - 1), abs(rest / rest_expected - 1))
    total = m.sum()
    worst = max(worst, abs(total / L["/system/totalMassKg"] - 1))
print(json.dumps({"springs": springs, "worst": worst}))
`, { dir: newtonDir });
    expect(result.springs).toBeGreaterThan(20);
    expect(result.worst).toBeLessThan(1e-12);
  });

  it("the card's histogram counts equal numpy.histogram over the labels", () => {
    const card = readFileSync(join(finDir, 'CARD.md'), 'utf8');
    const section = card.split('### `/system/cellSizeM` (m)')[1].split('```text\n')[1].split('```')[0];
    const counts = section.trim().split('\n').map((line) => Number(line.split('│').pop()));
    const values = finManifest.episodes.map((e) => e.labels['/system/cellSizeM'] as number);
    const reference = runReferencePython<number[]>(`
import json, sys
import numpy as np
v = json.load(sys.stdin)
print(json.dumps(np.histogram(v, bins=8, range=(min(v), max(v)))[0].tolist()))
`, values);
    expect(counts).toEqual(reference);
  });

  it('CARD.md carries the hardware-safety caution and its Python snippets run against the folder', () => {
    const card = readFileSync(join(finDir, 'CARD.md'), 'utf8');
    expect(card).toContain('Simulated data does not replace hardware testing');
    expect(card).toContain('conservative limits');
    expect(card).toContain("the lab's own safety rules");
    // The Pliant loader's snippet needs pliant_data.py on the path: test/dataset-python-loader.test.ts runs it.
    const snippets = [...card.matchAll(/```python\n([\s\S]*?)```/g)].map((m) => m[1]).filter((s) => !s.includes('import pliant_data'));
    expect(snippets.length).toBe(2);
    const firstOk = finManifest.episodes.find((e) => e.status === 'ok')!;
    for (const snippet of snippets) {
      const run = spawnSync(REFERENCE_PYTHON, ['-c', snippet], { cwd: finDir, encoding: 'utf8' });
      expect(run.stderr).toBe('');
      expect(run.status).toBe(0);
      expect(run.stdout).toMatch(/ep-\d{6}/);
    }
    expect(spawnSync(REFERENCE_PYTHON, ['-c', snippets[0]], { cwd: finDir, encoding: 'utf8' }).stdout).toContain(`${firstOk.id} ${firstOk.split} (201, `);
  });
});

describe('manifest against its JSON Schema (ajv, draft 2020-12)', () => {
  it('accepts the written manifests and refuses broken copies', () => {
    const validate = new Ajv2020({ strict: false }).compile(MANIFEST_SCHEMA);
    expect(validate(finManifest), JSON.stringify(validate.errors)).toBe(true);
    expect(validate(newtonManifest), JSON.stringify(validate.errors)).toBe(true);
    const broken = (edit: (m: any) => void): boolean => {
      const copy = structuredClone(finManifest) as any;
      edit(copy);
      return validate(copy) as boolean;
    };
    expect(broken((m) => delete m.episodes[0].status)).toBe(false);
    expect(broken((m) => (m.files[0].sha256 = 'not-a-digest'))).toBe(false);
    expect(broken((m) => (m.episodes[0].files = []))).toBe(false);
    expect(broken((m) => (m.files[0].path = '../outside.npz'))).toBe(false);
    expect(broken((m) => (m.run = 'yesterday'))).toBe(false);
  });
});
