// The scorer's energy drift counts the bending energy of a chain with bending rigidity: on a
// clamped, pinned-top tether of the Korrin Bay tank (invented demo values) the energy drift of
// the constant-velocity floor equals what NumPy computes from the episode and prediction files
// with the discrete bending energy k·(1 − cos φ) of every hinge and clamp (φ from the dot
// product of the unit segment tangents; discrete elastic rod energy, e.g. Bergou et al., "Discrete
// elastic rods", SIGGRAPH 2008, §4, whose 1 − cos form we use — from memory) added to the
// kinetic, gravitational and Hooke spring terms. Leaving the bending term out moves the
// reference by far more than the tolerance, so the test can tell.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import type { ScoreDocument } from '../sim/identify/score/score-document.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';
import { runPliant } from './support/score-fixture.ts';

const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-score-bending-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const SCENARIO = {
  formatVersion: 1,
  name: 'korrin-stiff-tether-energy',
  description: 'Korrin Bay test tank: a stiff tether clamped at the top. Invented numbers for demonstration.',
  system: {
    kind: 'chain', partCount: 8, lengthM: 1.2, totalMassKg: 0.2, axialStiffnessN: 3000, dampingRatio: 0.05,
    bendingStiffnessNm2: { kind: 'uniform', min: 0.01, max: 0.03 }, bendingDampingRatio: 0.05, clampedEnds: ['top'],
    diameterM: 0.01, anchor: 'top-pinned', directionUnit: [1, 0, 0],
  },
  world: { gravityMPerS2: [0, -9.81, 0] },
  time: { recordIntervalS: 0.01, recordedSteps: 40 },
  episodes: 4,
  seed: 77,
  splits: { fractions: { test: 1 } },
  export: { dtype: 'float64' },
};

const REFERENCE = `
import json, sys, os, numpy as np
r = json.load(sys.stdin)
m = json.load(open(os.path.join(r['dataset'], 'manifest.json')))
def unit(a):
    return a / np.linalg.norm(a, axis=-1, keepdims=True)
out = {}
for e in m['episodes']:
    if e['status'] != 'ok':
        continue
    d = np.load(os.path.join(r['dataset'], 'episodes', e['id'] + '.npz'))
    q = np.load(os.path.join(r['predictions'], e['id'] + '.npz'))
    nf = d['node_features']
    mass = np.where((nf[:, 1] != 0) | (nf[:, 2] != 0), 0.0, nf[:, 0])
    g = np.array([e['labels']['/world/gravityMPerS2/%d' % k] for k in range(3)])
    ed = d['edges']; L0 = d['edge_rest_length']; k = d['edge_stiffness']
    H = d['hinges']; kh = d['hinge_stiffness']; Q = d['clamps']; cd = d['clamp_direction']; kq = d['clamp_stiffness']
    def energy(x, v, bending):
        E = 0.5 * np.sum(mass * np.sum(v ** 2, axis=2), axis=1) - np.sum(mass * (x @ g), axis=1)
        E = E + 0.5 * np.sum(k * (np.linalg.norm(x[:, ed[:, 1]] - x[:, ed[:, 0]], axis=2) - L0) ** 2, axis=1)
        if bending:
            ta = unit(x[:, H[:, 1]] - x[:, H[:, 0]]); tb = unit(x[:, H[:, 2]] - x[:, H[:, 1]])
            E = E + np.sum(kh * (1 - np.sum(ta * tb, axis=2)), axis=1)
            tq = unit(x[:, Q[:, 1]] - x[:, Q[:, 0]])
            E = E + np.sum(kq * (1 - np.sum(tq * cd, axis=2)), axis=1)
        return E
    res = {}
    for bending in (True, False):
        E = energy(d['positions'], d['velocities'], bending); Eh = energy(q['positions'], q['velocities'], bending)
        res['with' if bending else 'without'] = float((Eh[-1] - Eh[0]) - (E[-1] - E[0]))
    res['hinges'] = int(H.shape[0]); res['clamps'] = int(Q.shape[0])
    out[e['id']] = res
print(json.dumps(out))
`;

describe.skipIf(!python.available)('score energy drift with bending rigidity', () => {
  it('equals NumPy with the hinge and clamp energy k·(1 − cos φ) included', async () => {
    writeFileSync(join(work, 'stiff.json'), JSON.stringify(SCENARIO));
    const dataset = join(work, 'stiff');
    const predictions = join(work, 'pred');
    for (const args of [
      ['generate', join(work, 'stiff.json'), '--out', dataset, '--workers', '1', '--progress', 'none'],
      ['baseline', 'predict', '--model', 'constant-velocity', dataset, '--out', predictions],
      ['score', dataset, predictions, '--out', join(work, 'report')],
    ]) {
      const run = await runPliant(args, work);
      expect(run.code, `${args[0]}: ${run.stderr}`).toBe(0);
    }
    const score = JSON.parse(readFileSync(join(work, 'report', 'score.json'), 'utf8')) as ScoreDocument;
    expect(score.settings.energy).toBe('kinetic+elastic+gravitational+bending');
    const reference = runReferencePython<Record<string, { with: number; without: number; hinges: number; clamps: number }>>(REFERENCE, { dataset, predictions });
    expect(score.episodes.length).toBe(4);
    for (const row of score.episodes) {
      const want = reference[row.id];
      expect(want.hinges).toBe(7); // interior nodes of an 8-part chain
      expect(want.clamps).toBe(1);
      // float64 files; the sums differ only in order and in |w|² against 2(1 − cos φ).
      expect(Math.abs(row.energyDriftJ! - want.with), `${row.id}: ${row.energyDriftJ} vs NumPy ${want.with}`).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(want.with)));
      expect(Math.abs(want.with - want.without), `${row.id}: the bending term matters`).toBeGreaterThan(1e-6 * Math.max(1, Math.abs(want.with)));
    }
  });
});
