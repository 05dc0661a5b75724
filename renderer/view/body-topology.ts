// The fixed structure of a body as the 3-D view needs it: which nodes the springs join, the
// springs' unactuated rest lengths, the cells with their materials and channels, and the outer
// faces derived from the cells. The preview worker sends it from a built Model; dataset playback
// rebuilds it from an episode's graph arrays. Both then share one view.

export interface BodyTopology {
  nodeCount: number;
  /** Per node: material index, −1 for none. */
  nodeMaterial: Int16Array;
  /** Per node: actuator channel, −1 for none. */
  nodeChannel: Int16Array;
  /** Per node: 1 where the node is pinned or driven (drawn as a support). */
  nodeFixed: Uint8Array;
  springCount: number;
  /** 2 per spring: node indices. */
  springNodes: Uint32Array;
  /** Unactuated rest length per spring, m. */
  springRestLengthM: Float64Array;
  /** Corners per cell: 8 (voxel), 4 (square) or 0 (no cells, e.g. a chain). */
  cellCornerCount: number;
  cellCount: number;
  cellCorners: Uint32Array;
  cellMaterial: Int16Array;
  cellChannel: Int16Array;
  /** Material names by index, for the legend. */
  materialNames: string[];
}

/** Outer faces of the cells as quads (4 node indices each, in cyclic order) and their owning cell. */
export interface SurfaceQuads {
  quadCount: number;
  quadNodes: Uint32Array;
  quadCell: Uint32Array;
}

// Voxel corner numbering (bit 0 = x, bit 1 = y, bit 2 = z) as the lattice builder uses it; each
// face lists the corners with one bit fixed, in cyclic order around the face.
const VOXEL_FACES: ReadonlyArray<readonly [number, number, number, number]> = [
  [0, 2, 6, 4], // x = 0
  [1, 5, 7, 3], // x = 1
  [0, 4, 5, 1], // y = 0
  [2, 3, 7, 6], // y = 1
  [0, 1, 3, 2], // z = 0
  [4, 6, 7, 5], // z = 1
];

/**
 * Faces that belong to exactly one cell: the body's skin. A face shared by two cells is inside
 * the body and never visible, so drawing only the skin keeps large lattices cheap. Square cells
 * (2-D lattices) are their own faces.
 */
export function surfaceQuads(topology: BodyTopology): SurfaceQuads {
  const { cellCount, cellCornerCount, cellCorners } = topology;
  if (cellCornerCount === 4) {
    const quadNodes = new Uint32Array(4 * cellCount);
    const quadCell = new Uint32Array(cellCount);
    for (let c = 0; c < cellCount; c++) {
      const o = 4 * c;
      // Square corners are numbered like voxel corners (bit 0 = x, bit 1 = y): 0, 1, 3, 2 goes round.
      quadNodes[o] = cellCorners[o];
      quadNodes[o + 1] = cellCorners[o + 1];
      quadNodes[o + 2] = cellCorners[o + 3];
      quadNodes[o + 3] = cellCorners[o + 2];
      quadCell[c] = c;
    }
    return { quadCount: cellCount, quadNodes, quadCell };
  }
  if (cellCornerCount !== 8) return { quadCount: 0, quadNodes: new Uint32Array(0), quadCell: new Uint32Array(0) };
  const owners = new Map<string, number>();
  const sorted = [0, 0, 0, 0];
  const keyOf = (c: number, face: readonly number[]): string => {
    for (let k = 0; k < 4; k++) sorted[k] = cellCorners[8 * c + face[k]];
    sorted.sort((a, b) => a - b);
    return sorted.join(',');
  };
  for (let c = 0; c < cellCount; c++) {
    for (const face of VOXEL_FACES) {
      const key = keyOf(c, face);
      owners.set(key, owners.has(key) ? -1 : c);
    }
  }
  const nodes: number[] = [];
  const cells: number[] = [];
  for (let c = 0; c < cellCount; c++) {
    for (const face of VOXEL_FACES) {
      if (owners.get(keyOf(c, face)) !== c) continue;
      for (let k = 0; k < 4; k++) nodes.push(cellCorners[8 * c + face[k]]);
      cells.push(c);
    }
  }
  return { quadCount: cells.length, quadNodes: Uint32Array.from(nodes), quadCell: Uint32Array.from(cells) };
}

/** Springs meeting at each node, as compressed rows: springs of node i are incidence[start[i]..start[i+1]). */
export interface NodeSpringIncidence {
  start: Uint32Array;
  springs: Uint32Array;
}

export function nodeSpringIncidence(topology: BodyTopology): NodeSpringIncidence {
  const n = topology.nodeCount;
  const start = new Uint32Array(n + 1);
  const ends = topology.springNodes;
  for (let e = 0; e < ends.length; e++) start[ends[e] + 1]++;
  for (let i = 0; i < n; i++) start[i + 1] += start[i];
  const fill = start.slice(0, n);
  const springs = new Uint32Array(ends.length);
  for (let s = 0; s < topology.springCount; s++) {
    springs[fill[ends[2 * s]]++] = s;
    springs[fill[ends[2 * s + 1]]++] = s;
  }
  return { start, springs };
}
