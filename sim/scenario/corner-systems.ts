// The systems the checks build: the scenario's parameters all at their demanding end (the
// stiffest, lightest, most damped and largest systems it can draw) or all at the gentle end.
// Chains are built as they would be sampled; lattices from every listed map, or, for generated
// shapes, as small test blocks of each material and of all materials mixed, because every
// generated body is a subset of such cells and the stability bound of a node depends only on
// the cells around it.
import type { BuiltSystem } from '../systems/built-system.ts';
import { buildChain } from '../systems/chain.ts';
import type { LatticeMaterial, MaterialMap2D, MaterialMap3D } from '../systems/lattice.ts';
import { buildLattice } from '../systems/lattice.ts';
import { DemandingCorner } from './demanding-corner.ts';
import { channelledMaterials } from './lattice-materials.ts';
import { resolveChainParameters } from './resolve-chain.ts';
import { resolveLatticeParameters } from './resolve-lattice.ts';
import type { Scenario } from './scenario-types.ts';

/** Cells per axis of a test block: enough for corner, edge, face and interior nodes. */
const TEST_BLOCK_CELLS = 3;

export function cornerSystems(scenario: Scenario, corner: 'demanding' | 'gentle'): BuiltSystem[] {
  const resolver = new DemandingCorner(corner);
  const spec = scenario.system;
  if (spec.kind === 'chain') return [buildChain(resolveChainParameters(spec, resolver))];
  const lattice = resolveLatticeParameters(spec, resolver);
  const build = (materialMap: MaterialMap2D | MaterialMap3D, materials: LatticeMaterial[]): BuiltSystem =>
    buildLattice({ cellSizeM: lattice.cellSizeM, materialMap, materials, base: spec.base, originM: lattice.originM, clamps: lattice.clamps });
  if (lattice.shape.kind === 'map') {
    if ('generator' in spec.shape) return [];
    return spec.shape.maps.map((map) => build(map, lattice.materials));
  }
  const shape = lattice.shape;
  const channelled = channelledMaterials(lattice.materials, shape.actuatedChannelCount);
  const nx = Math.min(TEST_BLOCK_CELLS, shape.boundsCells[0]);
  const ny = Math.min(TEST_BLOCK_CELLS, shape.boundsCells[1]);
  const nz = shape.dimension === 3 ? Math.min(TEST_BLOCK_CELLS, shape.boundsCells[2]) : 1;
  const block = (valueAt: (cell: number) => number): MaterialMap2D | MaterialMap3D => {
    if (shape.dimension === 2) return Array.from({ length: ny }, (_, y) => Array.from({ length: nx }, (_, x) => valueAt(x + nx * y)));
    return Array.from({ length: ny }, (_, y) => Array.from({ length: nz }, (_, z) => Array.from({ length: nx }, (_, x) => valueAt(x + nx * (y + ny * z)))));
  };
  const count = lattice.materials.length;
  const systems = lattice.materials.map((_, m) => build(block(() => channelled.indexOf(m, 0) + 1), channelled.materials));
  if (count > 1) systems.push(build(block((cell) => channelled.indexOf(cell % count, 0) + 1), channelled.materials));
  return systems;
}
