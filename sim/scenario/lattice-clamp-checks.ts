// Checks of a lattice's clamp groups that the schema cannot make: exactly one way of choosing
// nodes per group, faces a 2-D body has, distinct channel names, and — for listed maps, where
// the body is known in advance — that every group holds at least one node of every map.
// Generated shapes differ from episode to episode, so there only faces can be clamped.
import type { LatticeMaterial } from '../systems/lattice.ts';
import { buildLattice, latticeDimension } from '../systems/lattice.ts';
import type { ResolvedLattice } from './resolve-lattice.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { LatticeSystemSpec } from './scenario-types.ts';

export function findLatticeClampProblems(spec: LatticeSystemSpec, lattice: ResolvedLattice, materials: LatticeMaterial[]): ScenarioProblem[] {
  const problems: ScenarioProblem[] = [];
  const names = new Map<string, number>();
  spec.clamps.forEach((clamp, i) => {
    const pointer = `/system/clamps/${i}`;
    const ways = [clamp.face, clamp.cells, clamp.boxM].filter((way) => way !== undefined).length;
    if (ways !== 1) problems.push({ pointer, message: `chooses its nodes ${ways === 0 ? 'in no way' : 'in more than one way'}; give exactly one of "face", "cells" and "boxM"` });
    const name = lattice.clamps[i].name;
    const earlier = names.get(name);
    if (earlier !== undefined) problems.push({ pointer: `${pointer}/name`, message: `"${name}" is also the name of /system/clamps/${earlier}; give each clamp its own name so their channels differ` });
    else names.set(name, i);
    if ('generator' in spec.shape && clamp.face === undefined) {
      problems.push({ pointer, message: 'picks cells or a box on a generated shape, which differs from episode to episode; clamp a face instead, or list the shape as maps' });
    }
  });
  if (problems.length > 0 || 'generator' in spec.shape) return problems;
  spec.shape.maps.forEach((map, m) => {
    try {
      buildLattice({ cellSizeM: lattice.cellSizeM, materialMap: map, materials, base: spec.base, originM: lattice.originM, clamps: lattice.clamps });
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
      const dimension = latticeDimension(map);
      problems.push({ pointer: '/system/clamps', message: `with material map ${m} (${dimension}-D): ${error.message}` });
    }
  });
  return problems;
}
