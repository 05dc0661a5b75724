// Randomises an episode's start: normal noise on the position and velocity of every free node.
// Pinned and driven nodes keep their prescribed state; 2-D lattices stay in their plane.
import type { Model } from '../core/model.ts';
import { NODE_DRIVEN, NODE_PINNED } from '../core/model.ts';
import type { RandomStream } from '../random/random-stream.ts';

/**
 * Adds N(0, positionStdM²) to each in-plane coordinate and N(0, velocityStdMPerS²) to each
 * in-plane velocity component of every free node. Positions and velocities come from separate
 * streams so that turning one noise on or off leaves the other unchanged.
 */
export function applyInitialStateNoise(
  model: Model,
  dimensions: 2 | 3,
  positionStdM: number,
  velocityStdMPerS: number,
  positionStream: RandomStream,
  velocityStream: RandomStream,
): void {
  const n = model.nodeCount;
  const x = model.positionM;
  const v = model.velocityMPerS;
  for (let i = 0; i < n; i++) {
    if (model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN)) continue;
    for (let axis = 0; axis < dimensions; axis++) {
      if (positionStdM > 0) x[3 * i + axis] += positionStdM * positionStream.nextNormal();
      if (velocityStdMPerS > 0) v[3 * i + axis] += velocityStdMPerS * velocityStream.nextNormal();
    }
  }
}
