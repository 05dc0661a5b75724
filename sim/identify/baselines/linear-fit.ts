// Fits the operator G = [A_0 … A_K  B  b] of z_{t+1} ≈ G·ω_t by least squares through a
// truncated singular value decomposition of the snapshot matrix (dynamic mode decomposition
// with control: Proctor, Brunton & Kutz, "Dynamic mode decomposition with control", SIAM J.
// Appl. Dyn. Syst. 15(1), 2016, eqs. 3.5–3.9): with Ωᵀ = U Σ Vᵀ truncated to rank r,
// Gᵀ = V_r Σ_r⁻¹ U_rᵀ Z'ᵀ, the minimum-norm least-squares solution on the kept subspace.
// The decomposition is ml-matrix's.
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { chooseRank, numericalRankTolerance, type RankChoice } from './rank-rule.ts';
import type { SnapshotMatrices } from './linear-snapshots.ts';

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
  /** Root mean square of the one-step residual Z' − GΩ over the fitted snapshots. */
  oneStepRms: number;
}

export function fitLinearOperator(snapshots: SnapshotMatrices, choice: RankChoice): LinearOperatorFit {
  const m = snapshots.rows;
  const p = snapshots.snapshotSize;
  const n = snapshots.stateSize;
  const omegaT = Matrix.from1DArray(m, p, snapshots.inputsT);
  const nextT = Matrix.from1DArray(m, n, snapshots.nextStatesT);
  const svd = new SingularValueDecomposition(omegaT, { autoTranspose: true, computeLeftSingularVectors: true, computeRightSingularVectors: true });
  const sigma = svd.diagonal;
  const rank = chooseRank(sigma, m, p, choice);
  const u = svd.leftSingularVectors; // m × min(m, p)
  const v = svd.rightSingularVectors; // p × min(m, p)
  // Gᵀ = V_r Σ_r⁻¹ (U_rᵀ Z'ᵀ), formed without the unkept columns.
  const ur = u.subMatrix(0, m - 1, 0, Math.max(rank, 1) - 1);
  const vr = v.subMatrix(0, p - 1, 0, Math.max(rank, 1) - 1);
  const projected = ur.transpose().mmul(nextT); // r × n
  for (let i = 0; i < rank; i++) for (let c = 0; c < n; c++) projected.set(i, c, projected.get(i, c) / sigma[i]);
  const gT = rank > 0 ? vr.mmul(projected) : Matrix.zeros(p, n); // p × n
  const operator = new Float64Array(n * p);
  for (let r = 0; r < n; r++) for (let c = 0; c < p; c++) operator[r * p + c] = gT.get(c, r);
  const residual = nextT.sub(omegaT.mmul(gT));
  let sumSquares = 0;
  for (let i = 0; i < m; i++) for (let c = 0; c < n; c++) sumSquares += residual.get(i, c) ** 2;
  return {
    operator,
    stateSize: n,
    snapshotSize: p,
    snapshotCount: m,
    singularValues: sigma.slice(),
    rank,
    rankTolerance: numericalRankTolerance(sigma, m, p),
    oneStepRms: Math.sqrt(sumSquares / Math.max(1, m * n)),
  };
}
