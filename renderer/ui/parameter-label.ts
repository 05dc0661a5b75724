// Words for a sampled parameter's JSON pointer, for tables a person reads: the path in plain
// words without the unit suffix our naming rule puts on keys, and the unit on its own
// ("/system/materials/0/youngsModulusPa" → "materials 0 · youngs modulus", "Pa"). A key that names
// no unit reads "–" (dimensionless), never "1".
import { unitFromKey } from '../sweep/unit-from-key.ts';

export interface ParameterLabel {
  /** The pointer in words, e.g. "cell size" or "materials 0 · damping ratio". */
  name: string;
  /** The SI unit, or "–" for a dimensionless value. */
  unit: string;
  pointer: string;
}

/** Shown in place of a unit for a dimensionless quantity. */
export const DIMENSIONLESS = '–';

/** Top-level groups every label lives in; they add nothing to a table already about one episode. */
const GROUPS = new Set(['system']);

export function parameterLabel(pointer: string): ParameterLabel {
  const segments = pointer.split(/[/.]/).filter((s) => s !== '').map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'));
  const words: string[] = [];
  let unit: string | null = null;
  segments.forEach((segment, i) => {
    if (i === 0 && GROUPS.has(segment) && segments.length > 1) return;
    if (/^[0-9]+(–[0-9]+)?$/.test(segment)) {
      // An index joins the word before it ("materials 0").
      if (words.length > 0) words[words.length - 1] += ` ${segment}`;
      else words.push(segment);
      return;
    }
    const last = i === segments.length - 1 || segments.slice(i + 1).every((s) => /^[0-9]+(–[0-9]+)?$/.test(s));
    const keyUnit = last ? unitFromKey(segment) ?? compoundUnit(segment) : null;
    if (last) unit = keyUnit;
    words.push(spacedWords(keyUnit ? stripUnit(segment) : segment));
  });
  return { name: words.join(' · ') || pointer, unit: dimensionlessDash(unit), pointer };
}

/** "1" (the SI way of writing a dimensionless unit) and no unit both read "–". */
export function dimensionlessDash(unit: string | null | undefined): string {
  return !unit || unit === '1' ? DIMENSIONLESS : unit;
}

/** Units written as one word in keys ("bendingStiffnessNm2" → N·m²), which unitFromKey reads word by word. */
const COMPOUND_UNITS: Readonly<Record<string, string>> = { Nm2: 'N·m²', Nm: 'N·m' };

function compoundUnit(key: string): string | null {
  const match = /[a-z0-9]([A-Z][a-z]*[0-9]*)$/.exec(key);
  return match ? COMPOUND_UNITS[match[1]] ?? null : null;
}

/** Removes the trailing unit words (M, Pa, KgPerM3, …) the key ends in. */
function stripUnit(key: string): string {
  const words = key.match(/[A-Z][a-z]*[0-9]*|^[a-z]+[0-9]*/g) ?? [key];
  let end = words.length;
  while (end > 1 && (UNIT_WORDS.has(words[end - 1]) || words[end - 1] === 'Per')) end--;
  return words.slice(0, end).join('');
}

const UNIT_WORDS = new Set(['M', 'M2', 'M3', 'Kg', 'S', 'S2', 'N', 'Ns', 'Pa', 'Hz', 'J', 'W', 'Rad', 'Nm', 'Nm2']);

function spacedWords(key: string): string {
  return key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
}

/**
 * A drawn value as a table shows it: numbers as they are, a list of numbers as its count and
 * range ("16 values, 0.1–0.9"), anything else as short text.
 */
export function summariseValue(text: string): string {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    return text;
  }
  if (Array.isArray(value)) {
    const numbers = value.flat(Infinity).filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
    if (numbers.length === 0) return `${value.length} values`;
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of numbers) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    const range = lo === hi ? `all ${short(lo)}` : `${short(lo)}–${short(hi)}`;
    return `${numbers.length} values, ${range}`;
  }
  if (typeof value === 'number') return short(value);
  return typeof value === 'string' ? value : text;
}

function short(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(4)));
}

export interface ParameterGroup {
  /** Pointers of the group's members, in the order given. */
  pointers: string[];
  label: ParameterLabel;
  /** The members' values as a table shows them: one value as it is, several summarised. */
  value: string;
}

/**
 * Groups parameters that differ only in an index ("/system/materials/0/densityKgPerM3" …
 * "/system/materials/15/densityKgPerM3", or "actuator-0" … "actuator-15"), so sixteen materials
 * take one row each quantity rather than sixteen: "materials 0–15 · density", "16 values, all 1000".
 */
export function groupParameters(labels: Record<string, string>): ParameterGroup[] {
  const groups = new Map<string, { pointers: string[]; values: string[]; indices: number[][] }>();
  for (const [pointer, value] of Object.entries(labels)) {
    const indices: number[] = [];
    const pattern = pointer.replace(/(^|\/|-)([0-9]+)(?=\/|$)/g, (_, lead: string, digits: string) => {
      indices.push(Number(digits));
      return `${lead}#`;
    });
    let group = groups.get(pattern);
    if (!group) groups.set(pattern, (group = { pointers: [], values: [], indices: [] }));
    group.pointers.push(pointer);
    group.values.push(value);
    group.indices.push(indices);
  }
  return [...groups.entries()].map(([pattern, g]) => {
    if (g.pointers.length === 1) return { pointers: g.pointers, label: parameterLabel(g.pointers[0]), value: summariseValue(g.values[0]) };
    let slot = 0;
    const ranged = pattern.replace(/#/g, () => {
      const column = g.indices.map((list) => list[slot]);
      slot++;
      const lo = Math.min(...column);
      const hi = Math.max(...column);
      return lo === hi ? String(lo) : `${lo}–${hi}`;
    });
    return { pointers: g.pointers, label: { ...parameterLabel(ranged), pointer: ranged }, value: summariseValue(`[${g.values.map((v) => (isJsonNumber(v) ? v : JSON.stringify(v))).join(',')}]`) };
  });
}

function isJsonNumber(text: string): boolean {
  return /^-?[0-9]+(\.[0-9]+)?([eE][+-]?[0-9]+)?$/.test(text.trim());
}
