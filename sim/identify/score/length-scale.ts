// The length an episode's position errors are divided by, so that chains and lattices of other
// sizes compare: the root mean square distance of the recorded nodes from their centroid at
// t = 0 (the unweighted radius of gyration of the initial configuration), in metres. It needs
// no knowledge of the system's kind and does not change when the body is rotated or moved.
// A straight chain of length L with evenly spaced nodes has about L/sqrt(12) (uniform rod).
import type { FloatData } from '../predictions/prediction-arrays.ts';

export function initialRmsRadiusM(recordedPositionsM: FloatData, nodes: number): number {
  let cx = 0;
  let cy = 0;
  let cz = 0;
  for (let i = 0; i < nodes; i++) {
    cx += recordedPositionsM[3 * i];
    cy += recordedPositionsM[3 * i + 1];
    cz += recordedPositionsM[3 * i + 2];
  }
  cx /= nodes;
  cy /= nodes;
  cz /= nodes;
  let sum = 0;
  for (let i = 0; i < nodes; i++) {
    const dx = recordedPositionsM[3 * i] - cx;
    const dy = recordedPositionsM[3 * i + 1] - cy;
    const dz = recordedPositionsM[3 * i + 2] - cz;
    sum += dx * dx + dy * dy + dz * dz;
  }
  return Math.sqrt(sum / nodes);
}
