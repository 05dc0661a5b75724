// How the code that turns a scenario's specs into builder parameters obtains each number. The
// same resolution code serves an episode (values drawn from per-parameter streams) and the
// checks (values at the demanding end of every range), so both always visit the same
// parameters under the same JSON pointers.
import type { NumericValueSpec } from '../random/distribution.ts';

/**
 * Which end of a parameter's range makes a system hardest to integrate or largest: 'high' for
 * stiffness, damping and counts, 'low' for masses, densities, lengths and cell sizes, 'none'
 * where the stability bound and the size do not depend on it.
 */
export type DemandingEnd = 'high' | 'low' | 'none';

export interface ParameterResolver {
  /** The value to use for the parameter written as `spec` at `pointer` in the scenario. */
  value(spec: NumericValueSpec, pointer: string, demanding: DemandingEnd): number;
}
