// The linear baseline (DMDc, Proctor, Brunton & Kutz, SIAM J. Appl. Dyn. Syst. 15(1), 2016)
// against NumPy: on the snapshot matrices of a generated dataset, the operator ml-matrix's SVD
// gives must equal numpy.linalg.lstsq's minimum-norm least-squares solution (same rank rule:
// NumPy's default rcond = max(M, N)·eps, NumPy documentation of lstsq) and the singular values
// numpy.linalg.svd's. The system is linear by construction: a chain with no gravity and no drag
// whose top is driven along the chain's own axis, so every node moves on that axis, spring
// directions stay fixed and Hooke's law with axial damping is linear in the state (a spring
// under a fixed axis is a linear spring: common practice, no source). On such a system the
// one-step prediction of held-back episodes must be exact up to rounding.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { episodesOfSplits, loadTrajectory, openDataset } from '../sim/identify/baselines/dataset-episodes.ts';
import type { EpisodeTrajectory } from '../sim/identify/baselines/episode-trajectory.ts';
import { fitLinearOperator } from '../sim/identify/baselines/linear-fit.ts';
import { linearRollout } from '../sim/identify/baselines/linear-rollout.ts';
import { buildSnapshots } from '../sim/identify/baselines/linear-snapshots.ts';
import type { LinearLayout } from '../sim/identify/baselines/linear-state.ts';
import { rolloutStartOf } from '../sim/identify/baselines/rollout-start.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-linear-baseline-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** A Korrin Bay tether probe hanging straight and shaken along its axis (invented demo values). */
const SCENARIO = {
  formatVersion: 1,
  name: 'korrin-axial-probe',
  description: 'Korrin Bay test tank: a short tether probe shaken along its own axis with gravity off. Invented numbers for demonstration.',
  system: { kind: 'chain', partCount: 4, lengthM: 0.8, totalMassKg: 0.2, axialStiffnessN: 400, secondNeighbourSpringRatio: 0.05, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-driven', originM: [0, 1, 0], directionUnit: [0, -1, 0], drivenAxes: ['y'] },
  world: { gravityMPerS2: [0, 0, 0] },
  controls: { default: { kind: 'band-limited', cutoffHz: 4, std: 0.001, componentCount: 12 } },
  time: { recordIntervalS: 0.005, recordedSteps: 160, substeps: 'auto' },
  episodes: 8,
  seed: 314,
  splits: { fractions: { train: 0.75, test: 0.25 } },
  export: { format: 'npz', dtype: 'float64' },
};

const quiet = { stdout: () => {}, stderr: (t: string) => process.stderr.write(t), isTerminal: false, env: {}, cwd: work };
const train: EpisodeTrajectory[] = [];
const held: EpisodeTrajectory[] = [];
const layout: LinearLayout = { nodeCount: 5, channelCount: 1, delays: 0, affine: true, stateForm: 'relative' };

beforeAll(async () => {
  writeFileSync(join(work, 'probe.json'), JSON.stringify(SCENARIO));
  expect(await runCli(['generate', join(work, 'probe.json'), '--out', join(work, 'probe'), '--workers', '1'], quiet)).toBe(0);
  const dataset = await openDataset(join(work, 'probe'));
  for (const record of episodesOfSplits(dataset, ['train'])) train.push(await loadTrajectory(dataset, record));
  for (const record of episodesOfSplits(dataset, ['test'])) held.push(await loadTrajectory(dataset, record));
}, 120_000);

describe.skipIf(!python.available)('linear baseline (DMDc) against numpy.linalg', () => {
  it('has both splits to work with (the checks below are not vacuous)', () => {
    expect(train.length).toBeGreaterThanOrEqual(3);
    expect(held.length).toBeGreaterThanOrEqual(1);
  });

  for (const delays of [0, 2]) {
    it(`fits the operator numpy.linalg.lstsq fits, with the singular values of numpy.linalg.svd (${delays} delays)`, () => {
      const l = { ...layout, delays };
      const snapshots = buildSnapshots(l, train);
      const fit = fitLinearOperator(snapshots, { kind: 'auto' });
      const reference = runReferencePython<{ operator: number[][]; sigma: number[]; rank: number }>(
        [
          'import json, sys, numpy as np',
          'd = json.load(sys.stdin)',
          'omega_t = np.array(d["omega"]).reshape(d["m"], d["p"])',
          'next_t = np.array(d["next"]).reshape(d["m"], d["n"])',
          'g_t, _, rank, sigma = np.linalg.lstsq(omega_t, next_t, rcond=None)',
          'print(json.dumps({"operator": g_t.T.tolist(), "sigma": np.linalg.svd(omega_t, compute_uv=False).tolist(), "rank": int(rank)}))',
        ].join('\n'),
        { omega: Array.from(snapshots.inputsT), next: Array.from(snapshots.nextStatesT), m: snapshots.rows, p: snapshots.snapshotSize, n: snapshots.stateSize },
      );
      expect(fit.rank).toBe(reference.rank);
      expect(fit.rank).toBeGreaterThan(5);
      // Singular values agree to float64 rounding relative to the largest (Golub & Van Loan, §8.6: backward stable SVD).
      for (let i = 0; i < fit.rank; i++) expect(Math.abs(fit.singularValues[i] - reference.sigma[i])).toBeLessThan(1e-10 * reference.sigma[0]);
      // The minimum-norm solution is unique for a given rank; its sensitivity grows with σ₁/σ_r, so compare relative to ‖G‖ with that factor.
      let diff = 0;
      let norm = 0;
      for (let r = 0; r < fit.stateSize; r++) {
        for (let c = 0; c < fit.snapshotSize; c++) {
          diff += (fit.operator[r * fit.snapshotSize + c] - reference.operator[r][c]) ** 2;
          norm += reference.operator[r][c] ** 2;
        }
      }
      const condition = reference.sigma[0] / reference.sigma[fit.rank - 1];
      expect(Math.sqrt(diff / norm)).toBeLessThan(1e-13 * condition);
      expect(Math.sqrt(diff / norm)).toBeLessThan(1e-6);
    });
  }

  it('keeps under "energy:F" the rank NumPy\'s cumulative sum of σ² gives', () => {
    const snapshots = buildSnapshots(layout, train);
    for (const fraction of [0.9, 0.999999]) {
      const fit = fitLinearOperator(snapshots, { kind: 'energy', fraction });
      const reference = runReferencePython<{ rank: number }>(
        [
          'import json, sys, numpy as np',
          'd = json.load(sys.stdin); s = np.linalg.svd(np.array(d["omega"]).reshape(d["m"], d["p"]), compute_uv=False)',
          'e = np.cumsum(s ** 2) / np.sum(s ** 2)',
          'print(json.dumps({"rank": int(np.searchsorted(e, d["f"]) + 1)}))',
        ].join('\n'),
        { omega: Array.from(snapshots.inputsT), m: snapshots.rows, p: snapshots.snapshotSize, f: fraction },
      );
      expect(fit.rank).toBe(reference.rank);
    }
  });

  it('predicts the next state of held-back episodes of the linear system to rounding level', () => {
    const fit = fitLinearOperator(buildSnapshots(layout, train), { kind: 'auto' });
    const snapshots = buildSnapshots(layout, held);
    let worst = 0;
    let scale = 0;
    for (let j = 0; j < snapshots.rows; j++) {
      for (let r = 0; r < fit.stateSize; r++) {
        let predicted = 0;
        for (let c = 0; c < fit.snapshotSize; c++) predicted += fit.operator[r * fit.snapshotSize + c] * snapshots.inputsT[j * fit.snapshotSize + c];
        const actual = snapshots.nextStatesT[j * fit.stateSize + r];
        worst = Math.max(worst, Math.abs(predicted - actual));
        scale = Math.max(scale, Math.abs(actual));
      }
    }
    expect(scale).toBeGreaterThan(1e-5); // the probe does move
    // Rounding level: float64 eps 2.2e-16 times the operator's conditioning of the data, far below any modelling error.
    expect(worst / scale).toBeLessThan(1e-9);
  });

  it('keeps the numerical rank under the "stable" rule on this damped system, with the spectral radius numpy.linalg.eigvals gives', () => {
    // A damped linear oscillator chain dissipates energy, so its exact one-step map has every
    // eigenvalue inside the unit circle (common practice, no source); the driven node's
    // prescribed motion adds eigenvalues at 0.
    const l = { ...layout, delays: 1 };
    const snapshots = buildSnapshots(l, train);
    const auto = fitLinearOperator(snapshots, { kind: 'auto' }, 1);
    const stable = fitLinearOperator(snapshots, { kind: 'stable' }, 1);
    expect(stable.rank).toBe(auto.rank);
    const n = stable.stateSize;
    const p = stable.snapshotSize;
    const reference = runReferencePython<{ radius: number }>(
      [
        'import json, sys, numpy as np',
        'd = json.load(sys.stdin); n = d["n"]; g = np.array(d["g"]).reshape(n, d["p"])',
        'c = np.zeros((2 * n, 2 * n)); c[:n, :] = g[:, :2 * n]; c[n:, :n] = np.eye(n)',
        'print(json.dumps({"radius": float(np.abs(np.linalg.eigvals(c)).max())}))',
      ].join('\n'),
      { g: Array.from(stable.operator), n, p },
    );
    expect(Math.abs(stable.spectralRadius - reference.radius)).toBeLessThan(1e-8);
    expect(reference.radius).toBeLessThan(1);
    expect(reference.radius).toBeGreaterThan(0.5);
  });

  it('rolls out open-loop from the initial state to the recorded trajectory of a held-back episode', () => {
    const fit = fitLinearOperator(buildSnapshots(layout, train), { kind: 'auto' });
    const episode = held[0];
    const size = (episode.steps + 1) * episode.nodeCount * 3;
    const out = { positionM: new Float64Array(size), velocityMPerS: new Float64Array(size) };
    linearRollout(layout, fit.operator, rolloutStartOf(episode), out);
    let worst = 0;
    let travel = 0;
    for (let i = 0; i < size; i++) {
      worst = Math.max(worst, Math.abs(out.positionM[i] - episode.positionM[i]));
      travel = Math.max(travel, Math.abs(episode.positionM[i] - episode.positionM[i % (3 * episode.nodeCount)]));
    }
    expect(travel).toBeGreaterThan(1e-5);
    // A stable linear map iterated 160 times stays within rounding growth (common practice, no source).
    expect(worst / travel).toBeLessThan(1e-7);
  });
});
