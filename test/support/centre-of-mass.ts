// Centre of mass and total linear momentum of the free nodes of a model, read from a flat
// positions/velocities array (one frame of a trajectory or the live model state).
import type { Model } from '../../sim/core/model.ts';

/** Writes the mass-weighted mean of the free nodes' vectors (positions or velocities) to out. */
export function freeNodeMeanOf(model: Model, vectors: Float64Array, frameOffset: number, out: Float64Array): Float64Array {
  let total = 0;
  out[0] = 0;
  out[1] = 0;
  out[2] = 0;
  for (let i = 0; i < model.nodeCount; i++) {
    if (model.inverseMassPerKg[i] === 0) continue;
    const m = model.massKg[i];
    const o = frameOffset + 3 * i;
    out[0] += m * vectors[o];
    out[1] += m * vectors[o + 1];
    out[2] += m * vectors[o + 2];
    total += m;
  }
  out[0] /= total;
  out[1] /= total;
  out[2] /= total;
  return out;
}

/** Total mass of the free nodes, kg. */
export function freeMassKg(model: Model): number {
  let total = 0;
  for (let i = 0; i < model.nodeCount; i++) if (model.inverseMassPerKg[i] !== 0) total += model.massKg[i];
  return total;
}
