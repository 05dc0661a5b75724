// Solves the grey-box regression y ≈ A·θ by linear least squares with ml-matrix's singular
// value decomposition. Columns are scaled to unit length first (equilibration; Golub & Van
// Loan, Matrix Computations, §3.5.2) so the condition number describes the problem and not the
// units. Standard errors are those of ordinary least squares, se_j = √(s²·[(AᵀA)⁻¹]_jj) with
// s² = ‖y − Aθ‖²/(rows − columns) (e.g. Seber & Lee, Linear Regression Analysis, §3.3); they
// assume independent residuals, which recorded trajectories only approximate. A column that is
// zero throughout (a term the episode never exercises) is not identifiable: null.
import { Matrix, SingularValueDecomposition } from 'ml-matrix';

export interface LeastSquaresResult {
  /** Per column, or null where the column is zero or below the numerical rank. */
  estimate: (number | null)[];
  standardError: (number | null)[];
  /** σ_max/σ_min of the column-scaled design over the identifiable columns. */
  condition: number;
  residualRms: number;
  rows: number;
}

export function solveLeastSquares(matrix: Float64Array, target: Float64Array, rows: number, columns: number): LeastSquaresResult {
  const norms = new Float64Array(columns);
  for (let r = 0; r < rows; r++) for (let c = 0; c < columns; c++) norms[c] += matrix[r * columns + c] ** 2;
  const kept: number[] = [];
  for (let c = 0; c < columns; c++) {
    norms[c] = Math.sqrt(norms[c]);
    if (norms[c] > 0) kept.push(c);
  }
  const estimate: (number | null)[] = new Array(columns).fill(null);
  const standardError: (number | null)[] = new Array(columns).fill(null);
  if (kept.length === 0 || rows <= kept.length) return { estimate, standardError, condition: Infinity, residualRms: NaN, rows };
  const q = kept.length;
  const scaled = new Matrix(rows, q);
  for (let r = 0; r < rows; r++) for (let j = 0; j < q; j++) scaled.set(r, j, matrix[r * columns + kept[j]] / norms[kept[j]]);
  const svd = new SingularValueDecomposition(scaled, { autoTranspose: true });
  const sigma = svd.diagonal;
  const tolerance = Math.max(rows, q) * Number.EPSILON * sigma[0];
  const rank = sigma.filter((s) => s > tolerance).length;
  const y = Matrix.columnVector(Array.from(target));
  const u = svd.leftSingularVectors;
  const v = svd.rightSingularVectors;
  const uty = u.transpose().mmul(y);
  const theta = new Float64Array(q);
  for (let i = 0; i < rank; i++) {
    const w = uty.get(i, 0) / sigma[i];
    for (let j = 0; j < q; j++) theta[j] += v.get(j, i) * w;
  }
  let rss = 0;
  for (let r = 0; r < rows; r++) {
    let fitted = 0;
    for (let j = 0; j < q; j++) fitted += scaled.get(r, j) * theta[j];
    rss += (target[r] - fitted) ** 2;
  }
  const s2 = rss / (rows - q);
  for (let j = 0; j < q; j++) {
    if (rank < q) continue; // a rank-deficient design leaves every estimate in doubt
    let variance = 0;
    for (let i = 0; i < q; i++) variance += (v.get(j, i) / sigma[i]) ** 2;
    const c = kept[j];
    estimate[c] = theta[j] / norms[c];
    standardError[c] = Math.sqrt(s2 * variance) / norms[c];
  }
  if (rank < q) for (let j = 0; j < q; j++) estimate[kept[j]] = theta[j] / norms[kept[j]];
  return { estimate, standardError, condition: sigma[0] / sigma[q - 1], residualRms: Math.sqrt(rss / rows), rows };
}
