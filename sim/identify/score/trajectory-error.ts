// Position error of a predicted trajectory against the recorded one, per recorded step: the
// root mean square over nodes of the Euclidean distance between predicted and recorded node
// positions, RMSE(h) = sqrt((1/N) Σ_i |p̂_i(h) − p_i(h)|²), in metres. Per node Euclidean, so
// it is sqrt(3) times the per-coordinate RMSE. Every node counts, pinned and driven ones too:
// the prediction is of the whole `positions` array. See SCORING.md.
import type { FloatData } from '../predictions/prediction-arrays.ts';

/** Writes RMSE(h) for h = 0 … rows−1 into outRmseM[0 … rows−1]. */
export function positionRmsePerStep(predicted: FloatData, recorded: FloatData, rows: number, nodes: number, outRmseM: Float64Array): void {
  const perRow = 3 * nodes;
  for (let h = 0; h < rows; h++) {
    const o = h * perRow;
    let sum = 0;
    for (let j = 0; j < perRow; j++) {
      const d = predicted[o + j] - recorded[o + j];
      sum += d * d;
    }
    outRmseM[h] = Math.sqrt(sum / nodes);
  }
}
