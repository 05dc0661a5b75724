// A design as a function of (master seed, episode count, parameter list) and nothing else, so
// every shard and worker that builds it gets the same points. Coordinates are in [0, 1); the
// caller maps them through each parameter's inverse CDF. Parameters are ordered by their JSON
// pointers (sorted by UTF-16 code units, JavaScript's default order), which is the Sobol
// dimension order; constant parameters never enter, so adding one moves nothing.
// Memory once built: Sobol 256 bytes per dimension (scrambled direction numbers), Latin
// hypercube six round keys per parameter, grid one level count per parameter; any episode's
// point is then computed on its own in O(dimension) (Latin hypercube: O(dimension) expected, the
// cycle walk of its permutation).
import type { DesignKind, DesignParameter, DesignSpec } from './design-spec.ts';
import { gridCoordinates } from './full-factorial-grid.ts';
import { LatinHypercubeCoordinate } from './latin-hypercube.ts';
import type { ScrambledSobolDimension } from './sobol-scramble.ts';
import { scrambledSobolCoordinate, scrambledSobolDimension } from './sobol-scramble.ts';

export interface DesignPlan {
  kind: Exclude<DesignKind, 'independent'>;
  /** JSON pointers of the coordinates, in design order. */
  pointers: readonly string[];
  /** Number of points (the scenario's episodes). */
  points: number;
  /** Grid only: levels per coordinate, in design order. */
  levels?: readonly number[];
  /** Coordinates of episode `index`, one per pointer. */
  coordinates(index: number): number[];
}

export function compareCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * The plan of a checked design (see design-problems.ts); null for "independent". `parameters`
 * are the scenario's distributed parameters, in any order.
 */
export function planDesign(spec: DesignSpec, seed: number | string, episodes: number, parameters: readonly DesignParameter[]): DesignPlan | null {
  if (spec.kind === 'independent') return null;
  const sorted = [...parameters].sort((a, b) => compareCodeUnits(a.pointer, b.pointer));
  if (spec.kind === 'grid') {
    const levelsByPointer = spec.levels ?? {};
    const covered = sorted.filter((p) => levelsByPointer[p.pointer] !== undefined);
    const levels = covered.map((p) => levelsByPointer[p.pointer]);
    return { kind: 'grid', pointers: covered.map((p) => p.pointer), points: episodes, levels, coordinates: (index) => gridCoordinates(levels, index) };
  }
  const pointers = sorted.map((p) => p.pointer);
  if (spec.kind === 'latin-hypercube') {
    const columns = sorted.map((p) => new LatinHypercubeCoordinate(seed, episodes, p.subStream));
    return { kind: 'latin-hypercube', pointers, points: episodes, coordinates: (index) => columns.map((c) => c.coordinate(index)) };
  }
  const dimensions: ScrambledSobolDimension[] = sorted.map((_, k) => scrambledSobolDimension(seed, k + 1));
  return { kind: 'sobol', pointers, points: episodes, coordinates: (index) => dimensions.map((d) => scrambledSobolCoordinate(d, index)) };
}
