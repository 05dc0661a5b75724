// The lattice-8x8x8 benchmark case: an 8 × 8 × 8 block of cubic cells, each with its 12 edges,
// 12 face diagonals and 4 body diagonals, neighbours sharing nodes and springs. Counting on a
// cubic grid of n³ cells (elementary combinatorics): (n+1)³ nodes, 3·n·(n+1)² edges,
// 3·n²·(n+1) faces with 2 diagonals each, n³ cells with 4 body diagonals each. The bench line
// must report those counts. A short run keeps every node on the ground plane y = 0 or above it,
// which is what a projection contact model is for (common practice, no source), up to the
// rounding of landing exactly on the plane (y + dt·(h − y)/dt need not be h to the last bit).
import { describe, expect, it } from 'vitest';

import { buildLattice8x8x8, lattice8x8x8Case, runLattice8x8x8 } from '../sim/bench/lattice-8x8x8.ts';

const N = 8;
const NODES = (N + 1) ** 3;
const SPRINGS = 3 * N * (N + 1) ** 2 + 2 * 3 * N * N * (N + 1) + 4 * N ** 3;

describe('lattice-8x8x8 benchmark case (counts on a cubic grid, elementary combinatorics)', () => {
  it(`has ${NODES} nodes and ${SPRINGS} springs`, () => {
    const model = buildLattice8x8x8();
    expect(model.nodeCount).toBe(NODES);
    expect(model.springCount).toBe(SPRINGS);
    expect(model.controlChannelCount).toBe(1);
  });

  it('a short actuated run on the ground stays finite with no node below the plane', () => {
    const run = runLattice8x8x8(10);
    expect(Number.isFinite(run.checksum)).toBe(true);
    expect(run.lowestYM).toBeGreaterThanOrEqual(-1e-12);
    expect(run.nodes).toBe(NODES);
    expect(run.springs).toBe(SPRINGS);
  });

  it('the bench line reports throughput, node and spring counts and a checksum', async () => {
    const line = await lattice8x8x8Case.run();
    expect(line).toMatchObject({ nodes: NODES, springs: SPRINGS });
    expect(Object.keys(line).sort()).toEqual(['checksum', 'dt_s', 'kernel', 'nodes', 'seconds', 'spring_updates_per_s', 'springs', 'steps']);
    expect(Number.isFinite(line.checksum)).toBe(true);
    expect(line.spring_updates_per_s as number).toBeGreaterThan(0);
  });
});
