// Graph labels must describe exactly the system that was built: node features from the chain's
// definition (part masses lumped half to each end; the anchor and handles as flags), edges from
// its springs (structural k = EA/segment, bending a fraction of it), cells and materials from
// the lattice's map. Expected values come from the builders' stated definitions (chain.ts
// header; common practice, no source), not from the model arrays.
import { describe, expect, it } from 'vitest';

import { applyActuation } from '../sim/core/control-application.ts';
import { RELATION_NAMES, RELATION_SECOND_NEIGHBOUR, RELATION_STRUCTURAL } from '../sim/core/model.ts';
import { buildChain } from '../sim/systems/chain.ts';
import { graphLabels, NODE_FEATURE_NAMES } from '../sim/systems/graph-labels.ts';
import type { LatticeMaterial } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';

const F = NODE_FEATURE_NAMES.length;

describe('graph labels of a chain (definitions in sim/systems/chain.ts)', () => {
  const parts = 6;
  const system = buildChain({
    partCount: parts, lengthM: 1.2, totalMassKg: 0.3, axialStiffnessN: 60, secondNeighbourSpringRatio: 0.25, dampingRatio: 0.1,
    diameterM: 0.006, anchor: 'top-driven', originM: [0, 2, 0], directionUnit: [0, -1, 0], forceHandles: [-1, 3], forceAxes: ['x', 'z'], drivenAxes: ['x'],
  });
  const labels = graphLabels(system.model);

  it('node features: lumped masses, driven top, two handles', () => {
    expect(NODE_FEATURE_NAMES).toEqual(['mass_kg', 'pinned', 'driven', 'handle', 'material', 'channel']);
    expect(labels.nodeFeatures.length).toBe((parts + 1) * F);
    const partMass = 0.3 / parts;
    for (let i = 0; i <= parts; i++) {
      const row = Array.from(labels.nodeFeatures.subarray(i * F, (i + 1) * F));
      const mass = i === 0 || i === parts ? partMass / 2 : partMass;
      expect(row[0]).toBeCloseTo(mass, 15);
      expect(row.slice(1)).toEqual([0, i === 0 ? 1 : 0, i === parts || i === 3 ? 1 : 0, -1, -1]);
    }
  });

  it('edges: 6 structural (i, i+1) at EA/segment, 5 bending (i, i+2) at a quarter of it, with rest lengths', () => {
    const segment = 1.2 / parts;
    const k = 60 / segment;
    const edges: string[] = [];
    for (let e = 0; e < labels.edgeRelation.length; e++) {
      const [a, b] = [labels.edges[2 * e], labels.edges[2 * e + 1]];
      const relation = labels.edgeRelation[e];
      edges.push(`${RELATION_NAMES[relation]} ${a}-${b}`);
      const span = b - a;
      expect(relation).toBe(span === 1 ? RELATION_STRUCTURAL : RELATION_SECOND_NEIGHBOUR);
      expect(labels.edgeRestLengthM[e]).toBeCloseTo(span * segment, 14);
      expect(labels.edgeStiffnessNPerM[e]).toBeCloseTo(span === 1 ? k : 0.25 * k, 10);
      expect(labels.edgeDampingNsPerM[e]).toBeGreaterThan(0);
    }
    expect(edges.filter((e) => e.startsWith('structural')).length).toBe(parts);
    expect(edges.filter((e) => e.startsWith('second-neighbour')).length).toBe(parts - 1);
    expect(new Set(edges).size).toBe(edges.length);
  });

  it('labels are copies: later changes to the model do not rewrite them', () => {
    const rest = labels.edgeRestLengthM[0];
    system.model.stiffnessNPerM[0] *= 2;
    expect(labels.edgeStiffnessNPerM[0]).toBeCloseTo(60 / 0.2, 10);
    expect(labels.edgeRestLengthM[0]).toBe(rest);
    system.model.stiffnessNPerM[0] /= 2;
  });
});

describe('graph labels of a lattice (material map definitions in sim/systems/lattice.ts)', () => {
  const materials: LatticeMaterial[] = [
    { name: 'eel body', youngsModulusPa: 3e4, densityKgPerM3: 1000, dampingRatio: 0.1, actuatorChannel: null, actuationStrainMax: 0 },
    { name: 'eel actuator', youngsModulusPa: 2e4, densityKgPerM3: 1050, dampingRatio: 0.1, actuatorChannel: 0, actuationStrainMax: 0.2 },
  ];
  // 2-D rows [y][x]: bottom row passive, top row: actuator, passive, actuator.
  const system = buildLattice({ cellSizeM: 0.02, materialMap: [[1, 1, 1], [2, 1, 2]], materials, base: 'free', originM: [0, 0, 0] });
  const model = system.model;
  const labels = graphLabels(model);

  it('cells with their materials and channels in map order, corners at the right places', () => {
    expect(Array.from(labels.cellMaterial)).toEqual([0, 0, 0, 1, 0, 1]);
    expect(Array.from(labels.cellChannel)).toEqual([-1, -1, -1, 0, -1, 0]);
    expect(labels.cells.length).toBe(6 * 4);
    // Cell c sits at grid (c % 3, ⌊c / 3⌋); its corner j at offset (j & 1, j >> 1).
    for (let c = 0; c < 6; c++) {
      for (let j = 0; j < 4; j++) {
        const node = labels.cells[4 * c + j];
        expect(model.positionM[3 * node]).toBeCloseTo(0.02 * ((c % 3) + (j & 1)), 15);
        expect(model.positionM[3 * node + 1]).toBeCloseTo(0.02 * (Math.floor(c / 3) + (j >> 1)), 15);
      }
    }
  });

  it('node features give the first owning cell\'s material and the channel of any actuated cell', () => {
    // Worked from the map (cells are visited row by row from the bottom): nodes of rows y = 0
    // and 1 first belong to bottom-row (passive) cells; on row 2 the first owner of x = 0, 1
    // and 3 is a actuator cell, of x = 2 the passive middle cell. Every node touching a actuator
    // cell (all of rows 1 and 2) reads its channel 0.
    const expectedMaterial = [[0, 0, 0, 0], [0, 0, 0, 0], [1, 1, 0, 1]];
    const expectedChannel = [[-1, -1, -1, -1], [0, 0, 0, 0], [0, 0, 0, 0]];
    expect(model.nodeCount).toBe(12);
    for (let i = 0; i < model.nodeCount; i++) {
      const x = Math.round(model.positionM[3 * i] / 0.02);
      const y = Math.round(model.positionM[3 * i + 1] / 0.02);
      const row = Array.from(labels.nodeFeatures.subarray(i * F, (i + 1) * F));
      expect(row.slice(1)).toEqual([0, 0, 0, expectedMaterial[y][x], expectedChannel[y][x]]);
    }
  });

  it('edge rest lengths stay the built ones while actuation changes the live rest lengths', () => {
    applyActuation(model, Float64Array.of(1));
    let changed = 0;
    for (let s = 0; s < model.springCount; s++) if (model.restLengthM[s] !== model.baseRestLengthM[s]) changed++;
    expect(changed).toBeGreaterThan(0);
    const fresh = graphLabels(model);
    const x = model.positionM;
    for (let e = 0; e < model.springCount; e++) {
      const [a, b] = [fresh.edges[2 * e], fresh.edges[2 * e + 1]];
      const built = Math.hypot(x[3 * b] - x[3 * a], x[3 * b + 1] - x[3 * a + 1], x[3 * b + 2] - x[3 * a + 2]);
      expect(fresh.edgeRestLengthM[e]).toBeCloseTo(built, 15);
    }
  });
});
