// The Python loader shipped with Pliant (sim/dataset/card/python/pliant_data.py), checked against
// Debian's NumPy, h5py and PyTorch under /usr/bin/python3 on two generated Korrin Bay datasets:
// a tether sweep whose part count varies (so node counts differ within a split), written as NPZ
// and HDF5, and a fin lattice sweep written as HDF5 only. Each check names its reference:
// numpy.load for episode arrays, h5py for the HDF5 path, NumPy slicing for windows,
// numpy.mean / numpy.std (population, ddof=0) for the statistics and the normalised arrays,
// torch.utils.data.DataLoader for the PyTorch class, and `pliant loader` for the shipped text.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { generateDataset } from '../sim/dataset/write/generate-dataset.ts';
import { checkScenarioText, checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { REFERENCE_PYTHON, referencePythonAvailability, referenceTorchAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const LOADER_DIR = join(ROOT, 'sim', 'dataset', 'card', 'python');
const python = referencePythonAvailability();
const torch = python.available ? referenceTorchAvailability() : python;
const work = mkdtempSync(join(tmpdir(), 'pliant-loader-'));
const tetherDir = join(work, 'tether');
const finDir = join(work, 'fin');
let tetherManifest: DatasetManifest;

/** A demo scenario, shortened so the test stays quick; still checked like a file. */
function shortDemo(file: string, episodes: number, format: 'npz' | 'hdf5' | 'both', recordedSteps: number): Scenario {
  const parsed = checkScenarioText(readFileSync(join(ROOT, 'scenarios', file), 'utf8'), file);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.problems));
  const value = JSON.parse(JSON.stringify(parsed.scenario)) as Record<string, any>;
  value.episodes = episodes;
  value.export = { ...value.export, format };
  value.time = { ...value.time, recordedSteps };
  const checked = checkScenarioValue(value);
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return checked.scenario;
}

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

/** Python with the shipped loader importable, reading {"dir": ...} from stdin. */
function py<T>(body: string, input: Record<string, unknown>): T {
  return runReferencePython<T>(`
import json, sys
sys.path.insert(0, ${JSON.stringify(LOADER_DIR)})
import numpy as np
args = json.load(sys.stdin)
${body}
`, input);
}

beforeAll(async () => {
  if (!python.available) return;
  // Korrin Bay tether: part count 8 to 24, so the train split mixes node counts.
  tetherManifest = await generate(shortDemo('korrin-tether.json', 10, 'both', 40), tetherDir);
  await generate(shortDemo('korrin-fin.json', 4, 'hdf5', 30), finDir);
}, 600_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe.runIf(python.available)('pliant_data.py against NumPy and h5py', () => {
  it('the tether sweep really has different node counts within train (else padding is not exercised)', () => {
    const train = tetherManifest.episodes.filter((e) => e.status === 'ok' && e.split === 'train');
    const counts = new Set(train.map((e) => e.simulation.nodeCount));
    expect(train.length).toBeGreaterThanOrEqual(3);
    expect(counts.size).toBeGreaterThanOrEqual(2);
  });

  it('lists the ok episodes of each split as the manifest read with json does, and leaves out rejected ones', () => {
    // Reference: the manifest parsed by Python's json module, filtered by hand. The rejected
    // case uses a copy of the folder whose manifest marks one episode rejected and lacks its file.
    const result = py<{ mismatches: string[]; splits: number; rejectedListed: boolean; rejectedLoad: string }>(`
import os, shutil, pliant_data
manifest = json.load(open(args["dir"] + "/manifest.json"))
ds = pliant_data.PliantDataset(args["dir"])
mismatches = []
splits = sorted({e["split"] for e in manifest["episodes"]})
for split in splits:
    want = [e["id"] for e in manifest["episodes"] if e["status"] == "ok" and e["split"] == split]
    got = [e["id"] for e in ds.episodes(split)]
    if got != want: mismatches.append(f"{split}: {got} != {want}")
copy = args["dir"] + "-rejected"
shutil.copytree(args["dir"], copy)
m = json.load(open(copy + "/manifest.json"))
victim = next(e for e in m["episodes"] if e["split"] == "train")
victim["status"], victim["files"] = "rejected", []
os.remove(copy + "/episodes/" + victim["id"] + ".npz")
json.dump(m, open(copy + "/manifest.json", "w"))
rds = pliant_data.PliantDataset(copy)
listed = victim["id"] in [e["id"] for e in rds.episodes("train")] + [w["episode_id"] for w in rds.windows("train", 5, 5, 5)]
try:
    rds.load_episode(victim["id"]); message = "loaded"
except pliant_data.PliantDataError as error:
    message = str(error)
print(json.dumps({"mismatches": mismatches, "splits": len(splits), "rejectedListed": listed, "rejectedLoad": message}))
`, { dir: tetherDir });
    expect(result.mismatches).toEqual([]);
    expect(result.splits).toBeGreaterThanOrEqual(3);
    expect(result.rejectedListed).toBe(false);
    expect(result.rejectedLoad).toContain('lists no ok episode');
  });

  it('loads every array of every episode exactly as numpy.load of its NPZ file', () => {
    const result = py<{ compared: number; wrong: string[] }>(`
import pliant_data
ds = pliant_data.PliantDataset(args["dir"])
compared, wrong = 0, []
for record in ds.episodes():
    got = ds.load_episode(record["id"])
    with np.load(args["dir"] + "/episodes/" + record["id"] + ".npz") as ref:
        if sorted(got) != sorted(ref.files): wrong.append(f'{record["id"]}: names {sorted(got)} != {sorted(ref.files)}')
        for name in ref.files:
            compared += 1
            if got[name].dtype != ref[name].dtype or not np.array_equal(got[name], ref[name]): wrong.append(record["id"] + "/" + name)
print(json.dumps({"compared": compared, "wrong": wrong}))
`, { dir: tetherDir });
    expect(result.wrong).toEqual([]);
    expect(result.compared).toBeGreaterThan(10 * 10);
  });

  it('reads the split HDF5 files (h5py) to the same arrays as the NPZ path, and an HDF5-only fin dataset as h5py reads it', () => {
    const result = py<{ tether: number; fin: number; wrong: string[]; finSource: string }>(`
import h5py, pliant_data
wrong, counts = [], {}
ds = pliant_data.PliantDataset(args["tether"])
counts["tether"] = 0
for record in ds.episodes():
    a, b = ds.load_episode(record["id"], "npz"), ds.load_episode(record["id"], "hdf5")
    for name in a:
        counts["tether"] += 1
        if a[name].dtype != b[name].dtype or not np.array_equal(a[name], b[name]): wrong.append("tether " + record["id"] + "/" + name)
fin = pliant_data.PliantDataset(args["fin"])
counts["fin"] = 0
manifest = json.load(open(args["fin"] + "/manifest.json"))
for record in manifest["files"]:
    with h5py.File(args["fin"] + "/" + record["path"], "r") as f:
        for episode_id in record["episodes"]:
            got = fin.load_episode(episode_id)  # no NPZ in the folder: the loader must take HDF5
            for name in f[episode_id].keys():
                counts["fin"] += 1
                ref = f[episode_id][name][...]
                if got[name].dtype != ref.dtype or not np.array_equal(got[name], ref): wrong.append("fin " + episode_id + "/" + name)
try:
    fin.load_episode(fin.episodes()[0]["id"], "npz"); source = "npz loaded"
except pliant_data.PliantDataError as error:
    source = str(error)
ds.close(); fin.close()
print(json.dumps({"tether": counts["tether"], "fin": counts["fin"], "wrong": wrong, "finSource": source}))
`, { tether: tetherDir, fin: finDir });
    expect(result.wrong).toEqual([]);
    expect(result.tether).toBeGreaterThan(100);
    expect(result.fin).toBeGreaterThan(4 * 10);
    expect(result.finSource).toContain('has no NPZ file');
  });

  it('cuts windows equal to NumPy slices of the episode arrays, as many as fit', () => {
    // Reference: plain NumPy slicing of numpy.load's arrays with the documented convention
    // (history states s..s+H-1, future states s+H..s+H+F-1, control rows s..s+H+F-2).
    const result = py<{ windows: number; expected: number; wrong: string[] }>(`
import pliant_data
ds = pliant_data.PliantDataset(args["dir"])
H, F, S = 7, 4, 3
wrong, expected, seen = [], 0, 0
for split in ds.splits():
    got = list(ds.windows(split, history=H, horizon=F, stride=S))
    seen += len(got)
    k = 0
    for record in ds.episodes(split):
        with np.load(args["dir"] + "/episodes/" + record["id"] + ".npz") as a:
            p, v, c, nf = a["positions"], a["velocities"], a["controls"], a["node_features"]
        starts = list(range(0, p.shape[0] - (H + F) + 1, S))
        expected += len(starts)
        for s in starts:
            w = got[k]; k += 1
            ref = {"history_positions": p[s:s+H], "future_positions": p[s+H:s+H+F], "history_velocities": v[s:s+H],
                   "future_velocities": v[s+H:s+H+F], "controls": c[s:s+H+F-1], "node_features": nf}
            if w["episode_id"] != record["id"] or w["start"] != s: wrong.append(f'{record["id"]}@{s}: got {w["episode_id"]}@{w["start"]}')
            for name, value in ref.items():
                if w[name].shape != value.shape or not np.array_equal(w[name], value): wrong.append(f'{record["id"]}@{s} {name}')
print(json.dumps({"windows": seen, "expected": expected, "wrong": wrong}))
`, { dir: tetherDir });
    expect(result.wrong).toEqual([]);
    // 41 states, windows of 11 every 3 records: floor((41 − 11) / 3) + 1 = 11 per episode.
    expect(result.expected).toBe(11 * tetherManifest.episodes.filter((e) => e.status === 'ok').length);
    expect(result.windows).toBe(result.expected);
  });

  it('pads a batch of different node counts with zeros and marks exactly the padded nodes in node_mask', () => {
    const result = py<{ nodeCounts: number[]; nodeMax: number; wrong: string[] }>(`
import pliant_data
ds = pliant_data.PliantDataset(args["dir"])
windows = [next(ds.windows("train", 5, 3, 100).__iter__())]
for record in ds.episodes("train")[1:]:
    windows.append(pliant_data.cut_window(ds.load_episode(record["id"]), record["id"], 2, pliant_data.WindowSpec(5, 3)))
batch = pliant_data.collate_windows(windows)
counts = [w["history_positions"].shape[1] for w in windows]
n_max, wrong = max(counts), []
for i, (w, n) in enumerate(zip(windows, counts)):
    expected_mask = np.arange(n_max) < n   # reference: True for the first n nodes only
    if not np.array_equal(batch["node_mask"][i], expected_mask): wrong.append(f"mask {i}")
    for key in ("history_positions", "future_positions", "history_velocities", "future_velocities"):
        if not np.array_equal(batch[key][i, :, :n], w[key]): wrong.append(f"{key} {i} real part")
        if np.any(batch[key][i, :, n:] != 0): wrong.append(f"{key} {i} padding not zero")
    if not np.array_equal(batch["node_features"][i, :n], w["node_features"]) or np.any(batch["node_features"][i, n:] != 0): wrong.append(f"node_features {i}")
    if not np.array_equal(batch["controls"][i], w["controls"]): wrong.append(f"controls {i}")
if batch["history_positions"].shape != (len(windows), 5, n_max, 3): wrong.append(f'shape {batch["history_positions"].shape}')
if batch["node_mask"].dtype != np.bool_: wrong.append("mask dtype")
print(json.dumps({"nodeCounts": counts, "nodeMax": n_max, "wrong": wrong}))
`, { dir: tetherDir });
    expect(result.wrong).toEqual([]);
    expect(new Set(result.nodeCounts).size).toBeGreaterThanOrEqual(2);
    expect(result.nodeMax).toBe(Math.max(...result.nodeCounts));
  });

  it('the manifest\'s per-split statistics and the loader\'s own pass equal numpy.mean / numpy.std / min / max over the split, and normalised arrays have mean 0 and std 1', () => {
    // Reference: numpy.mean and numpy.std (ddof=0) over every record and node of the split's
    // episodes at once, in float64. The loader gets there in one Welford/Chan pass per episode.
    const result = py<{ statWorst: number; meanWorst: number; stdWorst: number; count: number; refCount: number }>(`
import pliant_data
ds = pliant_data.PliantDataset(args["dir"])
stats = ds.statistics("train")
# The manifest's statistics (Pliant's Chan combination in index order) and the loader's own pass.
assert "train" in ds.manifest["normalisation"]
streamed = ds._stream_statistics("train", None)
raw = {n: [] for n in pliant_data.NORMALISED_ARRAYS}
for record in ds.episodes("train"):
    with np.load(args["dir"] + "/episodes/" + record["id"] + ".npz") as a:
        for n in raw: raw[n].append(a[n].reshape(-1, a[n].shape[-1]).astype(np.float64))
stat_worst = 0.0
for n, blocks in raw.items():
    whole = np.concatenate(blocks)
    ref_mean, ref_std = np.mean(whole, axis=0), np.std(whole, axis=0)
    for st in (stats, streamed):
        stat_worst = max(stat_worst, float(np.max(np.abs(st[n]["mean"] - ref_mean) / ref_std)), float(np.max(np.abs(st[n]["std"] / ref_std - 1))))
    if "min" in stats[n]:
        stat_worst = max(stat_worst, float(np.max(np.abs(np.asarray(stats[n]["min"]) - whole.min(axis=0)))), float(np.max(np.abs(np.asarray(stats[n]["max"]) - whole.max(axis=0)))))
# One window per episode covering every record: history = T+1 states, horizon 0.
T1 = ds.episodes("train")[0]["simulation"]["recordedSteps"] + 1
norm = {n: [] for n in raw}
for w in ds.windows("train", history=T1, horizon=0, normalise=True):
    norm["positions"].append(w["history_positions"].reshape(-1, 3))
    norm["velocities"].append(w["history_velocities"].reshape(-1, 3))
    norm["controls"].append(w["controls"])
mean_worst = std_worst = 0.0
for n, blocks in norm.items():
    whole = np.concatenate(blocks).astype(np.float64)
    mean_worst = max(mean_worst, float(np.max(np.abs(np.mean(whole, axis=0)))))
    std_worst = max(std_worst, float(np.max(np.abs(np.std(whole, axis=0) - 1))))
print(json.dumps({"statWorst": stat_worst, "meanWorst": mean_worst, "stdWorst": std_worst,
                  "count": stats["positions"]["count"], "refCount": int(sum(b.shape[0] for b in raw["positions"]))}))
`, { dir: tetherDir });
    // Both in float64 over the same float32 values: agreement to rounding (1e-9 of a std).
    expect(result.statWorst).toBeLessThan(1e-9);
    // The normalised arrays are rounded to float32 (relative 6e-8), so mean 0 and std 1 hold to 1e-5.
    expect(result.meanWorst).toBeLessThan(1e-5);
    expect(result.stdWorst).toBeLessThan(1e-5);
    expect(result.count).toBe(result.refCount);
  });

  it('uses the statistics a manifest carries under "normalisation" instead of computing them', () => {
    const result = py<{ worst: number; read: number[] }>(`
import shutil, pliant_data
copy = args["dir"] + "-stats"
shutil.copytree(args["dir"], copy)
m = json.load(open(copy + "/manifest.json"))
given = {"positions": {"mean": [1.0, 2.0, 3.0], "std": [0.5, 0.25, 2.0]},
         "velocities": {"mean": [0.0, 0.0, 0.0], "std": [1.0, 1.0, 1.0]},
         "controls": {"mean": [0.1, -0.1], "std": [0.2, 0.4]}}
m[pliant_data.NORMALISATION_KEY] = {"train": given}
json.dump(m, open(copy + "/manifest.json", "w"))
ds = pliant_data.PliantDataset(copy)
w = next(iter(ds.windows("train", 6, 2, 100, normalise=True)))
with np.load(copy + "/episodes/" + w["episode_id"] + ".npz") as a:
    p, c = a["positions"][:6].astype(np.float64), a["controls"][:7].astype(np.float64)
ref_p = (p - np.array(given["positions"]["mean"])) / np.array(given["positions"]["std"])
ref_c = (c - np.array(given["controls"]["mean"])) / np.array(given["controls"]["std"])
worst = max(float(np.max(np.abs(w["history_positions"] - ref_p))), float(np.max(np.abs(w["controls"] - ref_c))))
print(json.dumps({"worst": worst, "read": ds.statistics("train")["positions"]["std"].tolist()}))
`, { dir: tetherDir });
    expect(result.read).toEqual([0.5, 0.25, 2.0]);
    expect(result.worst).toBeLessThan(1e-5); // float32 rounding of values of order 10
  });

  it('needs only NumPy: without h5py and torch it still reads NPZ and says what to install for HDF5', () => {
    const run = spawnSync(REFERENCE_PYTHON, ['-c', `
import sys, json
sys.modules["h5py"] = None; sys.modules["torch"] = None   # make both imports fail
sys.path.insert(0, ${JSON.stringify(LOADER_DIR)})
import pliant_data
ds = pliant_data.PliantDataset(${JSON.stringify(tetherDir)})
first = ds.episodes()[0]["id"]
shape = list(ds.load_episode(first, "npz")["positions"].shape)
try:
    ds.load_episode(first, "hdf5"); message = "loaded"
except pliant_data.PliantDataError as error:
    message = str(error)
print(json.dumps({"shape": shape, "torchClass": hasattr(pliant_data, "PliantWindowDataset"), "message": message}))
`], { encoding: 'utf8' });
    expect(run.stderr).toBe('');
    const result = JSON.parse(run.stdout) as { shape: number[]; torchClass: boolean; message: string };
    expect(result.shape).toEqual([41, tetherManifest.episodes.find((e) => e.status === 'ok')!.simulation.nodeCount, 3]);
    expect(result.torchClass).toBe(false);
    expect(result.message).toContain('python3-h5py');
  });

  it('the card\'s loader snippet runs from inside the dataset folder with the module written by `pliant loader --out`', async () => {
    const moduleDir = join(work, 'training-code');
    let stdout = '';
    const io = { stdout: (t: string) => void (stdout += t), stderr: () => {}, isTerminal: false, env: {}, cwd: work };
    expect(await runCli(['loader', '--out', 'training-code/pliant_data.py'], io)).toBe(1); // folder missing: a message, not a trace
    mkdirSync(moduleDir);
    expect(await runCli(['loader', '--out', 'training-code'], io)).toBe(0);
    const shipped = readFileSync(join(LOADER_DIR, 'pliant_data.py'), 'utf8');
    expect(readFileSync(join(moduleDir, 'pliant_data.py'), 'utf8')).toBe(shipped);
    stdout = '';
    expect(await runCli(['loader'], io)).toBe(0);
    expect(stdout).toBe(shipped);

    const card = readFileSync(join(tetherDir, 'CARD.md'), 'utf8');
    const snippet = [...card.matchAll(/```python\n([\s\S]*?)```/g)].map((m) => m[1]).find((s) => s.includes('import pliant_data'));
    expect(snippet).toBeDefined();
    const run = spawnSync(REFERENCE_PYTHON, ['-c', snippet!], { cwd: tetherDir, encoding: 'utf8', env: { ...process.env, PYTHONPATH: moduleDir } });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const split = tetherManifest.episodes.find((e) => e.status === 'ok')!.split;
    const inSplit = tetherManifest.episodes.filter((e) => e.status === 'ok' && e.split === split);
    // 41 states, windows of 10 + 10 every 10 records: starts 0, 10, 20 per episode.
    expect(run.stdout).toMatch(new RegExp(`^${inSplit[0].id} ${3 * inSplit.length} \\(${Math.min(8, 3 * inSplit.length)}, 10, \\d+, 3\\)`));
  });
});

describe.runIf(torch.available)('pliant_data.py with PyTorch from Debian', () => {
  it('a torch DataLoader over PliantWindowDataset yields every window in batches of the expected shapes and dtypes', () => {
    const result = py<{ batches: { b: number; n: number; shapes: Record<string, number[]>; dtypes: Record<string, string>; nMax: number; ids: string[] }[]; windows: number; expectedWindows: number; numpyAgree: boolean }>(`
import torch, pliant_data
H, F, S = 6, 4, 5
train = pliant_data.PliantWindowDataset(args["dir"], "train", history=H, horizon=F, stride=S, normalise=True)
loader = torch.utils.data.DataLoader(train, batch_size=4, shuffle=False, collate_fn=pliant_data.torch_collate)
nodes = {e["id"]: e["simulation"]["nodeCount"] for e in train.dataset.episodes("train")}
batches, total = [], 0
for batch in loader:
    total += len(batch["episode_id"])
    batches.append({"b": len(batch["episode_id"]), "n": int(batch["history_positions"].shape[2]),
                    "shapes": {k: list(v.shape) for k, v in batch.items() if k != "episode_id"},
                    "dtypes": {k: str(v.dtype) for k, v in batch.items() if k != "episode_id"},
                    "nMax": max(nodes[i] for i in batch["episode_id"]), "ids": batch["episode_id"]})
# The same windows through the NumPy path, normalised alike, must equal the tensors.
reference = list(train.dataset.windows("train", H, F, S, normalise=True))
first = next(iter(loader))
ref_batch = pliant_data.collate_windows(reference[:4])
agree = all(np.array_equal(first[k].numpy(), ref_batch[k]) for k in ("history_positions", "future_velocities", "controls", "node_mask"))
print(json.dumps({"batches": batches, "windows": total, "expectedWindows": len(reference), "numpyAgree": agree}))
`, { dir: tetherDir });
    expect(result.numpyAgree).toBe(true);
    expect(result.windows).toBe(result.expectedWindows);
    // 41 states, windows of 10 every 5 records: starts 0, 5, …, 30, so 7 per train episode.
    const trainOk = tetherManifest.episodes.filter((e) => e.status === 'ok' && e.split === 'train').length;
    expect(result.windows).toBe(7 * trainOk);
    for (const batch of result.batches) {
      const { b, n } = batch;
      expect(batch.n).toBe(batch.nMax);
      expect(batch.shapes).toEqual({
        start: [b], node_mask: [b, n], history_positions: [b, 6, n, 3], history_velocities: [b, 6, n, 3],
        future_positions: [b, 4, n, 3], future_velocities: [b, 4, n, 3], controls: [b, 9, 2], node_features: [b, n, 6],
      });
      expect(batch.dtypes).toEqual({
        start: 'torch.int64', node_mask: 'torch.bool', history_positions: 'torch.float32', history_velocities: 'torch.float32',
        future_positions: 'torch.float32', future_velocities: 'torch.float32', controls: 'torch.float32', node_features: 'torch.float32',
      });
    }
  });
});
