// The system and world a calibration simulates: the scenario's own builders with every
// parameter taken from a table of chosen values (fitted, known or nominal) instead of drawn,
// and no start-state noise: the start is the scenario's laid-out shape at rest.
import type { World } from '../../core/world.ts';
import type { NumericValueSpec } from '../../random/distribution.ts';
import { latticeBody } from '../../scenario/lattice-shape.ts';
import type { ParameterResolver } from '../../scenario/parameter-resolver.ts';
import { shapeStream } from '../../scenario/parameter-streams.ts';
import { resolveChainParameters } from '../../scenario/resolve-chain.ts';
import { resolveLatticeParameters } from '../../scenario/resolve-lattice.ts';
import { resolveWorld } from '../../scenario/resolve-world.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import type { BuiltSystem } from '../../systems/built-system.ts';
import { buildChain } from '../../systems/chain.ts';
import { buildLattice } from '../../systems/lattice.ts';

class ChosenValues implements ParameterResolver {
  constructor(private readonly values: ReadonlyMap<string, number>) {}

  value(_spec: NumericValueSpec, pointer: string): number {
    const value = this.values.get(pointer);
    // The caller fills a value for every pointer scenarioParameters lists.
    if (value === undefined) throw new RangeError(`no calibration value for ${pointer}`);
    return value;
  }
}

export interface CalibrationSystem {
  system: BuiltSystem;
  world: World;
}

/**
 * Builds the system with `values` (JSON pointer → value). A lattice whose shape is grown at
 * random takes episode 0's shape, so the marker nodes mean the same body on every call.
 */
export function buildCalibrationSystem(scenario: Scenario, values: ReadonlyMap<string, number>): CalibrationSystem {
  const resolver = new ChosenValues(values);
  const spec = scenario.system;
  let system: BuiltSystem;
  if (spec.kind === 'chain') {
    system = buildChain(resolveChainParameters(spec, resolver));
  } else {
    const lattice = resolveLatticeParameters(spec, resolver);
    const body = latticeBody(spec.shape, lattice.shape, lattice.materials, spec.base === 'clamped', shapeStream(scenario.seed, 0));
    system = buildLattice({ cellSizeM: lattice.cellSizeM, materialMap: body.materialMap, materials: body.materials, base: spec.base, originM: lattice.originM });
  }
  return { system, world: resolveWorld(scenario.world, resolver) };
}
