// Normal modes of a model linearised about its current state: K from stiffness-matrix.ts over
// the free coordinates, the mass-weighted problem A = M^(−1/2)·K·M^(−1/2) (symmetric, same
// eigenvalues ω² as M⁻¹K; common practice, no source), decomposed with ml-matrix's symmetric
// eigen-decomposition (Householder tridiagonalisation and QL, eigenvalues ascending). A mode's
// displacement shape is u = M^(−1/2)·q for the eigenvector q. The dense decomposition costs
// O(n³) time and n² memory, so callers cap n (scenarios: MAX_MODE_COORDINATES in
// sim/scenario/scenario-limits.ts).
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

import type { Model } from './model.ts';
import { NODE_DRIVEN, NODE_PINNED } from './model.ts';
import { stiffnessMatrix } from './stiffness-matrix.ts';

/**
 * Eigenvalues at or below this fraction of the largest |ω²| count as zero (rigid-body motions,
 * unstressed mechanisms such as a slack string's sideways swing) and are skipped together with
 * negative ones (an unstable equilibrium). The decomposition's own error is about machine
 * epsilon (2.2e-16) times the largest eigenvalue times a small factor, the bending differences'
 * about 1e-12 of the bending stiffness; real slow modes sit far above both even for stiff
 * tethers (a hanging steel cable's sideways ω² is about m·g/(4·EA) ≈ 1e-7 of its axial one).
 */
export const ZERO_MODE_TOLERANCE = 1e-12;

/** Coordinates (3·node + axis) of the free nodes along the given axes (0 x, 1 y, 2 z), node by node. */
export function freeCoordinates(model: Model, axes: readonly number[]): Int32Array {
  const list: number[] = [];
  for (let i = 0; i < model.nodeCount; i++) {
    if (model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN)) continue;
    for (const axis of axes) list.push(3 * i + axis);
  }
  return Int32Array.from(list);
}

export interface NormalModes {
  coordinates: Int32Array;
  /** ω² of every mode, ascending, rad²/s² (zero and negative ones included). */
  eigenvalues: Float64Array;
  /** Displacement shape of mode m (in eigenvalue order) at [m·n + c], for coordinate c; unscaled. */
  shapes: Float64Array;
}

export function normalModes(model: Model, coordinates: Int32Array): NormalModes {
  const n = coordinates.length;
  const k = stiffnessMatrix(model, coordinates);
  const rootMass = new Float64Array(n);
  for (let c = 0; c < n; c++) rootMass[c] = Math.sqrt(model.massKg[Math.floor(coordinates[c] / 3)]);
  const a = new Matrix(n, n);
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) a.set(r, c, k[r * n + c] / (rootMass[r] * rootMass[c]));
  const decomposition = new EigenvalueDecomposition(a, { assumeSymmetric: true });
  const vectors = decomposition.eigenvectorMatrix;
  const values = decomposition.realEigenvalues;
  // ml-matrix returns them ascending; sorting keeps that a property of this file, not of the library.
  const order = Array.from({ length: n }, (_, i) => i).sort((p, q) => values[p] - values[q] || p - q);
  const eigenvalues = new Float64Array(n);
  const shapes = new Float64Array(n * n);
  order.forEach((column, m) => {
    eigenvalues[m] = values[column];
    for (let c = 0; c < n; c++) shapes[m * n + c] = vectors.get(c, column) / rootMass[c];
  });
  return { coordinates, eigenvalues, shapes };
}

/** Indices (in eigenvalue order) of the modes above ZERO_MODE_TOLERANCE: mode 1 is the first of these. */
export function vibrationModes(modes: NormalModes): number[] {
  let largest = 0;
  for (const value of modes.eigenvalues) largest = Math.max(largest, Math.abs(value));
  const kept: number[] = [];
  modes.eigenvalues.forEach((value, m) => {
    if (largest > 0 && value > ZERO_MODE_TOLERANCE * largest) kept.push(m);
  });
  return kept;
}
