// Material maps drawn as text: rows of characters with a legend that names each character's
// material, a form one can read and edit by eye where the numeric form ([y][x] of material
// numbers, bottom row first) has to be counted. The text is a picture, so it is written top
// first, as the body looks: a 2-D map is its rows from the top down, a 3-D map its levels from
// the top down, each level a plan seen from above with one row per z (z = 0 first). Every
// character a map uses must be in its legend, except "." which is always empty; a legend
// entry of null is empty too. Converted to the numeric form once, when a scenario is checked,
// so everything after the checker (and the seed file) sees numbers only.
import type { ScenarioProblem } from './scenario-problem.ts';
import type { MaterialMap } from './scenario-types.ts';

export interface TextMaterialMap2D {
  legend: Record<string, string | null>;
  rows: string[];
}

export interface TextMaterialMap3D {
  legend: Record<string, string | null>;
  levels: string[][];
}

export type TextMaterialMap = TextMaterialMap2D | TextMaterialMap3D;

/** The character that is empty without a legend entry. */
export const EMPTY_CELL_CHARACTER = '.';

export function isTextMaterialMap(map: unknown): map is TextMaterialMap {
  return map !== null && typeof map === 'object' && !Array.isArray(map);
}

/**
 * The numeric map a text map draws, or the problems that stop it. `materialNames` are the
 * scenario's materials in order (material m is number m + 1); `pointer` is the map's own.
 */
export function numericMaterialMap(
  map: TextMaterialMap, materialNames: readonly string[], pointer: string,
): { map: MaterialMap; problems: ScenarioProblem[] } {
  const problems: ScenarioProblem[] = [];
  const numberOf = new Map<string, number>([[EMPTY_CELL_CHARACTER, 0]]);
  for (const [character, name] of Object.entries(map.legend)) {
    const at = `${pointer}/legend/${character.replace(/~/g, '~0').replace(/\//g, '~1')}`;
    if ([...character].length !== 1) {
      problems.push({ pointer: at, message: `"${character}" is not one character; each legend key is the single character that stands for a material in the rows` });
      continue;
    }
    if (name === null) {
      numberOf.set(character, 0);
      continue;
    }
    const index = materialNames.indexOf(name);
    if (index < 0) {
      problems.push({ pointer: at, message: `names the material "${name}", which /system/materials does not list; the materials are ${materialNames.map((n) => `"${n}"`).join(', ')} (or null for an empty cell)` });
      continue;
    }
    numberOf.set(character, index + 1);
  }
  const rowNumbers = (row: string, at: string): number[] => {
    const cells: number[] = [];
    [...row].forEach((character, x) => {
      const value = numberOf.get(character);
      if (value === undefined) {
        problems.push({ pointer: at, message: `has "${character}" at character ${x + 1}, which the legend does not name; add it to ${pointer}/legend or use "${EMPTY_CELL_CHARACTER}" for an empty cell` });
        cells.push(0);
      } else cells.push(value);
    });
    return cells;
  };
  if ('rows' in map) {
    const rows = map.rows.map((row, r) => rowNumbers(row, `${pointer}/rows/${r}`));
    return { map: rows.reverse(), problems };
  }
  const levels = map.levels.map((level, l) => level.map((row, z) => rowNumbers(row, `${pointer}/levels/${l}/${z}`)));
  return { map: levels.reverse(), problems };
}
