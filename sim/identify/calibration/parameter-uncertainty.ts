// Standard errors and identifiability at a least-squares optimum, by the textbook linearisation
// of nonlinear least squares (Seber & Wild, Nonlinear Regression, 1989, ch. 2 and 5; chapters from memory):
//   σ̂² = SSR / (n − p),   Cov(θ̂) ≈ σ̂² (JᵀJ)⁻¹,
// with J the Jacobian of the model over the scaled parameters θ at the optimum. A value's
// standard error follows by the delta method, SE(v) = |dv/dθ|·SE(θ). A parameter is called not
// identifiable from the data when J is numerically rank-deficient in a direction it takes part
// in (a singular value below RELATIVE_SINGULAR_VALUE_FLOOR of the largest; the parameter's
// share of that right singular vector at least NULL_DIRECTION_SHARE), or when its relative
// standard error exceeds RELATIVE_STANDARD_ERROR_CEILING. The thresholds are our choices
// (common practice, no source): 1e-6 is far above the rounding of a forward simulation and far
// below any direction the data really informs; a standard error of half the value means the
// data does not pin the parameter down.
import { inverse, Matrix, SingularValueDecomposition } from 'ml-matrix';

import type { FreeParameter } from './free-parameters.ts';
import { valuePerTheta } from './free-parameters.ts';

export const RELATIVE_SINGULAR_VALUE_FLOOR = 1e-6;
export const NULL_DIRECTION_SHARE = 0.2;
export const RELATIVE_STANDARD_ERROR_CEILING = 0.5;

export interface NotIdentifiable {
  /** Index into the parameters given. */
  index: number;
  reason: string;
}

export interface ParameterUncertainty {
  residualCount: number;
  degreesOfFreedom: number;
  ssrM2: number;
  /** σ̂, the residual standard deviation, m. */
  sigmaM: number;
  /** Singular values of J over θ, largest first. */
  singularValues: number[];
  relativeSingularValues: number[];
  /** σ̂²(JᵀJ)⁻¹ over θ; null when JᵀJ is singular. */
  covarianceTheta: number[][] | null;
  seTheta: number[];
  /** Standard errors in each parameter's own unit. */
  seValue: number[];
  correlation: number[][];
  notIdentifiable: NotIdentifiable[];
}

/**
 * `columns[j]` is ∂(simulated coordinates)/∂θ_j at the optimum; `theta` the optimum of the
 * parameters `params` (same order); `ssrM2` the sum of squared residuals there.
 */
export function parameterUncertainty(columns: readonly Float64Array[], params: readonly FreeParameter[], theta: ArrayLike<number>, values: ArrayLike<number>, ssrM2: number): ParameterUncertainty {
  const p = columns.length;
  const n = columns[0].length;
  const jacobian = new Matrix(n, p);
  for (let j = 0; j < p; j++) for (let i = 0; i < n; i++) jacobian.set(i, j, columns[j][i]);
  const degreesOfFreedom = n - p;
  const sigma2 = ssrM2 / degreesOfFreedom;

  const svd = new SingularValueDecomposition(jacobian, { computeLeftSingularVectors: false, computeRightSingularVectors: true, autoTranspose: false });
  const order = svd.diagonal.map((s, i) => [s, i] as const).sort((a, b) => b[0] - a[0]);
  const singularValues = order.map(([s]) => s);
  const largest = singularValues[0];
  const relativeSingularValues = singularValues.map((s) => (largest > 0 ? s / largest : 0));
  const flagged = new Map<number, string>();
  const right = svd.rightSingularVectors;
  order.forEach(([s, column], rank) => {
    if (!(relativeSingularValues[rank] < RELATIVE_SINGULAR_VALUE_FLOOR)) return;
    for (let j = 0; j < p; j++) {
      if (Math.abs(right.get(j, column)) >= NULL_DIRECTION_SHARE && !flagged.has(j)) {
        const partners = [];
        for (let k = 0; k < p; k++) if (k !== j && Math.abs(right.get(k, column)) >= NULL_DIRECTION_SHARE) partners.push(params[k].pointer);
        flagged.set(
          j,
          `the data cannot tell it apart${partners.length ? ` from ${partners.join(', ')}` : ''}: the Jacobian's singular value ${s.toExponential(2)} along their combined direction is ${relativeSingularValues[rank].toExponential(2)} of the largest (below ${RELATIVE_SINGULAR_VALUE_FLOOR})`,
        );
      }
    }
  });

  let covarianceTheta: number[][] | null = null;
  const seTheta = new Array<number>(p).fill(Infinity);
  const seValue = new Array<number>(p).fill(Infinity);
  const correlation = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, k) => (i === k ? 1 : NaN)));
  if (relativeSingularValues[p - 1] > 0 && Number.isFinite(sigma2)) {
    const normal = jacobian.transpose().mmul(jacobian);
    const covariance = inverse(normal).mul(sigma2);
    covarianceTheta = covariance.to2DArray();
    for (let j = 0; j < p; j++) {
      seTheta[j] = Math.sqrt(Math.max(0, covariance.get(j, j)));
      seValue[j] = Math.abs(valuePerTheta(params[j], theta[j])) * seTheta[j];
    }
    for (let i = 0; i < p; i++) for (let k = 0; k < p; k++) correlation[i][k] = covariance.get(i, k) / (seTheta[i] * seTheta[k]);
  }
  for (let j = 0; j < p; j++) {
    if (flagged.has(j)) continue;
    const relative = params[j].scaling === 'log' ? seValue[j] / Math.abs(values[j]) : seTheta[j];
    if (!(relative <= RELATIVE_STANDARD_ERROR_CEILING)) {
      flagged.set(j, `its standard error is ${Number.isFinite(relative) ? `${(100 * relative).toFixed(0)} %` : 'unbounded'} of ${params[j].scaling === 'log' ? 'its value' : 'its range'} (above ${100 * RELATIVE_STANDARD_ERROR_CEILING} %)`);
    }
  }
  const notIdentifiable = [...flagged.entries()].sort((a, b) => a[0] - b[0]).map(([index, reason]) => ({ index, reason }));
  return { residualCount: n, degreesOfFreedom, ssrM2, sigmaM: Math.sqrt(sigma2), singularValues, relativeSingularValues, covarianceTheta, seTheta, seValue, correlation, notIdentifiable };
}
