// Random face-connected bodies: starting from one seed cell, each step adds a cell chosen
// uniformly among the empty cells that share a face with the body and lie inside the box. The
// body is face-connected by construction and the result depends only on the stream.
import type { RandomStream } from '../random/random-stream.ts';

export interface GrownShape {
  nx: number;
  ny: number;
  nz: number;
  /** Linear cell indices (x + nx·(y + ny·z)) in the order they were added. */
  cells: Int32Array;
}

/**
 * Grows `cellCount` cells inside nx × ny × nz (nz = 1 for 2-D). With `seedOnBottom` the seed
 * cell lies in the bottom layer y = 0, so a clamped base has something to hold.
 */
export function growFaceConnectedShape(nx: number, ny: number, nz: number, cellCount: number, seedOnBottom: boolean, stream: RandomStream): GrownShape {
  const total = nx * ny * nz;
  if (!(cellCount >= 1 && cellCount <= total)) throw new RangeError(`cannot grow ${cellCount} cells in a box of ${total}`);
  const queued = new Uint8Array(total);
  const frontier = new Int32Array(total);
  const cells = new Int32Array(cellCount);
  let frontierLength = 0;
  const x0 = stream.nextIntInclusive(0, nx - 1);
  const y0 = seedOnBottom ? 0 : stream.nextIntInclusive(0, ny - 1);
  const z0 = stream.nextIntInclusive(0, nz - 1);
  frontier[frontierLength++] = x0 + nx * (y0 + ny * z0);
  queued[frontier[0]] = 1;
  for (let count = 0; count < cellCount; count++) {
    const pick = count === 0 ? 0 : stream.nextIntInclusive(0, frontierLength - 1);
    const cell = frontier[pick];
    frontier[pick] = frontier[--frontierLength];
    cells[count] = cell;
    const x = cell % nx;
    const y = Math.floor(cell / nx) % ny;
    const z = Math.floor(cell / (nx * ny));
    const queue = (cx: number, cy: number, cz: number): void => {
      if (cx < 0 || cy < 0 || cz < 0 || cx >= nx || cy >= ny || cz >= nz) return;
      const neighbour = cx + nx * (cy + ny * cz);
      if (queued[neighbour]) return;
      queued[neighbour] = 1;
      frontier[frontierLength++] = neighbour;
    };
    queue(x - 1, y, z);
    queue(x + 1, y, z);
    queue(x, y - 1, z);
    queue(x, y + 1, z);
    queue(x, y, z - 1);
    queue(x, y, z + 1);
  }
  return { nx, ny, nz, cells };
}
