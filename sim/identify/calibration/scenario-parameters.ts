// Every numeric parameter a scenario resolves, found by running the scenario's own resolution
// code (resolve-chain, resolve-lattice, resolve-world) with a resolver that writes down each
// pointer and spec it is asked for: the same pointers the sampler labels episodes with.
import type { NumericValueSpec } from '../../random/distribution.ts';
import { isConstant } from '../../random/distribution.ts';
import type { DemandingEnd, ParameterResolver } from '../../scenario/parameter-resolver.ts';
import { resolveChainParameters } from '../../scenario/resolve-chain.ts';
import { resolveLatticeParameters } from '../../scenario/resolve-lattice.ts';
import { resolveWorld } from '../../scenario/resolve-world.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';

export interface ScenarioParameter {
  pointer: string;
  spec: NumericValueSpec;
  demanding: DemandingEnd;
  /** True when the spec is a distribution that can give more than one value. */
  distributed: boolean;
  /**
   * The value a calibration starts from: a constant itself, the middle of a uniform range,
   * the geometric middle of a log-uniform one, a normal's mean; null for integer and choice
   * specs, which a calibration cannot fit and the bench must state.
   */
  nominal: number | null;
}

class ListingResolver implements ParameterResolver {
  readonly found = new Map<string, ScenarioParameter>();

  value(spec: NumericValueSpec, pointer: string, demanding: DemandingEnd): number {
    const nominal = nominalValue(spec);
    if (!this.found.has(pointer)) this.found.set(pointer, { pointer, spec, demanding, distributed: !isConstant(spec), nominal });
    // Integer and choice specs still need a value to carry on resolving; their smallest one.
    return nominal ?? firstValue(spec);
  }
}

/** Each numeric parameter of the scenario's system and world, in resolution order. */
export function scenarioParameters(scenario: Scenario): ScenarioParameter[] {
  const resolver = new ListingResolver();
  if (scenario.system.kind === 'chain') resolveChainParameters(scenario.system, resolver);
  else resolveLatticeParameters(scenario.system, resolver);
  resolveWorld(scenario.world, resolver);
  return [...resolver.found.values()];
}

export function nominalValue(spec: NumericValueSpec): number | null {
  if (typeof spec === 'number') return spec;
  switch (spec.kind) {
    case 'uniform':
      return 0.5 * (spec.min + spec.max);
    case 'log-uniform':
      return Math.sqrt(spec.min * spec.max);
    case 'normal':
      return spec.mean;
    case 'integer':
    case 'categorical':
      return isConstant(spec) ? firstValue(spec) : null;
  }
}

function firstValue(spec: NumericValueSpec): number {
  if (typeof spec === 'number') return spec;
  if (spec.kind === 'categorical') return spec.values[0];
  return spec.min;
}
