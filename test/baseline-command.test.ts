// `pliant baseline fit|predict` end to end on a small Korrin Bay tether dataset: the
// predictions folders follow the predictions contract and NumPy reads them (numpy.load); the
// floors are checked against their formulas computed by NumPy from the episode files
// (persistence x_t = x_0; constant velocity x_t = x_0 + t·Δt·v_0: uniform motion, common
// practice, no source); the files are byte-identical when written twice; and every bad input
// exits with 2 and a message that names the problem, never a stack trace.
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { sha256Hex } from '../sim/dataset/formats/file-digest.ts';
import type { NamedArray } from '../sim/dataset/formats/named-array.ts';
import { decodeNpz, encodeNpz } from '../sim/dataset/formats/npz.ts';
import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const work = mkdtempSync(join(tmpdir(), 'pliant-baseline-cli-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

function tether(name: string, partCount: number, splits: object): object {
  return {
    formatVersion: 1,
    name,
    description: 'Korrin Bay test tank: a short tether dragged by the rover. Invented numbers for demonstration.',
    system: { kind: 'chain', partCount, lengthM: 1, totalMassKg: 0.2, axialStiffnessN: { kind: 'uniform', min: 800, max: 1200 }, secondNeighbourSpringRatio: 0.02, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-driven', drivenAxes: ['x', 'z'] },
    world: { gravityMPerS2: [0, -9.81, 0] },
    controls: { default: { kind: 'band-limited', cutoffHz: 1, std: 0.04, componentCount: 6 } },
    time: { recordIntervalS: 0.02, recordedSteps: 40 },
    episodes: 8,
    seed: 5,
    splits,
    export: { format: 'npz', dtype: 'float32' },
  };
}

interface Run { code: number; out: string; err: string }

async function pliant(...args: string[]): Promise<Run> {
  let out = '';
  let err = '';
  const code = await runCli(args, { stdout: (t) => (out += t), stderr: (t) => (err += t), isTerminal: false, env: {}, cwd: work });
  return { code, out, err };
}

const STACK = /\n\s+at .+:\d+/;

beforeAll(async () => {
  writeFileSync(join(work, 'tether.json'), JSON.stringify(tether('korrin-short-tether', 5, { fractions: { train: 0.5, validation: 0.25, test: 0.25 } })));
  writeFileSync(join(work, 'no-train.json'), JSON.stringify(tether('korrin-tether-no-train', 7, { fractions: { validation: 0.5, test: 0.5 } })));
  for (const name of ['tether', 'no-train']) expect((await pliant('generate', join(work, `${name}.json`), '--out', join(work, name), '--workers', '1')).code).toBe(0);
}, 120_000);

function manifest(dir: string): { episodes: { id: string; split: string; status: string; simulation: { recordIntervalS: number } }[]; files: { path: string; sha256: string; sizeBytes: number }[] } {
  return JSON.parse(readFileSync(join(work, dir, 'manifest.json'), 'utf8'));
}

const python = referencePythonAvailability();

describe('pliant baseline: predictions folders', () => {
  it('fits the linear model and writes one NPZ per ok non-train episode that NumPy reads with the episode\'s shape and initial state', async () => {
    const fit = await pliant('baseline', 'fit', 'tether', '--model', 'linear', '--out', 'linear.json', '--delays', '1');
    expect(fit.code, fit.err).toBe(0);
    const model = JSON.parse(readFileSync(join(work, 'linear.json'), 'utf8'));
    expect(model.dataset).toMatchObject({ name: 'korrin-short-tether', masterSeed: '5' });
    expect(model.fittedOn.episodes.length).toBeGreaterThan(0);
    expect(model.safetyCaution).toBe(SAFETY_CAUTION);
    const predict = await pliant('baseline', 'predict', 'linear.json', 'tether', '--out', 'pred-linear');
    expect(predict.code, predict.err).toBe(0);
    const expected = manifest('tether').episodes.filter((e) => e.status === 'ok' && e.split !== 'train').map((e) => `${e.id}.npz`);
    expect(expected.length).toBeGreaterThan(0);
    expect(readdirSync(join(work, 'pred-linear')).sort()).toEqual([...expected, 'predictions.json'].sort());
    expect(JSON.parse(readFileSync(join(work, 'pred-linear', 'predictions.json'), 'utf8'))).toMatchObject({ predictionsFormat: 1, model: 'linear' });
    if (!python.available) return;
    const checked = runReferencePython<{ id: string; shape: number[]; recorded: number[]; row0: boolean; finite: boolean }[]>(
      [
        'import json, sys, numpy as np',
        'd = json.load(sys.stdin); out = []',
        'for ep in d["ids"]:',
        '    p = np.load(f"{d[\'pred\']}/{ep}.npz"); e = np.load(f"{d[\'data\']}/episodes/{ep}.npz")',
        '    out.append({"id": ep, "shape": list(p["positions"].shape), "recorded": list(e["positions"].shape),',
        '                "row0": bool(np.array_equal(p["positions"][0], e["positions"][0]) and np.array_equal(p["velocities"][0], e["velocities"][0])),',
        '                "finite": bool(np.isfinite(p["positions"]).all() and np.isfinite(p["velocities"]).all())})',
        'print(json.dumps(out))',
      ].join('\n'),
      { ids: expected.map((f) => f.slice(0, -4)), pred: join(work, 'pred-linear'), data: join(work, 'tether') },
    );
    for (const c of checked) {
      expect(c.shape, c.id).toEqual(c.recorded);
      expect(c.row0, c.id).toBe(true);
      expect(c.finite, c.id).toBe(true);
    }
  });

  it.skipIf(!python.available)('writes the persistence and constant-velocity floors NumPy computes from the episode files', async () => {
    for (const model of ['persistence', 'constant-velocity']) {
      const run = await pliant('baseline', 'predict', '--model', model, 'tether', '--out', `pred-${model}`, '--split', 'test,validation');
      expect(run.code, run.err).toBe(0);
    }
    const ids = readdirSync(join(work, 'pred-persistence')).filter((f) => f.endsWith('.npz')).map((f) => f.slice(0, -4));
    const dt = manifest('tether').episodes[0].simulation.recordIntervalS;
    const worst = runReferencePython<{ persistence: number; constantVelocity: number; moved: number }>(
      [
        'import json, sys, numpy as np',
        'd = json.load(sys.stdin); a = b = moved = 0.0',
        'for ep in d["ids"]:',
        '    e = np.load(f"{d[\'data\']}/episodes/{ep}.npz"); x0 = e["positions"][0].astype(np.float64); v0 = e["velocities"][0].astype(np.float64)',
        '    t = np.arange(e["positions"].shape[0])[:, None, None] * d["dt"]',
        '    p = np.load(f"{d[\'work\']}/pred-persistence/{ep}.npz"); c = np.load(f"{d[\'work\']}/pred-constant-velocity/{ep}.npz")',
        '    a = max(a, np.abs(p["positions"] - x0).max(), np.abs(p["velocities"] - v0).max())',
        '    b = max(b, np.abs(c["positions"] - (x0 + t * v0)).max(), np.abs(c["velocities"] - v0).max())',
        '    moved = max(moved, np.abs(e["positions"] - x0).max())',
        'print(json.dumps({"persistence": float(a), "constantVelocity": float(b), "moved": float(moved)}))',
      ].join('\n'),
      { ids, dt, data: join(work, 'tether'), work },
    );
    expect(ids.length).toBeGreaterThan(0);
    expect(worst.moved).toBeGreaterThan(1e-3); // the floors differ from the recording
    expect(worst.persistence).toBe(0);
    expect(worst.constantVelocity).toBeLessThan(1e-12);
  });

  it('records the linear options it was fitted with: absolute state, no constant column, at most 5 singular values', async () => {
    const run = await pliant('baseline', 'fit', 'tether', '--model', 'linear', '--state', 'absolute', '--no-affine', '--rank', '5', '--out', 'models/linear-5.json');
    expect(run.code, run.err).toBe(0);
    expect(run.out).toContain(SAFETY_CAUTION);
    const model = JSON.parse(readFileSync(join(work, 'models/linear-5.json'), 'utf8'));
    expect(model.linear).toMatchObject({ delays: 0, affine: false, stateForm: 'absolute', rankRule: '5' });
    for (const group of model.linear.groups) {
      expect(group.rank).toBe(5);
      expect(group.operator.columns).toBe(6 * group.nodeCount + group.channelCount);
    }
    expect((await pliant('baseline', 'predict', 'models/linear-5.json', 'tether', '--out', 'pred-linear-5')).code).toBe(0);
  });

  it('predicts the same floor from a `fit --model persistence` file as from `predict --model persistence`', async () => {
    expect((await pliant('baseline', 'fit', 'tether', '--model', 'persistence', '--out', 'persistence.json')).code).toBe(0);
    expect((await pliant('baseline', 'predict', 'persistence.json', 'tether', '--out', 'pred-persistence-file')).code).toBe(0);
    expect((await pliant('baseline', 'predict', '--model', 'persistence', 'tether', '--out', 'pred-persistence-direct')).code).toBe(0);
    const names = readdirSync(join(work, 'pred-persistence-direct')).filter((f) => f.endsWith('.npz'));
    expect(names.length).toBeGreaterThan(0);
    for (const name of names) expect(readFileSync(join(work, 'pred-persistence-file', name)).equals(readFileSync(join(work, 'pred-persistence-direct', name))), name).toBe(true);
  });

  it('writes the same bytes when the same model predicts again', async () => {
    expect((await pliant('baseline', 'predict', 'linear.json', 'tether', '--out', 'pred-linear-again')).code).toBe(0);
    for (const name of readdirSync(join(work, 'pred-linear'))) {
      expect(readFileSync(join(work, 'pred-linear-again', name)).equals(readFileSync(join(work, 'pred-linear', name))), name).toBe(true);
    }
  });

  it('fits the grey-box model, writes estimates beside true values and a report with the safety caution, and warns about coarse recording', async () => {
    const run = await pliant('baseline', 'fit', 'tether', '--model', 'grey-box', '--out', 'grey.json');
    expect(run.code, run.err).toBe(0);
    expect(run.err).toMatch(/too coarse/);
    const model = JSON.parse(readFileSync(join(work, 'grey.json'), 'utf8'));
    expect(model.greyBox.episodes[0].parameters.find((p: { name: string }) => p.name === 'gravity.y').truth).toBeCloseTo(-9.81, 12);
    const report = readFileSync(join(work, 'grey.md'), 'utf8');
    expect(report).toContain(SAFETY_CAUTION);
    expect(report).toContain('| stiffness.structural |');
  });
});

/** Rewrites one episode file of a dataset with `edit` applied and patches its checksum in the manifest. */
function tamper(dir: string, split: string, edit: (arrays: NamedArray[]) => NamedArray[], manifestEdit: (m: any) => void = () => {}): string {
  const m = manifest(dir) as any;
  const episode = m.episodes.find((e: { status: string; split: string }) => e.status === 'ok' && e.split === split);
  const file = m.files.find((f: { path: string }) => f.path === `episodes/${episode.id}.npz`);
  const path = join(work, dir, file.path);
  const bytes = encodeNpz(edit(decodeNpz(readFileSync(path), path)));
  writeFileSync(path, bytes);
  file.sha256 = sha256Hex(bytes);
  file.sizeBytes = bytes.length;
  manifestEdit(m);
  writeFileSync(join(work, dir, 'manifest.json'), JSON.stringify(m));
  return episode.id;
}

describe('pliant baseline: bad inputs exit with 2 and a message, never a stack trace', () => {
  const cases: [string, () => Promise<string[]>, RegExp][] = [
    ['unknown model name', async () => ['fit', 'tether', '--model', 'kalman', '--out', 'x.json'], /--model "kalman" is not one of persistence, constant-velocity, linear, grey-box/],
    ['no --model', async () => ['fit', 'tether', '--out', 'x.json'], /--model is required/],
    ['no --out', async () => ['fit', 'tether', '--model', 'linear'], /--out MODEL.json is required/],
    ['a dataset without a train split', async () => ['fit', 'no-train', '--model', 'linear', '--out', 'x.json'], /no-train has no ok episodes in train to fit the linear baseline on \(ok episodes per split: validation \d, test \d, train 0\)/],
    ['a folder that is no dataset', async () => ['fit', '.', '--model', 'linear', '--out', 'x.json'], /is not a finished dataset folder: manifest.json is missing/],
    ['a bad --rank', async () => ['fit', 'tether', '--model', 'linear', '--rank', 'most', '--out', 'x.json'], /--rank "most" is not stable, auto, a whole number/],
    ['--delays for the grey-box model', async () => ['fit', 'tether', '--model', 'grey-box', '--delays', '2', '--out', 'x.json'], /--delays only apply to --model linear/],
    ['an unknown action', async () => ['train', 'tether'], /unknown action "train"; use fit or predict/],
    ['predicting a split the dataset lacks', async () => ['predict', '--model', 'persistence', 'tether', '--split', 'held-out', '--out', 'p'], /has no split "held-out"/],
    ['predicting with a grey-box file', async () => ['predict', 'grey.json', 'tether', '--out', 'p'], /holds estimated parameters, not a predictor/],
    ['--model linear without a fit', async () => ['predict', '--model', 'linear', 'tether', '--out', 'p'], /needs fitting first/],
    ['a linear model without an operator for the episodes\' node count', async () => ['predict', 'linear.json', 'no-train', '--out', 'p'], /no operator for 8 nodes, 2 channels .* cannot predict ep-/],
    ['--skip-unfitted with no episode of a fitted size', async () => ['predict', 'linear.json', 'no-train', '--out', 'p', '--skip-unfitted'], /has an operator for none of the episodes of validation, test/],
    ['--out naming a folder that holds other files (the dataset itself)', async () => ['predict', '--model', 'persistence', 'tether', '--out', 'tether'], /tether already holds files that are not predictions; give --out a new or empty folder/],
    ['a model file that is not JSON', async () => { writeFileSync(join(work, 'broken.json'), '{"baselineModelFormat": 1,'); return ['predict', 'broken.json', 'tether', '--out', 'p']; }, /broken.json: not valid JSON/],
    ['a model file naming an unknown model', async () => {
      const m = JSON.parse(readFileSync(join(work, 'linear.json'), 'utf8'));
      writeFileSync(join(work, 'unknown.json'), JSON.stringify({ ...m, model: 'oracle' }));
      return ['predict', 'unknown.json', 'tether', '--out', 'p'];
    }, /unknown.json is not a baseline model file:\n {2}\/model: must be equal to one of the allowed values/],
    ['a linear operator of the wrong shape', async () => {
      const m = JSON.parse(readFileSync(join(work, 'linear.json'), 'utf8'));
      m.linear.groups[0].operator.data.pop();
      writeFileSync(join(work, 'short.json'), JSON.stringify(m));
      return ['predict', 'short.json', 'tether', '--out', 'p'];
    }, /short.json \(\/linear\/groups\/0\/operator\): holds 36 × 75 with 2699 numbers/],
    ['positions holding NaN', async () => {
      tamper('tether', 'train', (arrays) => arrays.map((a) => (a.name === 'positions' ? { ...a, data: a.data.map((x, i) => (i === 7 ? NaN : x)) } as NamedArray : a)));
      return ['fit', 'tether', '--model', 'linear', '--out', 'x.json', '--split', 'train'];
    }, /episode ep-\d+\): "positions" holds a non-finite value \(NaN\) at flat index 7/],
    ['velocities of the wrong shape', async () => {
      tamper('no-train', 'validation', (arrays) => arrays.map((a) => (a.name === 'velocities' ? { ...a, shape: [a.shape[0], a.shape[1] - 1, 3], data: a.data.slice(0, a.shape[0] * (a.shape[1] - 1) * 3) } as NamedArray : a)), (m) => {
        const e = m.episodes.find((x: { status: string; split: string }) => x.status === 'ok' && x.split === 'validation');
        const f = m.files.find((x: { path: string }) => x.path === `episodes/${e.id}.npz`);
        const v = f.arrays.find((x: { name: string }) => x.name === 'velocities');
        v.shape = [v.shape[0], v.shape[1] - 1, 3];
      });
      return ['fit', 'no-train', '--model', 'linear', '--split', 'validation,test', '--out', 'x.json'];
    }, /"velocities" has shape \[41, 7, 3\], expected \(T\+1, N, 3\) = \[41, 8, 3\]/],
  ];
  for (const [name, args, message] of cases) {
    it(name, async () => {
      const run = await pliant('baseline', ...(await args()));
      expect(run.err).toMatch(message);
      expect(run.code).toBe(2);
      expect(run.err).not.toMatch(STACK);
    });
  }
});
