// A value spec's quantile function: the value at probability u in [0, 1). A design (grid,
// Latin hypercube, Sobol) places each episode in the unit cube; this turns each coordinate into
// the parameter's value so that the design's evenness carries over to the distribution written
// in the scenario. Uniform and log-uniform are inverted in closed form, the truncated normal by
// solving its distribution function (standard-normal-tails.ts) by bracketed Newton steps, and
// integer and categorical values by the stratum u falls in: floor(u × count), or the first
// value whose cumulative weight exceeds u × total.
import type { CategoricalSpec, ValueSpec } from './distribution.ts';
import type { JsonValue } from './json-value.ts';
import { SpecError } from './spec-problem.ts';
import { standardNormalCdf, standardNormalDensity, standardNormalUpperTail } from './standard-normal-tails.ts';
import { findValueSpecProblems } from './value-spec-problems.ts';

const MAX_ITERATIONS = 200;

/** The value of `spec` at probability `u` (0 <= u < 1). Throws a SpecError for an invalid spec. */
export function valueAtProbability(spec: ValueSpec, u: number, pointer = ''): JsonValue {
  if (!(u >= 0 && u < 1)) throw new RangeError(`probability ${u} at ${pointer || '/'} is outside [0, 1)`);
  const problems = findValueSpecProblems(spec, pointer);
  if (problems.length > 0) throw new SpecError(problems);
  if (typeof spec === 'number') return spec;
  switch (spec.kind) {
    case 'uniform':
      return Math.min(spec.max, spec.min + (spec.max - spec.min) * u);
    case 'log-uniform': {
      const logMin = Math.log(spec.min);
      return Math.min(spec.max, Math.max(spec.min, Math.exp(logMin + (Math.log(spec.max) - logMin) * u)));
    }
    case 'normal': {
      const z = truncatedStandardNormalQuantile(u, (spec.min - spec.mean) / spec.std, (spec.max - spec.mean) / spec.std);
      return Math.min(spec.max, Math.max(spec.min, spec.mean + spec.std * z));
    }
    case 'integer':
      return Math.min(spec.max, spec.min + Math.floor(u * (spec.max - spec.min + 1)));
    case 'categorical':
      return spec.values[categoryAtProbability(spec, u)];
  }
}

function categoryAtProbability(spec: CategoricalSpec, u: number): number {
  const weights = spec.weights;
  if (weights === undefined) return Math.min(spec.values.length - 1, Math.floor(u * spec.values.length));
  let total = 0;
  for (const weight of weights) total += weight;
  const target = u * total;
  let cumulative = 0;
  let lastPossible = 0;
  for (let i = 0; i < weights.length; i++) {
    if (weights[i] <= 0) continue;
    cumulative += weights[i];
    lastPossible = i;
    if (target < cumulative) return i;
  }
  return lastPossible;
}

/**
 * The u-quantile of Z ~ N(0, 1) conditioned on lower <= Z <= upper. Works with the upper tail Q
 * when the interval lies above 0 (and by symmetry below), so far tails keep their precision.
 */
export function truncatedStandardNormalQuantile(u: number, lower: number, upper: number): number {
  if (!(lower <= upper) || !Number.isFinite(lower) || !Number.isFinite(upper)) throw new RangeError(`truncated normal needs finite bounds lower <= upper, got [${lower}, ${upper}]`);
  // The lowest probability is the lower bound itself, even where Phi(lower) underflows to 0.
  if (lower === upper || u === 0) return lower;
  // Below zero, mirror onto the upper tail; 1 - u is passed beside u rather than recomputed
  // from it, because for u near 0 the subtraction would lose the digits that matter there.
  if (upper <= 0) return -upperTailQuantile(1 - u, u, -upper, -lower);
  if (lower >= 0) return upperTailQuantile(u, 1 - u, lower, upper);
  const pLower = standardNormalCdf(lower);
  const mass = standardNormalCdf(upper) - pLower;
  if (u <= 0.5) {
    const target = pLower + u * mass;
    return solveIncreasing((z) => standardNormalCdf(z) - target, lower, upper);
  }
  // Near the top Phi(z) is close to 1 and its last digits are gone; solve with Q instead.
  const tailTarget = standardNormalUpperTail(upper) + (1 - u) * mass;
  return solveIncreasing((z) => tailTarget - standardNormalUpperTail(z), lower, upper);
}

// 0 <= lower < upper, `below` + `above` = 1: Q falls from Q(lower) to Q(upper); find z with
// Q(lower) - Q(z) = below (Q(lower) - Q(upper)), measured from the end whose share is smaller
// (that share is the exact one of the two).
function upperTailQuantile(below: number, above: number, lower: number, upper: number): number {
  const qLower = standardNormalUpperTail(lower);
  const qUpper = standardNormalUpperTail(upper);
  const target = below <= above ? qLower - below * (qLower - qUpper) : qUpper + above * (qLower - qUpper);
  return solveIncreasing((z) => target - standardNormalUpperTail(z), lower, upper);
}

// Root of an increasing g on [lo, hi] whose slope is the normal density: Newton steps kept
// inside a shrinking bracket, a bisection whenever a step would leave it.
function solveIncreasing(g: (z: number) => number, lo: number, hi: number): number {
  let a = lo;
  let b = hi;
  let z = 0.5 * (a + b);
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const value = g(z);
    if (value === 0) return z;
    if (value < 0) a = z;
    else b = z;
    const slope = standardNormalDensity(z);
    let next = slope > 0 ? z - value / slope : NaN;
    if (!(next > a && next < b)) next = 0.5 * (a + b);
    if (next === z || b - a <= 4 * Number.EPSILON * Math.max(1, Math.abs(z))) return next;
    z = next;
  }
  return z;
}
