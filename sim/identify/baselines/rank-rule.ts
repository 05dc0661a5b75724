// How many singular values of the snapshot matrix the linear baseline keeps. "auto" is the
// numerical-rank rule NumPy's lstsq and matrix_rank use: keep σ_i > max(rows, columns)·ε·σ₁
// (ε = 2⁻⁵², float64 machine epsilon; Press et al., Numerical Recipes, §2.6, and the NumPy
// documentation of numpy.linalg.matrix_rank). A whole number R keeps at most R of the values
// that pass that rule (a truncation that regularises the fit: Proctor, Brunton & Kutz 2016, §3).
// `energy:F` keeps the fewest leading values whose squares sum to at least the fraction F of all.
// "stable" (the command line's default) keeps the largest rank up to the numerical one whose
// fitted state-transition matrix has spectral radius ≤ 1, so an open-loop rollout cannot grow
// without bound; it is decided in linear-fit.ts, which can form the operator.

export type RankChoice = { kind: 'auto' } | { kind: 'stable' } | { kind: 'fixed'; rank: number } | { kind: 'energy'; fraction: number };

export function numericalRankTolerance(singularValues: ArrayLike<number>, rows: number, columns: number): number {
  const largest = singularValues.length > 0 ? singularValues[0] : 0;
  return Math.max(rows, columns) * Number.EPSILON * largest;
}

/** Number of singular values to keep; values must be sorted descending. */
export function chooseRank(singularValues: ArrayLike<number>, rows: number, columns: number, choice: RankChoice): number {
  const tolerance = numericalRankTolerance(singularValues, rows, columns);
  let numerical = 0;
  while (numerical < singularValues.length && singularValues[numerical] > tolerance) numerical++;
  if (choice.kind === 'auto' || choice.kind === 'stable') return numerical;
  if (choice.kind === 'fixed') return Math.min(choice.rank, numerical);
  let total = 0;
  for (let i = 0; i < numerical; i++) total += singularValues[i] * singularValues[i];
  let kept = 0;
  let sum = 0;
  while (kept < numerical && sum < choice.fraction * total) {
    sum += singularValues[kept] * singularValues[kept];
    kept++;
  }
  return kept;
}

/** Parses the --rank option: "stable", "auto", a whole number ≥ 1, or "energy:F" with 0 < F ≤ 1; null if malformed. */
export function parseRankChoice(text: string): RankChoice | null {
  if (text === 'auto') return { kind: 'auto' };
  if (text === 'stable') return { kind: 'stable' };
  if (/^[1-9][0-9]*$/.test(text)) return { kind: 'fixed', rank: Number(text) };
  const energy = /^energy:(0?\.[0-9]+|1(\.0*)?)$/.exec(text);
  if (energy) {
    const fraction = Number(energy[1]);
    if (fraction > 0 && fraction <= 1) return { kind: 'energy', fraction };
  }
  return null;
}

export function rankChoiceText(choice: RankChoice): string {
  if (choice.kind === 'auto' || choice.kind === 'stable') return choice.kind;
  if (choice.kind === 'fixed') return String(choice.rank);
  return `energy:${choice.fraction}`;
}
