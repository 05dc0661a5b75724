// Checks beyond the schema, on a value that already fits it: every distribution well formed
// (min ≤ max and the like), physical consistency (kinetic ≤ static friction, split fractions
// summing to 1), sizes within the limits, held-out rules that can work, control specs and
// channel names that fit the system, an observation that fits the records and the nodes, and
// sub-steps that keep the integration stable.
import { PARAMS_POINTER } from '../random/derived-expression.ts';
import type { NumericValueSpec } from '../random/distribution.ts';
import { isConstant, specBounds } from '../random/distribution.ts';
import { findValueSpecProblems } from '../random/value-spec-problems.ts';
import { findChannelKeyProblems, findControlSpecProblemsOf } from './control-checks.ts';
import { cornerSystems } from './corner-systems.ts';
import type { ParameterSite } from './demanding-corner.ts';
import { DemandingCorner } from './demanding-corner.ts';
import { findScenarioDesignProblems } from './design/design-checks.ts';
import { findHeldOutProblems } from './held-out-checks.ts';
import { findLatticeClampProblems } from './lattice-clamp-checks.ts';
import { findLatticeShapeProblems } from './lattice-shape-checks.ts';
import { linkedPointers, linkedRangeView } from './linked-parameters.ts';
import { findObservationProblems } from './observation-checks.ts';
import { resolveChainParameters } from './resolve-chain.ts';
import { resolveLatticeParameters } from './resolve-lattice.ts';
import { resolveStartState } from './resolve-start-state.ts';
import { resolveWorld } from './resolve-world.ts';
import { FRACTION_SUM_TOLERANCE, MAX_RECORDED_NODE_STATES, MAX_STRING_SEED, MIN_NODE_MASS_KG } from './scenario-limits.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { ChainSystemSpec, LatticeSystemSpec, Scenario } from './scenario-types.ts';
import { SPLIT_ORDER } from './split-assignment.ts';
import { findSplitPlanProblems } from './splits/split-plan-checks.ts';
import { findStabilityProblems } from './stability-check.ts';
import { findStartStateProblems } from './start-state-checks.ts';

/**
 * Every numeric parameter of the scenario, as the sampler will visit it: named parameters
 * first, then the places. Linked places and derived parameters appear as the range they reach.
 */
export function parameterSites(written: Scenario): ParameterSite[] {
  const scenario = linkedRangeView(written);
  const corner = new DemandingCorner('demanding');
  for (const [name, spec] of Object.entries(scenario.params ?? {})) corner.value(spec as NumericValueSpec, `${PARAMS_POINTER}/${name}`, 'none');
  if (scenario.system.kind === 'chain') resolveChainParameters(scenario.system, corner);
  else resolveLatticeParameters(scenario.system, corner);
  resolveWorld(scenario.world, corner);
  resolveStartState(scenario.initialState, corner);
  corner.value(scenario.initialState.positionNoiseM, '/initialState/positionNoiseM', 'none');
  corner.value(scenario.initialState.velocityNoiseMPerS, '/initialState/velocityNoiseMPerS', 'none');
  if (scenario.observation !== undefined) {
    corner.value(scenario.observation.positionNoiseM, '/observation/positionNoiseM', 'none');
    corner.value(scenario.observation.dropoutProbability, '/observation/dropoutProbability', 'none');
  }
  return corner.sites;
}

/**
 * `scenario` is the range view of linkedRangeView when the scenario names parameters, and
 * `written` the scenario as checked: planned splits and designs are worked out from the latter,
 * since a linked value follows from its parameters' draws, not from a range of its own.
 */
export function findPhysicalProblems(scenario: Scenario, written: Scenario = scenario): ScenarioProblem[] {
  const sites = parameterSites(scenario);
  const problems: ScenarioProblem[] = [];
  for (const site of sites) {
    // The map choice is made from "maps" and "weights", checked with the shape.
    if (site.pointer === '/system/shape/maps') continue;
    for (const p of findValueSpecProblems(site.spec, site.pointer)) problems.push({ pointer: p.pointer, message: `${p.message}; ${p.fix}` });
  }
  problems.push(...findSeedProblems(scenario));
  problems.push(...findControlSpecProblemsOf(scenario));
  // Bounds of malformed distributions mean nothing; report those first.
  if (problems.length > 0) return problems;

  problems.push(...findFrictionProblems(scenario), ...findFractionProblems(scenario), ...findHeldOutProblems(scenario.splits.heldOut, sites));
  const linked = linkedPointers(written);
  problems.push(...findScenarioDesignProblems(scenario, sites.filter((site) => !linked.has(site.pointer))));
  let maxNodes: number;
  if (scenario.system.kind === 'chain') {
    problems.push(...findChainProblems(scenario.system));
    maxNodes = specBounds(scenario.system.partCount).max + 1;
  } else {
    const shape = findLatticeShapeProblems(scenario.system);
    problems.push(...shape.problems, ...findLatticeMassProblems(scenario.system));
    maxNodes = shape.maxNodes;
    if (shape.problems.length === 0) {
      const lattice = resolveLatticeParameters(scenario.system, new DemandingCorner('demanding'));
      problems.push(...findLatticeClampProblems(scenario.system, lattice, lattice.materials));
    }
  }
  problems.push(...findObservationProblems(scenario, maxNodes));
  const states = (scenario.time.recordedSteps + 1) * maxNodes;
  if (states > MAX_RECORDED_NODE_STATES) {
    problems.push({
      pointer: '/time/recordedSteps',
      message:
        `${scenario.time.recordedSteps + 1} records × ${maxNodes} nodes (the largest system here) = ${states} node states per episode, above the limit of ` +
        `${MAX_RECORDED_NODE_STATES} (about ${Math.round((MAX_RECORDED_NODE_STATES * 48) / 1e6)} MB of positions and velocities); record fewer steps or use fewer nodes`,
    });
  }
  if (problems.length > 0) return problems;

  // Counting the held-out episodes samples every episode's parameters, so only a sound scenario gets here.
  problems.push(...findSplitPlanProblems(written, sites));
  if (problems.length > 0) return problems;

  const demanding = cornerSystems(scenario, 'demanding');
  const gentle = cornerSystems(scenario, 'gentle');
  problems.push(...findChannelKeyProblems(scenario, [...demanding, ...gentle]));
  problems.push(...findStartStateProblems(scenario, [...demanding, ...gentle], maxNodes));
  problems.push(...findStabilityProblems(scenario, demanding, cornerWords(sites)));
  return problems;
}

/** A cell corner gets an eighth of the cell's mass (a quarter in 2-D), so the lightest node is a lone cell's corner. */
function findLatticeMassProblems(spec: LatticeSystemSpec): ScenarioProblem[] {
  const smallestCellM = specBounds(spec.cellSizeM).min;
  return spec.materials.flatMap((material, i) => {
    const lightestDensity = specBounds(material.densityKgPerM3).min;
    const lightestNodeKg = (lightestDensity * smallestCellM ** 3) / 8;
    if (lightestNodeKg >= MIN_NODE_MASS_KG) return [];
    return [{
      pointer: `/system/materials/${i}/densityKgPerM3`,
      message: `can be ${lightestDensity} kg/m³, which with cells of ${smallestCellM} m gives a node ${lightestNodeKg.toPrecision(3)} kg, below the ${MIN_NODE_MASS_KG} kg Pliant simulates; give a larger density (kg/m³) or larger cells`,
    }];
  });
}

function cornerWords(sites: readonly ParameterSite[]): string {
  const varying = sites.filter((s) => s.demanding !== 'none' && !isConstant(s.spec));
  return varying.map((s) => `${s.pointer} = ${Number(s.value.toPrecision(6))}`).join(', ');
}

function findSeedProblems(scenario: Scenario): ScenarioProblem[] {
  if (typeof scenario.seed === 'string' && BigInt(scenario.seed) > MAX_STRING_SEED) {
    return [{ pointer: '/seed', message: `"${scenario.seed}" is above 18446744073709551615 (2^64 - 1), the largest seed; use a smaller one` }];
  }
  return [];
}

function findFrictionProblems(scenario: Scenario): ScenarioProblem[] {
  const surfaces: { pointer: string; kineticFriction: NumericValueSpec; staticFriction: NumericValueSpec }[] = [];
  if (scenario.world.ground !== undefined) surfaces.push({ pointer: '/world/ground', ...scenario.world.ground });
  (scenario.world.obstacles ?? []).forEach((obstacle, index) => surfaces.push({ pointer: `/world/obstacles/${index}`, ...obstacle }));
  return surfaces.flatMap((surface) => frictionProblems(surface.pointer, surface.kineticFriction, surface.staticFriction));
}

function frictionProblems(pointer: string, kineticSpec: NumericValueSpec, staticSpec: NumericValueSpec): ScenarioProblem[] {
  const kinetic = specBounds(kineticSpec);
  const stat = specBounds(staticSpec);
  if (kinetic.max <= stat.min) return [];
  const same = isConstant(kineticSpec) && isConstant(staticSpec);
  return [
    {
      pointer: `${pointer}/kineticFriction`,
      message: same
        ? `${kinetic.max} is above the static friction ${stat.min}; Coulomb friction needs kinetic ≤ static, so lower kineticFriction or raise staticFriction`
        : `can reach ${kinetic.max}, above the lowest static friction ${stat.min} (${pointer}/staticFriction); Coulomb friction needs kinetic ≤ static in every episode, so keep kineticFriction's range below staticFriction's`,
    },
  ];
}

function findFractionProblems(scenario: Scenario): ScenarioProblem[] {
  const fractions = scenario.splits.fractions;
  const sum = SPLIT_ORDER.reduce((total, name) => total + fractions[name], 0);
  if (Math.abs(sum - 1) <= FRACTION_SUM_TOLERANCE) return [];
  const parts = SPLIT_ORDER.map((name) => `${name} ${fractions[name]}`).join(' + ');
  return [{ pointer: '/splits/fractions', message: `must sum to 1 (got ${parts} = ${Number(sum.toPrecision(12))}); adjust them, e.g. train 0.8, validation 0.1, test 0.1` }];
}

function nodeIndexProblems(spec: ChainSystemSpec['pinnedNodes'][number], pointer: string, shortest: number): ScenarioProblem[] {
  const { min, max } = specBounds(spec);
  if (max > shortest) return [{ pointer, message: `can be node ${max}, which the shortest chain (${shortest} parts, nodes 0 to ${shortest}) does not have; use a smaller index, or a negative one to count from the free end` }];
  if (min < -(shortest + 1)) return [{ pointer, message: `can be ${min}, which counts past the start of the shortest chain (${shortest + 1} nodes, so -1 to -${shortest + 1}); use an index closer to the free end` }];
  return [];
}

function findChainProblems(spec: ChainSystemSpec): ScenarioProblem[] {
  const problems: ScenarioProblem[] = [];
  if (spec.directionUnit.every((c) => isConstant(c) && specBounds(c).max === 0)) {
    problems.push({ pointer: '/system/directionUnit', message: 'is the zero vector [0, 0, 0], which has no direction; give e.g. [0, -1, 0] to hang the chain downwards' });
  }
  if (spec.clampedEnds.length > 0 && specBounds(spec.bendingStiffnessNm2).min <= 0) {
    problems.push({ pointer: '/system/clampedEnds', message: 'clamps an end, but /system/bendingStiffnessNm2 can be 0, and a clamp acts through the bending rigidity; give bendingStiffnessNm2 > 0 (EI in N·m²) or leave clampedEnds out' });
  }
  // A mass that rounds to nothing per node (a denormal total, say) passes "> 0" in the schema but
  // leaves nodes massless, which the model builder cannot take.
  const lightestNodeKg = specBounds(spec.totalMassKg).min / (specBounds(spec.partCount).max + 1);
  if (!(lightestNodeKg >= MIN_NODE_MASS_KG)) {
    problems.push({ pointer: '/system/totalMassKg', message: `can be ${specBounds(spec.totalMassKg).min} kg, which gives the longest chain ${lightestNodeKg.toPrecision(3)} kg per node, below the ${MIN_NODE_MASS_KG} kg Pliant simulates; give a larger mass (it is in kg)` });
  }
  const shortest = specBounds(spec.partCount).min;
  spec.pinnedNodes.forEach((node, i) => problems.push(...nodeIndexProblems(node, `/system/pinnedNodes/${i}`, shortest)));
  spec.drivenNodes.forEach((node, i) => problems.push(...nodeIndexProblems(node, `/system/drivenNodes/${i}`, shortest)));
  const seen = new Map<number, number>();
  spec.forceHandles.forEach((handle, i) => {
    const pointer = `/system/forceHandles/${i}`;
    const { min, max } = specBounds(handle);
    if (max > shortest) {
      problems.push({ pointer, message: `can be node ${max}, which the shortest chain (${shortest} parts, nodes 0 to ${shortest}) does not have; use a smaller index, or a negative one to count from the free end` });
    } else if (min < -(shortest + 1)) {
      problems.push({ pointer, message: `can be ${min}, which counts past the start of the shortest chain (${shortest + 1} nodes, so -1 to -${shortest + 1}); use an index closer to the free end` });
    }
    if (isConstant(handle)) {
      const earlier = seen.get(min);
      if (earlier !== undefined) problems.push({ pointer, message: `repeats handle ${min} of /system/forceHandles/${earlier}; list each handle once` });
      else seen.set(min, i);
    }
  });
  return problems;
}
