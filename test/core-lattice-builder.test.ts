// Counting invariants of the lattice builder for a full block of nx × ny × nz cells (grid
// combinatorics; common practice, no source), the mass it distributes (ρ·V), the stiffness each
// spring collects from the cells that share it (from the Cauchy–Born constants in
// sim/systems/material-springs.ts: k1 = 22·E·a/35 for an interior edge, k2 = k3 = 6·E·a/35;
// in 2-D k1 = 3·E·a/4, k2 = 3·E·a/8), and its outer panels.
import { describe, expect, it } from 'vitest';

import type { Model } from '../sim/core/model.ts';
import {
  NODE_PINNED, RELATION_BODY_DIAGONAL, RELATION_CELL_EDGE, RELATION_FACE_DIAGONAL,
} from '../sim/core/model.ts';
import type { LatticeMaterial } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';

const A = 0.025;
const SOFT: LatticeMaterial = { name: 'fin silicone', youngsModulusPa: 8e4, densityKgPerM3: 1100, dampingRatio: 0.1, actuatorChannel: null, actuationStrainMax: 0 };
const STIFF: LatticeMaterial = { name: 'fin rib', youngsModulusPa: 9e5, densityKgPerM3: 1500, dampingRatio: 0.1, actuatorChannel: 0, actuationStrainMax: 0.1 };

function block3(nx: number, ny: number, nz: number, value: (x: number, y: number, z: number) => number): number[][][] {
  return Array.from({ length: ny }, (_, y) => Array.from({ length: nz }, (_, z) => Array.from({ length: nx }, (_, x) => value(x, y, z))));
}

function countRelation(model: Model, relation: number): number {
  let count = 0;
  for (let s = 0; s < model.springCount; s++) if (model.springRelation[s] === relation) count++;
  return count;
}

function totalMass(model: Model): number {
  return model.massKg.reduce((sum, m) => sum + m, 0);
}

describe('3-D block invariants (grid combinatorics; common practice, no source)', () => {
  const [nx, ny, nz] = [4, 3, 2];
  const system = buildLattice({ cellSizeM: A, materialMap: block3(nx, ny, nz, () => 1), materials: [SOFT], base: 'free', originM: [0.1, 0, -0.2] });
  const model = system.model;

  it('(nx+1)(ny+1)(nz+1) nodes, nx·ny·nz cells of 8 corners', () => {
    expect(model.nodeCount).toBe((nx + 1) * (ny + 1) * (nz + 1));
    expect(model.cellCount).toBe(nx * ny * nz);
    expect(model.cellCornerCount).toBe(8);
  });

  it('spring counts per relation: grid edges, two diagonals per grid face, four per cell', () => {
    const edges = nx * (ny + 1) * (nz + 1) + (nx + 1) * ny * (nz + 1) + (nx + 1) * (ny + 1) * nz;
    const faces = (nx + 1) * ny * nz + nx * (ny + 1) * nz + nx * ny * (nz + 1);
    expect(countRelation(model, RELATION_CELL_EDGE)).toBe(edges);
    expect(countRelation(model, RELATION_FACE_DIAGONAL)).toBe(2 * faces);
    expect(countRelation(model, RELATION_BODY_DIAGONAL)).toBe(4 * nx * ny * nz);
    expect(model.springCount).toBe(edges + 2 * faces + 4 * nx * ny * nz);
  });

  it('masses sum to ρ·V and each node holds ρ·a³/8 per cell it belongs to', () => {
    expect(totalMass(model)).toBeCloseTo(SOFT.densityKgPerM3 * nx * ny * nz * A ** 3, 12);
    // A corner node of the block belongs to one cell, an interior node to eight.
    const corner = 0; // grid (0, 0, 0)
    expect(model.massKg[corner]).toBeCloseTo((SOFT.densityKgPerM3 * A ** 3) / 8, 14);
    expect(Math.max(...model.massKg)).toBeCloseTo(SOFT.densityKgPerM3 * A ** 3, 14);
  });

  it('outer panels: 2(nx·ny + ny·nz + nz·nx) quads, each of area a²', () => {
    expect(model.panelNodeCount).toBe(4);
    expect(model.panelCount).toBe(2 * (nx * ny + ny * nz + nz * nx));
    const x = model.positionM;
    for (let q = 0; q < model.panelCount; q++) {
      const [i0, , i2] = [model.panelNodes[4 * q], model.panelNodes[4 * q + 1], model.panelNodes[4 * q + 2]];
      const diagonal = Math.hypot(x[3 * i2] - x[3 * i0], x[3 * i2 + 1] - x[3 * i0 + 1], x[3 * i2 + 2] - x[3 * i0 + 2]);
      expect(diagonal).toBeCloseTo(A * Math.SQRT2, 14);
    }
  });

  it('stiffness collected by shared springs: interior edge 22Ea/35, surface edge half, block edge a quarter; diagonals 6Ea/35 (or half on the surface)', () => {
    const ea = SOFT.youngsModulusPa * A;
    const seen = new Set<string>();
    for (let s = 0; s < model.springCount; s++) {
      const k = model.stiffnessNPerM[s] / ea;
      const relation = model.springRelation[s];
      if (relation === RELATION_CELL_EDGE) seen.add(`edge ${(k * 35).toFixed(6)}`);
      else if (relation === RELATION_FACE_DIAGONAL) seen.add(`face ${(k * 35).toFixed(6)}`);
      else seen.add(`body ${(k * 35).toFixed(6)}`);
    }
    expect([...seen].sort()).toEqual(['body 6.000000', 'edge 11.000000', 'edge 22.000000', 'edge 5.500000', 'face 3.000000', 'face 6.000000']);
  });
});

describe('2-D strip invariants (grid combinatorics; common practice, no source)', () => {
  const [nx, ny] = [5, 2];
  const map = Array.from({ length: ny }, () => Array.from({ length: nx }, () => 1));
  const model = buildLattice({ cellSizeM: A, materialMap: map, materials: [SOFT], base: 'clamped', originM: [0, 0, 0] }).model;

  it('(nx+1)(ny+1) nodes, edges, two diagonals per cell, 2(nx+ny) outline panels of width a', () => {
    expect(model.nodeCount).toBe((nx + 1) * (ny + 1));
    expect(model.cellCornerCount).toBe(4);
    expect(countRelation(model, RELATION_CELL_EDGE)).toBe(nx * (ny + 1) + (nx + 1) * ny);
    expect(countRelation(model, RELATION_FACE_DIAGONAL)).toBe(2 * nx * ny);
    expect(countRelation(model, RELATION_BODY_DIAGONAL)).toBe(0);
    expect(model.panelNodeCount).toBe(2);
    expect(model.panelCount).toBe(2 * (nx + ny));
    expect(model.panelWidthM).toBe(A);
    // 2-D cells are a thick: mass ρ·a³ per cell.
    expect(totalMass(model)).toBeCloseTo(SOFT.densityKgPerM3 * nx * ny * A ** 3, 12);
  });

  it('clamped base pins exactly the nx+1 bottom nodes', () => {
    const pinned = [...model.nodeFlags.keys()].filter((i) => model.nodeFlags[i] & NODE_PINNED);
    expect(pinned.length).toBe(nx + 1);
    for (const i of pinned) {
      expect(model.positionM[3 * i + 1]).toBe(0);
      expect(model.inverseMassPerKg[i]).toBe(0);
    }
  });

  it('edge stiffness 3Ea/4 inside, 3Ea/8 on the outline; diagonals 3Ea/8', () => {
    const ea = SOFT.youngsModulusPa * A;
    const values = new Set<string>();
    for (let s = 0; s < model.springCount; s++) values.add(`${model.springRelation[s]}:${((8 * model.stiffnessNPerM[s]) / ea).toFixed(6)}`);
    expect([...values].sort()).toEqual([`${RELATION_CELL_EDGE}:3.000000`, `${RELATION_CELL_EDGE}:6.000000`, `${RELATION_FACE_DIAGONAL}:3.000000`]);
  });
});

describe('mixed materials and holes (common practice, no source)', () => {
  it('a shared face between soft and stiff cells sums both shares; mass sums ρ_i·a³ over the cells', () => {
    // Two cells side by side along x: soft at x = 0, stiff (actuated) at x = 1.
    const system = buildLattice({ cellSizeM: A, materialMap: [[[1, 2]]], materials: [SOFT, STIFF], base: 'free', originM: [0, 0, 0] });
    const model = system.model;
    expect(model.nodeCount).toBe(12);
    expect(totalMass(model)).toBeCloseTo((SOFT.densityKgPerM3 + STIFF.densityKgPerM3) * A ** 3, 14);
    const a = SOFT.youngsModulusPa * A;
    const b = STIFF.youngsModulusPa * A;
    const x = model.positionM;
    let sharedEdges = 0;
    for (let s = 0; s < model.springCount; s++) {
      const ia = model.springNodeA[s];
      const ib = model.springNodeB[s];
      const onSharedFace = Math.abs(x[3 * ia] - A) < 1e-12 && Math.abs(x[3 * ib] - A) < 1e-12;
      if (!onSharedFace || model.springRelation[s] !== RELATION_CELL_EDGE) continue;
      sharedEdges++;
      expect(model.stiffnessNPerM[s]).toBeCloseTo((22 * (a + b)) / 35 / 4, 9);
    }
    expect(sharedEdges).toBe(4);
    // Only the stiff cell's material is actuated: 28 springs of that cell carry an entry.
    expect(model.actuationEntryCount).toBe(28);
    expect(system.controlChannels).toHaveLength(1);
  });

  it('empty cells leave no nodes, springs or mass behind and expose their faces as panels', () => {
    // An L of three cells in 2-D.
    const model = buildLattice({ cellSizeM: A, materialMap: [[1, 1], [1, 0]], materials: [SOFT], base: 'free', originM: [0, 0, 0] }).model;
    expect(model.nodeCount).toBe(8);
    expect(model.cellCount).toBe(3);
    expect(countRelation(model, RELATION_FACE_DIAGONAL)).toBe(6);
    expect(countRelation(model, RELATION_CELL_EDGE)).toBe(10);
    expect(model.panelCount).toBe(8); // the L's outline: perimeter 8a
  });
});
