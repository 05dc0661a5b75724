// What the schema cannot say about lattice shapes: maps of one dimension naming existing
// materials, map weights and material weights of the right length, generator boxes that can
// hold the requested cells, and bodies within the cell and node limits.
import { specBounds } from '../random/distribution.ts';
import { MAX_LATTICE_CELLS, MAX_NODES } from './scenario-limits.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { LatticeSystemSpec, MaterialMap } from './scenario-types.ts';

/** Problems of the shape and materials, plus the largest node count any episode can have. */
export function findLatticeShapeProblems(spec: LatticeSystemSpec): { problems: ScenarioProblem[]; maxNodes: number } {
  const problems: ScenarioProblem[] = [];
  const names = new Map<string, number>();
  spec.materials.forEach((m, i) => {
    const earlier = names.get(m.name);
    if (earlier !== undefined) problems.push({ pointer: `/system/materials/${i}/name`, message: `"${m.name}" is already the name of material ${earlier + 1}; give each material its own name` });
    else names.set(m.name, i);
  });
  if ('generator' in spec.shape) return checkGenerator(spec, problems);
  let maxNodes = 0;
  const maps = spec.shape.maps;
  maps.forEach((map, i) => {
    const result = checkMap(map, `/system/shape/maps/${i}`, spec.materials.length, problems);
    maxNodes = Math.max(maxNodes, result);
  });
  const weights = spec.shape.weights;
  if (weights !== undefined) {
    if (weights.length !== maps.length) {
      problems.push({ pointer: '/system/shape/weights', message: `has ${weights.length} entr${weights.length === 1 ? 'y' : 'ies'} for ${maps.length} map${maps.length === 1 ? '' : 's'}; give one weight per map` });
    } else if (!weights.some((w) => w > 0)) {
      problems.push({ pointer: '/system/shape/weights', message: 'are all zero; give at least one map a positive weight' });
    }
  }
  return { problems, maxNodes };
}

function checkMap(map: MaterialMap, pointer: string, materialCount: number, problems: ScenarioProblem[]): number {
  const threeD = Array.isArray(map[0][0]);
  const corners = new Set<number>();
  let cells = 0;
  const before = problems.length;
  const visitCell = (value: number, at: string, x: number, y: number, z: number): void => {
    if (value > materialCount) {
      problems.push({ pointer: at, message: `names material ${value}, but only ${materialCount} material${materialCount === 1 ? ' is' : 's are'} listed; use 0 (empty) to ${materialCount}` });
      return;
    }
    if (value === 0) return;
    cells++;
    // Corner keys on a grid wide enough for any map within the cell limit.
    for (let c = 0; c < (threeD ? 8 : 4); c++) corners.add(((z + (c >> 2)) * 65536 + (y + ((c >> 1) & 1))) * 65536 + (x + (c & 1)));
  };
  for (let y = 0; y < map.length; y++) {
    const layer = map[y] as unknown[];
    for (let j = 0; j < layer.length; j++) {
      const entry = layer[j];
      const at = `${pointer}/${y}/${j}`;
      if (Array.isArray(entry) !== threeD) {
        problems.push({
          pointer: at,
          message: threeD
            ? 'is a single cell, but this map is 3-D (layers of rows, as its first entry); write a row [..] of cells here'
            : 'is a row, but this map is 2-D (rows of cells, as its first entry); write a single cell number here',
        });
        return 0;
      }
      if (threeD) (entry as number[]).forEach((value, x) => visitCell(value, `${at}/${x}`, x, y, j));
      else visitCell(entry as number, at, j, y, 0);
      if (cells > MAX_LATTICE_CELLS) {
        problems.push({ pointer, message: `has more than ${MAX_LATTICE_CELLS} cells, the limit for one body; use a smaller map or larger cells` });
        return 0;
      }
    }
  }
  if (problems.length === before && cells === 0) problems.push({ pointer, message: 'has no cells (every entry is 0); fill at least one cell with a material number' });
  if (corners.size > MAX_NODES) problems.push({ pointer, message: `has ${corners.size} nodes, above the limit of ${MAX_NODES} for one system; use a smaller map` });
  return corners.size;
}

function checkGenerator(spec: LatticeSystemSpec, problems: ScenarioProblem[]): { problems: ScenarioProblem[]; maxNodes: number } {
  if (!('generator' in spec.shape)) return { problems, maxNodes: 0 };
  const g = spec.shape.generator;
  const at = '/system/shape/generator';
  if (g.boundsCells.length !== g.dimension) {
    problems.push({ pointer: `${at}/boundsCells`, message: `has ${g.boundsCells.length} entries for a ${g.dimension}-D shape; give ${g.dimension === 2 ? '[x, y]' : '[x, y, z]'} cell counts` });
    return { problems, maxNodes: 0 };
  }
  if (g.materialWeights.length !== spec.materials.length) {
    problems.push({
      pointer: `${at}/materialWeights`,
      message: `has ${g.materialWeights.length} entr${g.materialWeights.length === 1 ? 'y' : 'ies'} for ${spec.materials.length} material${spec.materials.length === 1 ? '' : 's'}; give one weight per material`,
    });
  } else if (!g.materialWeights.some((w) => specBounds(w).max > 0)) {
    problems.push({ pointer: `${at}/materialWeights`, message: 'are all zero; give at least one material a positive weight' });
  }
  const bounds = g.boundsCells.map((b) => specBounds(b));
  const smallestBox = bounds.reduce((product, b) => product * b.min, 1);
  const largestBox = bounds.reduce((product, b) => product * b.max, 1);
  const cellsMax = specBounds(g.cellCount).max;
  if (cellsMax > smallestBox) {
    problems.push({
      pointer: `${at}/cellCount`,
      message: `can reach ${cellsMax} cells, more than the smallest box (${bounds.map((b) => b.min).join(' × ')} = ${smallestBox} cells) holds; lower cellCount or enlarge boundsCells`,
    });
  }
  if (cellsMax > MAX_LATTICE_CELLS) {
    problems.push({ pointer: `${at}/cellCount`, message: `can reach ${cellsMax} cells, above the limit of ${MAX_LATTICE_CELLS} for one body; lower it` });
  }
  const gridNodes = bounds.reduce((product, b) => product * (b.max + 1), 1);
  const maxNodes = Math.min(gridNodes, Math.min(cellsMax, largestBox) * (g.dimension === 3 ? 8 : 4));
  if (maxNodes > MAX_NODES && cellsMax <= MAX_LATTICE_CELLS) {
    problems.push({ pointer: `${at}/cellCount`, message: `allows bodies of up to ${maxNodes} nodes, above the limit of ${MAX_NODES} for one system; lower cellCount` });
  }
  return { problems, maxNodes };
}
