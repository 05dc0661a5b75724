// The scenario a calibration writes: the user's scenario as written, with each identifiable
// fitted parameter replaced by a uniform range of ± k standard errors around its fitted value
// (clipped to the fit's search box, which keeps the sign) and every other key left as it was,
// so `pliant generate` randomises around what the bench showed. Parameters the data could not
// tell keep their original spec, and so do the bench's known values: they are the conditions
// of that one test (a tether's part count, its weighed mass), not findings to sweep around, and
// writing them as constants would also void held-out rules built on them.
import { checkScenarioValue } from '../../scenario/check-scenario.ts';
import { pointerSegments } from '../../scenario/json-source-map.ts';
import type { ScenarioProblem } from '../../scenario/scenario-problem.ts';
import type { CalibrationResult } from './calibrate.ts';

/** Default k: ± 2 standard errors, about a 95 % interval for a well-posed fit. */
export const DEFAULT_RANGE_STANDARD_ERRORS = 2;

export interface FittedRange {
  pointer: string;
  min: number;
  max: number;
}

export type FittedScenario = { ok: true; value: Record<string, unknown>; ranges: FittedRange[] } | { ok: false; value: Record<string, unknown>; problems: ScenarioProblem[] };

/** Ranges v ± k·SE of the identifiable parameters, clipped to the search box. */
export function fittedRanges(result: CalibrationResult, k: number): FittedRange[] {
  return result.parameters
    .filter((p) => p.identifiable && p.standardError !== null)
    .map((p) => ({
      pointer: p.pointer,
      min: Math.max(p.searchMin, p.value - k * (p.standardError as number)),
      max: Math.min(p.searchMax, p.value + k * (p.standardError as number)),
    }));
}

export function fittedScenario(written: unknown, result: CalibrationResult, k: number, measurementName: string): FittedScenario {
  const value = structuredClone(written) as Record<string, unknown>;
  const ranges = fittedRanges(result, k);
  for (const range of ranges) setAtPointer(value, range.pointer, { kind: 'uniform', min: significant(range.min), max: significant(range.max) });
  const name = typeof value.name === 'string' ? `${value.name}-fitted`.slice(0, 64) : 'fitted';
  value.name = name;
  const untold = result.parameters.filter((p) => !p.identifiable).map((p) => p.pointer);
  const note =
    ` Calibrated by pliant calibrate to ${measurementName}: ${ranges.map((r) => r.pointer).join(', ') || 'no parameter'} ${ranges.length === 1 ? 'is' : 'are'} uniform over the fitted value ± ${k} standard errors` +
    (result.selection.known.length ? `; the bench's known values (${result.selection.known.join(', ')}) were used for the fit and are kept as written here` : '') +
    (untold.length ? `; ${untold.join(', ')} kept as written (not identifiable from the measurement)` : '') +
    '.';
  value.description = `${typeof value.description === 'string' ? value.description : ''}${note}`.slice(0, 4000);
  const checked = checkScenarioValue(value);
  return checked.ok ? { ok: true, value, ranges } : { ok: false, value, problems: checked.problems };
}

/** Twelve significant digits: enough for any range, and no 0.30000000000000004 in the file. */
function significant(x: number): number {
  return Number(x.toPrecision(12));
}

function setAtPointer(root: Record<string, unknown>, pointer: string, replacement: unknown): void {
  const segments = pointerSegments(pointer);
  let node: Record<string, unknown> | unknown[] = root;
  for (let i = 0; i < segments.length - 1; i++) {
    const key = segments[i];
    const next = (node as Record<string, unknown>)[key];
    if (next === null || typeof next !== 'object') (node as Record<string, unknown>)[key] = {};
    node = (node as Record<string, unknown>)[key] as Record<string, unknown>;
  }
  (node as Record<string, unknown>)[segments[segments.length - 1]] = replacement;
}
