// Dealing episodes to splits in exact numbers. Episodes arrive in an order (random, or sorted by
// stratum and random within it); each goes to the split furthest behind its share of the
// episodes dealt so far, among splits not yet full. Every split ends with exactly its count, and
// along the order each split keeps close to its proportional share, so every run of consecutive
// episodes (a stratum) is split nearly in proportion. This is sequential apportionment, the
// problem of Balinski & Young, "Fair Representation" (1982), from memory; the bound the tests
// check is stated there.

/**
 * Split (index into `counts`) of each position of an order of `total` episodes, where
 * counts sum to total. Ties go to the split listed first.
 */
export function dealInOrder(counts: readonly number[], total: number): Uint8Array {
  const sum = counts.reduce((a, b) => a + b, 0);
  if (sum !== total) throw new RangeError(`split counts sum to ${sum}, not to the ${total} episodes being dealt`);
  const dealt = new Array<number>(counts.length).fill(0);
  const out = new Uint8Array(total);
  for (let k = 0; k < total; k++) {
    let best = -1;
    let bestDeficit = -Infinity;
    for (let s = 0; s < counts.length; s++) {
      if (dealt[s] >= counts[s]) continue;
      // Deficit scaled by total, an exact integer: counts_s (k + 1) - dealt_s total.
      const deficit = counts[s] * (k + 1) - dealt[s] * total;
      if (deficit > bestDeficit) {
        best = s;
        bestDeficit = deficit;
      }
    }
    out[k] = best;
    dealt[best]++;
  }
  return out;
}

/**
 * Whole counts from fractions by largest remainders (Hamilton's method; Balinski & Young 1982,
 * from memory): each split gets floor(fraction × total), the episodes left over go one each to
 * the largest fractional parts, ties to the split listed first.
 */
export function countsFromFractions(fractions: readonly number[], total: number): number[] {
  const sum = fractions.reduce((a, b) => a + b, 0);
  const quotas = fractions.map((f) => (f / sum) * total);
  const counts = quotas.map(Math.floor);
  let left = total - counts.reduce((a, b) => a + b, 0);
  const byRemainder = quotas.map((q, s) => ({ s, r: q - Math.floor(q) })).sort((a, b) => b.r - a.r || a.s - b.s);
  for (const { s } of byRemainder) {
    if (left <= 0) break;
    if (fractions[s] > 0) {
      counts[s]++;
      left--;
    }
  }
  return counts;
}
