// The centred L2 discrepancy of a point set in [0, 1)^d (Hickernell 1998, "A generalized
// discrepancy and quadrature error bound", Math. Comp. 67, 299-322, eq. for CD; the same formula
// as SciPy's scipy.stats.qmc.discrepancy(method="CD")), as the squared value SciPy returns:
//   CD^2 = (13/12)^d - (2/n) sum_i prod_k (1 + |x_ik - 1/2|/2 - |x_ik - 1/2|^2/2)
//          + (1/n^2) sum_i sum_j prod_k (1 + |x_ik - 1/2|/2 + |x_jk - 1/2|/2 - |x_ik - x_jk|/2).
// Lower is more evenly spread. It costs n^2 d operations, so callers bound n.

/** Squared centred L2 discrepancy of `n` points stored point by point (row-major n × d). */
export function centredL2DiscrepancySquared(points: Float64Array, n: number, d: number): number {
  if (n < 1 || d < 1 || points.length !== n * d) throw new RangeError(`centred discrepancy needs n × d = ${n} × ${d} coordinates, got ${points.length}`);
  let single = 0;
  for (let i = 0; i < n; i++) {
    let product = 1;
    for (let k = 0; k < d; k++) {
      const a = Math.abs(points[i * d + k] - 0.5);
      product *= 1 + 0.5 * a - 0.5 * a * a;
    }
    single += product;
  }
  let pairs = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let product = 1;
      for (let k = 0; k < d; k++) {
        const xi = points[i * d + k];
        const xj = points[j * d + k];
        product *= 1 + 0.5 * Math.abs(xi - 0.5) + 0.5 * Math.abs(xj - 0.5) - 0.5 * Math.abs(xi - xj);
      }
      pairs += product;
    }
  }
  return (13 / 12) ** d - (2 / n) * single + pairs / (n * n);
}
