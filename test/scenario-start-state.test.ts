// Start states of an episode (sim/scenario/start-pose.ts, settle-start.ts):
// - settled: a hanging chain starts at its static equilibrium, each structural spring j
//   stretched by g·(mass below)/k (Hooke's law and statics of a hanging rope; Halliday &
//   Resnick, Fundamentals of Physics; from memory), at rest;
// - pose: a rigid rotation about the pinned top keeps every node's distance to it and turns
//   the chain by the given angle (Rodrigues' rotation formula, common practice, no source);
// - spin: the start velocities are those of a rigid body, v = v₀ + ω × r, so the body's
//   angular momentum about its centre of mass is I·ω with I = Σ m(|r|²·1 − r·rᵀ) (Goldstein,
//   Classical Mechanics, rigid-body kinematics; from memory) and its momentum M·v₀.
import { describe, expect, it } from 'vitest';

import { RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';

type Json = Record<string, unknown>;

function tether(initialState: Json): Json {
  return {
    formatVersion: 1, name: 'korrin-tether-start', episodes: 2, seed: 77, time: { recordIntervalS: 0.02, recordedSteps: 10 },
    system: { kind: 'chain', partCount: 12, lengthM: 1.2, totalMassKg: 0.3, axialStiffnessN: 3000, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-pinned', originM: [0, 2, 0], directionUnit: [0, -1, 0], bendingStiffnessNm2: 0.002 },
    initialState,
  };
}

function sampled(value: Json) {
  const checked = checkScenarioValue(value);
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return sampleEpisode(checked.scenario, 0);
}

describe('settled start', () => {
  it('a hanging chain settled for 3 s: every structural extension within 1% of g·m_below/k, velocities 0', () => {
    const episode = sampled(tether({ settleS: 3, settleDragPerS: 8 }));
    const model = episode.system.model;
    expect(episode.labels['/initialState/settleS']).toBe(3);
    for (let s = 0; s < model.springCount; s++) {
      if (model.springRelation[s] !== RELATION_STRUCTURAL) continue;
      const a = model.springNodeA[s];
      const b = model.springNodeB[s];
      const length = Math.hypot(...[0, 1, 2].map((k) => model.positionM[3 * b + k] - model.positionM[3 * a + k]));
      let below = 0;
      for (let i = Math.max(a, b); i < model.nodeCount; i++) below += model.massKg[i];
      const expected = (9.81 * below) / model.stiffnessNPerM[s];
      expect(Math.abs((length - model.restLengthM[s]) / expected - 1)).toBeLessThan(0.01);
    }
    expect(model.velocityMPerS.every((v) => v === 0)).toBe(true);
  });

  it('without settling the chain starts unstretched (the built shape)', () => {
    const model = sampled(tether({})).system.model;
    expect(Math.abs(model.positionM[3 * 12 + 1] - (2 - 1.2))).toBeLessThan(1e-12);
  });
});

describe('start pose and motion', () => {
  it('rotationRad 0.4 about z turns the chain about its pinned top by 0.4 rad, keeping distances', () => {
    const model = sampled(tether({ rotationRad: 0.4 })).system.model;
    for (let i = 1; i < model.nodeCount; i++) {
      const dx = model.positionM[3 * i];
      const dy = model.positionM[3 * i + 1] - 2;
      expect(Math.hypot(dx, dy)).toBeCloseTo(0.1 * i, 12);
      // Counter-clockwise about +z swings the downward chain towards +x.
      expect(Math.atan2(dx, -dy)).toBeCloseTo(0.4, 12);
    }
  });

  it('a free 3-D block with velocityMPerS and spinRadPerS moves as a rigid body: P = M·v₀, L = I·ω', () => {
    const value = {
      formatVersion: 1, name: 'korrin-fin-spin', episodes: 1, seed: 5, time: { recordIntervalS: 0.01, recordedSteps: 1 },
      system: { kind: 'lattice', cellSizeM: 0.02, shape: { maps: [[[[1, 1, 1], [1, 1, 1]], [[1, 1, 1], [1, 0, 1]]]] }, materials: [{ name: 'fin-silicone', youngsModulusPa: 2e5, densityKgPerM3: 1100, dampingRatio: 0.2 }] },
      initialState: { velocityMPerS: [0.1, -0.2, 0.05], spinRadPerS: [0.5, 1.5, -0.7] },
    };
    const model = sampled(value).system.model;
    const m = model.massKg;
    const x = model.positionM;
    const v = model.velocityMPerS;
    let mass = 0;
    const centre = [0, 0, 0];
    for (let i = 0; i < model.nodeCount; i++) {
      mass += m[i];
      for (let k = 0; k < 3; k++) centre[k] += m[i] * x[3 * i + k];
    }
    for (let k = 0; k < 3; k++) centre[k] /= mass;
    const p = [0, 0, 0];
    const angular = [0, 0, 0];
    const inertia = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
    for (let i = 0; i < model.nodeCount; i++) {
      const r = [0, 1, 2].map((k) => x[3 * i + k] - centre[k]);
      const vi = [0, 1, 2].map((k) => v[3 * i + k]);
      for (let k = 0; k < 3; k++) p[k] += m[i] * vi[k];
      angular[0] += m[i] * (r[1] * vi[2] - r[2] * vi[1]);
      angular[1] += m[i] * (r[2] * vi[0] - r[0] * vi[2]);
      angular[2] += m[i] * (r[0] * vi[1] - r[1] * vi[0]);
      const r2 = r[0] * r[0] + r[1] * r[1] + r[2] * r[2];
      for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) inertia[a][b] += m[i] * ((a === b ? r2 : 0) - r[a] * r[b]);
    }
    const omega = [0.5, 1.5, -0.7];
    const velocity = [0.1, -0.2, 0.05];
    for (let k = 0; k < 3; k++) {
      expect(p[k]).toBeCloseTo(mass * velocity[k], 12);
      const expected = inertia[k][0] * omega[0] + inertia[k][1] * omega[1] + inertia[k][2] * omega[2];
      expect(angular[k]).toBeCloseTo(expected, 12);
    }
  });

  it('refuses to translate a chain with a pinned top, pointing at /initialState/translationM', () => {
    const checked = checkScenarioValue(tether({ translationM: [0.1, 0, 0] }));
    expect(checked.ok).toBe(false);
    if (!checked.ok) expect(checked.problems.map((p) => p.pointer)).toContain('/initialState/translationM');
  });
});
