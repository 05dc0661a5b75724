// Curved chain starts (sim/scenario/start-curve.ts), checked against plane geometry:
// - arc: the nodes lie on the circle of radius R = 1/|κ| through node 0 whose centre is R
//   along the bend direction, consecutive nodes one rest length apart (a chord of length a
//   subtends 2·asin(a/(2R)) at the centre; common geometry, no source), and node j sits at
//   central angle j·2·asin(a·|κ|/2) from node 0;
// - sine: every node lies on w(u) = A·(sin(2πu/λ + φ) − sin φ) in the chain's plane, again one
//   rest length after the one before (the definition of the shape; no source needed beyond it);
// - both: structural springs start at rest length, node 0 does not move, the drawn values are
//   labels, and a scenario without a curve keeps the straight built line.
import { describe, expect, it } from 'vitest';

import type { Model } from '../sim/core/model.ts';
import { RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { unitOfLabel } from '../sim/dataset/manifest/label-units.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';

type Json = Record<string, unknown>;

const PARTS = 16;
const LENGTH_M = 1.6;
const SEGMENT_M = LENGTH_M / PARTS;

function tether(initialState: Json, system: Json = {}, episodes = 1): Json {
  return {
    formatVersion: 1, name: 'korrin-tether-curve', episodes, seed: 31, time: { recordIntervalS: 0.02, recordedSteps: 5 },
    system: { kind: 'chain', partCount: PARTS, lengthM: LENGTH_M, totalMassKg: 0.4, axialStiffnessN: 3000, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-pinned', originM: [0.3, 2, -0.1], directionUnit: [0, -1, 0], bendingStiffnessNm2: 0.002, ...system },
    initialState,
  };
}

function checked(value: Json) {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

function node(model: Model, i: number): number[] {
  return [0, 1, 2].map((k) => model.positionM[3 * i + k]);
}

function distance(p: number[], q: number[]): number {
  return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}

function expectStructuralAtRest(model: Model): void {
  let structural = 0;
  for (let s = 0; s < model.springCount; s++) {
    if (model.springRelation[s] !== RELATION_STRUCTURAL) continue;
    structural++;
    const length = distance(node(model, model.springNodeA[s]), node(model, model.springNodeB[s]));
    expect(Math.abs(length / model.restLengthM[s] - 1)).toBeLessThan(1e-12);
  }
  expect(structural).toBe(PARTS);
}

describe('arc start (circle chord geometry)', () => {
  for (const kappa of [1.5, -2.5]) {
    it(`κ = ${kappa} 1/m: nodes on the circle of radius 1/|κ| tangent to the chain at node 0, at angles j·2·asin(a|κ|/2), springs at rest length`, () => {
      const model = sampleEpisode(checked(tether({ curve: { kind: 'arc', curvaturePerM: kappa, bendDirectionUnit: [1, 0, 0] } })), 0).system.model;
      const top = [0.3, 2, -0.1];
      const radius = 1 / Math.abs(kappa);
      // Chain along −y, bending towards +x for κ > 0 and −x for κ < 0.
      const centre = [top[0] + Math.sign(kappa) * radius, top[1], top[2]];
      const step = 2 * Math.asin((SEGMENT_M * Math.abs(kappa)) / 2);
      expect(node(model, 0)).toEqual(top);
      for (let j = 1; j <= PARTS; j++) {
        const p = node(model, j);
        expect(Math.abs(distance(p, centre) / radius - 1)).toBeLessThan(1e-12);
        const fromCentre = [p[0] - centre[0], p[1] - centre[1]];
        const angle = Math.atan2(-fromCentre[1], -Math.sign(kappa) * fromCentre[0]);
        // Angles past π wrap; compare on the circle.
        expect(Math.abs(Math.sin(angle - j * step))).toBeLessThan(1e-12);
        expect(Math.cos(angle - j * step)).toBeGreaterThan(0);
        expect(p[2]).toBe(top[2]);
      }
      expectStructuralAtRest(model);
    });
  }

  it('curvature 0 leaves the built straight line (to rounding)', () => {
    const model = sampleEpisode(checked(tether({ curve: { kind: 'arc', curvaturePerM: 0 } })), 0).system.model;
    for (let j = 0; j <= PARTS; j++) {
      expect(node(model, j)[0]).toBeCloseTo(0.3, 14);
      expect(node(model, j)[1]).toBeCloseTo(2 - j * SEGMENT_M, 14);
    }
  });

  it('a randomised curvature is drawn per episode, labelled, and each episode\'s shape fits its own label', () => {
    const scenario = checked(tether({ curve: { kind: 'arc', curvaturePerM: { kind: 'uniform', min: 0.5, max: 3 } } }, {}, 4));
    const drawn = new Set<number>();
    for (let e = 0; e < 4; e++) {
      const episode = sampleEpisode(scenario, e);
      const kappa = episode.labels['/initialState/curve/curvaturePerM'] as number;
      expect(kappa).toBeGreaterThanOrEqual(0.5);
      expect(kappa).toBeLessThanOrEqual(3);
      drawn.add(kappa);
      const centre = [0.3 + 1 / kappa, 2, -0.1];
      const tip = node(episode.system.model, PARTS);
      expect(Math.abs(distance(tip, centre) * kappa - 1)).toBeLessThan(1e-12);
    }
    expect(drawn.size).toBe(4);
    // The card prints the unit its key names (project naming rule).
    expect(unitOfLabel('/initialState/curve/curvaturePerM')).toBe('1/m');
    expect(unitOfLabel('/initialState/mode/frequencyHz')).toBe('Hz');
  });
});

describe('sine start (the curve w(u) = A·(sin(2πu/λ + φ) − sin φ))', () => {
  it('A = 0.08 m, λ = 0.7 m, φ = 0.4 rad bending along z: every node on the curve, one rest length apart', () => {
    const amplitudeM = 0.08;
    const wavelengthM = 0.7;
    const phaseRad = 0.4;
    const model = sampleEpisode(checked(tether({ curve: { kind: 'sine', amplitudeM, wavelengthM, phaseRad, bendDirectionUnit: [0.2, 0.5, 1] } })), 0).system.model;
    // The bend direction made perpendicular to the chain's −y is (0.2, 0, 1)/|·|.
    const p = [0.2 / Math.hypot(0.2, 1), 0, 1 / Math.hypot(0.2, 1)];
    let farthestU = 0;
    for (let j = 1; j <= PARTS; j++) {
      const r = node(model, j).map((c, k) => c - [0.3, 2, -0.1][k]);
      const u = -r[1];
      const w = r[0] * p[0] + r[2] * p[2];
      const across = r[0] * p[2] - r[2] * p[0];
      expect(Math.abs(across)).toBeLessThan(1e-15);
      expect(Math.abs(w - amplitudeM * (Math.sin((2 * Math.PI * u) / wavelengthM + phaseRad) - Math.sin(phaseRad)))).toBeLessThan(1e-12);
      expect(u).toBeGreaterThan(farthestU);
      farthestU = u;
    }
    // A wavy chain reaches less far along its line than a straight one.
    expect(farthestU).toBeLessThan(LENGTH_M);
    expectStructuralAtRest(model);
  });

  it('labels amplitude, wavelength and phase; a scenario without a curve has no curve labels', () => {
    const labels = sampleEpisode(checked(tether({ curve: { kind: 'sine', amplitudeM: 0.05, wavelengthM: 0.5 } })), 0).labels;
    expect(labels['/initialState/curve/amplitudeM']).toBe(0.05);
    expect(labels['/initialState/curve/wavelengthM']).toBe(0.5);
    expect(labels['/initialState/curve/phaseRad']).toBe(0);
    const plain = sampleEpisode(checked(tether({})), 0).labels;
    expect(Object.keys(plain).filter((key) => key.startsWith('/initialState/curve') || key.startsWith('/initialState/mode'))).toEqual([]);
  });
});

describe('curve checks', () => {
  const problemsOf = (value: Json): string[] => {
    const result = checkScenarioValue(value);
    return result.ok ? [] : result.problems.map((p) => `${p.pointer}: ${p.message}`);
  };

  it('refuses an arc whose parts cannot be chords of its circle, naming the largest curvature that fits', () => {
    const problems = problemsOf(tether({ curve: { kind: 'arc', curvaturePerM: { kind: 'uniform', min: 1, max: 25 } } }));
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(/^\/initialState\/curve\/curvaturePerM: can be 25 1\/m/);
    expect(problems[0]).toContain('20.0 1/m');
  });

  it('refuses a bend direction along the chain, a chain held at both ends, and a lattice', () => {
    expect(problemsOf(tether({ curve: { kind: 'arc', curvaturePerM: 1, bendDirectionUnit: [0, 2, 0] } }))[0]).toMatch(/^\/initialState\/curve\/bendDirectionUnit: is along the chain/);
    expect(problemsOf(tether({ curve: { kind: 'arc', curvaturePerM: 1 } }, { anchor: 'both-pinned' }))[0]).toMatch(/^\/initialState\/curve: .*node 16 is pinned or driven/);
    const lattice = {
      formatVersion: 1, name: 'korrin-fin-curve', episodes: 1, seed: 5, time: { recordIntervalS: 0.01, recordedSteps: 1 },
      system: { kind: 'lattice', cellSizeM: 0.02, shape: { maps: [[[1, 1], [1, 1]]] }, materials: [{ name: 'fin-silicone', youngsModulusPa: 2e5, densityKgPerM3: 1100, dampingRatio: 0.2 }] },
      initialState: { curve: { kind: 'sine', amplitudeM: 0.01, wavelengthM: 0.1 } },
    };
    expect(problemsOf(lattice)[0]).toMatch(/^\/initialState\/curve: bends a chain, but this system is a lattice/);
  });

  it('refuses an unknown curve kind and a sine without a wavelength, by pointer', () => {
    expect(problemsOf(tether({ curve: { kind: 'spiral', curvaturePerM: 1 } })).join('\n')).toContain('/initialState/curve/kind');
    expect(problemsOf(tether({ curve: { kind: 'sine', amplitudeM: 0.1 } })).join('\n')).toContain('wavelengthM');
  });
});
