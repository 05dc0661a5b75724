// Sub-steps for a target accuracy, besides the stability rule. Semi-implicit Euler keeps a
// modified energy H̃ = H + O(dt) exactly for a linear oscillator and to exponentially long
// times otherwise (Hairer, Lubich & Wanner, Geometric Numerical Integration, 2nd ed., ch. IX);
// for x'' = −ω²x it is H̃ = ½v² + ½ω²x² − ½·dt·ω²·x·v (for v first, then x with the new
// v), so the true energy H swings in a band of relative width ω·dt peak to peak
// (from that expression and |x·v| ≤ H/ω). Choosing ω_max·dt ≤ ε, with ω_max the
// Gershgorin upper bound of the stability bound, keeps the band of every mode within ε.
import type { StabilityBound } from './stability-bound.ts';

/** Smallest number of equal sub-steps per interval with ω_max·dt ≤ targetBand (relative). */
export function accuracySubsteps(intervalS: number, bound: StabilityBound, targetBand: number): number {
  if (!(targetBand > 0)) throw new RangeError(`accuracy target must be a positive relative energy band, got ${targetBand}`);
  if (bound.omegaMaxRadPerS === 0) return 1;
  return Math.max(1, Math.ceil((intervalS * bound.omegaMaxRadPerS) / targetBand));
}
