// What the schema cannot say about a design: a grid's levels must name distributed parameters,
// give each a sensible count and multiply out to the episode count; a Sobol design needs no
// more dimensions than the direction-number table has; every design but "independent" needs
// something to vary. Problems carry JSON pointers into the scenario and say how to fix them.
import type { DesignParameter, DesignSpec } from './design-spec.ts';
import { SOBOL_MAX_DIMENSION } from './sobol-direction-numbers.ts';

export interface DesignProblem {
  pointer: string;
  message: string;
}

function escapeMember(member: string): string {
  return member.replace(/~/g, '~0').replace(/\//g, '~1');
}

/** Number of distinct values an integer or categorical spec can take; Infinity for continuous ones. */
function valueCount(parameter: DesignParameter): number {
  const spec = parameter.spec;
  if (typeof spec === 'number') return 1;
  if (spec.kind === 'integer') return spec.max - spec.min + 1;
  if (spec.kind === 'categorical') return spec.weights === undefined ? spec.values.length : spec.weights.filter((w) => w > 0).length;
  return Infinity;
}

export function findDesignProblems(spec: DesignSpec, episodes: number, parameters: readonly DesignParameter[]): DesignProblem[] {
  const problems: DesignProblem[] = [];
  if (spec.levels !== undefined && spec.kind !== 'grid') {
    problems.push({ pointer: '/design/levels', message: `is only read by a "grid" design, not by "${spec.kind}"; remove it or set "kind": "grid"` });
  }
  if (spec.kind === 'independent') return problems;
  if (parameters.length === 0) {
    problems.push({ pointer: '/design/kind', message: `"${spec.kind}" needs at least one distributed parameter, and every value of this scenario is fixed; make a value a distribution or remove "design"` });
    return problems;
  }
  const known = parameters.map((p) => p.pointer);
  if (spec.kind === 'sobol' && parameters.length > SOBOL_MAX_DIMENSION) {
    problems.push({
      pointer: '/design/kind',
      message: `a Sobol design here has one dimension per distributed parameter, ${parameters.length}, above the ${SOBOL_MAX_DIMENSION} dimensions of the Joe & Kuo direction numbers; use "latin-hypercube", or fix some parameters`,
    });
  }
  if (spec.kind !== 'grid') return problems;
  const levels = spec.levels;
  if (levels === undefined || Object.keys(levels).length === 0) {
    problems.push({ pointer: '/design', message: `a grid needs "levels": the number of levels of each parameter it spans, e.g. {"${known[0]}": 4}; distributed parameters here: ${known.join(', ')}` });
    return problems;
  }
  let product = 1;
  const factors: string[] = [];
  for (const [pointer, count] of Object.entries(levels)) {
    const at = `/design/levels/${escapeMember(pointer)}`;
    const parameter = parameters.find((p) => p.pointer === pointer);
    if (parameter === undefined) {
      problems.push({ pointer: at, message: `"${pointer}" is not a distributed parameter of this scenario (fixed values and control signals cannot be gridded); distributed parameters here: ${known.join(', ')}` });
      continue;
    }
    const values = valueCount(parameter);
    if (count > values) {
      problems.push({ pointer: at, message: `asks for ${count} levels of a parameter that takes only ${values} values; use at most ${values}` });
    }
    product *= count;
    factors.push(String(count));
  }
  if (problems.length === 0 && product !== episodes) {
    problems.push({
      pointer: '/episodes',
      message: `is ${episodes}, but the grid in /design/levels has ${factors.join(' × ')} = ${product} combinations, one episode each; set "episodes" to ${product} or change the levels`,
    });
  }
  return problems;
}
