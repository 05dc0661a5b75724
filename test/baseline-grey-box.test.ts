// Grey-box identification recovers the parameters a dataset was generated with. With one
// sub-step per record interval and a float64 export, semi-implicit Euler makes
// m·(v(t+Δt) − v(t))/Δt exactly the force at the recorded state (Hairer, Lubich & Wanner,
// Geometric Numerical Integration, §I.1, the symplectic Euler method), so the least-squares
// estimates must equal the true labels to rounding; the tolerance 1e-8 (relative) leaves room
// for float64 rounding amplified by condition numbers near 10 (common practice, no source).
// The solver is checked against numpy.linalg.lstsq on the same design, and its standard errors
// against the ordinary least-squares formula s²·(AᵀA)⁻¹ computed by NumPy (Seber & Lee, Linear
// Regression Analysis, §3.3). With noise added to the recording the errors must grow with the
// noise and stay finite.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { EpisodeRecord } from '../sim/dataset/manifest/dataset-manifest.ts';
import { episodesOfSplits, loadTrajectory, type OpenDataset,openDataset } from '../sim/identify/baselines/dataset-episodes.ts';
import type { EpisodeTrajectory } from '../sim/identify/baselines/episode-trajectory.ts';
import { buildGreyBoxDesign } from '../sim/identify/baselines/grey-box-design.ts';
import { type EpisodeIdentification,identifyEpisode } from '../sim/identify/baselines/grey-box-identify.ts';
import { solveLeastSquares } from '../sim/identify/baselines/grey-box-solve.ts';
import { structureOf } from '../sim/identify/baselines/grey-box-structure.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const work = mkdtempSync(join(tmpdir(), 'pliant-grey-box-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const quiet = { stdout: () => {}, stderr: (t: string) => process.stderr.write(t), isTerminal: false, env: {}, cwd: work };

/** A Korrin Bay tether probe in air, driven at the top (invented demo values). */
const AIR = {
  formatVersion: 1,
  name: 'korrin-probe-air',
  description: 'Korrin Bay test tank: a tether probe swung in air above the tank. Invented numbers for demonstration.',
  system: { kind: 'chain', partCount: 6, lengthM: 1.2, totalMassKg: 0.3, axialStiffnessN: { kind: 'uniform', min: 500, max: 1500 }, secondNeighbourSpringRatio: 0.05, dampingRatio: { kind: 'uniform', min: 0.05, max: 0.2 }, diameterM: 0.008, anchor: 'top-driven', originM: [0, 2, 0], directionUnit: [1, -1, 0], drivenAxes: ['x', 'z'] },
  world: { gravityMPerS2: [0, { kind: 'uniform', min: -10.5, max: -8.5 }, 0], airDragPerS: { kind: 'uniform', min: 0.1, max: 0.5 } },
  // No ramp-in: the noise test below was calibrated on the drive at full strength from t = 0.
  controls: { rampInS: 0, default: { kind: 'band-limited', cutoffHz: 1.5, std: 0.05, componentCount: 8 } },
  time: { recordIntervalS: 0.001, recordedSteps: 400, substeps: 1 },
  initialState: { velocityNoiseMPerS: 0.05 },
  episodes: 3,
  seed: 7,
  export: { format: 'npz', dtype: 'float64' },
};

/** A loose length of tether dropped onto the tank floor (invented demo values). */
const FLOOR = {
  formatVersion: 1,
  name: 'korrin-probe-floor',
  description: 'Korrin Bay test tank: a loose tether length dropped onto the dry tank floor. Invented numbers for demonstration.',
  system: { kind: 'chain', partCount: 5, lengthM: 0.5, totalMassKg: 0.1, axialStiffnessN: 300, secondNeighbourSpringRatio: 0.1, dampingRatio: 0.1, diameterM: 0.008, anchor: 'free', originM: [0, 0.05, 0], directionUnit: [1, 0.3, 0] },
  world: { gravityMPerS2: [0, -9.81, 0], ground: { heightM: 0, staticFriction: 0.6, kineticFriction: 0.4 } },
  time: { recordIntervalS: 0.001, recordedSteps: 400, substeps: 1 },
  initialState: { velocityNoiseMPerS: 0.2 },
  episodes: 2,
  seed: 11,
  splits: { fractions: { train: 1 } },
  export: { format: 'npz', dtype: 'float64' },
};

/** Two cells of a soft fin, the second actuated (invented demo values). */
const FIN_PAIR = {
  formatVersion: 1,
  name: 'korrin-fin-cell-pair',
  description: 'Korrin Bay test tank: two cells of a soft fin, one actuated, in air. Invented numbers for demonstration.',
  system: {
    kind: 'lattice', cellSizeM: 0.02, shape: { maps: [[[1, 2]]] }, originM: [0, 1, 0],
    materials: [
      { name: 'skin', youngsModulusPa: 20000, densityKgPerM3: 1100, dampingRatio: 0.1 },
      { name: 'actuator', youngsModulusPa: 20000, densityKgPerM3: 1100, dampingRatio: 0.1, actuatorChannel: 0, actuationStrainMax: 0.2 },
    ],
  },
  world: { gravityMPerS2: [0, -9.81, 0] },
  controls: { default: { kind: 'sinusoid', amplitude: 1, frequencyHz: 3 } },
  time: { recordIntervalS: 0.0005, recordedSteps: 400, substeps: 1 },
  initialState: { velocityNoiseMPerS: 0.05 },
  episodes: 2,
  seed: 3,
  export: { format: 'npz', dtype: 'float64' },
};

interface Loaded { dataset: OpenDataset; episodes: { trajectory: EpisodeTrajectory; record: EpisodeRecord }[] }
const loaded = new Map<string, Loaded>();

async function generate(name: string, scenario: object | string, extra: string[] = []): Promise<void> {
  const path = typeof scenario === 'string' ? scenario : join(work, `${name}.json`);
  if (typeof scenario !== 'string') writeFileSync(path, JSON.stringify(scenario));
  expect(await runCli(['generate', path, '--out', join(work, name), '--workers', '1', ...extra], quiet)).toBe(0);
  const dataset = await openDataset(join(work, name));
  const records = episodesOfSplits(dataset, Object.keys(dataset.manifest.splits));
  const episodes = [];
  for (const record of records) episodes.push({ trajectory: await loadTrajectory(dataset, record), record });
  loaded.set(name, { dataset, episodes });
}

beforeAll(async () => {
  await generate('air', AIR);
  await generate('floor', FLOOR);
  await generate('fin-pair', FIN_PAIR);
  // The fine-recorded tether the README's identification walk-through uses, cut to 2 episodes.
  await generate('fine', join(ROOT, 'scenarios/identification/korrin-tether-fine.json'), ['--episodes', '2']);
}, 180_000);

function identifyAll(name: string): EpisodeIdentification[] {
  const { dataset, episodes } = loaded.get(name)!;
  return episodes.map(({ trajectory, record }) => identifyEpisode(trajectory, record, dataset.manifest.scenario));
}

function expectRecovered(ids: EpisodeIdentification[], expectedNames: string[]): void {
  expect(ids.length).toBeGreaterThan(0);
  for (const id of ids) {
    expect(id.parameters.map((p) => p.name)).toEqual(expectedNames);
    expect(id.rows).toBeGreaterThan(100);
    for (const p of id.parameters) {
      expect(p.estimate, `${id.episode} ${p.name}`).not.toBeNull();
      expect(p.truth, `${id.episode} ${p.name}`).not.toBeNull();
      if (p.truth === 0) expect(p.absoluteError!, `${id.episode} ${p.name}`).toBeLessThan(1e-8);
      else expect(p.relativeError!, `${id.episode} ${p.name} estimate ${p.estimate} truth ${p.truth}`).toBeLessThan(1e-8);
    }
  }
}

describe('grey-box identification recovers the generating parameters (float64, one sub-step)', () => {
  it('in air: per-relation stiffness and damping, gravity and the air-drag rate', () => {
    expectRecovered(identifyAll('air'), ['stiffness.structural', 'damping.structural', 'stiffness.second-neighbour', 'damping.second-neighbour', 'gravity.x', 'gravity.y', 'gravity.z', 'air-drag']);
  });

  it('in water: with resistive-force drag and buoyancy (the fine-recorded Korrin tether)', () => {
    expectRecovered(identifyAll('fine'), ['stiffness.structural', 'damping.structural', 'stiffness.second-neighbour', 'damping.second-neighbour', 'gravity.x', 'gravity.y', 'gravity.z', 'fluid-normal', 'fluid-tangential']);
  });

  it('on the tank floor: nodes in ground contact are left out and the rest still give the exact values', () => {
    const ids = identifyAll('floor');
    expect(ids.every((id) => id.contactExclusions > 0)).toBe(true); // the chain does land
    expectRecovered(ids, ['stiffness.structural', 'damping.structural', 'stiffness.second-neighbour', 'damping.second-neighbour', 'gravity.x', 'gravity.y', 'gravity.z']);
  });
});

/** Gaussian noise by Box–Muller (Box & Muller, Ann. Math. Statist. 29, 1958) from Pliant's Philox stream. */
function noisy(trajectory: EpisodeTrajectory, sigma: number, seed: number): EpisodeTrajectory {
  const stream = new RandomStream(seed, 0, StreamPurpose.preview);
  const gaussian = (): number => Math.sqrt(-2 * Math.log(1 - stream.nextFloat64())) * Math.cos(2 * Math.PI * stream.nextFloat64());
  const positionM = trajectory.positionM.map((x) => x + sigma * gaussian());
  // Velocity noise of 10·σ per second: a velocity estimate from positions over ~0.1 s.
  const velocityMPerS = trajectory.velocityMPerS.map((v) => v + 10 * sigma * gaussian());
  return { ...trajectory, positionM, velocityMPerS };
}

describe('grey-box identification of an actuated lattice', () => {
  it('leaves out the nodes of the actuated cell and recovers the passive cell\'s springs and gravity exactly', () => {
    const ids = identifyAll('fin-pair');
    for (const id of ids) {
      expect(id.freeNodes).toBe(2); // of 6 nodes, the 4 corners of the actuated cell are left out
      expect(id.excludedNodes).toBe(4);
      for (const p of id.parameters) expect(p.truthRange, p.name).toBeNull(); // the springs it sees are all single-cell ones
    }
    expectRecovered(ids, ['stiffness.cell-edge', 'damping.cell-edge', 'stiffness.face-diagonal', 'damping.face-diagonal', 'gravity.x', 'gravity.y', 'gravity.z']);
  });
});

describe('grey-box identification with noise', () => {
  it('degrades gracefully: errors grow with the noise, stay finite, and stay small for small noise', () => {
    const { dataset, episodes } = loaded.get('air')!;
    const { trajectory, record } = episodes[0];
    const levels = [1e-9, 1e-7, 1e-5];
    const worst = levels.map((sigma) => {
      const id = identifyEpisode(noisy(trajectory, sigma, 99), record, dataset.manifest.scenario);
      for (const p of id.parameters) expect(Number.isFinite(p.estimate!)).toBe(true);
      const errors = id.parameters.filter((p) => p.relativeError !== null).map((p) => p.relativeError!);
      return Math.max(...errors);
    });
    expect(worst[0]).toBeLessThan(1e-3);
    // Smoothly: each 100-fold step in noise raises the worst error by a similar factor (measured
    // 1.1e-7, 1.1e-5, 1.2e-3 when written), never by a jump to nonsense.
    for (let i = 1; i < levels.length; i++) {
      expect(worst[i] / worst[i - 1]).toBeGreaterThan(10);
      expect(worst[i] / worst[i - 1]).toBeLessThan(1000);
    }
    expect(worst[2]).toBeLessThan(0.05);
  });
});

const python = referencePythonAvailability();

describe.skipIf(!python.available)('grey-box least squares against numpy.linalg.lstsq', () => {
  it('gives NumPy\'s estimates and ordinary least-squares standard errors on a noisy design', () => {
    const { dataset, episodes } = loaded.get('air')!;
    const { trajectory, record } = episodes[1];
    const design = buildGreyBoxDesign(noisy(trajectory, 1e-6, 5), structureOf(dataset.manifest.scenario, record));
    const p = design.columns.length;
    const ours = solveLeastSquares(design.matrix, design.target, design.rowCount, p);
    const reference = runReferencePython<{ theta: number[]; se: number[] }>(
      [
        'import json, sys, numpy as np',
        'd = json.load(sys.stdin)',
        'a = np.array(d["a"]).reshape(d["rows"], d["p"]); y = np.array(d["y"])',
        'theta = np.linalg.lstsq(a, y, rcond=None)[0]',
        'r = y - a @ theta; s2 = r @ r / (d["rows"] - d["p"])',
        'se = np.sqrt(s2 * np.diag(np.linalg.inv(a.T @ a)))',
        'print(json.dumps({"theta": theta.tolist(), "se": se.tolist()}))',
      ].join('\n'),
      { a: Array.from(design.matrix), y: Array.from(design.target), rows: design.rowCount, p },
    );
    for (let j = 0; j < p; j++) {
      const scale = Math.max(Math.abs(reference.theta[j]), reference.se[j]);
      expect(Math.abs(ours.estimate[j]! - reference.theta[j])).toBeLessThan(1e-7 * scale);
      expect(Math.abs(ours.standardError[j]! - reference.se[j])).toBeLessThan(1e-6 * reference.se[j]);
    }
  });
});
