// Fits the operator G = [A_0 … A_K  B  b] of z_{t+1} ≈ G·ω_t by least squares through a
// truncated singular value decomposition of the snapshot matrix (dynamic mode decomposition
// with control: Proctor, Brunton & Kutz, "Dynamic mode decomposition with control", SIAM J.
// Appl. Dyn. Syst. 15(1), 2016, eqs. 3.5–3.9): with Ωᵀ = U Σ Vᵀ truncated to rank r,
// Gᵀ = V_r Σ_r⁻¹ U_rᵀ Z'ᵀ, the minimum-norm least-squares solution on the kept subspace.
// The decompositions (SVD, eigenvalues for the "stable" rule) are ml-matrix's.
import { EigenvalueDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';

import type { SnapshotMatrices } from './linear-snapshots.ts';
import { chooseRank, numericalRankTolerance, type RankChoice } from './rank-rule.ts';

export interface LinearOperatorFit {
  /** n × p, row-major. */
  operator: Float64Array;
  stateSize: number;
  snapshotSize: number;
  snapshotCount: number;
  /** All singular values of Ωᵀ, descending. */
  singularValues: number[];
  rank: number;
  rankTolerance: number;
  /** Spectral radius of the fitted state-transition matrix (delay companion form). */
  spectralRadius: number;
  /** Root mean square of the one-step residual Z' − GΩ over the fitted snapshots. */
  oneStepRms: number;
}

/** Spectral radius above which the "stable" rule calls an operator unstable: 1 plus rounding. */
const STABLE_RADIUS = 1 + 1e-9;

export function fitLinearOperator(snapshots: SnapshotMatrices, choice: RankChoice, delays = 0): LinearOperatorFit {
  const m = snapshots.rows;
  const p = snapshots.snapshotSize;
  const n = snapshots.stateSize;
  const omegaT = Matrix.from1DArray(m, p, snapshots.inputsT);
  const nextT = Matrix.from1DArray(m, n, snapshots.nextStatesT);
  const svd = new SingularValueDecomposition(omegaT, { autoTranspose: true });
  const sigma = svd.diagonal;
  const u = svd.leftSingularVectors; // m × min(m, p)
  const v = svd.rightSingularVectors; // p × min(m, p)
  const projected = u.transpose().mmul(nextT); // min(m, p) × n: U ᵀ Z'ᵀ, shared by every rank
  const operatorOfRank = (rank: number): Float64Array => {
    const operator = new Float64Array(n * p);
    for (let i = 0; i < rank; i++) {
      for (let r = 0; r < n; r++) {
        const w = projected.get(i, r) / sigma[i];
        if (w === 0) continue;
        for (let c = 0; c < p; c++) operator[r * p + c] += v.get(c, i) * w;
      }
    }
    return operator;
  };
  let rank: number;
  if (choice.kind === 'stable') {
    // The largest rank up to the numerical one whose rollout cannot grow without bound; found
    // by bisection, taking stability to be lost once and for all as the rank grows.
    let high = chooseRank(sigma, m, p, { kind: 'auto' });
    if (spectralRadius(operatorOfRank(high), n, p, delays) <= STABLE_RADIUS) rank = high;
    else {
      let low = 0;
      while (high - low > 1) {
        const mid = (low + high) >> 1;
        if (spectralRadius(operatorOfRank(mid), n, p, delays) <= STABLE_RADIUS) low = mid;
        else high = mid;
      }
      rank = low;
    }
  } else rank = chooseRank(sigma, m, p, choice);
  const operator = operatorOfRank(rank);
  let sumSquares = 0;
  for (let j = 0; j < m; j++) {
    for (let r = 0; r < n; r++) {
      let fitted = 0;
      for (let c = 0; c < p; c++) fitted += operator[r * p + c] * snapshots.inputsT[j * p + c];
      sumSquares += (snapshots.nextStatesT[j * n + r] - fitted) ** 2;
    }
  }
  return {
    operator,
    stateSize: n,
    snapshotSize: p,
    snapshotCount: m,
    singularValues: sigma.slice(),
    rank,
    rankTolerance: numericalRankTolerance(sigma, m, p),
    spectralRadius: spectralRadius(operator, n, p, delays),
    oneStepRms: Math.sqrt(sumSquares / Math.max(1, m * n)),
  };
}

/**
 * Largest |λ| of the state-transition matrix of z_{t+1} = Σ_d A_d z_{t−d} + …, written in
 * companion form [A_0 … A_K; I 0 …; …; 0 … I 0] so delays are part of the state.
 */
export function spectralRadius(operator: Float64Array, n: number, p: number, delays: number): number {
  const size = n * (delays + 1);
  const companion = new Matrix(size, size);
  for (let r = 0; r < n; r++) for (let c = 0; c < size; c++) companion.set(r, c, operator[r * p + c]);
  for (let r = n; r < size; r++) companion.set(r, r - n, 1);
  const eigen = new EigenvalueDecomposition(companion);
  let radius = 0;
  const re = eigen.realEigenvalues;
  const im = eigen.imaginaryEigenvalues;
  for (let i = 0; i < re.length; i++) radius = Math.max(radius, Math.hypot(re[i], im[i]));
  return radius;
}
