// Checks of an observation block beyond the schema: a time base of whole records, and listed
// markers that the systems can have. A chain's node count is known from its part count, so a
// marker beyond the shortest chain is refused here; a lattice's smallest body is not known
// before it is built, so only markers beyond its largest are refused here and the rest are
// checked per episode when it is built (resolve-observation.ts).
import { specBounds } from '../random/distribution.ts';
import { observationTiming } from './observation-timing.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';

/** `maxNodes`: the most nodes any episode's system can have. */
export function findObservationProblems(scenario: Scenario, maxNodes: number): ScenarioProblem[] {
  const spec = scenario.observation;
  if (spec === undefined) return [];
  const timing = observationTiming(spec, scenario.time);
  const problems: ScenarioProblem[] = timing.ok ? [] : [...timing.problems];
  if (!('nodes' in spec.markers)) return problems;
  const system = scenario.system;
  const chain = system.kind === 'chain';
  const fewest = system.kind === 'chain' ? specBounds(system.partCount).min + 1 : null;
  const limit = fewest ?? maxNodes;
  const which = chain
    ? (fewest === maxNodes ? `the chain (${limit} nodes, 0 to ${limit - 1})` : `the shortest chain (${limit} nodes, 0 to ${limit - 1})`)
    : `the largest body this scenario can build (${limit} nodes, 0 to ${limit - 1})`;
  // With a fixed node count, -1 and the last index are known to be the same node.
  const fixedCount = chain && fewest === maxNodes ? limit : null;
  const firstMarkerOf = new Map<number, number>();
  spec.markers.nodes.forEach((node, k) => {
    const pointer = `/observation/markers/nodes/${k}`;
    if (fixedCount !== null && node < limit && node >= -limit) {
      const resolved = node < 0 ? fixedCount + node : node;
      const earlier = firstMarkerOf.get(resolved);
      if (earlier !== undefined) problems.push({ pointer, message: `is node ${resolved} of the chain, the same node as /observation/markers/nodes/${earlier}; list each node once` });
      else firstMarkerOf.set(resolved, k);
    }
    if (node >= limit) {
      problems.push({ pointer, message: `is node ${node}, which ${which} does not have; use a smaller index, or a negative one to count from the last node (-1 is the last)` });
    } else if (node < -limit) {
      problems.push({ pointer, message: `is ${node}, which counts past node 0 of ${which}, so -1 to -${limit}; use an index closer to the last node` });
    }
  });
  return problems;
}
