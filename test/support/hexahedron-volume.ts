// Volume of a voxel cell from its eight corner positions, for checks on actuated and deformed
// cells. Splits the hexahedron into six tetrahedra around the diagonal from corner 0 to corner
// 7 (the usual decomposition; exact for any cell whose faces stay planar, and a consistent
// second-order estimate otherwise). Corner order is the lattice's: bit 0 = x, bit 1 = y,
// bit 2 = z.

// Each tetrahedron is (0, a, b, 7) with (a, b) walking once round the cube's middle ring so
// that every one has positive orientation for an undeformed cell.
const RING: ReadonlyArray<readonly [number, number]> = [[1, 3], [3, 2], [2, 6], [6, 4], [4, 5], [5, 1]];

/** Signed volume, m³, of the cell whose corners are nodes cornerNodes of positionM. */
export function hexahedronVolumeM3(positionM: Float64Array, cornerNodes: ArrayLike<number>): number {
  const p0 = 3 * cornerNodes[0];
  const p7 = 3 * cornerNodes[7];
  const dx = positionM[p7] - positionM[p0];
  const dy = positionM[p7 + 1] - positionM[p0 + 1];
  const dz = positionM[p7 + 2] - positionM[p0 + 2];
  let sixTimesVolume = 0;
  for (const [a, b] of RING) {
    const pa = 3 * cornerNodes[a];
    const pb = 3 * cornerNodes[b];
    const ax = positionM[pa] - positionM[p0];
    const ay = positionM[pa + 1] - positionM[p0 + 1];
    const az = positionM[pa + 2] - positionM[p0 + 2];
    const bx = positionM[pb] - positionM[p0];
    const by = positionM[pb + 1] - positionM[p0 + 1];
    const bz = positionM[pb + 2] - positionM[p0 + 2];
    // Triple product a · (b × d).
    sixTimesVolume += ax * (by * dz - bz * dy) + ay * (bz * dx - bx * dz) + az * (bx * dy - by * dx);
  }
  return sixTimesVolume / 6;
}
