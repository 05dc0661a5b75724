// Normal-mode starts (sim/core/stiffness-matrix.ts, sim/core/normal-modes.ts,
// sim/scenario/mode-start.ts), checked against results from outside the project:
// - beaded string: n equal masses m on a string of tension T, spacing a, fixed at both ends,
//   have transverse ω_k = 2·√(T/(m·a))·sin(kπ/(2(n+1))) and mode shapes sin(j·k·π/(n+1));
//   with springs k the longitudinal ones are 2·√(k/m)·sin(kπ/(2(n+1))) (French, Vibrations and
//   Waves, ch. 5, coupled oscillators; from memory);
// - hanging chain: a uniform heavy chain of length L hanging from a fixed point swings with
//   ω_n = (j_{0,n}/2)·√(g/L), j_{0,n} the zeros of the Bessel function J0 (Daniel Bernoulli
//   1733 and Euler; treated e.g. in Rayleigh, The Theory of Sound, vol. 1; from memory), the
//   zeros from scipy.special.jn_zeros;
// - cantilever: a clamped-free Euler–Bernoulli beam of rigidity EI, mass per length μ and
//   length L bends with ω_n = (β_n·L)²·√(EI/(μ·L⁴)), β_n·L the roots of cos x·cosh x = −1
//   (Timoshenko, Vibration Problems in Engineering; from memory), roots from scipy.optimize.brentq
//   — this checks the bending hinges' and the clamp's differenced stiffness;
// - the eigenvalues of the same mass-weighted matrix from numpy.linalg.eigh (LAPACK);
// - the spring stiffness against central differences of the model's own spring force;
// - an episode started in mode k of an undamped beaded chain oscillates at ω_k (period from
//   the recording's zero crossings) and stays in that mode (projection on the others small).
import { describe, expect, it } from 'vitest';

import type { Model } from '../sim/core/model.ts';
import { freeCoordinates, normalModes, vibrationModes, ZERO_MODE_TOLERANCE } from '../sim/core/normal-modes.ts';
import { SPRING_PART_ELASTIC, writeSpringForcePart } from '../sim/core/spring-force-parts.ts';
import { stiffnessMatrix } from '../sim/core/stiffness-matrix.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import { ScenarioProblemError } from '../sim/scenario/scenario-problem.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import { buildLattice } from '../sim/systems/lattice.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';
import { zeroCrossingPeriodS } from './support/zero-crossing-period.ts';

type Json = Record<string, unknown>;
const python = referencePythonAvailability();

function chain(overrides: Partial<ChainParameters>): Model {
  return buildChain({
    partCount: 13, lengthM: 1.3, totalMassKg: 0.65, axialStiffnessN: 26, secondNeighbourSpringRatio: 0, dampingRatio: 0, diameterM: 0.01,
    anchor: 'both-pinned', originM: [0, 0, 0], directionUnit: [1, 0, 0], forceHandles: [], forceAxes: [], drivenAxes: [], ...overrides,
  }).model;
}

/** 12 free beads of 0.05 kg between fixed ends, springs 260 N/m, stretched by `stretch` so the tension is 260·0.1·stretch N. */
function beadedString(stretch: number): Model {
  const model = chain({});
  for (let j = 0; j <= 13; j++) model.positionM[3 * j] = j * 0.1 * (1 + stretch);
  return model;
}

function checkedScenario(value: Json) {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

const sorted = (values: Iterable<number>): number[] => [...values].sort((a, b) => a - b);

describe('beaded string (French, Vibrations and Waves: ω_k = 2√(T/(m·a))·sin(kπ/(2(n+1))))', () => {
  const n = 12;
  const mKg = 0.05;
  const springNPerM = 260;

  it('eigenvalues over x and y: the 12 longitudinal and 12 transverse ω² of the stretched string, to 1e-10 relative', () => {
    const stretch = 0.02;
    const model = beadedString(stretch);
    expect(model.massKg[1]).toBeCloseTo(mKg, 14);
    const tensionN = springNPerM * 0.1 * stretch;
    const spacingM = 0.1 * (1 + stretch);
    const expected: number[] = [];
    for (let k = 1; k <= n; k++) {
      const s = Math.sin((k * Math.PI) / (2 * (n + 1)));
      expected.push(4 * (springNPerM / mKg) * s * s, 4 * (tensionN / (mKg * spacingM)) * s * s);
    }
    const modes = normalModes(model, freeCoordinates(model, [0, 1]));
    const got = sorted(modes.eigenvalues);
    sorted(expected).forEach((value, i) => expect(Math.abs(got[i] / value - 1)).toBeLessThan(1e-10));
  });

  for (const k of [1, 4, 11]) {
    it(`transverse mode ${k}: shape ∝ sin(j·${k}·π/13) to 1e-10, ω within 1e-10 of 2√(T/(m·a))·sin(${k}π/26)`, () => {
      const model = beadedString(0.05);
      const modes = normalModes(model, freeCoordinates(model, [1]));
      const kept = vibrationModes(modes);
      expect(kept).toHaveLength(n);
      const m = kept[k - 1];
      const shape = modes.shapes.subarray(m * n, (m + 1) * n);
      const exact = Array.from({ length: n }, (_, j) => Math.sin(((j + 1) * k * Math.PI) / (n + 1)));
      const dot = exact.reduce((sum, e, j) => sum + e * shape[j], 0);
      const norm = Math.hypot(...exact) * Math.hypot(...shape);
      expect(1 - Math.abs(dot) / norm).toBeLessThan(1e-10);
      const tensionN = springNPerM * 0.1 * 0.05;
      const omega = 2 * Math.sqrt(tensionN / (mKg * 0.105)) * Math.sin((k * Math.PI) / (2 * (n + 1)));
      expect(Math.abs(Math.sqrt(modes.eigenvalues[m]) / omega - 1)).toBeLessThan(1e-10);
    });
  }

  it('the unstretched string has no sideways stiffness: its 24 sideways modes are zero and skipped, the 12 longitudinal kept', () => {
    const model = beadedString(0);
    const modes = normalModes(model, freeCoordinates(model, [0, 1, 2]));
    expect(vibrationModes(modes)).toHaveLength(n);
    const largest = Math.max(...modes.eigenvalues.map(Math.abs));
    for (let m = 0; m < 2 * n; m++) expect(Math.abs(modes.eigenvalues[m])).toBeLessThanOrEqual(ZERO_MODE_TOLERANCE * largest);
  });
});

describe('stiffness matrix against the model\'s own forces', () => {
  it('spring K of a stretched, bent 3-D chain equals central differences of writeSpringForcePart to 1e-6 relative', () => {
    const model = chain({ partCount: 6, anchor: 'top-pinned', directionUnit: [1, -1, 0.3], secondNeighbourSpringRatio: 0.3 });
    for (let i = 1; i < model.nodeCount; i++) for (let k = 0; k < 3; k++) model.positionM[3 * i + k] *= 1 + 0.03 * Math.sin(3 * i + k);
    const coordinates = freeCoordinates(model, [0, 1, 2]);
    const k = stiffnessMatrix(model, coordinates);
    const n = coordinates.length;
    const plus = new Float64Array(3 * model.nodeCount);
    const minus = new Float64Array(3 * model.nodeCount);
    let largest = 0;
    for (const value of k) largest = Math.max(largest, Math.abs(value));
    const h = 1e-6;
    for (let c = 0; c < n; c++) {
      const original = model.positionM[coordinates[c]];
      model.positionM[coordinates[c]] = original + h;
      writeSpringForcePart(model, SPRING_PART_ELASTIC, plus);
      model.positionM[coordinates[c]] = original - h;
      writeSpringForcePart(model, SPRING_PART_ELASTIC, minus);
      model.positionM[coordinates[c]] = original;
      for (let r = 0; r < n; r++) {
        const difference = -(plus[coordinates[r]] - minus[coordinates[r]]) / (2 * h);
        expect(Math.abs(k[r * n + c] - difference)).toBeLessThan(1e-6 * largest);
      }
    }
  });

  it('a free 3-D block has exactly its 6 rigid-body modes below the zero tolerance', () => {
    const model = buildLattice({
      cellSizeM: 0.02, materialMap: [[[1, 1], [1, 1]], [[1, 1], [1, 0]]],
      materials: [{ name: 'fin-silicone', youngsModulusPa: 2e5, densityKgPerM3: 1100, dampingRatio: 0.2, actuatorChannel: null, actuationStrainMax: 0 }],
      base: 'free', originM: [0, 0, 0],
    }).model;
    const modes = normalModes(model, freeCoordinates(model, [0, 1, 2]));
    expect(modes.coordinates.length - vibrationModes(modes).length).toBe(6);
  });
});

describe.skipIf(!python.available)('against SciPy and NumPy', () => {
  it('hanging chain: ω_n of the lumped chain converge to (j_{0,n}/2)·√(g/L) (j_{0,n} from scipy.special.jn_zeros) as 1/N²', () => {
    const zeros = runReferencePython<number[]>('import json, scipy.special; print(json.dumps(list(scipy.special.jn_zeros(0, 3))))', null);
    expect(zeros[0]).toBeCloseTo(2.4048, 4);
    const g = 9.81;
    const lengthM = 1;
    const errors = [20, 40].map((parts) => {
      // Nearly inextensible (EA = 1e7 N), placed at its exact static equilibrium: spring j
      // stretched by g·(mass below)/k (Hooke and statics; common practice, no source).
      const model = chain({ partCount: parts, lengthM, totalMassKg: 0.5, axialStiffnessN: 1e7, anchor: 'top-pinned', directionUnit: [0, -1, 0] });
      let y = 0;
      for (let j = 0; j < parts; j++) {
        let below = 0;
        for (let i = j + 1; i <= parts; i++) below += model.massKg[i];
        y -= model.restLengthM[j] + (g * below) / model.stiffnessNPerM[j];
        model.positionM[3 * (j + 1) + 1] = y;
      }
      const modes = normalModes(model, freeCoordinates(model, [0, 1]));
      const kept = vibrationModes(modes);
      return zeros.map((zero, i) => Math.sqrt(modes.eigenvalues[kept[i]]) / ((zero / 2) * Math.sqrt(g / lengthM)) - 1);
    });
    // The bound (measured, then fixed here): with 40 parts mode 1 within 0.03 %, mode 2 within
    // 0.3 %, mode 3 within 1.2 % (about 0.03·j³/N²), and every error shrinks by 4 ± 0.5 from 20
    // to 40 parts: the lumped chain is a second-order discretisation of the continuous one.
    const bounds = [3e-4, 3e-3, 1.2e-2];
    errors[1].forEach((error, i) => expect(Math.abs(error)).toBeLessThan(bounds[i]));
    errors[0].forEach((error, i) => expect(Math.abs(error / errors[1][i] - 4)).toBeLessThan(0.5));
  });

  it('cantilever chain (clamped top, EI, no gravity): sideways ω_n converge to the Euler–Bernoulli (β_n·L)²·√(EI/(μL⁴)) as 1/N²', () => {
    const roots = runReferencePython<number[]>(
      'import json, math, scipy.optimize as o; f = lambda x: math.cos(x) * math.cosh(x) + 1; print(json.dumps([o.brentq(f, a, b, xtol=1e-14) for a, b in [(1, 3), (4, 6), (7, 9)]]))',
      null,
    );
    expect(roots[0]).toBeCloseTo(1.8751, 4);
    const eiNm2 = 0.01;
    const massKg = 0.5;
    const errors = [20, 40].map((parts) => {
      const model = chain({ partCount: parts, lengthM: 1, totalMassKg: massKg, axialStiffnessN: 1e5, anchor: 'top-pinned', bendingStiffnessNm2: eiNm2, clampedEnds: ['top'] });
      const modes = normalModes(model, freeCoordinates(model, [1]));
      const kept = vibrationModes(modes);
      expect(kept).toHaveLength(parts);
      return roots.map((root, i) => Math.sqrt(modes.eigenvalues[kept[i]]) / (root * root * Math.sqrt(eiNm2 / massKg)) - 1);
    });
    // Measured, then fixed: with 40 parts within 0.1 %, 0.4 %, 0.8 % for modes 1-3; shrinking
    // by 4 ± 0.5 from 20 to 40 parts (second order).
    [1e-3, 4e-3, 8e-3].forEach((bound, i) => expect(Math.abs(errors[1][i])).toBeLessThan(bound));
    errors[0].forEach((error, i) => expect(Math.abs(error / errors[1][i] - 4)).toBeLessThan(0.5));
  });

  it('eigenvalues of M^(-1/2)·K·M^(-1/2) of a bent chain with bending hinges match numpy.linalg.eigh to 1e-9 of the largest', () => {
    const model = chain({ partCount: 10, anchor: 'top-pinned', directionUnit: [0, -1, 0], axialStiffnessN: 500, bendingStiffnessNm2: 0.01, clampedEnds: ['top'] });
    for (let i = 1; i < model.nodeCount; i++) model.positionM[3 * i] = 0.02 * Math.sin(i);
    const coordinates = freeCoordinates(model, [0, 1, 2]);
    const n = coordinates.length;
    const k = stiffnessMatrix(model, coordinates);
    const weighted: number[][] = [];
    for (let r = 0; r < n; r++) {
      weighted.push([]);
      for (let c = 0; c < n; c++) weighted[r].push(k[r * n + c] / Math.sqrt(model.massKg[Math.floor(coordinates[r] / 3)] * model.massKg[Math.floor(coordinates[c] / 3)]));
    }
    const reference = runReferencePython<number[]>('import json, sys, numpy; a = numpy.array(json.load(sys.stdin)); print(json.dumps(numpy.linalg.eigh(a)[0].tolist()))', weighted);
    const modes = normalModes(model, coordinates);
    const largest = Math.max(...reference.map(Math.abs));
    reference.forEach((value, i) => expect(Math.abs(modes.eigenvalues[i] - value)).toBeLessThan(1e-9 * largest));
    // The bending part is not vacuous: the same chain without EI has other eigenvalues.
    const slack = normalModes(chain({ partCount: 10, anchor: 'top-pinned', directionUnit: [0, -1, 0], axialStiffnessN: 500 }), freeCoordinates(model, [0, 1, 2]));
    expect(Math.abs(slack.eigenvalues[n - 1] - modes.eigenvalues[n - 1]) + Math.abs(slack.eigenvalues[0] - modes.eigenvalues[0])).toBeGreaterThan(1e-3);
  });

  // The 40-part bounds above scaled by (40/24)² for 24 parts, plus 0.1 % for the settling's
  // residue and the tether's stretch under its weight (EA = 20 kN: about 1e-4).
  const TETHER_BOUNDS = [3e-4, 3e-3, 1.2e-2].map((bound) => bound * (40 / 24) ** 2 + 1e-3);

  it('a settled hanging tether started in its modes 1 to 3: the labelled frequencies match the Bessel result within the discretisation bound for 24 parts', () => {
    const zeros = runReferencePython<number[]>('import json, scipy.special; print(json.dumps(list(scipy.special.jn_zeros(0, 3))))', null);
    zeros.forEach((zero, i) => {
      const value = {
        formatVersion: 1, name: 'korrin-tether-mode', episodes: 1, seed: 3, time: { recordIntervalS: 0.02, recordedSteps: 2 },
        system: { kind: 'chain', partCount: 24, lengthM: 1.2, totalMassKg: 0.3, axialStiffnessN: 20000, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-pinned', originM: [0, 2, 0], directionUnit: [0, -1, 0] },
        initialState: { settleS: 6, settleDragPerS: 8, mode: { index: i + 1, amplitudeM: 0.01, axes: ['x', 'y'] } },
      };
      const result = checkScenarioValue(value);
      if (!result.ok) throw new Error(JSON.stringify(result.problems));
      const labels = sampleEpisode(result.scenario, 0).labels;
      const expectedHz = ((zero / 2) * Math.sqrt(9.81 / 1.2)) / (2 * Math.PI);
      const error = (labels['/initialState/mode/frequencyHz'] as number) / expectedHz - 1;
      expect(Math.abs(error)).toBeLessThan(TETHER_BOUNDS[i]);
    });
  });
});

describe('an episode started in a mode stays in it (beaded chain, no gravity, no damping)', () => {
  const n = 12;
  function episodeValue(index: number, amplitudeM: number): Json {
    return {
      formatVersion: 1, name: 'korrin-tether-beads', episodes: 1, seed: 9, time: { recordIntervalS: 0.002, recordedSteps: 1500, substeps: 20 },
      world: { gravityMPerS2: [0, 0, 0] },
      system: { kind: 'chain', partCount: n + 1, lengthM: 1.3, totalMassKg: 0.65, axialStiffnessN: 26, dampingRatio: 0, diameterM: 0.01, anchor: 'both-pinned', originM: [0, 0, 0], directionUnit: [1, 0, 0] },
      initialState: { mode: { index, amplitudeM } },
    };
  }

  for (const k of [1, 3, 7]) {
    it(`mode ${k}: the 24 slack sideways modes are skipped, ω from the label equals 2√(k/m)·sin(${k}π/26), the recorded period is within 0.2 % of it and the other modes stay below 1e-9 of it`, () => {
      const result = checkScenarioValue(episodeValue(k, 2e-3));
      if (!result.ok) throw new Error(JSON.stringify(result.problems));
      const episode = sampleEpisode(result.scenario, 0);
      const omega = 2 * Math.sqrt(260 / 0.05) * Math.sin((k * Math.PI) / (2 * (n + 1)));
      expect(Math.abs((2 * Math.PI * (episode.labels['/initialState/mode/frequencyHz'] as number)) / omega - 1)).toBeLessThan(1e-10);
      expect(episode.labels['/initialState/mode/index']).toBe(k);
      const model = episode.system.model;
      // Largest node displacement is the amplitude; the first bead moves in +x (sign convention).
      let largest = 0;
      for (let j = 1; j <= n; j++) largest = Math.max(largest, Math.abs(model.positionM[3 * j] - 0.1 * j));
      expect(Math.abs(largest / 2e-3 - 1)).toBeLessThan(1e-9);
      expect(model.positionM[3] - 0.1).toBeGreaterThan(0);
      const trajectory = recordTrajectory(model, episode.world, episode.controls, episode.recording);
      const steps = trajectory.steps + 1;
      const modal = (mode: number): Float64Array => {
        const q = new Float64Array(steps);
        for (let t = 0; t < steps; t++) {
          for (let j = 1; j <= n; j++) q[t] += (trajectory.positionM[(t * (n + 2) + j) * 3] - 0.1 * j) * Math.sin((j * mode * Math.PI) / (n + 1));
        }
        return q;
      };
      const own = modal(k);
      const periodS = zeroCrossingPeriodS(own, episode.recording.recordIntervalS);
      expect(Math.abs(periodS / ((2 * Math.PI) / omega) - 1)).toBeLessThan(2e-3);
      const ownPeak = Math.max(...own.map(Math.abs));
      for (let other = 1; other <= n; other++) {
        if (other === k) continue;
        expect(Math.max(...modal(other).map(Math.abs))).toBeLessThan(1e-9 * ownPeak);
      }
      // Nothing moves sideways.
      for (let t = 0; t < steps; t += 50) for (let j = 0; j < n + 2; j++) expect(trajectory.positionM[(t * (n + 2) + j) * 3 + 1]).toBe(0);
    });
  }

  it('randomised index and amplitude: each episode\'s labels and start fit its own draw (frequency of the drawn mode, largest displacement |amplitude|)', () => {
    const value = episodeValue(1, 1e-3);
    (value.initialState as Json).mode = { index: { kind: 'integer', min: 1, max: 5 }, amplitudeM: { kind: 'uniform', min: -2e-3, max: 2e-3 } };
    value.episodes = 6;
    const scenario = checkedScenario(value);
    const indices = new Set<number>();
    for (let e = 0; e < 6; e++) {
      const episode = sampleEpisode(scenario, e);
      const index = episode.labels['/initialState/mode/index'] as number;
      const amplitudeM = episode.labels['/initialState/mode/amplitudeM'] as number;
      indices.add(index);
      const omega = 2 * Math.sqrt(260 / 0.05) * Math.sin((index * Math.PI) / (2 * (n + 1)));
      expect(Math.abs((2 * Math.PI * (episode.labels['/initialState/mode/frequencyHz'] as number)) / omega - 1)).toBeLessThan(1e-10);
      let largest = 0;
      for (let j = 1; j <= n; j++) largest = Math.max(largest, Math.abs(episode.system.model.positionM[3 * j] - 0.1 * j));
      expect(Math.abs(largest / Math.abs(amplitudeM) - 1)).toBeLessThan(1e-9);
      // Sign convention: bead 1 moves with the sign of the amplitude (sin(kπ/13) > 0 for every k).
      expect(Math.sign(episode.system.model.positionM[3] - 0.1)).toBe(Math.sign(amplitudeM));
    }
    expect(indices.size).toBeGreaterThan(1);
  });

  it('a negative amplitude starts the mirror image; index above the vibration modes names /initialState/mode/index at sampling', () => {
    const up = sampleEpisode(checkedScenario(episodeValue(2, 1e-3)), 0).system.model;
    const down = sampleEpisode(checkedScenario(episodeValue(2, -1e-3)), 0).system.model;
    for (let j = 1; j <= n; j++) expect(up.positionM[3 * j] - 0.1 * j).toBeCloseTo(-(down.positionM[3 * j] - 0.1 * j), 15);
    // 36 coordinates pass the check, but only 12 have stiffness.
    const result = checkScenarioValue(episodeValue(13, 1e-3));
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    let thrown: unknown;
    try {
      sampleEpisode(result.scenario, 0);
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(ScenarioProblemError);
    expect((thrown as ScenarioProblemError).problems[0].pointer).toBe('/initialState/mode/index');
    expect((thrown as ScenarioProblemError).problems[0].message).toContain('has 12 vibration modes over its 36 free coordinates');
  });

  it('refuses at check time a mode start above the size limit, naming the pointer, the size and the fix', () => {
    const value = episodeValue(1, 1e-3);
    (value.system as Json).partCount = 200;
    const result = checkScenarioValue(value);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const problem = result.problems.find((p) => p.pointer === '/initialState/mode');
    expect(problem?.message).toContain('603 coordinates (201 nodes × 3 axes), above the 450');
    expect(problem?.message).toContain('fewer axes');
  });
});

describe('a 2-D clamped fin started in its first mode (small-amplitude motion follows the linearised mode; common practice, no source)', () => {
  it('stays in the x-y plane, starts with its largest node displacement at the amplitude, and swings at the labelled frequency within 0.1 %', () => {
    const value = {
      formatVersion: 1, name: 'korrin-fin-mode', episodes: 1, seed: 4, time: { recordIntervalS: 0.001, recordedSteps: 1200, substeps: 'auto' },
      world: { gravityMPerS2: [0, 0, 0] },
      system: { kind: 'lattice', cellSizeM: 0.01, base: 'clamped', shape: { maps: [[[1, 1], [1, 1], [1, 1], [1, 1], [1, 1], [1, 1]]] }, materials: [{ name: 'fin-silicone', youngsModulusPa: 2e5, densityKgPerM3: 1100, dampingRatio: 0 }] },
      initialState: { mode: { index: 1, amplitudeM: 1e-4 } },
    };
    const episode = sampleEpisode(checkedScenario(value), 0);
    const model = episode.system.model;
    const rest = buildLattice({
      cellSizeM: 0.01, materialMap: [[1, 1], [1, 1], [1, 1], [1, 1], [1, 1], [1, 1]],
      materials: [{ name: 'fin-silicone', youngsModulusPa: 2e5, densityKgPerM3: 1100, dampingRatio: 0, actuatorChannel: null, actuationStrainMax: 0 }],
      base: 'clamped', originM: [0, 0, 0],
    }).model;
    let largest = 0;
    let tip = 0;
    for (let i = 0; i < model.nodeCount; i++) {
      expect(model.positionM[3 * i + 2]).toBe(rest.positionM[3 * i + 2]);
      const d = Math.hypot(model.positionM[3 * i] - rest.positionM[3 * i], model.positionM[3 * i + 1] - rest.positionM[3 * i + 1]);
      if (d > largest) [largest, tip] = [d, i];
    }
    expect(Math.abs(largest / 1e-4 - 1)).toBeLessThan(1e-12);
    const frequencyHz = episode.labels['/initialState/mode/frequencyHz'] as number;
    const trajectory = recordTrajectory(model, episode.world, episode.controls, episode.recording);
    const signal = new Float64Array(trajectory.steps + 1);
    for (let t = 0; t <= trajectory.steps; t++) signal[t] = trajectory.positionM[(t * model.nodeCount + tip) * 3] - rest.positionM[3 * tip];
    const periodS = zeroCrossingPeriodS(signal, episode.recording.recordIntervalS);
    expect(Math.abs(periodS * frequencyHz - 1)).toBeLessThan(1e-3);
  });
});
