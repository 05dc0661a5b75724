// Reads the SI unit from the end of a scenario key, where our naming rule puts it
// (restLengthM → m, densityKgPerM3 → kg/m³, dampingNsPerM → N·s/m), so the form can print the
// unit beside every value without a second table to keep in step with the schema.

const UNIT_TOKENS: Readonly<Record<string, string>> = {
  M: 'm',
  M2: 'm²',
  M3: 'm³',
  Kg: 'kg',
  S: 's',
  S2: 's²',
  N: 'N',
  Ns: 'N·s',
  Pa: 'Pa',
  Hz: 'Hz',
  J: 'J',
  W: 'W',
  Rad: 'rad',
};

/** The unit the key ends in, or null when the key names none. */
export function unitFromKey(key: string): string | null {
  const words = key.match(/[A-Z][a-z]*[0-9]*|^[a-z]+[0-9]*/g);
  if (!words || words.length < 2) return null;
  const numerator: string[] = [];
  const denominator: string[] = [];
  let i = words.length - 1;
  const taken: string[] = [];
  while (i >= 1 && (UNIT_TOKENS[words[i]] !== undefined || words[i] === 'Per')) {
    taken.unshift(words[i]);
    i--;
  }
  if (taken.length === 0) return null;
  let below = false;
  for (const word of taken) {
    if (word === 'Per') {
      below = true;
      continue;
    }
    (below ? denominator : numerator).push(UNIT_TOKENS[word]);
  }
  if (numerator.length === 0 && denominator.length === 0) return null;
  const top = numerator.length > 0 ? numerator.join('·') : '1';
  return denominator.length > 0 ? `${top}/${denominator.join('·')}` : top;
}

/**
 * The unit of a field from its key, else from its description: "1" where it says dimensionless,
 * or the short unit after ", in" / ", " at the end of a sentence ("Phase at t = 0, in rad").
 */
export function unitOfField(key: string, description: string | undefined): string | null {
  const fromKey = unitFromKey(key);
  if (fromKey) return fromKey;
  if (!description) return null;
  if (/\bdimensionless\b/i.test(description)) return '1';
  const match = /,\s*(?:in\s+)?([A-Za-z·/²³]{1,8})(?=[.;:(]|\s*$)/.exec(description);
  return match && KNOWN_UNITS.has(match[1]) ? match[1] : null;
}

const KNOWN_UNITS = new Set(['m', 's', 'N', 'Hz', 'rad', 'Pa', 'kg', 'J', 'W', 'm/s', 'm/s²', 'kg/m³', '1/s', 'N·s/m', 'N·s/m³']);
