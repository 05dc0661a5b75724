// The coverage numbers a dataset card reports for a design: the squared centred L2 discrepancy
// of its unit-cube points and, beside it, what independent uniform points of the same size give
// on average. That mean follows from the definition (centred-discrepancy.ts): with a = |x - 1/2|
// uniform on [0, 1/2], E[1 + a/2 - a^2/2] = 13/12, the cross term of two independent points also
// has mean 13/12 per coordinate (E|x - y| = 1/3), and the n diagonal terms 1 + a have mean 5/4,
// so E[CD^2] = ((5/4)^d - (13/12)^d) / n.
import { centredL2DiscrepancySquared } from './centred-discrepancy.ts';
import type { DesignPlan } from './design-plan.ts';

/** Bound on n^2 d, the discrepancy's cost, so a card of a huge sweep is still written quickly. */
export const DISCREPANCY_WORK_LIMIT = 2e8;

export interface DesignCoverage {
  /** Points the value was computed over: all of them, or the first ones when there are too many. */
  pointsMeasured: number;
  centredDiscrepancySquared: number;
  /** E[CD^2] of as many independent uniform points in as many dimensions. */
  independentMean: number;
}

export function expectedIndependentCentredDiscrepancySquared(n: number, d: number): number {
  return ((5 / 4) ** d - (13 / 12) ** d) / n;
}

export function designCoverage(plan: DesignPlan): DesignCoverage | null {
  const d = plan.pointers.length;
  if (d === 0) return null;
  const n = Math.max(1, Math.min(plan.points, Math.floor(Math.sqrt(DISCREPANCY_WORK_LIMIT / d))));
  const points = new Float64Array(n * d);
  for (let i = 0; i < n; i++) points.set(plan.coordinates(i), i * d);
  return { pointsMeasured: n, centredDiscrepancySquared: centredL2DiscrepancySquared(points, n, d), independentMean: expectedIndependentCentredDiscrepancySquared(n, d) };
}
