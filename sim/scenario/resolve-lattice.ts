// Lattice specs to the numbers a lattice episode needs before its body is grown: cell size,
// materials, origin and the shape's parameters, one value per parameter from the resolver.
import type { LatticeClamp, LatticeMaterial } from '../systems/lattice.ts';
import { resolveLatticeMaterials } from './lattice-materials.ts';
import type { ShapeParameters } from './lattice-shape.ts';
import { resolveShapeParameters } from './lattice-shape.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import { resolveVector3 } from './resolve-chain.ts';
import type { LatticeSystemSpec } from './scenario-types.ts';

export interface ResolvedLattice {
  cellSizeM: number;
  materials: LatticeMaterial[];
  shape: ShapeParameters;
  originM: [number, number, number];
  clamps: LatticeClamp[];
}

export function resolveLatticeParameters(spec: LatticeSystemSpec, resolver: ParameterResolver): ResolvedLattice {
  return {
    // ω² ∝ E/(ρ·a²): small cells are the demanding end.
    cellSizeM: resolver.value(spec.cellSizeM, '/system/cellSizeM', 'low'),
    materials: resolveLatticeMaterials(spec, resolver),
    shape: resolveShapeParameters(spec.shape, resolver),
    originM: resolveVector3(spec.originM, '/system/originM', resolver),
    clamps: spec.clamps.map((clamp, i) => {
      const resolved: LatticeClamp = { name: clamp.name ?? `clamp-${i}`, drivenAxes: [...clamp.drivenAxes] };
      if (clamp.face !== undefined) resolved.face = clamp.face;
      if (clamp.cells !== undefined) resolved.cells = clamp.cells.map((at) => [...at]);
      if (clamp.boxM !== undefined) {
        resolved.boxM = {
          min: resolveVector3(clamp.boxM.min, `/system/clamps/${i}/boxM/min`, resolver),
          max: resolveVector3(clamp.boxM.max, `/system/clamps/${i}/boxM/max`, resolver),
        };
      }
      return resolved;
    }),
  };
}
