// `pliant score` end to end on a small generated tether dataset, every metric of score.json
// recomputed in Debian's NumPy (/usr/bin/python3, numpy.load on the same NPZ files) from the
// formulas of sim/identify/score/SCORING.md: per-node Euclidean RMSE, the RMS radius at t = 0,
// valid prediction time (after Vlachas et al., Neural Networks 2020, from memory), the energy
// drift (kinetic ½mv², gravitational −m·g·x, elastic ½k(|Δx| − L0)², textbook mechanics),
// percentiles with numpy.percentile's default (Hyndman & Fan 1996, definition 7), parameter bin
// counts with numpy.histogram. Two predictions: persistence (every row the initial state,
// written with Pliant's NPZ writer) and the truth plus Gaussian noise whose spread grows with
// the horizon (written by numpy.savez_compressed, float32, velocities for some episodes only).
// Also: the same inputs give the same bytes of every output file.
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { scoreProblems } from '../sim/identify/score/score-check.ts';
import type { ScoreDocument } from '../sim/identify/score/score-document.ts';
import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';
import { generateScoreDataset, manifestOf, runPliant, writePersistencePredictions } from './support/score-fixture.ts';

const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-score-'));
let dataset = '';
const persistence = join(work, 'persistence');
const noisy = join(work, 'noisy');

afterAll(() => rmSync(work, { recursive: true, force: true }));

const NOISE_SCRIPT = `
import json, sys, os, numpy as np
req = json.load(sys.stdin)
rng = np.random.default_rng(20260412)
os.makedirs(req['out'], exist_ok=True)
for k, eid in enumerate(req['ids']):
    d = np.load(os.path.join(req['dataset'], 'episodes', eid + '.npz'))
    p = d['positions'].astype(np.float64)
    sigma = 0.001 * (1.0 + np.arange(p.shape[0]))[:, None, None]
    noise = rng.normal(0.0, 1.0, p.shape) * sigma
    noise[0] = 0.0
    arrays = {'positions': (p + noise).astype(np.float32)}
    if k % 2 == 0:
        v = d['velocities'].astype(np.float64)
        vn = rng.normal(0.0, 0.01, v.shape)
        vn[0] = 0.0
        arrays['velocities'] = (v + vn).astype(np.float32)
    np.savez_compressed(os.path.join(req['out'], eid + '.npz'), **arrays)
with open(os.path.join(req['out'], 'predictions.json'), 'w') as f:
    json.dump({'predictionsFormat': 1, 'model': 'noisy-truth', 'description': 'the recorded truth plus growing Gaussian noise'}, f)
print(json.dumps({'ok': True}))
`;

// Recomputes the score from the NPZ files and the manifest, independently of Pliant's code.
const REFERENCE_SCRIPT = `
import json, sys, os, numpy as np
req = json.load(sys.stdin)
m = json.load(open(os.path.join(req['dataset'], 'manifest.json')))
splits = req['splits']
eps = [e for e in m['episodes'] if e['status'] == 'ok' and e['split'] in splits]
# Episodes without a prediction file are left out (pliant score --allow-missing) and listed.
missing = [{'id': e['id'], 'split': e['split']} for e in eps if not os.path.exists(os.path.join(req['predictions'], e['id'] + '.npz'))]
eps = [e for e in eps if os.path.exists(os.path.join(req['predictions'], e['id'] + '.npz'))]
rows, curves = [], {}
for e in eps:
    d = np.load(os.path.join(req['dataset'], e['files'][0]))
    q = np.load(os.path.join(req['predictions'], e['id'] + '.npz'))
    p = d['positions'].astype(np.float64); ph = q['positions'].astype(np.float64)
    t = d['time'].astype(np.float64)
    T = p.shape[0] - 1
    rmse = np.sqrt(np.sum((ph - p) ** 2, axis=(1, 2)) / p.shape[1])
    c = p[0].mean(axis=0)
    ell = np.sqrt(np.mean(np.sum((p[0] - c) ** 2, axis=1)))
    norm = rmse / ell
    over = np.nonzero(norm[1:] > req['threshold'])[0]
    if over.size:
        vpt, reached = t[over[0]] - t[0], True
    else:
        vpt, reached = t[T] - t[0], False
    dt = e['simulation']['recordIntervalS']
    hs = [h['steps'] if h['steps'] is not None else int(round(h['seconds'] / dt)) for h in req['horizons']]
    drift = rel = None
    if 'velocities' in q.files:
        nf = d['node_features'].astype(np.float64)
        mass = np.where((nf[:, 1] != 0) | (nf[:, 2] != 0), 0.0, nf[:, 0])
        g = np.array([e['labels']['/world/gravityMPerS2/%d' % k] for k in range(3)])
        ed = d['edges']; L0 = d['edge_rest_length'].astype(np.float64); k_ = d['edge_stiffness'].astype(np.float64)
        def energy(x, v):
            kin = 0.5 * np.sum(mass[None, :] * np.sum(v ** 2, axis=2), axis=1)
            grav = -np.sum(mass[None, :] * (x @ g), axis=1)
            stretch = np.linalg.norm(x[:, ed[:, 1]] - x[:, ed[:, 0]], axis=2) - L0[None, :]
            return kin + grav + 0.5 * np.sum(k_[None, :] * stretch ** 2, axis=1)
        E = energy(p, d['velocities'].astype(np.float64)); Eh = energy(ph, q['velocities'].astype(np.float64))
        drift = float((Eh[T] - Eh[0]) - (E[T] - E[0]))
        rel = drift / float(E.max() - E.min()) if E.max() > E.min() else None
    rows.append({'id': e['id'], 'split': e['split'], 'recordedSteps': T, 'nodes': p.shape[1], 'lengthScaleM': float(ell),
                 'oneStepRmseM': float(rmse[1]), 'horizonRmseM': [float(rmse[h]) for h in hs],
                 'meanNormalisedError': float(norm[1:].mean()), 'validPredictionTimeS': float(vpt), 'validPredictionTimeReached': reached,
                 'energyDriftJ': drift, 'relativeEnergyDrift': rel})
    curves.setdefault(e['split'], []).append((rmse, norm))
def stats(v):
    v = np.asarray(v, dtype=np.float64)
    return None if v.size == 0 else {'mean': float(v.mean()), 'median': float(np.percentile(v, 50)), 'p90': float(np.percentile(v, 90))}
def group(rs, cs):
    withE = [r for r in rs if r['energyDriftJ'] is not None]
    return {
        'episodes': len(rs),
        'meanRmseByStepM': np.mean([c[0] for c in cs], axis=0).tolist(),
        'meanNormalisedErrorByStep': np.mean([c[1] for c in cs], axis=0).tolist(),
        'oneStepRmseM': stats([r['oneStepRmseM'] for r in rs]),
        'oneStepNormalisedError': stats([r['oneStepRmseM'] / r['lengthScaleM'] for r in rs]),
        'horizons': [{'rmseM': stats([r['horizonRmseM'][k] for r in rs]), 'normalisedError': stats([r['horizonRmseM'][k] / r['lengthScaleM'] for r in rs])} for k in range(len(req['horizons']))],
        'meanNormalisedError': stats([r['meanNormalisedError'] for r in rs]),
        'validPredictionTimeS': stats([r['validPredictionTimeS'] for r in rs]),
        'validPredictionTimeReachedFraction': float(np.mean([r['validPredictionTimeReached'] for r in rs])),
        'energyDriftJ': stats([r['energyDriftJ'] for r in withE]),
        'relativeEnergyDrift': stats([r['relativeEnergyDrift'] for r in withE if r['relativeEnergyDrift'] is not None]),
        'episodesWithVelocities': len(withE),
    }
summ = {s: group([r for r in rows if r['split'] == s], curves[s]) for s in splits if s in curves}
summ['overall'] = group(rows, [c for s in splits if s in curves for c in curves[s]])
params = []
keys = [k for k, v in eps[0]['labels'].items() if all(isinstance(x['labels'].get(k), (int, float)) and not isinstance(x['labels'].get(k), bool) for x in eps)]
for key in keys:
    vals = np.array([x['labels'][key] for x in eps], dtype=np.float64)
    if vals.min() == vals.max():
        continue
    counts, edges = np.histogram(vals, bins=8, range=(vals.min(), vals.max()))
    idx = np.minimum(np.floor((vals - vals.min()) / (vals.max() - vals.min()) * 8), 7).astype(int)
    err = np.array([r['meanNormalisedError'] for r in rows])
    means = [float(err[idx == b].mean()) if np.any(idx == b) else None for b in range(8)]
    sp = np.array([r['split'] for r in rows])
    per = {s: {'count': [int(np.sum((idx == b) & (sp == s))) for b in range(8)],
               'meanNormalisedError': [float(err[(idx == b) & (sp == s)].mean()) if np.any((idx == b) & (sp == s)) else None for b in range(8)]}
           for s in splits}
    params.append({'label': key, 'count': counts.tolist(), 'edges': edges.tolist(), 'meanNormalisedError': means, 'splits': per})
print(json.dumps({'rows': rows, 'splits': summ, 'params': params, 'missing': missing}))
`;

interface Reference {
  rows: ScoreDocument['episodes'];
  missing: ScoreDocument['predictions']['missing'];
  splits: Record<string, Partial<ScoreDocument['overall']>>;
  params: { label: string; count: number[]; edges: number[]; meanNormalisedError: (number | null)[]; splits: Record<string, { count: number[]; meanNormalisedError: (number | null)[] }> }[];
}

/** Relative 1e-9 (different summation order), absolute 1e-12 for values near 0. */
function expectClose(actual: unknown, expected: unknown, where: string): void {
  if (expected === null || typeof expected === 'boolean' || typeof expected === 'string') {
    expect(actual, where).toEqual(expected);
    return;
  }
  if (typeof expected === 'number') {
    expect(typeof actual, where).toBe('number');
    expect(Math.abs((actual as number) - expected), `${where}: ${actual} vs NumPy ${expected}`).toBeLessThanOrEqual(1e-12 + 1e-9 * Math.abs(expected));
    return;
  }
  if (Array.isArray(expected)) {
    expect(Array.isArray(actual), where).toBe(true);
    expect((actual as unknown[]).length, `${where} length`).toBe(expected.length);
    expected.forEach((e, i) => expectClose((actual as unknown[])[i], e, `${where}[${i}]`));
    return;
  }
  for (const [key, value] of Object.entries(expected as Record<string, unknown>)) expectClose((actual as Record<string, unknown>)[key], value, `${where}.${key}`);
}

function readScore(dir: string): ScoreDocument {
  return JSON.parse(readFileSync(join(dir, 'score.json'), 'utf8')) as ScoreDocument;
}

function compareWithNumPy(score: ScoreDocument, predictions: string): void {
  const reference = runReferencePython<Reference>(REFERENCE_SCRIPT, {
    dataset, predictions, splits: score.settings.splits, horizons: score.settings.horizons, threshold: score.settings.validPredictionTimeThreshold,
  });
  expect(score.predictions.missing).toEqual(reference.missing);
  expect(score.episodes.map((r) => r.id)).toEqual(reference.rows.map((r) => r.id));
  reference.rows.forEach((row, i) => expectClose(score.episodes[i], row, `episode ${row.id}`));
  expect(Object.keys(reference.splits).sort()).toEqual([...score.settings.splits.filter((s) => score.splits[s].episodes > 0), 'overall'].sort());
  for (const [split, summary] of Object.entries(reference.splits)) {
    const { horizons, ...rest } = summary as ScoreDocument['overall'];
    const ours = split === 'overall' ? score.overall : score.splits[split];
    expectClose(ours, rest, `split ${split}`);
    horizons.forEach((h, k) => expectClose(ours.horizons[k], h, `split ${split} horizon ${k}`));
  }
  expect(score.parameters.map((p) => p.label)).toEqual(reference.params.map((p) => p.label));
  reference.params.forEach((p, k) => {
    expect(score.parameters[k].splits.all.count, p.label).toEqual(p.count);
    expectClose(score.parameters[k].edges, p.edges, `${p.label} edges`);
    expectClose(score.parameters[k].splits.all.meanNormalisedError, p.meanNormalisedError, `${p.label} bins`);
    for (const [split, bins] of Object.entries(p.splits)) expectClose(score.parameters[k].splits[split], bins, `${p.label} bins of ${split}`);
  });
}

describe.skipIf(!python.available)('pliant score against NumPy', () => {
  beforeAll(async () => {
    dataset = await generateScoreDataset(work);
    writePersistencePredictions(dataset, persistence);
    const ids = manifestOf(dataset).episodes.filter((e) => e.status === 'ok').map((e) => e.id);
    runReferencePython(NOISE_SCRIPT, { dataset, out: noisy, ids });
  }, 120_000);

  it('the fixture has train, test and held-out episodes (else the gap cannot be checked)', () => {
    const s = manifestOf(dataset).splits;
    expect(s.train.ok).toBeGreaterThan(0);
    expect(s.test.ok).toBeGreaterThan(0);
    expect(s['held-out'].ok).toBeGreaterThan(0);
  });

  it('persistence over every split: each metric equals NumPy on the same files', async () => {
    const out = join(work, 'report-persistence');
    const run = await runPliant(['score', dataset, persistence, '--out', out, '--split', 'train,validation,test,held-out'], work);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const score = readScore(out);
    expect(scoreProblems(score)).toEqual([]);
    expect(score.caution).toBe(SAFETY_CAUTION);
    expect(score.predictions.model).toBe('persistence');
    expect(score.settings.horizons.map((h) => h.steps)).toEqual([10, 30]);
    // Persistence is exact at h = 0 by construction (row 0 is the given state).
    expect(score.overall.meanRmseByStepM[0]).toBe(0);
    compareWithNumPy(score, persistence);
    expect(readFileSync(join(out, 'REPORT.md'), 'utf8')).toContain(SAFETY_CAUTION);
  });

  it('noisy truth on test and held-out, horizons in steps and seconds: equals NumPy, and the gap is held-out against test', async () => {
    const out = join(work, 'report-noisy');
    const run = await runPliant(['score', dataset, noisy, '--out', out, '--split', 'test,held-out', '--horizons', '1,5,0.3s', '--vpt-threshold', '0.05'], work);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const score = readScore(out);
    expect(score.predictions.model).toBe('noisy-truth');
    expect(score.settings.horizons).toEqual([{ horizon: '1', steps: 1, seconds: null }, { horizon: '5', steps: 5, seconds: null }, { horizon: '0.3s', steps: null, seconds: 0.3 }]);
    compareWithNumPy(score, noisy);
    // Some episodes carry velocities, some do not.
    expect(score.episodes.some((r) => r.energyDriftJ === null)).toBe(true);
    expect(score.episodes.some((r) => r.energyDriftJ !== null)).toBe(true);
    // The noise passes 0.05·ℓ within the rollout for at least one episode, so VPT is exercised.
    expect(score.episodes.some((r) => r.validPredictionTimeReached)).toBe(true);
    const [gap] = score.generalisationGap.entries;
    expect(gap.split).toBe('held-out');
    expect(gap.ruleText).toBe('/system/partCount > 5');
    const held = score.splits['held-out'];
    const test = score.splits.test;
    const vpt = gap.metrics.find((m) => m.metric === 'valid prediction time (s)')!;
    expect(vpt.heldOut).toBe(held.validPredictionTimeS!.mean);
    expect(vpt.test).toBe(test.validPredictionTimeS!.mean);
    expect(vpt.difference).toBe(held.validPredictionTimeS!.mean - test.validPredictionTimeS!.mean);
    expect(vpt.ratio).toBe(held.validPredictionTimeS!.mean / test.validPredictionTimeS!.mean);
    const report = readFileSync(join(out, 'REPORT.md'), 'utf8');
    expect(report).toContain('# Score of noisy-truth on korrin-tether-score-check');
    expect(report).toContain('Held out by: /system/partCount > 5');
  });

  it("scores the linear baseline's folder, which leaves out node counts it was not fitted on, with --allow-missing: equals NumPy on the episodes present and lists the others", async () => {
    const fit = await runPliant(['baseline', 'fit', dataset, '--model', 'linear', '--out', join(work, 'linear.json')], work);
    expect(fit.code, fit.stderr).toBe(0);
    const linear = join(work, 'pred-linear');
    const predict = await runPliant(['baseline', 'predict', join(work, 'linear.json'), dataset, '--out', linear, '--skip-unfitted', '--split', 'test,held-out'], work);
    expect(predict.code, predict.stderr).toBe(0);
    // Which episodes the linear model cannot predict, from NumPy's reading of the episode files:
    // those whose node count no train episode has (the operator is fitted per node count).
    const expectedMissing = runReferencePython<{ id: string; split: string }[]>(`
import json, sys, os, numpy as np
req = json.load(sys.stdin)
m = json.load(open(os.path.join(req['dataset'], 'manifest.json')))
nodes = lambda e: np.load(os.path.join(req['dataset'], e['files'][0]))['positions'].shape[1]
ok = [e for e in m['episodes'] if e['status'] == 'ok']
trained = {nodes(e) for e in ok if e['split'] == 'train'}
print(json.dumps([{'id': e['id'], 'split': e['split']} for e in ok if e['split'] in ('test', 'held-out') and nodes(e) not in trained]))`, { dataset });
    expect(expectedMissing.length).toBeGreaterThan(0);

    const refused = await runPliant(['score', dataset, linear, '--out', join(work, 'report-linear-refused')], work);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain(`${expectedMissing.length} of the`);
    expect(refused.stderr).toContain('--allow-missing');

    const out = join(work, 'report-linear');
    const run = await runPliant(['score', dataset, linear, '--out', out, '--allow-missing'], work);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    expect(run.stdout).toContain(`${expectedMissing.length} episode${expectedMissing.length === 1 ? '' : 's'} had no prediction file`);
    const score = readScore(out);
    expect(scoreProblems(score)).toEqual([]);
    expect(score.predictions.model).toBe('linear');
    expect(score.predictions.missing).toEqual(expectedMissing);
    compareWithNumPy(score, linear);
    const report = readFileSync(join(out, 'REPORT.md'), 'utf8');
    expect(report).toContain('### Episodes without a prediction');
    for (const m of expectedMissing) expect(report).toContain(m.id);
    // Every held-out tether is longer than any train tether, so nothing measures the gap, and
    // the report says why rather than showing an empty table.
    if (score.splits['held-out'].episodes === 0) expect(score.generalisationGap.note).toBe('the predictions hold no episode of the held-out splits, so the gap cannot be measured');
  });

  it('gives the same bytes of score.json, REPORT.md and every SVG for the same inputs', async () => {
    const a = join(work, 'same-a');
    const b = join(work, 'same-b');
    for (const out of [a, b]) expect((await runPliant(['score', dataset, noisy, '--out', out], work)).code).toBe(0);
    const files = ['score.json', 'REPORT.md', ...readdirSync(join(a, 'plots')).map((f) => `plots/${f}`)];
    expect(files.filter((f) => f.endsWith('.svg')).length).toBeGreaterThanOrEqual(2);
    expect(readdirSync(join(b, 'plots')).map((f) => `plots/${f}`)).toEqual(files.slice(2));
    for (const f of files) expect(readFileSync(join(b, f)).equals(readFileSync(join(a, f))), f).toBe(true);
  });

  it("writes SVGs that Python's XML parser reads, one line per scored split, and links each from REPORT.md", async () => {
    const out = join(work, 'charts');
    expect((await runPliant(['score', dataset, noisy, '--out', out, '--split', 'test,held-out'], work)).code).toBe(0);
    const svgs = readdirSync(join(out, 'plots')).map((f) => join(out, 'plots', f));
    const parsed = runReferencePython<{ root: string; paths: number }[]>(`
import json, sys, xml.etree.ElementTree as ET
out = []
for path in json.load(sys.stdin):
    root = ET.parse(path).getroot()
    out.append({'root': root.tag, 'paths': len(root.findall('{http://www.w3.org/2000/svg}path'))})
print(json.dumps(out))`, svgs);
    for (const p of parsed) expect(p.root).toBe('{http://www.w3.org/2000/svg}svg');
    const horizon = svgs.findIndex((f) => f.endsWith('error-vs-horizon.svg'));
    expect(parsed[horizon].paths).toBe(2);
    const report = readFileSync(join(out, 'REPORT.md'), 'utf8');
    for (const f of svgs) expect(report).toContain(`](plots/${f.split('/').at(-1)})`);
  });
});
