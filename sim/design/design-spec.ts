// What a scenario's "design" key says: how the episodes' points in the space of distributed
// parameters are chosen. "independent" (the default, and what a scenario without the key does)
// draws every parameter of every episode on its own; the others place the episodes jointly.
import type { NumericValueSpec } from '../random/distribution.ts';

export type DesignKind = 'independent' | 'grid' | 'latin-hypercube' | 'sobol';

export const DESIGN_KINDS: readonly DesignKind[] = ['independent', 'grid', 'latin-hypercube', 'sobol'];

export interface DesignSpec {
  kind: DesignKind;
  /** Grid only: levels per parameter, keyed by the parameter's JSON pointer. */
  levels?: Record<string, number>;
}

/** A distributed parameter as a design sees it. */
export interface DesignParameter {
  pointer: string;
  spec: NumericValueSpec;
  /** The parameter's own random sub-stream (the one its independent draws use). */
  subStream: number;
}
