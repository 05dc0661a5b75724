// Lattices: soft bodies built from cubic (3-D) or square (2-D) cells on a grid, given as a
// material map. Neighbouring cells share corner nodes and springs; each cell adds its share of
// edge, face-diagonal and body-diagonal stiffness from its material (see material-springs.ts).
// Cells of actuated materials scale the rest lengths of their springs by (1 + strainMax·u) for
// their channel's control u in [−1, 1]. The outer faces (3-D) or outline edges (2-D) become
// fluid panels.
//
// Material maps: 2-D maps are rows [y][x], 3-D maps are layers [y][z][x]; y is up and index 0
// is the bottom. 0 is empty, m ≥ 1 is materials[m − 1].
import { NODE_PINNED, RELATION_BODY_DIAGONAL, RELATION_CELL_EDGE, RELATION_FACE_DIAGONAL } from '../core/model.ts';
import { ModelBuilder } from '../core/model-builder.ts';
import type { BuiltSystem } from './built-system.ts';
import type { ControlChannelInfo } from './control-channel.ts';
import { cellSpringShares } from './material-springs.ts';
import { dampingFromRatio } from './spring-damping.ts';

export interface LatticeMaterial {
  name: string;
  youngsModulusPa: number;
  densityKgPerM3: number;
  dampingRatio: number;
  /** Control channel that actuates cells of this material, or null for a passive material. */
  actuatorChannel: number | null;
  /** Largest relative change of rest length at |u| = 1, dimensionless. */
  actuationStrainMax: number;
}

export type LatticeBase = 'clamped' | 'free';
export type LatticeFace = '-x' | '+x' | '-y' | '+y' | '-z' | '+z';
type Axis = 'x' | 'y' | 'z';

/**
 * A group of nodes held in place, or moved by control channels along drivenAxes (a shaking
 * table). Exactly one of face, cells and boxM chooses the nodes.
 */
export interface LatticeClamp {
  /** Channel names start with this (e.g. "table" gives "table-offset-x"). */
  name: string;
  /** Every node on the body's outermost grid plane on that side. */
  face?: LatticeFace;
  /** Every corner node of these cells, given by grid position [x, y] or [x, y, z]. */
  cells?: number[][];
  /** Every node whose built position lies inside this box (both ends included), m. */
  boxM?: { min: [number, number, number]; max: [number, number, number] };
  /** Axes along which the group follows its channels; empty: pinned. */
  drivenAxes: Axis[];
}
export type MaterialMap2D = number[][];
export type MaterialMap3D = number[][][];

export interface LatticeParameters {
  cellSizeM: number;
  materialMap: MaterialMap2D | MaterialMap3D;
  materials: LatticeMaterial[];
  /** Clamped: the bottom nodes of the lowest layer are pinned. Free: nothing is pinned. */
  base: LatticeBase;
  /** Position of the grid's minimum corner, m. */
  originM: [number, number, number];
  /** Further held or driven node groups. */
  clamps?: LatticeClamp[];
}

interface Grid {
  dimension: 2 | 3;
  nx: number;
  ny: number;
  nz: number;
  at(x: number, y: number, z: number): number;
}

export function latticeDimension(map: MaterialMap2D | MaterialMap3D): 2 | 3 {
  return Array.isArray(map[0]?.[0]) ? 3 : 2;
}

function toGrid(map: MaterialMap2D | MaterialMap3D): Grid {
  if (latticeDimension(map) === 3) {
    const m = map as MaterialMap3D;
    const ny = m.length;
    const nz = Math.max(...m.map((layer) => layer.length));
    const nx = Math.max(...m.flatMap((layer) => layer.map((row) => row.length)));
    return { dimension: 3, nx, ny, nz, at: (x, y, z) => m[y]?.[z]?.[x] ?? 0 };
  }
  const m = map as MaterialMap2D;
  const ny = m.length;
  const nx = Math.max(...m.map((row) => row.length));
  return { dimension: 2, nx, ny, nz: 1, at: (x, y) => m[y]?.[x] ?? 0 };
}

// Corner offsets of a unit cube in a fixed order: bit 0 = x, bit 1 = y, bit 2 = z.
const CUBE_CORNERS: ReadonlyArray<readonly [number, number, number]> = [
  [0, 0, 0], [1, 0, 0], [0, 1, 0], [1, 1, 0], [0, 0, 1], [1, 0, 1], [0, 1, 1], [1, 1, 1],
];
const SQUARE_CORNERS: ReadonlyArray<readonly [number, number, number]> = [[0, 0, 0], [1, 0, 0], [0, 1, 0], [1, 1, 0]];

export function buildLattice(p: LatticeParameters): BuiltSystem<LatticeParameters> {
  const grid = toGrid(p.materialMap);
  const dim = grid.dimension;
  const a = p.cellSizeM;
  const corners = dim === 3 ? CUBE_CORNERS : SQUARE_CORNERS;
  const builder = new ModelBuilder(corners.length, dim === 3 ? 4 : 2, dim === 2 ? a : 0);
  const nodeIndex = new Map<number, number>();
  const key = (x: number, y: number, z: number) => (z * (grid.ny + 1) + y) * (grid.nx + 1) + x;
  const cellVolumeM3 = a * a * a; // 2-D cells are a thick

  const nodeAt = (x: number, y: number, z: number): number => {
    const k = key(x, y, z);
    let index = nodeIndex.get(k);
    if (index === undefined) {
      index = builder.addNode({
        positionM: [p.originM[0] + x * a, p.originM[1] + y * a, p.originM[2] + z * a],
        massKg: 0, // mass comes from the cells that share the node
      });
      nodeIndex.set(k, index);
    }
    return index;
  };

  const materialOf = (value: number, x: number, y: number, z: number): LatticeMaterial => {
    const material = p.materials[value - 1];
    if (!material) throw new RangeError(`material map names material ${value} at cell (${x}, ${y}, ${z}), but only ${p.materials.length} materials are given`);
    return material;
  };

  // First pass: nodes and masses; remember each cell's corner nodes.
  const cellList: { corners: number[]; value: number; x: number; y: number; z: number }[] = [];
  for (let z = 0; z < grid.nz; z++) {
    for (let y = 0; y < grid.ny; y++) {
      for (let x = 0; x < grid.nx; x++) {
        const value = grid.at(x, y, z);
        if (value === 0) continue;
        const material = materialOf(value, x, y, z);
        const cellCorners = corners.map(([cx, cy, cz]) => nodeAt(x + cx, y + cy, z + cz));
        const share = 1 / cellCorners.length;
        for (const node of cellCorners) {
          builder.addMass(node, material.densityKgPerM3 * cellVolumeM3 * share, cellVolumeM3 * share);
          builder.setNodeMaterial(node, value - 1, material.actuatorChannel ?? -1);
        }
        builder.addCell(cellCorners, value - 1, material.actuatorChannel ?? -1);
        cellList.push({ corners: cellCorners, value, x, y, z });
      }
    }
  }
  if (cellList.length === 0) throw new RangeError('the material map has no cells (every entry is 0)');

  // Second pass: springs; damping ratio is averaged over the cells sharing a spring, weighted
  // by the stiffness each contributes.
  const zetaWeighted: number[] = [];
  const addShare = (na: number, nb: number, share: number, relation: number, material: LatticeMaterial): void => {
    const s = builder.addSpring(na, nb, share, 0, relation);
    zetaWeighted[s] = (zetaWeighted[s] ?? 0) + share * material.dampingRatio;
    if (material.actuatorChannel !== null && material.actuationStrainMax !== 0) {
      builder.addActuation(s, material.actuatorChannel, share, material.actuationStrainMax);
    }
  };
  for (const cell of cellList) {
    const material = materialOf(cell.value, cell.x, cell.y, cell.z);
    const shares = cellSpringShares(material.youngsModulusPa, a, dim);
    const c = cell.corners;
    for (let i = 0; i < c.length; i++) {
      for (let j = i + 1; j < c.length; j++) {
        // Corner indices differ in as many bits as the pair's axes: 1 edge, 2 face, 3 body.
        const bits = popCount(i ^ j);
        if (bits === 1) addShare(c[i], c[j], shares.edgeShareNPerM, RELATION_CELL_EDGE, material);
        else if (bits === 2) addShare(c[i], c[j], shares.faceDiagonalShareNPerM, RELATION_FACE_DIAGONAL, material);
        else addShare(c[i], c[j], shares.bodyDiagonalShareNPerM, RELATION_BODY_DIAGONAL, material);
      }
    }
  }
  for (let s = 0; s < builder.springCount; s++) {
    const k = builder.stiffnessOf(s);
    const [na, nb] = builder.springNodes(s);
    builder.setDamping(s, dampingFromRatio(zetaWeighted[s] / k, k, builder.massOf(na), builder.massOf(nb)));
  }

  addSurfacePanels(builder, grid, nodeAt);

  if (p.base === 'clamped') {
    for (const cell of cellList) {
      if (cell.y !== 0) continue;
      for (let i = 0; i < corners.length; i++) if (corners[i][1] === 0) builder.setFlag(cell.corners[i], NODE_PINNED);
    }
  }

  const channels: ControlChannelInfo[] = [];
  const channelCount = Math.max(0, ...p.materials.map((m) => (m.actuatorChannel ?? -1) + 1));
  for (let ch = 0; ch < channelCount; ch++) {
    const names = p.materials.filter((m) => m.actuatorChannel === ch).map((m) => m.name);
    channels.push({ index: ch, name: `actuator-${ch}`, kind: 'actuator', unit: '1', description: `actuation level of ${names.length ? names.join(', ') : 'no'} cells: −1 contracts, +1 expands by the material's strain limit`, axis: null, node: null, clamp: null });
    builder.useChannel(ch);
  }
  // Driven groups take the channels after the actuators, in the order the clamps are listed.
  const gridOf = new Map<number, [number, number, number]>();
  for (const [k, node] of nodeIndex) {
    const x = k % (grid.nx + 1);
    const y = Math.floor(k / (grid.nx + 1)) % (grid.ny + 1);
    const z = Math.floor(k / ((grid.nx + 1) * (grid.ny + 1)));
    gridOf.set(node, [x, y, z]);
  }
  for (const clamp of p.clamps ?? []) {
    const nodes = clampNodes(clamp, dim, gridOf, cellList, builder);
    if (nodes.length === 0) throw new RangeError(`clamp "${clamp.name}" holds no node of the body; move its box or name cells and faces the body has`);
    const axes: [number, number, number] = [-1, -1, -1];
    for (const axis of clamp.drivenAxes) {
      axes[AXIS_INDEX[axis]] = channels.length;
      channels.push({ index: channels.length, name: `${clamp.name}-offset-${axis}`, kind: 'driven-offset', unit: 'm', description: `displacement along ${axis} of the ${nodes.length} nodes held by clamp "${clamp.name}" from their built positions, reached at the end of each control interval`, axis, node: null, clamp: clamp.name });
    }
    for (const node of nodes) {
      if (clamp.drivenAxes.length > 0) builder.addDriven(node, axes);
      else builder.setFlag(node, NODE_PINNED);
    }
  }
  return { kind: 'lattice', model: builder.build(), parameters: p, controlChannels: channels };
}

const AXIS_INDEX: Record<Axis, number> = { x: 0, y: 1, z: 2 };

function clampNodes(
  clamp: LatticeClamp,
  dimension: 2 | 3,
  gridOf: Map<number, [number, number, number]>,
  cells: readonly { corners: number[]; x: number; y: number; z: number }[],
  builder: ModelBuilder,
): number[] {
  if (clamp.face !== undefined) {
    const axis = AXIS_INDEX[clamp.face[1] as Axis];
    if (dimension === 2 && axis === 2) throw new RangeError(`clamp "${clamp.name}": a 2-D lattice has no ${clamp.face} face; use -x, +x, -y or +y`);
    let extreme = clamp.face[0] === '-' ? Infinity : -Infinity;
    for (const g of gridOf.values()) extreme = clamp.face[0] === '-' ? Math.min(extreme, g[axis]) : Math.max(extreme, g[axis]);
    return [...gridOf].filter(([, g]) => g[axis] === extreme).map(([node]) => node).sort((a, b) => a - b);
  }
  if (clamp.cells !== undefined) {
    const chosen = new Set<number>();
    for (const at of clamp.cells) {
      const cell = cells.find((c) => c.x === at[0] && c.y === at[1] && c.z === (at[2] ?? 0));
      if (!cell) throw new RangeError(`clamp "${clamp.name}" names cell [${at.join(', ')}], which the body does not have; name filled cells of the material map`);
      for (const node of cell.corners) chosen.add(node);
    }
    return [...chosen].sort((a, b) => a - b);
  }
  const box = clamp.boxM!;
  const nodes: number[] = [];
  for (let node = 0; node < builder.nodeCount; node++) {
    const x = builder.position(node);
    // A relative allowance keeps nodes that sit exactly on a box face inside despite rounding.
    let inside = true;
    for (let k = 0; k < 3; k++) {
      const slack = 1e-9 * Math.max(1, Math.abs(box.min[k]), Math.abs(box.max[k]));
      if (x[k] < box.min[k] - slack || x[k] > box.max[k] + slack) inside = false;
    }
    if (inside) nodes.push(node);
  }
  return nodes;
}

function addSurfacePanels(builder: ModelBuilder, grid: Grid, nodeAt: (x: number, y: number, z: number) => number): void {
  const filled = (x: number, y: number, z: number) =>
    x >= 0 && y >= 0 && z >= 0 && x < grid.nx && y < grid.ny && z < grid.nz && grid.at(x, y, z) !== 0;
  for (let z = 0; z < grid.nz; z++) {
    for (let y = 0; y < grid.ny; y++) {
      for (let x = 0; x < grid.nx; x++) {
        if (!filled(x, y, z)) continue;
        if (grid.dimension === 2) {
          if (!filled(x - 1, y, 0)) builder.addPanel([nodeAt(x, y, 0), nodeAt(x, y + 1, 0)]);
          if (!filled(x + 1, y, 0)) builder.addPanel([nodeAt(x + 1, y, 0), nodeAt(x + 1, y + 1, 0)]);
          if (!filled(x, y - 1, 0)) builder.addPanel([nodeAt(x, y, 0), nodeAt(x + 1, y, 0)]);
          if (!filled(x, y + 1, 0)) builder.addPanel([nodeAt(x, y + 1, 0), nodeAt(x + 1, y + 1, 0)]);
          continue;
        }
        // Quads listed cyclically so their diagonals are (0,2) and (1,3).
        if (!filled(x - 1, y, z)) builder.addPanel([nodeAt(x, y, z), nodeAt(x, y + 1, z), nodeAt(x, y + 1, z + 1), nodeAt(x, y, z + 1)]);
        if (!filled(x + 1, y, z)) builder.addPanel([nodeAt(x + 1, y, z), nodeAt(x + 1, y, z + 1), nodeAt(x + 1, y + 1, z + 1), nodeAt(x + 1, y + 1, z)]);
        if (!filled(x, y - 1, z)) builder.addPanel([nodeAt(x, y, z), nodeAt(x, y, z + 1), nodeAt(x + 1, y, z + 1), nodeAt(x + 1, y, z)]);
        if (!filled(x, y + 1, z)) builder.addPanel([nodeAt(x, y + 1, z), nodeAt(x + 1, y + 1, z), nodeAt(x + 1, y + 1, z + 1), nodeAt(x, y + 1, z + 1)]);
        if (!filled(x, y, z - 1)) builder.addPanel([nodeAt(x, y, z), nodeAt(x + 1, y, z), nodeAt(x + 1, y + 1, z), nodeAt(x, y + 1, z)]);
        if (!filled(x, y, z + 1)) builder.addPanel([nodeAt(x, y, z + 1), nodeAt(x, y + 1, z + 1), nodeAt(x + 1, y + 1, z + 1), nodeAt(x + 1, y, z + 1)]);
      }
    }
  }
}

function popCount(v: number): number {
  let count = 0;
  for (let b = v; b; b >>= 1) count += b & 1;
  return count;
}
