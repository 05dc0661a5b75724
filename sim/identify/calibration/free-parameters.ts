// Which parameters a calibration fits and how each is scaled for the optimiser. A parameter
// whose range keeps one sign (stiffness, damping, length, gravity's y) is fitted as
// θ = ln(value / nominal), so steps are relative and the value can never change sign; one
// whose range spans zero as θ = (value − nominal) / half-range. The search box is the spec's
// range widened by a factor 2 at each end (log scaling) or by one range width (linear), so a
// bench that disagrees with the scenario's guess can still be followed a good way out.
import { specBounds } from '../../random/distribution.ts';
import { closestName } from '../../scenario/closest-name.ts';
import { linkedPointers } from '../../scenario/linked-parameters.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import { CalibrationInputError } from './calibration-input-error.ts';
import type { ScenarioParameter } from './scenario-parameters.ts';
import { scenarioParameters } from './scenario-parameters.ts';

export const LOG_SEARCH_WIDENING = 2;

export interface FreeParameter {
  pointer: string;
  scaling: 'log' | 'linear';
  /** The reference value θ is measured from (the spec's nominal value). */
  nominal: number;
  /** Linear scaling only: value change per unit θ. */
  scale: number;
  searchMin: number;
  searchMax: number;
  parameter: ScenarioParameter;
}

export interface ParameterSelection {
  free: FreeParameter[];
  /** Every other parameter: known (from the bench) or nominal. */
  fixedValues: Map<string, number>;
  /** Pointers whose value came from the measurement's knownParameters. */
  known: string[];
}

export function valueOf(p: FreeParameter, theta: number): number {
  return p.scaling === 'log' ? p.nominal * Math.exp(theta) : p.nominal + p.scale * theta;
}

export function thetaOf(p: FreeParameter, value: number): number {
  return p.scaling === 'log' ? Math.log(value / p.nominal) : (value - p.nominal) / p.scale;
}

/** d value / d θ at θ. */
export function valuePerTheta(p: FreeParameter, theta: number): number {
  return p.scaling === 'log' ? p.nominal * Math.exp(theta) : p.scale;
}

/**
 * Free parameters: `fitPointers` when given, else every distributed parameter the bench does
 * not know. Throws CalibrationInputError for an unknown pointer (naming the nearest) and for
 * an integer or choice parameter left to fit or without a known value.
 */
export function selectParameters(scenario: Scenario, knownParameters: Record<string, number>, fitPointers: readonly string[] | undefined, knownSource: string): ParameterSelection {
  // Fitting one linked place on its own would cut it loose from its parameter, and fitting the
  // named parameters themselves is not built yet: say so rather than fit the wrong thing.
  const linked = [...linkedPointers(scenario)];
  if (linked.length > 0) {
    throw new CalibrationInputError(
      `the scenario takes ${linked.length === 1 ? 'a value' : `${linked.length} values`} from named parameters (${linked.slice(0, 3).join(', ')}${linked.length > 3 ? ', …' : ''}), which calibration cannot fit yet; write those places as numbers or distributions in a copy of the scenario for calibrating`,
    );
  }
  const listed = scenarioParameters(scenario);
  const byPointer = new Map(listed.map((p) => [p.pointer, p]));
  const names = listed.map((p) => p.pointer);
  const unknown = (pointer: string, where: string): CalibrationInputError => {
    const near = closestName(pointer, names);
    return new CalibrationInputError(
      `${where}: "${pointer}" is not a numeric parameter of the scenario${near ? `; did you mean "${near}"?` : '.'} The scenario's parameters are: ${names.join(', ')}`,
    );
  };
  for (const pointer of Object.keys(knownParameters)) {
    if (!byPointer.has(pointer)) throw unknown(pointer, `${knownSource} /knownParameters`);
  }
  let chosen: ScenarioParameter[];
  if (fitPointers !== undefined) {
    chosen = [];
    for (const pointer of fitPointers) {
      const p = byPointer.get(pointer);
      if (p === undefined) throw unknown(pointer, '--fit');
      if (pointer in knownParameters) throw new CalibrationInputError(`--fit: "${pointer}" is also given in ${knownSource} /knownParameters; a known value is not fitted, so drop one of the two`);
      if (chosen.includes(p)) throw new CalibrationInputError(`--fit: "${pointer}" is named twice; name it once`);
      chosen.push(p);
    }
  } else {
    chosen = listed.filter((p) => p.distributed && !(p.pointer in knownParameters));
  }
  const free: FreeParameter[] = [];
  for (const p of chosen) {
    if (p.nominal === null || (typeof p.spec !== 'number' && (p.spec.kind === 'integer' || p.spec.kind === 'categorical'))) {
      throw new CalibrationInputError(
        `${p.pointer} is drawn as a whole number or from a list, which a least-squares fit cannot move; state the bench's value in ${knownSource} under "knownParameters": { "${p.pointer}": … }`,
      );
    }
    free.push(freeParameter(p, p.nominal));
  }
  const fixedValues = new Map<string, number>();
  for (const p of listed) {
    if (free.some((f) => f.pointer === p.pointer)) continue;
    const known = knownParameters[p.pointer];
    if (known !== undefined) fixedValues.set(p.pointer, known);
    else if (p.nominal !== null) fixedValues.set(p.pointer, p.nominal);
    else throw new CalibrationInputError(`${p.pointer} varies per episode in the scenario and a calibration needs one value for it; state the bench's value in ${knownSource} under "knownParameters": { "${p.pointer}": … }`);
  }
  if (free.length === 0) throw new CalibrationInputError('nothing to fit: the scenario has no distributed parameter the bench does not already know; name parameters with --fit /json/pointer,…');
  return { free, fixedValues, known: Object.keys(knownParameters) };
}

function freeParameter(p: ScenarioParameter, nominal: number): FreeParameter {
  const { min, max } = specBounds(p.spec);
  if (min > 0 || max < 0) {
    const widening = min === max ? 2 * LOG_SEARCH_WIDENING : LOG_SEARCH_WIDENING;
    const smallest = Math.min(Math.abs(min), Math.abs(max)) / widening;
    const largest = Math.max(Math.abs(min), Math.abs(max)) * widening;
    const positive = nominal > 0;
    return { pointer: p.pointer, scaling: 'log', nominal, scale: 1, searchMin: positive ? smallest : -largest, searchMax: positive ? largest : -smallest, parameter: p };
  }
  const halfRange = 0.5 * (max - min);
  // A constant zero has no scale of its own; one SI unit.
  const scale = halfRange > 0 ? halfRange : 1;
  const width = max - min > 0 ? max - min : 1;
  return { pointer: p.pointer, scaling: 'linear', nominal, scale, searchMin: min - width, searchMax: max + width, parameter: p };
}
