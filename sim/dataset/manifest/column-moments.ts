// Per-column count, mean, sum of squared deviations (M2), minimum and maximum of an array whose
// last axis is the column (x, y, z of positions; one control channel each), for the per-split
// normalisation statistics a training loop needs. Each episode's moments are computed in two
// passes in float64 from the values as written (after rounding to the export dtype, so they
// describe the files), kept in its manifest record, and combined per split in episode-index
// order with the pairwise update of Chan, Golub & LeVeque (1979, "Updating formulae and a
// pairwise algorithm for computing sample variances"): the same order in a single run, after
// `--resume` and after a merge of shards, so the statistics agree bit for bit.

export interface ColumnMoments {
  count: number;
  mean: number[];
  m2: number[];
  min: number[];
  max: number[];
}

/** Moments of `values` read as rows of `columns` numbers; null when there are no rows. */
export function columnMoments(values: ArrayLike<number>, columns: number): ColumnMoments | null {
  const rows = columns > 0 ? Math.floor(values.length / columns) : 0;
  if (rows === 0) return null;
  const mean = new Array<number>(columns).fill(0);
  const min = new Array<number>(columns).fill(Infinity);
  const max = new Array<number>(columns).fill(-Infinity);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) {
      const v = values[r * columns + c];
      mean[c] += v;
      if (v < min[c]) min[c] = v;
      if (v > max[c]) max[c] = v;
    }
  }
  for (let c = 0; c < columns; c++) mean[c] /= rows;
  const m2 = new Array<number>(columns).fill(0);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < columns; c++) {
      const d = values[r * columns + c] - mean[c];
      m2[c] += d * d;
    }
  }
  return { count: rows, mean, m2, min, max };
}

/** The moments of a and b together (Chan, Golub & LeVeque's pairwise update); null when the columns differ. */
export function combineMoments(a: ColumnMoments, b: ColumnMoments): ColumnMoments | null {
  if (a.mean.length !== b.mean.length) return null;
  const count = a.count + b.count;
  const mean: number[] = [];
  const m2: number[] = [];
  for (let c = 0; c < a.mean.length; c++) {
    const delta = b.mean[c] - a.mean[c];
    mean.push(a.mean[c] + delta * (b.count / count));
    m2.push(a.m2[c] + b.m2[c] + delta * delta * ((a.count * b.count) / count));
  }
  return {
    count,
    mean,
    m2,
    min: a.min.map((v, c) => Math.min(v, b.min[c])),
    max: a.max.map((v, c) => Math.max(v, b.max[c])),
  };
}
