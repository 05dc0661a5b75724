// Elastic response of voxel lattices against continuum mechanics.
//  - A bar in uniaxial tension: σ = F/A and ε = ΔL/L measured on a gauge length away from the
//    clamped end, where the clamp's restraint of lateral contraction has died out (Saint-
//    Venant's principle); E_eff = σ/ε must match the material's Young's modulus (Hooke's law,
//    e.g. Gere & Timoshenko, Mechanics of Materials). The lateral strain gives Poisson's ratio,
//    which a central-force lattice fixes at 1/4 in 3-D and 1/3 in 2-D (Cauchy relations; Born
//    & Huang, Dynamical Theory of Crystal Lattices).
//  - An actuated free cell at u = ±1 scales every rest length by (1 ± strainMax), so it settles
//    to the similar cube with volume (1 ± strainMax)³·a³ (geometric similarity; common
//    practice, no source).
import { describe, expect, it } from 'vitest';

import type { Model } from '../sim/core/model.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { autoSubsteps, stabilityBound } from '../sim/core/stability-bound.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import type { LatticeMaterial, MaterialMap2D, MaterialMap3D } from '../sim/systems/lattice.ts';
import { buildLattice, latticeDimension } from '../sim/systems/lattice.ts';
import { latticePoissonRatio } from '../sim/systems/material-springs.ts';
import { withForceHandles } from './support/force-handles.ts';
import { hexahedronVolumeM3 } from './support/hexahedron-volume.ts';
import { zeroGravityWorld } from './support/zero-gravity-world.ts';

const CELL_M = 0.01;
const FIN_SILICONE: LatticeMaterial = { name: 'fin silicone', youngsModulusPa: 1e5, densityKgPerM3: 1100, dampingRatio: 0.3, actuatorChannel: null, actuationStrainMax: 0 };

function nodesAtHeight(model: Model, yM: number): number[] {
  const nodes: number[] = [];
  for (let i = 0; i < model.nodeCount; i++) if (Math.abs(model.positionM[3 * i + 1] - yM) < 1e-9) nodes.push(i);
  return nodes;
}

function meanOf(model: Model, nodes: number[], axis: number): number {
  return nodes.reduce((sum, i) => sum + model.positionM[3 * i + axis], 0) / nodes.length;
}

/**
 * Pulls a clamped vertical bar (width × depth cells, `layers` cells tall) at its top with
 * stress σ and returns the measured E and Poisson's ratio on the middle gauge length.
 */
function tensionTest(map: MaterialMap2D | MaterialMap3D, layers: number, width: number, depth: number, stressPa: number, materials: LatticeMaterial[] = [FIN_SILICONE]): { youngsModulusPa: number; poissonRatio: number } {
  const dim = latticeDimension(map);
  const built = buildLattice({ cellSizeM: CELL_M, materialMap: map, materials, base: 'clamped', originM: [0, 0, 0] }).model;
  const topY = layers * CELL_M;
  const top = nodesAtHeight(built, topY);
  expect(top.length).toBe((width + 1) * (dim === 3 ? depth + 1 : 1));
  const { model, firstChannel } = withForceHandles(built, top);
  // Consistent nodal loads of a uniform traction: each top cell carries σ·(its face area) and
  // hands a quarter (3-D) or a half (2-D) to each of its top corners. 2-D cells are a thick.
  const faceAreaM2 = CELL_M * CELL_M;
  const shareN = (stressPa * faceAreaM2) / (dim === 3 ? 4 : 2);
  const controls = new Float64Array(model.controlChannelCount);
  top.forEach((node, j) => {
    const ix = Math.round(model.positionM[3 * node] / CELL_M);
    const iz = Math.round(model.positionM[3 * node + 2] / CELL_M);
    const cellsX = ix === 0 || ix === width ? 1 : 2;
    const cellsZ = dim === 2 ? 1 : iz === 0 || iz === depth ? 1 : 2;
    controls[firstChannel + 3 * j + 1] = shareN * cellsX * cellsZ;
  });
  const gaugeLow = nodesAtHeight(model, Math.round(0.3 * layers) * CELL_M);
  const gaugeHigh = nodesAtHeight(model, Math.round(0.7 * layers) * CELL_M);
  const mid = nodesAtHeight(model, Math.round(0.5 * layers) * CELL_M);
  const gaugeLengthM = meanOf(model, gaugeHigh, 1) - meanOf(model, gaugeLow, 1);
  const midWidthM = Math.max(...mid.map((i) => model.positionM[3 * i])) - Math.min(...mid.map((i) => model.positionM[3 * i]));

  const world = zeroGravityWorld();
  // Fundamental of a clamped–free bar, ω₁ = (π/2)·√(E/ρ)/L; mass-proportional drag near 2·ω₁
  // settles it without changing the static answer.
  const softest = materials.reduce((a, b) => (a.youngsModulusPa / a.densityKgPerM3 < b.youngsModulusPa / b.densityKgPerM3 ? a : b));
  const omega1 = (Math.PI / 2) * Math.sqrt(softest.youngsModulusPa / softest.densityKgPerM3) / topY;
  world.airDragPerS = 2 * omega1;
  const intervalS = 0.002;
  const substeps = autoSubsteps(intervalS, stabilityBound(model, world.airDragPerS));
  const simulator = new Simulator(model, world);
  simulator.setControls(controls);
  const settleS = 40 / omega1;
  for (let t = 0; t * intervalS < settleS; t++) simulator.advanceInterval(intervalS, substeps);

  const strain = (meanOf(model, gaugeHigh, 1) - meanOf(model, gaugeLow, 1)) / gaugeLengthM - 1;
  const midWidthNowM = Math.max(...mid.map((i) => model.positionM[3 * i])) - Math.min(...mid.map((i) => model.positionM[3 * i]));
  const lateralStrain = midWidthNowM / midWidthM - 1;
  return { youngsModulusPa: stressPa / strain, poissonRatio: -lateralStrain / strain };
}

describe('lattice bar in uniaxial tension (Hooke\'s law, Gere & Timoshenko; Cauchy relations, Born & Huang)', () => {
  // The brief allows 10%; the homogenisation is exact for affine strain, so 1% is asked here.
  it('3-D bar 2×2 cells × 12 tall: E_eff within 1% of E, Poisson\'s ratio within 2% of 1/4', () => {
    const map: MaterialMap3D = Array.from({ length: 12 }, () => [[1, 1], [1, 1]]);
    const stressPa = 1e-3 * FIN_SILICONE.youngsModulusPa; // 0.1% strain: linear regime
    const { youngsModulusPa, poissonRatio } = tensionTest(map, 12, 2, 2, stressPa);
    expect(Math.abs(youngsModulusPa / FIN_SILICONE.youngsModulusPa - 1)).toBeLessThan(0.01);
    expect(Math.abs(poissonRatio / latticePoissonRatio(3) - 1)).toBeLessThan(0.02);
  });

  it('2-D strip 3 cells wide × 12 tall (thickness = cell size): E_eff within 1% of E, Poisson\'s ratio within 2% of 1/3', () => {
    const map: MaterialMap2D = Array.from({ length: 12 }, () => [1, 1, 1]);
    const stressPa = 1e-3 * FIN_SILICONE.youngsModulusPa;
    const { youngsModulusPa, poissonRatio } = tensionTest(map, 12, 3, 0, stressPa);
    expect(Math.abs(youngsModulusPa / FIN_SILICONE.youngsModulusPa - 1)).toBeLessThan(0.01);
    expect(Math.abs(poissonRatio / latticePoissonRatio(2) - 1)).toBeLessThan(0.02);
  });

  it('3-D bar of alternating soft and stiff layers (E and 3E): E_eff between the Reuss and Voigt bounds, within 10% of Reuss (Hill 1952)', () => {
    const stiff: LatticeMaterial = { ...FIN_SILICONE, name: 'fin rib', youngsModulusPa: 3 * FIN_SILICONE.youngsModulusPa };
    const map: MaterialMap3D = Array.from({ length: 12 }, (_, y) => (y % 2 === 0 ? [[1, 1], [1, 1]] : [[2, 2], [2, 2]]));
    const { youngsModulusPa } = tensionTest(map, 12, 2, 2, 1e-3 * FIN_SILICONE.youngsModulusPa, [FIN_SILICONE, stiff]);
    // Hill (1952): the effective modulus lies between the Reuss (series) and Voigt (parallel)
    // averages; loaded across its layers a laminate sits near the Reuss end.
    const reussPa = 2 / (1 / FIN_SILICONE.youngsModulusPa + 1 / stiff.youngsModulusPa);
    const voigtPa = (FIN_SILICONE.youngsModulusPa + stiff.youngsModulusPa) / 2;
    expect(youngsModulusPa).toBeGreaterThan(reussPa);
    expect(youngsModulusPa).toBeLessThan(voigtPa);
    expect(Math.abs(youngsModulusPa / reussPa - 1)).toBeLessThan(0.1);
  });
});

describe('actuated free voxel cell settles to volume (1 ± strainMax)³·a³ (geometric similarity; common practice)', () => {
  const strainMax = 0.12;
  const actuator: LatticeMaterial = { name: 'fin actuator', youngsModulusPa: 5e4, densityKgPerM3: 1050, dampingRatio: 0.5, actuatorChannel: 0, actuationStrainMax: strainMax };
  for (const u of [1, -1]) {
    it(`u = ${u}: volume within 2% of (1 ${u > 0 ? '+' : '−'} ${strainMax})³·a³`, () => {
      const system = buildLattice({ cellSizeM: CELL_M, materialMap: [[[1]]], materials: [actuator], base: 'free', originM: [0, 0, 0] });
      const model = system.model;
      expect(system.controlChannels.map((c) => c.kind)).toEqual(['actuator']);
      const corners = model.cellCorners.subarray(0, 8);
      expect(hexahedronVolumeM3(model.positionM, corners)).toBeCloseTo(CELL_M ** 3, 15);
      const steps = 200;
      const controls = new Float64Array(steps).fill(u);
      const trajectory = recordTrajectory(model, zeroGravityWorld(), controls, { recordIntervalS: 0.002, recordedSteps: steps, substeps: 'auto' });
      const last = trajectory.positionM.subarray(trajectory.steps * 3 * model.nodeCount);
      const expected = (1 + u * strainMax) ** 3 * CELL_M ** 3;
      expect(Math.abs(hexahedronVolumeM3(last, corners) / expected - 1)).toBeLessThan(0.02);
    });
  }
});
