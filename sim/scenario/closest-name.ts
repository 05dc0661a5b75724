// "Did you mean …?" for misspelt keys and enum values: the known name nearest to what was
// written, by Levenshtein edit distance (insertions, deletions, substitutions; Levenshtein 1966),
// and only when it is near enough to be a likely typo rather than a different word.

/** Levenshtein distance between two strings, compared case-insensitively. */
export function editDistance(a: string, b: string): number {
  const s = a.toLowerCase();
  const t = b.toLowerCase();
  let previous = new Array<number>(t.length + 1);
  let current = new Array<number>(t.length + 1);
  for (let j = 0; j <= t.length; j++) previous[j] = j;
  for (let i = 1; i <= s.length; i++) {
    current[0] = i;
    for (let j = 1; j <= t.length; j++) {
      const substitution = previous[j - 1] + (s[i - 1] === t[j - 1] ? 0 : 1);
      current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, substitution);
    }
    [previous, current] = [current, previous];
  }
  return previous[t.length];
}

/**
 * The one candidate that `written` abbreviates, else the candidate closest to it if within a
 * third of its length (at least 2 edits; 1 for words of up to 4 letters); else undefined.
 */
export function closestName(written: string, candidates: readonly string[]): string | undefined {
  // A clear abbreviation ("valid" for "validation") is a likelier intent than any near word.
  const lower = written.toLowerCase();
  const extending = lower.length >= 3 ? candidates.filter((c) => c.toLowerCase().startsWith(lower) && c !== written) : [];
  if (extending.length === 1) return extending[0];
  // Short words are only a typo away from many others ("sine" and "none"), so allow one edit.
  const allowed = written.length <= 4 ? 1 : Math.max(2, Math.floor(written.length / 3));
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const distance = editDistance(written, candidate);
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return bestDistance <= allowed && best !== written ? best : undefined;
}
