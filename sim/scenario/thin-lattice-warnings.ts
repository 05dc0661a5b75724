// Warns about lattice bodies too thin to bend like the continuum they stand for. A beam of
// cubic or square cells n cells thick is stiffer in bending than Euler–Bernoulli predicts for
// its Young's modulus: measured on slender cantilevers (length 10× thickness) under their own
// weight, 2.2× at 1 cell, 1.30× at 2, 1.13× at 3, 1.07× at 4 and 1.03× at 6 cells (2-D; 3-D
// one cell deep alike), close to 1 + 1.2/n² from 2 cells on (test/core-lattice-bending.test.ts).
// Nothing is wrong with such a scenario, so these are warnings, not problems.
import { specBounds } from '../random/distribution.ts';
import { linkedRangeView } from './linked-parameters.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { MaterialMap, Scenario } from './scenario-types.ts';

/** Bodies thinner than this many cells across their bending direction get a warning. */
export const THIN_LATTICE_CELLS = 4;

/** Measured bending stiffness over Euler–Bernoulli's, by cells across (index 1 to 3). */
const MEASURED_STIFFNESS_RATIO = [Number.NaN, 2.2, 1.3, 1.13];

/** Below this length over thickness a body is a block, not a beam, and bends little anyway. */
const SLENDER_RATIO = 2;

export function findThinLatticeWarnings(written: Scenario): ScenarioProblem[] {
  const system = linkedRangeView(written).system;
  if (system.kind !== 'lattice') return [];
  const warnings: ScenarioProblem[] = [];
  if ('generator' in system.shape) {
    const bounds = system.shape.generator.boundsCells.map((b) => specBounds(b).max);
    warnings.push(...thinAxes(bounds).map((w) => ({ pointer: `/system/shape/generator/boundsCells/${w.axis}`, message: words(w, 'bodies grown in this box are at most') })));
    return warnings;
  }
  system.shape.maps.forEach((map, m) => {
    for (const w of thinAxes(extents(map))) warnings.push({ pointer: `/system/shape/maps/${m}`, message: words(w, 'this body is') });
  });
  return warnings;
}

interface ThinAxis {
  axis: number;
  cells: number;
  spanAxis: number;
  spanCells: number;
}

const AXIS_NAMES = ['x', 'y', 'z'];

function thinAxes(extent: number[]): ThinAxis[] {
  let spanAxis = 0;
  for (let a = 1; a < extent.length; a++) if (extent[a] > extent[spanAxis]) spanAxis = a;
  const out: ThinAxis[] = [];
  for (let a = 0; a < extent.length; a++) {
    if (a === spanAxis || extent[a] >= THIN_LATTICE_CELLS || extent[spanAxis] < SLENDER_RATIO * extent[a]) continue;
    out.push({ axis: a, cells: extent[a], spanAxis, spanCells: extent[spanAxis] });
  }
  return out;
}

function words(w: ThinAxis, subject: string): string {
  const ratio = MEASURED_STIFFNESS_RATIO[w.cells];
  return (
    `warning: ${subject} ${w.cells} cell${w.cells === 1 ? '' : 's'} thick along ${AXIS_NAMES[w.axis]} over ${w.spanCells} along ${AXIS_NAMES[w.spanAxis]}; ` +
    `a lattice this thin bends about ${Math.round((ratio - 1) * 100)}% stiffer than an Euler–Bernoulli beam of its Young's modulus ` +
    `(measured ${ratio}×; error about 1.2/n² for n cells across). Use at least ${THIN_LATTICE_CELLS} cells across, or lower youngsModulusPa to match a measured bending stiffness`
  );
}

/** Filled extent of a map in cells along x, y (and z). */
function extents(map: MaterialMap): number[] {
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  const threeD = Array.isArray((map as unknown[][])[0]?.[0]);
  const mark = (x: number, y: number, z: number): void => {
    const at = [x, y, z];
    for (let k = 0; k < 3; k++) {
      lo[k] = Math.min(lo[k], at[k]);
      hi[k] = Math.max(hi[k], at[k]);
    }
  };
  if (threeD) {
    (map as number[][][]).forEach((layer, y) => layer.forEach((row, z) => row.forEach((v, x) => v !== 0 && mark(x, y, z))));
  } else {
    (map as number[][]).forEach((row, y) => row.forEach((v, x) => v !== 0 && mark(x, y, 0)));
  }
  const out = [hi[0] - lo[0] + 1, hi[1] - lo[1] + 1];
  if (threeD) out.push(hi[2] - lo[2] + 1);
  return out;
}
