// A full-factorial grid: every combination of the chosen levels of each coordinate, one episode
// per combination. Level k of L sits at the middle of its stratum, (k + 1/2) / L, so that after
// the inverse CDF a grid of an integer or categorical parameter with as many levels as values
// visits each value once, and a continuous one is spread evenly in probability. Episodes run
// through the combinations like digits of a mixed-radix number whose last coordinate changes
// fastest, so episode i's point needs only i and the level counts.

/** Coordinates in [0, 1) of episode `index` of a grid with `levels[p]` levels on coordinate p. */
export function gridCoordinates(levels: readonly number[], index: number): number[] {
  const out = new Array<number>(levels.length);
  let rest = index;
  for (let p = levels.length - 1; p >= 0; p--) {
    const level = rest % levels[p];
    rest = Math.floor(rest / levels[p]);
    out[p] = (level + 0.5) / levels[p];
  }
  return out;
}

/** Number of combinations, the episodes a grid needs. */
export function gridPointCount(levels: readonly number[]): number {
  return levels.reduce((product, l) => product * l, 1);
}
