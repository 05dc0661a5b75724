// The observed arrays of a scenario's `observation` block, checked in Debian's NumPy, SciPy and
// h5py against what was asked for:
// - noise: the residual observed − true (at the decimated, delayed record) of each episode has a
//   mean within 4 standard errors of 0 (|mean| ≤ 4σ/√n) and a sample variance inside the
//   two-sided 1 − 1e-6 interval of (n − 1)s²/σ² ~ χ²(n − 1), the sampling distribution of the
//   variance of normal samples (Rice, Mathematical Statistics and Data Analysis, §6.3; from
//   memory), with the χ² quantiles from scipy.stats.chi2; pooled over all episodes, the
//   standardised residual passes SciPy's Kolmogorov–Smirnov test against N(0, 1) at p > 1e-4;
// - dropouts: the dropped fraction is within 4 binomial standard deviations √(p(1 − p)/n) of
//   the asked probability (normal approximation to the binomial, de Moivre–Laplace; from memory);
// - decimation and latency are exact: observed_time equals time[::k] and, without noise or
//   dropouts, every observed position is bit for bit the true one of record j·k − latency;
// - NaN exactly where observed_mask is 0 (the layout's own rule; LAYOUT.md);
// - the HDF5 groups hold the same observed arrays as the NPZ files (h5py);
// - `pliant reproduce` gives byte-identical files, and without the block the arrays and the
//   ground truth are what they were.
// The thresholds are fixed before looking; the draws are fixed by the seed, so a pass is stable.
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { generateDataset } from '../sim/dataset/write/generate-dataset.ts';
import { observeTrajectory } from '../sim/episode/observe-trajectory.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';
import { checkScenarioText, checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import { ScenarioProblemError } from '../sim/scenario/scenario-problem.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-observe-'));

/** A short piece of the Korrin Bay rover tether, its top dragged about, seen by the tank's marker camera (invented values). */
function tetherScenario(extra: Record<string, unknown>, dtype: 'float32' | 'float64' = 'float64'): Record<string, unknown> {
  return {
    formatVersion: 1,
    name: 'korrin-tether-camera',
    description: 'Korrin Bay test tank: a short piece of the inspection rover\'s tether, tracked by the tank\'s marker camera. Invented numbers for demonstration.',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 6, max: 10 },
      lengthM: 1.2,
      totalMassKg: 0.2,
      axialStiffnessN: 3000,
      secondNeighbourSpringRatio: 0.02,
      dampingRatio: 0.1,
      diameterM: 0.008,
      anchor: 'top-driven',
      originM: [0, 1.5, 0],
      drivenAxes: ['x', 'z'],
    },
    world: { fluid: { densityKgPerM3: 1000, normalDragNsPerM3: 1200, tangentialDragNsPerM3: 200 } },
    controls: { default: { kind: 'band-limited', cutoffHz: 1.5, std: 0.05, componentCount: 8 } },
    time: { recordIntervalS: 0.02, recordedSteps: 240, substeps: 'auto' },
    initialState: { velocityNoiseMPerS: 0.01 },
    episodes: 6,
    seed: 7301,
    export: { format: 'both', dtype },
    ...extra,
  };
}

function checked(value: unknown): Scenario {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

function problemsOf(value: unknown): { pointer: string; message: string }[] {
  const result = checkScenarioValue(value);
  return result.ok ? [] : result.problems;
}

// Noisy, decimated, delayed, with dropouts: the statistics checks.
const NOISY = { markers: { everyNth: 2 }, positionNoiseM: { kind: 'uniform', min: 0.003, max: 0.006 }, frameStride: 3, latencyS: 0.04, dropoutProbability: 0.15 };
// Exact: no noise, no dropouts; rate given in Hz (50 Hz / 4), latency of 5 records, listed nodes.
const EXACT = { markers: { nodes: [0, -1, 3] }, rateHz: 12.5, latencyS: 0.1 };

const noisyDir = join(work, 'noisy');
const exactDir = join(work, 'exact');
const plainDir = join(work, 'plain');

async function generate(scenario: Scenario, outDir: string): Promise<DatasetManifest> {
  const result = await generateDataset({
    scenario,
    inputs: { kind: 'scenario', scenarioDir: work },
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

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

let noisy: DatasetManifest;
let plain: DatasetManifest;

beforeAll(async () => {
  noisy = await generate(checked(tetherScenario({ observation: NOISY })), noisyDir);
  await generate(checked(tetherScenario({ observation: EXACT }, 'float32')), exactDir);
  plain = await generate(checked(tetherScenario({})), plainDir);
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

const OBSERVED = ['observed_time', 'observed_positions', 'observed_mask', 'observed_nodes'];
// The arrays of a chain episode as sim/dataset/LAYOUT.md listed them before observations existed.
// Chains also carry their (possibly empty) hinge and clamp arrays.
const GROUND_TRUTH = ['time', 'positions', 'velocities', 'controls', 'energies', 'node_features', 'edges', 'edge_relation', 'edge_rest_length', 'edge_stiffness', 'edge_damping',
  'hinges', 'hinge_stiffness', 'hinge_damping', 'clamps', 'clamp_direction', 'clamp_stiffness', 'clamp_damping'];

function npzArrays(manifest: DatasetManifest): string[][] {
  return manifest.files.filter((f) => f.kind === 'episode-npz').map((f) => f.arrays.map((a) => a.name));
}

describe('observation block: manifest, card and arrays', () => {
  it('every recorded episode has the ground truth and then the four observed arrays, with the catalogue dtypes and shapes', () => {
    const ok = noisy.episodes.filter((e) => e.status === 'ok');
    expect(ok.length).toBe(6);
    for (const names of npzArrays(noisy)) expect(names).toEqual([...GROUND_TRUTH, ...OBSERVED]);
    for (const file of noisy.files.filter((f) => f.kind === 'episode-npz')) {
      const record = ok.find((e) => file.episodes.includes(e.id))!;
      const n = record.simulation.nodeCount;
      const markers = Math.floor((n - 1) / 2) + 1;
      const frames = Math.floor(240 / 3) + 1;
      const byName = new Map(file.arrays.map((a) => [a.name, a]));
      expect(byName.get('observed_time')).toMatchObject({ dtype: 'float64', shape: [frames], unit: 's' });
      expect(byName.get('observed_positions')).toMatchObject({ dtype: 'float64', shape: [frames, markers, 3], unit: 'm' });
      expect(byName.get('observed_mask')).toMatchObject({ dtype: 'uint8', shape: [frames, markers], unit: '1' });
      expect(byName.get('observed_nodes')).toMatchObject({ dtype: 'int32', shape: [markers], unit: '1' });
    }
    // The HDF5 groups list them too, prefixed by the episode id.
    const h5 = noisy.files.filter((f) => f.kind === 'split-hdf5').flatMap((f) => f.arrays.map((a) => a.name));
    for (const record of ok) for (const name of OBSERVED) expect(h5).toContain(`${record.id}/${name}`);
  });

  it('labels the drawn noise level and dropout probability of each episode under their pointers', () => {
    const sigmas = noisy.episodes.map((e) => e.labels['/observation/positionNoiseM'] as number);
    for (const sigma of sigmas) {
      expect(sigma).toBeGreaterThanOrEqual(0.003);
      expect(sigma).toBeLessThan(0.006);
    }
    expect(new Set(sigmas).size).toBe(sigmas.length);
    for (const e of noisy.episodes) expect(e.labels['/observation/dropoutProbability']).toBe(0.15);
  });

  it('the card states the observation settings beside the safety caution', () => {
    const card = readFileSync(join(noisyDir, 'CARD.md'), 'utf8');
    expect(card).toContain(SAFETY_CAUTION);
    expect(card).toContain('## Observations');
    expect(card).toContain('every 2 nodes from node 0 (nodes 0, 2, 4, …)');
    expect(card).toContain('every 3 records');
    expect(card).toContain('Latency: 0.04 s');
    expect(card).toContain('{"kind":"uniform","min":0.003,"max":0.006}');
    expect(card).toContain('probability `0.15`');
    // Labels with their units (from the key names, the project's naming rule).
    expect(card).toContain('| `/observation/dropoutProbability` | 0.15 | 1 |');
    expect(card).toContain('### `/observation/positionNoiseM` (m)');
    for (const name of OBSERVED) expect(card).toContain(`\`${name}\``);
  });

  it('without the block: the arrays the layout listed before, no observation labels, no observation section', () => {
    for (const names of npzArrays(plain)) expect(names).toEqual(GROUND_TRUTH);
    for (const e of plain.episodes) expect(Object.keys(e.labels).some((k) => k.startsWith('/observation'))).toBe(false);
    expect(readFileSync(join(plainDir, 'CARD.md'), 'utf8')).not.toContain('observed_');
  });

  it('adding the block changes no ground-truth draw: same labels otherwise, same splits, same simulation', () => {
    expect(noisy.episodes.length).toBe(plain.episodes.length);
    noisy.episodes.forEach((e, i) => {
      const p = plain.episodes[i];
      const labels = Object.fromEntries(Object.entries(e.labels).filter(([k]) => !k.startsWith('/observation/')));
      expect(labels).toEqual(p.labels);
      expect(e.split).toBe(p.split);
      expect(e.simulation).toEqual(p.simulation);
    });
  });
});

describe('observation block: scenario checks', () => {
  const base = (observation: Record<string, unknown>) => tetherScenario({ observation });

  it('accepts a rate that divides the record rate, also one not exact in binary (50 Hz / 3)', () => {
    expect(problemsOf(base({ rateHz: 25 }))).toEqual([]);
    expect(problemsOf(base({ rateHz: 50 / 3 }))).toEqual([]);
    expect(problemsOf(base({ latencyS: 0.06 }))).toEqual([]);
  });

  it('refuses a rate that does not divide the record rate, naming rates that do (copied, they are accepted)', () => {
    const [problem, ...rest] = problemsOf(base({ rateHz: 30 }));
    expect(rest).toEqual([]);
    expect(problem.pointer).toBe('/observation/rateHz');
    expect(problem.message).toContain('does not divide the record rate of 50 Hz');
    const suggested = [...problem.message.matchAll(/([\d.]+) Hz \((every [^)]*)\)/g)].map((m) => Number(m[1]));
    expect(suggested).toEqual([50, 25]);
    const third = problemsOf(base({ rateHz: 20 }))[0].message.match(/or ([\d.]+) Hz/)![1];
    expect(problemsOf(base({ rateHz: Number(third) }))).toEqual([]);
  });

  it('refuses a rate above the record rate, both frameStride and rateHz, and a latency off the record grid or past the end', () => {
    expect(problemsOf(base({ rateHz: 100 }))).toEqual([{ pointer: '/observation/rateHz', message: expect.stringContaining('above the record rate of 50 Hz') }]);
    expect(problemsOf(base({ rateHz: 25, frameStride: 2 }))).toEqual([{ pointer: '/observation/rateHz', message: expect.stringContaining('together with frameStride') }]);
    expect(problemsOf(base({ latencyS: 0.03 }))).toEqual([{ pointer: '/observation/latencyS', message: expect.stringContaining('use 0.02 or 0.04 s') }]);
    expect(problemsOf(base({ latencyS: 10 }))).toEqual([{ pointer: '/observation/latencyS', message: expect.stringContaining('longer than the 240 recorded steps') }]);
  });

  it('refuses a listed marker the shortest chain does not have, at its line and column', () => {
    const text = JSON.stringify(base({ markers: { nodes: [0, 7, -8] } }), null, 2);
    const result = checkScenarioText(text, 'camera.json');
    expect(result.ok).toBe(false);
    if (result.ok) return;
    // partCount 6 to 10: the shortest chain has 7 nodes, 0 to 6 or -1 to -7.
    expect(result.problems.map((p) => p.pointer)).toEqual(['/observation/markers/nodes/1', '/observation/markers/nodes/2']);
    expect(result.problems[0].message).toContain('shortest chain (7 nodes, 0 to 6)');
    const lines = text.split('\n');
    const line = result.problems[0].line!;
    expect(lines[line - 1].trim()).toBe('7,');
    expect(result.problems[1].message).toContain('counts past node 0');
  });

  it('with a fixed part count, -1 and the last index are the same marker and refused as a repeat', () => {
    const fixed = tetherScenario({ observation: { markers: { nodes: [2, 6, -1] } } });
    (fixed.system as Record<string, unknown>).partCount = 6;
    expect(problemsOf(fixed)).toEqual([{ pointer: '/observation/markers/nodes/2', message: expect.stringContaining('the same node as /observation/markers/nodes/1') }]);
  });

  it('a dropout probability of 1 and a negative noise level are refused by the schema', () => {
    expect(problemsOf(base({ dropoutProbability: 1 })).map((p) => p.pointer)).toEqual(['/observation/dropoutProbability']);
    expect(problemsOf(base({ positionNoiseM: -0.01 })).map((p) => p.pointer)).toEqual(['/observation/positionNoiseM']);
  });

  // A fin with two possible bodies: 2 cells in a row (6 nodes) or 2 × 3 cells (12 nodes).
  function finScenario(nodes: number[] | null): Record<string, unknown> {
    return {
      formatVersion: 1,
      name: 'korrin-fin-camera',
      system: {
        kind: 'lattice',
        cellSizeM: 0.02,
        shape: { maps: [[[1, 1]], [[1, 1, 1], [1, 1, 1]]] },
        materials: [{ name: 'skin', youngsModulusPa: 2e4, densityKgPerM3: 1000, dampingRatio: 0.1 }],
        base: 'clamped',
      },
      world: { gravityMPerS2: [0, 0, 0] },
      time: { recordIntervalS: 0.01, recordedSteps: 5 },
      episodes: 24,
      seed: 99,
      ...(nodes === null ? {} : { observation: { markers: { nodes } } }),
    };
  }

  it('a lattice marker beyond the largest body is refused at once; one beyond some bodies, when that episode is built', () => {
    expect(problemsOf(finScenario([12]))).toEqual([{ pointer: '/observation/markers/nodes/0', message: expect.stringContaining('largest body this scenario can build (12 nodes') }]);
    const withMarker = checked(finScenario([0, 8]));
    const without = checked(finScenario(null));
    const outcomes = { built: 0, refused: 0 };
    for (let i = 0; i < 24; i++) {
      const nodeCount = sampleEpisode(without, i).system.model.nodeCount;
      if (nodeCount > 8) {
        expect(Array.from(sampleEpisode(withMarker, i).observation!.markerNodes)).toEqual([0, 8]);
        outcomes.built++;
      } else {
        let thrown: unknown;
        try {
          sampleEpisode(withMarker, i);
        } catch (error) {
          thrown = error;
        }
        expect(thrown).toBeInstanceOf(ScenarioProblemError);
        expect((thrown as ScenarioProblemError).problems).toEqual([{ pointer: '/observation/markers/nodes/1', message: expect.stringContaining(`it has ${nodeCount} nodes`) }]);
        outcomes.refused++;
      }
    }
    expect(outcomes.built).toBeGreaterThan(0);
    expect(outcomes.refused).toBeGreaterThan(0);
  });

  it('the command line stops such a run with the episode, the pointer and the fix, and no stack trace', async () => {
    const path = join(work, 'fin-camera.json');
    writeFileSync(path, JSON.stringify(finScenario([0, 8]), null, 2));
    const outcome = await cli(['generate', path, '--out', join(work, 'fin-camera'), '--workers', '1', '--progress', 'none']);
    expect(outcome.code).toBe(2);
    expect(outcome.stderr).toMatch(/episode \d+ could not be built from the scenario: \/observation\/markers\/nodes\/1: is node 8, which this episode's system does not have/);
    expect(outcome.stderr).toContain('use {"everyNth": k}');
    expect(outcome.stderr).not.toMatch(/\n\s+at /);
  });
});

describe.runIf(python.available)('observed arrays in Debian NumPy, SciPy and h5py', () => {
  it('noise: mean within 4 standard errors of 0 and variance inside the χ² interval for each episode\'s own σ; Gaussian by Kolmogorov–Smirnov', () => {
    const result = runReferencePython<{ episodes: { n: number; sigma: number; meanZ: number; chi2: number; lo: number; hi: number; chi2NoLatency: number }[]; ksP: number; pooled: number }>(`
import json, sys
import numpy as np
from scipy import stats
args = json.load(sys.stdin)
m = json.load(open(args["dir"] + "/manifest.json"))
stride, latency = 3, 2
out, pooled = [], []
for e in m["episodes"]:
    a = np.load(args["dir"] + "/episodes/" + e["id"] + ".npz")
    sigma = e["labels"]["/observation/positionNoiseM"]
    x, op, mask, nodes = a["positions"], a["observed_positions"], a["observed_mask"], a["observed_nodes"]
    def residual(lag):
        res = []
        for j in range(op.shape[0]):
            src = j * stride - lag
            if src < 0 or src >= x.shape[0]:
                continue
            seen = mask[j] == 1
            res.append((op[j] - x[src][nodes])[seen].ravel())
        return np.concatenate(res)
    r = residual(latency)
    n = r.size
    s2 = r.var(ddof=1)
    alpha = 1e-6
    wrong = residual(0)
    out.append({"n": int(n), "sigma": sigma, "meanZ": float(r.mean() / (sigma / np.sqrt(n))),
                "chi2": float((n - 1) * s2 / sigma**2),
                "lo": float(stats.chi2.ppf(alpha / 2, n - 1)), "hi": float(stats.chi2.isf(alpha / 2, n - 1)),
                "chi2NoLatency": float((wrong.size - 1) * wrong.var(ddof=1) / sigma**2)})
    pooled.append(r / sigma)
z = np.concatenate(pooled)
print(json.dumps({"episodes": out, "ksP": float(stats.kstest(z, "norm").pvalue), "pooled": int(z.size)}))
`, { dir: noisyDir });
    expect(result.episodes.length).toBe(6);
    for (const e of result.episodes) {
      // At least 4 markers × 80 delayed frames × 3 coordinates, about 85 % of them seen.
      expect(e.n).toBeGreaterThan(700);
      expect(Math.abs(e.meanZ)).toBeLessThan(4);
      expect(e.chi2).toBeGreaterThan(e.lo);
      expect(e.chi2).toBeLessThan(e.hi);
      // The statistic can fail: compared with the state at the frame's own time (latency ignored,
      // two records off), the residual holds the motion too and lies outside the interval.
      expect(e.chi2NoLatency).toBeGreaterThan(e.hi);
    }
    expect(result.pooled).toBe(result.episodes.reduce((n, e) => n + e.n, 0));
    expect(result.ksP).toBeGreaterThan(1e-4);
  });

  it('dropouts: fraction within 4 binomial standard deviations of 0.15; mask 0 exactly where NaN; unseen before the delayed state exists', () => {
    const result = runReferencePython<{ dropped: number; eligible: number; maskAgrees: boolean; earlyUnseen: boolean; earlyRows: number }>(`
import json, sys
import numpy as np
args = json.load(sys.stdin)
m = json.load(open(args["dir"] + "/manifest.json"))
stride, latency = 3, 2
dropped = eligible = early_rows = 0
mask_agrees = early_unseen = True
for e in m["episodes"]:
    a = np.load(args["dir"] + "/episodes/" + e["id"] + ".npz")
    op, mask = a["observed_positions"], a["observed_mask"]
    nan = np.isnan(op)
    mask_agrees &= bool(np.array_equal(mask == 0, nan.all(axis=2)) and np.array_equal(mask == 1, np.isfinite(op).all(axis=2)))
    mask_agrees &= bool(set(np.unique(mask)) <= {0, 1})
    src = np.arange(op.shape[0]) * stride - latency
    early = src < 0
    early_rows += int(early.sum())
    early_unseen &= bool((mask[early] == 0).all())
    dropped += int((mask[~early] == 0).sum())
    eligible += int(mask[~early].size)
print(json.dumps({"dropped": dropped, "eligible": eligible, "maskAgrees": mask_agrees, "earlyUnseen": early_unseen, "earlyRows": early_rows}))
`, { dir: noisyDir });
    expect(result.maskAgrees).toBe(true);
    // Latency 2 records, stride 3: only frame 0 (record 0) comes before the first state.
    expect(result.earlyRows).toBe(6);
    expect(result.earlyUnseen).toBe(true);
    const p = 0.15;
    const fraction = result.dropped / result.eligible;
    expect(result.eligible).toBeGreaterThan(2000);
    expect(Math.abs(fraction - p)).toBeLessThan(4 * Math.sqrt((p * (1 - p)) / result.eligible));
  });

  it('decimation, markers and latency exact: observed_time is time[::k], nodes as asked, positions bit for bit those of record j·k − latency', () => {
    const result = runReferencePython<{ episodes: { timeExact: boolean; nodes: number[]; nodeCount: number; positionsExact: boolean; earlyNan: boolean; delayMatters: boolean; frames: number }[]; everyNth: boolean[] }>(`
import json, sys
import numpy as np
args = json.load(sys.stdin)
out = []
m = json.load(open(args["exact"] + "/manifest.json"))
stride, latency = 4, 5
for e in m["episodes"]:
    a = np.load(args["exact"] + "/episodes/" + e["id"] + ".npz")
    t, x, ot, op, mask, nodes = a["time"], a["positions"], a["observed_time"], a["observed_positions"], a["observed_mask"], a["observed_nodes"]
    exact, early_nan, matters = True, True, False
    for j in range(op.shape[0]):
        src = j * stride - latency
        if src < 0:
            early_nan &= bool(np.isnan(op[j]).all() and (mask[j] == 0).all())
            continue
        exact &= bool(np.array_equal(op[j].view(np.uint32), x[src][nodes].view(np.uint32)) and (mask[j] == 1).all())
        matters |= not np.array_equal(op[j], x[src + 1][nodes])
    out.append({"timeExact": bool(ot.dtype == t.dtype and np.array_equal(ot.view(np.uint32), t[::stride].view(np.uint32))), "nodes": nodes.tolist(),
                "nodeCount": int(x.shape[1]), "positionsExact": exact, "earlyNan": early_nan, "delayMatters": matters, "frames": int(ot.shape[0])})
every = []
m = json.load(open(args["noisy"] + "/manifest.json"))
for e in m["episodes"]:
    a = np.load(args["noisy"] + "/episodes/" + e["id"] + ".npz")
    every.append(bool(np.array_equal(a["observed_nodes"], np.arange(0, a["positions"].shape[1], 2))) and bool(np.array_equal(a["observed_time"], a["time"][::3])))
print(json.dumps({"episodes": out, "everyNth": every}))
`, { exact: exactDir, noisy: noisyDir });
    expect(result.episodes.length).toBe(6);
    for (const e of result.episodes) {
      expect(e.timeExact).toBe(true);
      // 241 records at 50 Hz seen at 12.5 Hz: records 0, 4, …, 240.
      expect(e.frames).toBe(61);
      expect(e.nodes).toEqual([0, e.nodeCount - 1, 3]);
      expect(e.positionsExact).toBe(true);
      expect(e.earlyNan).toBe(true);
      expect(e.delayMatters).toBe(true);
    }
    expect(result.everyNth).toEqual([true, true, true, true, true, true]);
  });

  it('the HDF5 groups hold the same observed arrays as the NPZ files, with the catalogue units', () => {
    const result = runReferencePython<{ compared: number; wrong: string[] }>(`
import json, sys
import numpy as np
import h5py
args = json.load(sys.stdin)
m = json.load(open(args["dir"] + "/manifest.json"))
compared, wrong = 0, []
units = {"observed_time": "s", "observed_positions": "m", "observed_mask": "1", "observed_nodes": "1"}
for f in m["files"]:
    if f["kind"] != "split-hdf5":
        continue
    with h5py.File(args["dir"] + "/" + f["path"], "r") as h:
        for episode in f["episodes"]:
            a = np.load(args["dir"] + "/episodes/" + episode + ".npz")
            for name, unit in units.items():
                d = h[episode][name]
                u = d.attrs["unit"]
                u = u.decode() if isinstance(u, bytes) else str(u)
                if d.dtype != a[name].dtype or not np.array_equal(d[...], a[name], equal_nan=d.dtype.kind == "f") or u != unit:
                    wrong.append(episode + "/" + name)
                compared += 1
print(json.dumps({"compared": compared, "wrong": wrong}))
`, { dir: noisyDir });
    expect(result.wrong).toEqual([]);
    expect(result.compared).toBe(6 * 4);
  });

  it('ground-truth arrays are identical with and without the block (NumPy array_equal of every member)', () => {
    const result = runReferencePython<{ compared: number; differ: string[] }>(`
import json, sys
import numpy as np
args = json.load(sys.stdin)
m = json.load(open(args["plain"] + "/manifest.json"))
compared, differ = 0, []
for e in m["episodes"]:
    p = np.load(args["plain"] + "/episodes/" + e["id"] + ".npz")
    o = np.load(args["noisy"] + "/episodes/" + e["id"] + ".npz")
    for name in p.files:
        compared += 1
        if p[name].dtype != o[name].dtype or not np.array_equal(p[name], o[name]):
            differ.append(e["id"] + "/" + name)
print(json.dumps({"compared": compared, "differ": differ}))
`, { plain: plainDir, noisy: noisyDir });
    expect(result.differ).toEqual([]);
    expect(result.compared).toBe(6 * GROUND_TRUTH.length);
  });
});

describe('observation block: separate draws (project rule in DEVELOPERS.md "Random streams"; common practice, no source)', () => {
  const steps = 30;
  const nodeCount = 5;
  const source = {
    nodeCount,
    steps,
    timeS: Float64Array.from({ length: steps + 1 }, (_, t) => t * 0.02),
    positionM: Float64Array.from({ length: (steps + 1) * nodeCount * 3 }, (_, i) => Math.sin(i)),
  };
  const settings = (positionNoiseStdM: number, dropoutProbability: number) => ({ markerNodes: Int32Array.from([4, 0, 2]), positionNoiseStdM, frameStride: 2, latencyRecords: 1, dropoutProbability });
  const observe = (noiseStdM: number, p: number) =>
    observeTrajectory(source, settings(noiseStdM, p), new RandomStream(5, 3, StreamPurpose.observation, 0), new RandomStream(5, 3, StreamPurpose.observation, 1));

  it('a different dropout rate leaves the noise of every sample still seen unchanged', () => {
    const all = observe(0.01, 0);
    const some = observe(0.01, 0.4);
    let seen = 0;
    for (let s = 0; s < some.seen.length; s++) {
      if (!some.seen[s]) continue;
      seen++;
      for (let a = 0; a < 3; a++) expect(Object.is(some.positionM[3 * s + a], all.positionM[3 * s + a])).toBe(true);
    }
    expect(seen).toBeGreaterThan(0);
    expect(seen).toBeLessThan(all.seen.reduce((n, v) => n + v, 0));
  });

  it('a different noise level leaves the dropouts unchanged', () => {
    expect(observe(0, 0.4).seen).toEqual(observe(0.05, 0.4).seen);
  });
});

function filesBelow(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' })
    .filter((p) => statSync(join(dir, p)).isFile())
    .map((p) => p.split('\\').join('/'))
    .sort();
}

describe('observation block: reproduction', () => {
  it('pliant reproduce regenerates every file byte for byte, observed arrays included', async () => {
    const again = join(work, 'noisy-again');
    const outcome = await cli(['reproduce', join(noisyDir, 'seed.json'), '--out', again, '--workers', '2']);
    expect(outcome.stderr).toBe('');
    expect(outcome.code).toBe(0);
    expect(outcome.stdout.trim().split('\n').at(-1)).toMatch(/^all \d+ files identical$/);
    const listed = [...noisy.documents, ...noisy.files].map((f) => f.path).sort();
    expect(filesBelow(again).filter((p) => p !== 'manifest.json')).toEqual(listed);
    for (const path of listed) expect(readFileSync(join(again, path)).equals(readFileSync(join(noisyDir, path))), relative(work, join(again, path))).toBe(true);
  });
});
