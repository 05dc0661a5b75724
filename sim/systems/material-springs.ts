// Spring constants of a voxel cell from a material's Young's modulus, by energy equivalence of
// a central-force lattice with the continuum (Cauchy–Born homogenisation: the lattice's elastic
// tensor is C_ijkl = (1/V) Σ k·L²·n_i n_j n_k n_l over the springs of a cell; see Born & Huang,
// Dynamical Theory of Crystal Lattices, 1954, and Ostoja-Starzewski, "Lattice models in
// micromechanics", Appl. Mech. Rev. 55 (2002) 35–60).
//
// 3-D cubic cell of side a with edge (k1, shared by 4 cells), face-diagonal (k2, shared by 2)
// and body-diagonal (k3) springs gives C11 = (k1 + 2k2 + 4k3/3)/a and C12 = C44 = (k2 + 4k3/3)/a.
// Isotropy (C11 − C12 = 2·C44) forces k1 = k2 + 8k3/3 and Poisson's ratio 1/4 (the Cauchy
// relation of central forces); choosing k2 = k3 then gives E = 35·k2/(6a):
//   k2 = k3 = 6·E·a/35,  k1 = 22·E·a/35   (full stiffness of an interior spring).
// 2-D square cell (thickness a) with edges (k1, shared by 2) and both diagonals (k2) gives
// C11 = (k1 + k2)/a, C12 = C66 = k2/a; isotropy k1 = 2·k2, Poisson's ratio 1/3 and
// E = 8·k2/(3a):  k2 = 3·E·a/8,  k1 = 3·E·a/4.
// Each cell contributes its share (k1/4 or k1/2 per edge, k2/2 per face diagonal in 3-D), so
// boundary springs are softer and a finite body has the material's modulus, like an assembly
// of finite elements.

export interface CellSpringShares {
  /** Stiffness a cell adds to each of its edges, N/m. */
  edgeShareNPerM: number;
  /** Stiffness a cell adds to each of its face diagonals, N/m. */
  faceDiagonalShareNPerM: number;
  /** Stiffness of each body diagonal (3-D only), N/m. */
  bodyDiagonalShareNPerM: number;
}

export function cellSpringShares(youngsModulusPa: number, cellSizeM: number, dimension: 2 | 3): CellSpringShares {
  const ea = youngsModulusPa * cellSizeM;
  if (dimension === 3) {
    return {
      edgeShareNPerM: (22 * ea) / 35 / 4,
      faceDiagonalShareNPerM: (6 * ea) / 35 / 2,
      bodyDiagonalShareNPerM: (6 * ea) / 35,
    };
  }
  return {
    edgeShareNPerM: (3 * ea) / 4 / 2,
    faceDiagonalShareNPerM: (3 * ea) / 8,
    bodyDiagonalShareNPerM: 0,
  };
}

/** Poisson's ratio the lattice reproduces (fixed by the Cauchy relation of central springs). */
export function latticePoissonRatio(dimension: 2 | 3): number {
  return dimension === 3 ? 0.25 : 1 / 3;
}
