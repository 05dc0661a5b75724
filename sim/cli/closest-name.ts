// "Did you mean …?" for a mistyped command or option: the known name nearest by edit distance
// (Levenshtein: insertions, deletions and substitutions cost 1; common practice, no source),
// offered only when it is close enough that the guess is likely to be what was meant.

function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
    }
    previous = current;
  }
  return previous[b.length];
}

/** The known name nearest to `typed`, or null when none is within a third of its length (at least 1, at most 3 edits). */
export function closestName(typed: string, known: readonly string[]): string | null {
  const limit = Math.min(3, Math.max(1, Math.floor(typed.replace(/^-+/, '').length / 3)));
  let best: string | null = null;
  let bestDistance = Infinity;
  for (const name of known) {
    const d = editDistance(typed, name);
    if (d < bestDistance) {
      best = name;
      bestDistance = d;
    }
  }
  return bestDistance <= limit ? best : null;
}

/** ' (did you mean "X"?)' or "" */
export function didYouMean(typed: string, known: readonly string[]): string {
  const guess = closestName(typed, known);
  return guess === null ? '' : ` (did you mean "${guess}"?)`;
}
