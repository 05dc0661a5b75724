// The stability bound against the true largest natural frequency. SciPy's generalised
// symmetric eigensolver scipy.linalg.eigh(K, M) (LAPACK sygvd) in Debian's /usr/bin/python3
// computes ω_max² as the largest eigenvalue of K·φ = ω²·M·φ, with K assembled in Python from
// the model's edges and stiffnesses (each spring adds k·n·nᵀ to its two diagonal blocks and
// −k·n·nᵀ to the off-diagonal ones: the direct stiffness method, e.g. Cook et al., Concepts
// and Applications of Finite Element Analysis; away from rest plus the geometric stiffness
// k·(1 − L0/L)·(I − n·nᵀ), same reference) and pinned degrees of freedom removed. Gershgorin's theorem (block form, Feingold & Varga 1962) makes our bound an upper
// bound; the check also asks that it is not wasteful: within a factor 2.
import { beforeAll, describe, expect, it } from 'vitest';

import type { Model } from '../sim/core/model.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import type { ChainAnchor } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import type { LatticeBase, LatticeMaterial, MaterialMap2D, MaterialMap3D } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

const EIGEN_SCRIPT = String.raw`
import sys, json
import numpy as np
from scipy.linalg import eigh

out = []
for d in json.load(sys.stdin):
    x = np.array(d['positionM'], dtype=float).reshape(-1, 3)
    m = np.array(d['massKg'], dtype=float)
    free = np.array(d['free'], dtype=bool)
    n = len(m)
    K = np.zeros((3 * n, 3 * n))
    for a, b, k, rest in zip(d['springA'], d['springB'], d['stiffnessNPerM'], d['restLengthM']):
        u = x[b] - x[a]
        length = np.linalg.norm(u)
        u = u / length
        # Tangent stiffness of a spring at length L: material part k*n*n^T plus the geometric
        # part k*(1 - L0/L)*(I - n*n^T); the latter vanishes at rest.
        block = k * (np.outer(u, u) + (1.0 - rest / length) * (np.eye(3) - np.outer(u, u)))
        K[3*a:3*a+3, 3*a:3*a+3] += block
        K[3*b:3*b+3, 3*b:3*b+3] += block
        K[3*a:3*a+3, 3*b:3*b+3] -= block
        K[3*b:3*b+3, 3*a:3*a+3] -= block
    dofs = np.repeat(free, 3)
    Kf = K[np.ix_(dofs, dofs)]
    Mf = np.diag(np.repeat(m[free], 3))
    w = eigh(Kf, Mf, eigvals_only=True)
    out.append(float(np.sqrt(max(w[-1], 0.0))))
print(json.dumps(out))
`;

interface Case {
  name: string;
  model: Model;
}

function chainCase(partCount: number, anchor: ChainAnchor, secondNeighbourSpringRatio: number): Case {
  const model = buildChain({
    partCount, lengthM: 0.1 * partCount, totalMassKg: 0.02 * partCount, axialStiffnessN: 50, secondNeighbourSpringRatio,
    dampingRatio: 0.05, diameterM: 0.008, anchor, originM: [0, 1, 0], directionUnit: [0.6, -0.8, 0], forceHandles: [], forceAxes: [], drivenAxes: [],
  }).model;
  return { name: `chain of ${partCount} parts, ${anchor}, bending ratio ${secondNeighbourSpringRatio}`, model };
}

const MATERIALS: LatticeMaterial[] = [
  { name: 'eel body', youngsModulusPa: 3e4, densityKgPerM3: 1000, dampingRatio: 0.1, actuatorChannel: 0, actuationStrainMax: 0.1 },
  { name: 'fin rib', youngsModulusPa: 6e5, densityKgPerM3: 1400, dampingRatio: 0.1, actuatorChannel: null, actuationStrainMax: 0 },
  { name: 'foam float', youngsModulusPa: 1e4, densityKgPerM3: 200, dampingRatio: 0.2, actuatorChannel: null, actuationStrainMax: 0 },
];

function latticeCase(name: string, map: MaterialMap2D | MaterialMap3D, base: LatticeBase): Case {
  return { name, model: buildLattice({ cellSizeM: 0.02, materialMap: map, materials: MATERIALS, base, originM: [0, 0, 0] }).model };
}

const CASES: Case[] = [
  chainCase(1, 'free', 0),
  chainCase(3, 'top-pinned', 0),
  chainCase(3, 'top-pinned', 0.5),
  chainCase(10, 'free', 0),
  chainCase(10, 'both-pinned', 0.2),
  chainCase(40, 'top-pinned', 0),
  chainCase(40, 'free', 1),
  latticeCase('2-D 6×3 lattice, three materials, an empty corner', [[1, 1, 2, 2, 3, 3], [1, 2, 2, 3, 3, 0], [2, 2, 3, 3, 0, 0]], 'free'),
  latticeCase('2-D 5×4 lattice, two materials, clamped base', [[2, 2, 2, 2, 2], [1, 1, 1, 1, 1], [1, 3, 1, 3, 1], [1, 1, 1, 1, 1]], 'clamped'),
  latticeCase('3-D 3×2×3 lattice, three materials, free', [
    [[1, 2, 3], [2, 3, 1], [3, 1, 2]],
    [[2, 2, 0], [1, 3, 3], [0, 1, 1]],
  ], 'free'),
  latticeCase('3-D 2×3×2 lattice, stiff ribs on soft body, clamped base', [
    [[2, 2], [2, 2]],
    [[1, 1], [1, 1]],
    [[1, 2], [3, 1]],
  ], 'clamped'),
  deformed(chainCase(12, 'top-pinned', 0.3), 'stretched to about 1.6× its rest length', (x, i) => x * (i % 3 === 1 ? 1.8 : 1)),
  deformed(latticeCase('3-D 3×2×3 lattice', [
    [[1, 2, 3], [2, 3, 1], [3, 1, 2]],
    [[2, 2, 1], [1, 3, 3], [1, 1, 1]],
  ], 'free'), 'with every node displaced by up to 25% of a cell', (x, i) => x + 0.005 * Math.sin(7.3 * i + 1.1)),
];

/** The same model in a deformed configuration, so the geometric stiffness is in play. */
function deformed(c: Case, how: string, move: (x: number, index: number) => number): Case {
  const x = c.model.positionM;
  for (let i = 0; i < x.length; i++) x[i] = move(x[i], i);
  return { name: `${c.name}, ${how}`, model: c.model };
}

describe.runIf(python.available)('stability bound vs scipy.linalg.eigh(K, M) (Gershgorin upper bound, Feingold & Varga 1962)', () => {
  let trueOmegas: number[] = [];
  beforeAll(() => {
    const models = CASES.map(({ model }) => ({
      positionM: Array.from(model.positionM),
      massKg: Array.from(model.massKg),
      free: Array.from(model.inverseMassPerKg, (w) => w > 0),
      springA: Array.from(model.springNodeA),
      springB: Array.from(model.springNodeB),
      stiffnessNPerM: Array.from(model.stiffnessNPerM),
      restLengthM: Array.from(model.restLengthM),
    }));
    trueOmegas = runReferencePython<number[]>(EIGEN_SCRIPT, models);
    expect(trueOmegas.length).toBe(CASES.length);
  });

  CASES.forEach(({ name, model }, index) => {
    it(`${name}: ω_true ≤ ω_bound ≤ 2·ω_true`, () => {
      const omegaTrue = trueOmegas[index];
      expect(omegaTrue).toBeGreaterThan(0);
      const omegaBound = stabilityBound(model).omegaMaxRadPerS;
      expect(omegaBound).toBeGreaterThanOrEqual(omegaTrue * (1 - 1e-9));
      expect(omegaBound).toBeLessThanOrEqual(2 * omegaTrue);
    });
  });
});
