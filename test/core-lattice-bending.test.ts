// Lattice bodies held where users put them, and how thin lattices bend.
// - A 2-D lattice strip clamped at its −x face sags under its own weight; Euler–Bernoulli gives
//   δ = w·L⁴/(8·EI) with w = ρ·g·h·a and I = a·h³/12 (Timoshenko & Gere, Mechanics of
//   Materials, cantilever table; from memory). The lattice is stiffer by about 1 + 1.2/n² for n
//   cells across: the figures README's cautions and `pliant validate`'s warning quote.
// - Face, cell and box clamps pick the nodes their definitions name; a driven face moved slowly
//   carries a free body with it rigidly (rigid translation, common practice, no source).
import { describe, expect, it } from 'vitest';

import { NODE_DRIVEN, NODE_PINNED } from '../sim/core/model.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import { findThinLatticeWarnings, THIN_LATTICE_CELLS } from '../sim/scenario/thin-lattice-warnings.ts';
import type { LatticeClamp, LatticeMaterial } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';
import { zeroGravityWorld } from './support/zero-gravity-world.ts';

const E_PA = 1e7;
const RHO = 1000;
const CELL_M = 0.01;
const material: LatticeMaterial = { name: 'hull-foam', youngsModulusPa: E_PA, densityKgPerM3: RHO, dampingRatio: 0.3, actuatorChannel: null, actuationStrainMax: 0 };

function strip(across: number, along: number, clamps: LatticeClamp[]) {
  const map = Array.from({ length: across }, () => Array.from({ length: along }, () => 1));
  return buildLattice({ cellSizeM: CELL_M, materialMap: map, materials: [material], base: 'free', originM: [0, 0, 0], clamps });
}

/** Euler–Bernoulli over measured bending stiffness of an n-cell-thick strip, 10 n long. */
function stiffnessRatio(across: number): number {
  const along = 10 * across;
  const model = strip(across, along, [{ name: 'root', face: '-x', drivenAxes: [] }]).model;
  const built = model.positionM.slice();
  const lengthM = along * CELL_M;
  const thicknessM = across * CELL_M;
  const f1Hz = ((1.8751 ** 2) / (2 * Math.PI)) * Math.sqrt((E_PA * thicknessM * thicknessM) / 12 / RHO) / (lengthM * lengthM);
  const world = defaultWorld();
  world.airDragPerS = 4 * Math.PI * f1Hz; // twice critical for the first mode: settles without overshoot
  const dtS = 0.5 * stabilityBound(model, world.airDragPerS).criticalDtS;
  const simulator = new Simulator(model, world);
  const steps = Math.ceil(8 / f1Hz / dtS);
  for (let s = 0; s < steps; s++) simulator.step(dtS);
  let sag = 0;
  let tipNodes = 0;
  for (let i = 0; i < model.nodeCount; i++) {
    if (Math.abs(built[3 * i] - lengthM) > 1e-9) continue;
    sag -= model.positionM[3 * i + 1] - built[3 * i + 1];
    tipNodes++;
  }
  const theoryM = (1.5 * RHO * 9.81 * lengthM ** 4) / (E_PA * thicknessM * thicknessM);
  return theoryM / (sag / tipNodes);
}

describe('thin 2-D lattice cantilever against Euler–Bernoulli (δ = wL⁴/8EI)', () => {
  const ratios = [2, 3, 4].map(stiffnessRatio);

  it('too stiff by 1.30× at 2 cells across, 1.13× at 3, 1.07× at 4 (each within ±0.03)', () => {
    expect(Math.abs(ratios[0] - 1.3)).toBeLessThan(0.03);
    expect(Math.abs(ratios[1] - 1.13)).toBeLessThan(0.03);
    expect(Math.abs(ratios[2] - 1.07)).toBeLessThan(0.03);
  });

  it('the excess falls about as 1/n²: from 2 to 4 cells by a factor 3.4 or more', () => {
    expect((ratios[0] - 1) / (ratios[2] - 1)).toBeGreaterThan(3.4);
  });

  it('validate warns below THIN_LATTICE_CELLS across, quoting the measured 30% for 2 cells', () => {
    const scenario = (across: number) => ({
      formatVersion: 1, name: 'korrin-hull-strip', episodes: 1, seed: 1, time: { recordIntervalS: 0.01, recordedSteps: 1 },
      system: { kind: 'lattice', cellSizeM: CELL_M, shape: { maps: [Array.from({ length: across }, () => Array.from({ length: 10 * across }, () => 1))] }, materials: [{ name: 'hull-foam', youngsModulusPa: E_PA, densityKgPerM3: RHO, dampingRatio: 0.3 }] },
    });
    const thin = checkScenarioValue(scenario(2));
    const thick = checkScenarioValue(scenario(THIN_LATTICE_CELLS));
    if (!thin.ok || !thick.ok) throw new Error('scenarios should be valid');
    const warnings = findThinLatticeWarnings(thin.scenario);
    expect(warnings).toHaveLength(1);
    expect(warnings[0].pointer).toBe('/system/shape/maps/0');
    expect(warnings[0].message).toContain('2 cells thick along y');
    expect(warnings[0].message).toContain('30%');
    expect(findThinLatticeWarnings(thick.scenario)).toEqual([]);
  });
});

describe('lattice clamps pick the nodes their definitions name', () => {
  it('faces, cells and a box of a 4 × 2 strip', () => {
    const held = (clamp: LatticeClamp): string[] => {
      const model = strip(2, 4, [clamp]).model;
      const out: number[] = [];
      for (let i = 0; i < model.nodeCount; i++) if (model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN)) out.push(i);
      return out.map((i) => [model.positionM[3 * i] / CELL_M, model.positionM[3 * i + 1] / CELL_M].map(Math.round).join(',')).sort();
    };
    expect(held({ name: 'a', face: '-x', drivenAxes: [] })).toEqual(['0,0', '0,1', '0,2']);
    expect(held({ name: 'a', face: '+y', drivenAxes: [] })).toEqual(['0,2', '1,2', '2,2', '3,2', '4,2']);
    expect(held({ name: 'a', cells: [[3, 1]], drivenAxes: [] })).toEqual(['3,1', '3,2', '4,1', '4,2']);
    expect(held({ name: 'a', boxM: { min: [0.015, -1, -1], max: [0.03, 0.01, 1] }, drivenAxes: [] })).toEqual(['2,0', '2,1', '3,0', '3,1']);
    expect(() => strip(2, 4, [{ name: 'a', face: '-z', drivenAxes: [] }])).toThrow(/2-D lattice has no -z face/);
    expect(() => strip(2, 4, [{ name: 'a', cells: [[9, 0]], drivenAxes: [] }])).toThrow(/does not have/);
  });

  it('a shaking table: the −y face driven 5 mm along x by a slow constant command carries a 3-D block with it', () => {
    const value = {
      formatVersion: 1, name: 'korrin-shaker', episodes: 1, seed: 3, time: { recordIntervalS: 0.01, recordedSteps: 150 },
      system: {
        kind: 'lattice', cellSizeM: 0.02, shape: { maps: [[[[1, 1]], [[1, 1]]]] }, clamps: [{ name: 'table', face: '-y', drivenAxes: ['x'] }],
        materials: [{ name: 'fin-silicone', youngsModulusPa: 2e5, densityKgPerM3: 1100, dampingRatio: 0.5 }],
      },
      world: { gravityMPerS2: [0, 0, 0] },
      controls: { default: { kind: 'constant', value: 0.005 }, rampInS: 0.5 },
    };
    const checked = checkScenarioValue(value);
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const episode = sampleEpisode(checked.scenario, 0);
    expect(episode.system.controlChannels.map((c) => c.name)).toEqual(['table-offset-x']);
    const model = episode.system.model;
    const built = model.positionM.slice();
    const trajectory = recordTrajectory(model, zeroGravityWorld(), episode.controls, episode.recording);
    const last = trajectory.steps * model.nodeCount * 3;
    for (let i = 0; i < model.nodeCount; i++) {
      const dx = trajectory.positionM[last + 3 * i] - built[3 * i];
      if (model.nodeFlags[i] & NODE_DRIVEN) expect(dx).toBeCloseTo(0.005, 12);
      else expect(Math.abs(dx - 0.005)).toBeLessThan(2e-4);
      expect(Math.abs(trajectory.positionM[last + 3 * i + 1] - built[3 * i + 1])).toBeLessThan(2e-4);
    }
  });
});
