// The SI unit of a sampled label, read from the unit its scenario key carries in its name
// (`lengthM`, `youngsModulusPa`, `gravityMPerS2/1`), the project's naming rule. Keys without a
// unit suffix are counts, ratios or names and get "1"; unknown endings get "" rather than a guess.

// Longest suffix first, so "MPerS2" wins over "S2" and "NsPerM" over "M".
const SUFFIX_UNITS: ReadonlyArray<readonly [RegExp, string]> = [
  [/NsPerM3$/, 'N·s/m³'],
  [/NsPerM$/, 'N·s/m'],
  [/KgPerM3$/, 'kg/m³'],
  [/MPerS2$/, 'm/s²'],
  [/MPerS$/, 'm/s'],
  [/NPerM$/, 'N/m'],
  [/PerM$/, '1/m'],
  [/PerS$/, '1/s'],
  [/Pa$/, 'Pa'],
  [/Hz$/, 'Hz'],
  [/Rad$/, 'rad'],
  [/Kg$/, 'kg'],
  [/M3$/, 'm³'],
  [/M$/, 'm'],
  [/S$/, 's'],
  [/N$/, 'N'],
  [/J$/, 'J'],
];

const DIMENSIONLESS = /(Count|Ratio|Probability|Friction|Fraction|Index|Cells|Strain|StrainMax|Weights?|Unit|kind|name|shape|anchor|base|buoyancy|Channel|Axes|Handles)$/i;

/**
 * Unit of the label at `pointer`: from the last non-numeric key of the pointer. Levels of a
 * control signal (/controls/<channel>/std, …/amplitude) carry no unit in their key; they are in
 * the channel's unit, given by `channelUnits` (channel name → unit) when known.
 */
export function unitOfLabel(pointer: string, channelUnits?: ReadonlyMap<string, string>): string {
  const keys = pointer.split('/').filter((k) => k !== '' && !/^[0-9]+$/.test(k));
  const key = keys[keys.length - 1] ?? '';
  for (const [pattern, unit] of SUFFIX_UNITS) if (pattern.test(key)) return unit;
  if (DIMENSIONLESS.test(key)) return '1';
  if (keys[0] === 'controls' && keys.length >= 3) return channelUnits?.get(keys[1].replace(/~1/g, '/').replace(/~0/g, '~')) ?? '';
  return '';
}
