// The standard normal distribution function Phi and its upper tail Q = 1 - Phi, accurate in
// relative terms far into the tails, for the inverse-CDF mapping of designs. No polynomial
// coefficients to mistype: erf from its everywhere-positive series exp(-x^2) sum 2^n x^(2n+1) /
// (1·3···(2n+1)) (Abramowitz & Stegun 7.1.6) for small x, erfc from its continued fraction
// (A&S 7.1.14) evaluated by the modified Lentz method (Press et al., Numerical Recipes, 5.2) for
// larger x, where 1 - erf would cancel.

const TWO_OVER_SQRT_PI = 2 / Math.sqrt(Math.PI);
const INV_SQRT_PI = 1 / Math.sqrt(Math.PI);
const SQRT_HALF = Math.SQRT1_2;
const INV_SQRT_TWO_PI = 1 / Math.sqrt(2 * Math.PI);
/** Below this the series is used, above it the continued fraction. */
const SERIES_LIMIT = 2.5;
const MAX_TERMS = 500;

function erfSeries(x: number): number {
  const x2 = x * x;
  let term = x;
  let sum = x;
  for (let n = 1; n < MAX_TERMS; n++) {
    term *= (2 * x2) / (2 * n + 1);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return TWO_OVER_SQRT_PI * Math.exp(-x2) * sum;
}

// erfc(x) = exp(-x^2)/sqrt(pi) · 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + ...))))), x > 0.
function erfcContinuedFraction(x: number): number {
  const tiny = 1e-300;
  let f = x;
  let c = x;
  let d = 0;
  for (let n = 1; n < MAX_TERMS; n++) {
    const a = n / 2;
    d = x + a * d;
    d = Math.abs(d) < tiny ? tiny : d;
    c = x + a / c;
    c = Math.abs(c) < tiny ? tiny : c;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return (INV_SQRT_PI * Math.exp(-x * x)) / f;
}

/** erfc(x) for any finite x. */
export function erfc(x: number): number {
  if (x < 0) return 2 - erfc(-x);
  if (x < SERIES_LIMIT) return 1 - erfSeries(x);
  return erfcContinuedFraction(x);
}

/** Phi(z), the standard normal distribution function. */
export function standardNormalCdf(z: number): number {
  return 0.5 * erfc(-z * SQRT_HALF);
}

/** Q(z) = 1 - Phi(z), computed without cancellation for large z. */
export function standardNormalUpperTail(z: number): number {
  return 0.5 * erfc(z * SQRT_HALF);
}

export function standardNormalDensity(z: number): number {
  return INV_SQRT_TWO_PI * Math.exp(-0.5 * z * z);
}
