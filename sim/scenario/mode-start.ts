// A start in one of the model's own normal modes: the model is linearised about its state at
// this point of the start (after the curve and pose, and after settling when settleS > 0, so a
// hanging chain is linearised about where it hangs; otherwise about the start pose, an
// equilibrium only without gravity), its modes found over the free nodes' coordinates along
// the chosen axes (sim/core/normal-modes.ts), and mode `index` (1 = the slowest mode above the
// zero tolerance, so rigid-body and other zero modes are skipped) added to the positions,
// scaled so that the largest displacement of any node is |amplitudeM|. Sign, so the same
// model always starts the same way: the first coordinate (node by node, x before y before z)
// whose displacement is at least SIGN_SHARE of the largest is positive for amplitudeM > 0;
// a negative amplitudeM starts the other way. Velocities are left as they are (zero unless a
// start velocity or spin follows), so the mode starts from rest at its turning point.
import type { Model } from '../core/model.ts';
import { freeCoordinates, normalModes, vibrationModes } from '../core/normal-modes.ts';
import { ScenarioProblemError } from './scenario-problem.ts';

export interface ResolvedModeStart {
  /** 1-based among the modes above the zero tolerance, slowest first. */
  index: number;
  amplitudeM: number;
  /** Axes (0 x, 1 y, 2 z) whose coordinates take part; the others are held while linearising. */
  axes: number[];
}

/** Share of the largest coordinate displacement that decides the sign (robust to rounding noise). */
export const SIGN_SHARE = 1e-3;

/** Adds the mode to the positions; returns its frequency ω/(2π), Hz. */
export function applyModeStart(model: Model, mode: ResolvedModeStart): { frequencyHz: number } {
  const coordinates = freeCoordinates(model, mode.axes);
  const modes = normalModes(model, coordinates);
  const kept = vibrationModes(modes);
  if (mode.index > kept.length) {
    throw new ScenarioProblemError([{
      pointer: '/initialState/mode/index',
      message: `is ${mode.index}, but this episode's system has ${kept.length} vibration mode${kept.length === 1 ? '' : 's'} over its ${coordinates.length} free coordinates (the other ${coordinates.length - kept.length} have no restoring stiffness: rigid-body motions, or a slack chain's sideways swing, which settleS under gravity gives a tension); choose a lower index or settle the system first`,
    }]);
  }
  const m = kept[mode.index - 1];
  const n = coordinates.length;
  const shape = modes.shapes.subarray(m * n, (m + 1) * n);
  let largestCoordinate = 0;
  for (let c = 0; c < n; c++) largestCoordinate = Math.max(largestCoordinate, Math.abs(shape[c]));
  let sign = 1;
  for (let c = 0; c < n; c++) {
    if (Math.abs(shape[c]) >= SIGN_SHARE * largestCoordinate) {
      sign = shape[c] > 0 ? 1 : -1;
      break;
    }
  }
  // Coordinates come node by node, so a node's displacement is the norm of its run.
  let largestNode = 0;
  for (let c = 0; c < n;) {
    const node = Math.floor(coordinates[c] / 3);
    let squared = 0;
    for (; c < n && Math.floor(coordinates[c] / 3) === node; c++) squared += shape[c] * shape[c];
    largestNode = Math.max(largestNode, Math.sqrt(squared));
  }
  const scale = (sign * mode.amplitudeM) / largestNode;
  for (let c = 0; c < n; c++) model.positionM[coordinates[c]] += scale * shape[c];
  return { frequencyHz: Math.sqrt(modes.eigenvalues[m]) / (2 * Math.PI) };
}
