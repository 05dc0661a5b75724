// Named parameters (/params) and the places that use them ({"ref": "/params/k"} or
// {"expr": "2 * /params/k"} wherever a number goes). Checking reads every such form, refuses
// unknown names, syntax errors and parameters that derive from themselves, and bounds each
// derived value by interval arithmetic; the place's own limits (the schema's, per place) are then
// checked against that range by running the schema over the "range view", where each linked
// place stands as the uniform (or integer) range it can reach. Sampling draws each named
// parameter once per episode from the stream of its own pointer (/params/<name>), derives the
// rest, and hands the builders a copy of the scenario with every linked place replaced by its
// number, so everything below sees plain value specs and the labels hold the resolved values.
// A scenario without any linked form is passed through untouched, so its datasets keep their bytes.
import type { DerivedExpression, ValueInterval } from '../random/derived-expression.ts';
import {
  derivedInterval,
  evaluateDerived,
  ExpressionSyntaxError,
  isWholeByConstruction,
  parametersUsed,
  PARAMS_POINTER,
  parseDerivedExpression,
} from '../random/derived-expression.ts';
import type { NumericValueSpec } from '../random/distribution.ts';
import { isConstant, specBounds } from '../random/distribution.ts';
import { childPointer } from '../random/spec-problem.ts';
import { findValueSpecProblems } from '../random/value-spec-problems.ts';
import { closestName } from './closest-name.ts';
import { pointerSegments } from './json-source-map.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { LinkedValueSpec, Scenario } from './scenario-types.ts';

/** One place that names parameters: where it is, where its text is, and the parsed text. */
interface LinkedPlace {
  pointer: string;
  /** Pointer of the "ref" or "expr" string, where syntax and name problems are shown. */
  textPointer: string;
  text: string;
  tree: DerivedExpression;
}

export interface ScenarioLinks {
  /** Parameters given as numbers or distributions, by name, in written order. */
  drawn: Map<string, NumericValueSpec>;
  /** Parameters given as ref or expr, in an order where each comes after those it uses. */
  derived: LinkedPlace[];
  /** Places outside /params that hold a ref or expr, in document order. */
  places: LinkedPlace[];
  interval: Map<string, ValueInterval>;
  whole: Map<string, boolean>;
}

type JsonObject = Record<string, unknown>;

function isObject(value: unknown): value is JsonObject {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

/** The text of a ref or expr form ({"ref": ...} reads as the expression of its pointer alone), else null. */
function linkedText(value: unknown): { member: 'ref' | 'expr'; text: string } | null {
  if (!isObject(value)) return null;
  const keys = Object.keys(value);
  if (keys.length !== 1) return null;
  const member = keys[0];
  if ((member !== 'ref' && member !== 'expr') || typeof value[member] !== 'string') return null;
  return { member, text: value[member] as string };
}

/** True for a {"ref"} or {"expr"} value. */
export function isLinkedValue(value: unknown): value is LinkedValueSpec {
  return linkedText(value) !== null;
}

/** Every ref or expr outside /params, with its pointer, in document order. */
function findLinkedForms(scenario: JsonObject): { pointer: string; value: unknown }[] {
  const found: { pointer: string; value: unknown }[] = [];
  const visit = (value: unknown, pointer: string): void => {
    if (linkedText(value) !== null) {
      found.push({ pointer, value });
      return;
    }
    if (Array.isArray(value)) value.forEach((item, i) => visit(item, childPointer(pointer, i)));
    else if (isObject(value)) for (const [key, inner] of Object.entries(value)) visit(inner, childPointer(pointer, key));
  };
  for (const [key, inner] of Object.entries(scenario)) if (key !== 'params') visit(inner, childPointer('', key));
  return found;
}

function parameterPointer(name: string): string {
  return `${PARAMS_POINTER}/${name}`;
}

/** Parses one form; a syntax error becomes a problem at the form's text. */
function parsePlace(pointer: string, value: unknown, problems: ScenarioProblem[]): LinkedPlace | null {
  const form = linkedText(value)!;
  const textPointer = childPointer(pointer, form.member);
  try {
    return { pointer, textPointer, text: form.text, tree: parseDerivedExpression(form.text) };
  } catch (error) {
    if (!(error instanceof ExpressionSyntaxError)) throw error;
    const what = form.member === 'ref' ? 'reference' : 'expression';
    problems.push({ pointer: textPointer, message: `${what} ${JSON.stringify(form.text)} does not read at column ${error.column}: ${error.reason}` });
    return null;
  }
}

function unknownNameProblems(place: LinkedPlace, names: readonly string[]): ScenarioProblem[] {
  const problems: ScenarioProblem[] = [];
  for (const name of parametersUsed(place.tree).keys()) {
    if (names.includes(name)) continue;
    const near = closestName(name, names);
    const fix = names.length === 0
      ? `define it under "params" at the top of the scenario, e.g. "params": {"${name}": 1}`
      : near !== undefined
        ? `did you mean ${parameterPointer(near)}?`
        : `the parameters are ${names.map((n) => parameterPointer(n)).join(', ')}`;
    problems.push({ pointer: place.textPointer, message: `names ${parameterPointer(name)}, which "params" does not define: ${fix}` });
  }
  return problems;
}

/**
 * Reads the scenario's named parameters and linked places. Returns null links for a scenario
 * with neither; problems for unknown names, syntax errors and cycles.
 */
export function readLinks(scenario: unknown): { links: ScenarioLinks | null; problems: ScenarioProblem[] } {
  if (!isObject(scenario)) return { links: null, problems: [] };
  const params = isObject(scenario.params) ? scenario.params : {};
  const forms = findLinkedForms(scenario);
  const names = Object.keys(params);
  if (names.length === 0 && forms.length === 0) return { links: null, problems: [] };
  const problems: ScenarioProblem[] = [];
  const drawn = new Map<string, NumericValueSpec>();
  const derivedByName = new Map<string, LinkedPlace>();
  for (const name of names) {
    const spec = params[name];
    if (linkedText(spec) === null) {
      drawn.set(name, spec as NumericValueSpec);
      continue;
    }
    const place = parsePlace(parameterPointer(name), spec, problems);
    if (place !== null) derivedByName.set(name, place);
  }
  const places: LinkedPlace[] = [];
  for (const form of forms) {
    const place = parsePlace(form.pointer, form.value, problems);
    if (place !== null) places.push(place);
  }
  for (const place of [...derivedByName.values(), ...places]) problems.push(...unknownNameProblems(place, names));
  if (problems.length > 0) return { links: null, problems };
  const order = derivationOrder(derivedByName, problems);
  if (problems.length > 0) return { links: null, problems };

  const interval = new Map<string, ValueInterval>();
  const whole = new Map<string, boolean>();
  for (const [name, spec] of drawn) {
    interval.set(name, specBounds(spec));
    whole.set(name, isWholeSpec(spec));
  }
  const derived = order.map((name) => derivedByName.get(name)!);
  for (const place of derived) {
    const name = place.pointer.slice(PARAMS_POINTER.length + 1);
    interval.set(name, derivedInterval(place.tree, (n) => interval.get(n)!));
    whole.set(name, isWholeByConstruction(place.tree, (n) => whole.get(n)!));
  }
  return { links: { drawn, derived, places, interval, whole }, problems: [] };
}

function isWholeSpec(spec: NumericValueSpec): boolean {
  if (typeof spec === 'number') return Number.isInteger(spec);
  if (spec.kind === 'integer') return true;
  if (spec.kind === 'categorical') return spec.values.every((v) => Number.isInteger(v));
  return isConstant(spec) && Number.isInteger(spec.min);
}

/** Derived parameters ordered so each follows the ones it uses; a cycle is a problem at each of its members. */
function derivationOrder(derived: Map<string, LinkedPlace>, problems: ScenarioProblem[]): string[] {
  const order: string[] = [];
  const state = new Map<string, 'visiting' | 'done'>();
  const reported = new Set<string>();
  const visit = (name: string, path: string[]): void => {
    const place = derived.get(name);
    if (place === undefined || state.get(name) === 'done') return;
    if (state.get(name) === 'visiting') {
      const cycle = [...path.slice(path.indexOf(name)), name];
      for (const member of new Set(cycle)) {
        if (reported.has(member)) continue;
        reported.add(member);
        const from = cycle.indexOf(member);
        const around = [...cycle.slice(from, -1), ...cycle.slice(0, from), member].map(parameterPointer).join(' → ');
        problems.push({ pointer: derived.get(member)!.textPointer, message: `derives from itself (${around}); give one of these parameters a number or a distribution` });
      }
      return;
    }
    state.set(name, 'visiting');
    for (const used of parametersUsed(place.tree).keys()) visit(used, [...path, name]);
    state.set(name, 'done');
    order.push(name);
  };
  for (const name of derived.keys()) visit(name, []);
  return order;
}

const linkCache = new WeakMap<object, ScenarioLinks | null>();

/** The links of a checked scenario (cached per scenario object); null when it has none. */
export function scenarioLinks(scenario: Scenario): ScenarioLinks | null {
  if (linkCache.has(scenario)) return linkCache.get(scenario)!;
  const { links, problems } = readLinks(scenario);
  if (problems.length > 0) throw new RangeError(`scenario links were not checked: ${problems[0].pointer}: ${problems[0].message}`);
  linkCache.set(scenario, links);
  return links;
}

/** True when some place or parameter holds a ref or expr (so views differ from the scenario). */
function hasLinkedForms(links: ScenarioLinks | null): links is ScenarioLinks {
  return links !== null && (links.places.length > 0 || links.derived.length > 0);
}

/** Pointers of the values that follow from named parameters: linked places and derived parameters. */
export function linkedPointers(scenario: Scenario): Set<string> {
  const links = scenarioLinks(scenario);
  if (links === null) return new Set();
  return new Set([...links.derived, ...links.places].map((p) => p.pointer));
}

function copyJson<T>(value: T): T {
  if (Array.isArray(value)) return value.map(copyJson) as T;
  if (isObject(value)) {
    const out: JsonObject = {};
    for (const [key, inner] of Object.entries(value)) Object.defineProperty(out, key, { value: copyJson(inner), enumerable: true, writable: true, configurable: true });
    return out as T;
  }
  return value;
}

function setAt(root: JsonObject, pointer: string, value: unknown): void {
  const segments = pointerSegments(pointer);
  let node: unknown = root;
  for (const segment of segments.slice(0, -1)) node = (node as JsonObject)[segment];
  (node as JsonObject)[segments[segments.length - 1]] = value;
}

function placeInterval(links: ScenarioLinks, place: LinkedPlace): ValueInterval {
  return derivedInterval(place.tree, (n) => links.interval.get(n)!);
}

/** The value spec standing for every value a linked place can take. */
function rangeSpec(interval: ValueInterval, whole: boolean): NumericValueSpec {
  if (interval.min === interval.max) return interval.min;
  return { kind: whole ? 'integer' : 'uniform', min: interval.min, max: interval.max };
}

const rangeViews = new WeakMap<object, Scenario>();

/**
 * The scenario with each linked place and derived parameter replaced by the range it can reach
 * (interval arithmetic over the named parameters' ranges): what the checks and the listing of
 * parameter sites read. The scenario itself when nothing is linked.
 */
export function linkedRangeView(scenario: Scenario): Scenario {
  const links = scenarioLinks(scenario);
  if (!hasLinkedForms(links)) return scenario;
  let view = rangeViews.get(scenario);
  if (view === undefined) {
    view = copyJson(scenario);
    for (const place of links.derived) setAt(view as unknown as JsonObject, place.pointer, rangeSpec(links.interval.get(nameOf(place))!, links.whole.get(nameOf(place))!));
    for (const place of links.places) {
      const whole = isWholeByConstruction(place.tree, (n) => links.whole.get(n)!);
      setAt(view as unknown as JsonObject, place.pointer, rangeSpec(placeInterval(links, place), whole));
    }
    rangeViews.set(scenario, view);
    linkCache.set(view, readLinks(view).links);
  }
  return view;
}

function nameOf(place: LinkedPlace): string {
  return place.pointer.slice(PARAMS_POINTER.length + 1);
}

/**
 * Values of every named parameter for one episode: drawn ones through `resolver` (so an
 * episode's draws come from the stream of /params/<name> and are labelled there), derived ones
 * computed in order and passed to `record`.
 */
function parameterValues(links: ScenarioLinks, resolver: ParameterResolver, record: (pointer: string, value: number) => void): Map<string, number> {
  const values = new Map<string, number>();
  for (const [name, spec] of links.drawn) values.set(name, resolver.value(spec, parameterPointer(name), 'none'));
  for (const place of links.derived) {
    const value = evaluateDerived(place.tree, (n) => values.get(n)!);
    values.set(nameOf(place), value);
    record(place.pointer, value);
  }
  return values;
}

/**
 * The scenario one episode simulates: named parameters drawn (through `resolver`) and every
 * linked place replaced by its number. The scenario itself when it names no parameters.
 */
export function scenarioForEpisode(scenario: Scenario, resolver: ParameterResolver, record: (pointer: string, value: number) => void): Scenario {
  const links = scenarioLinks(scenario);
  if (links === null) return scenario;
  const values = parameterValues(links, resolver, record);
  if (!hasLinkedForms(links)) return scenario;
  const episode = copyJson(scenario);
  for (const place of links.derived) setAt(episode as unknown as JsonObject, place.pointer, values.get(nameOf(place))!);
  for (const place of links.places) setAt(episode as unknown as JsonObject, place.pointer, evaluateDerived(place.tree, (n) => values.get(n)!));
  return episode;
}

/** The value of every linked place and derived parameter of one episode, by pointer. */
export function linkedValuesOfEpisode(scenario: Scenario, resolver: ParameterResolver): Map<string, number> {
  const out = new Map<string, number>();
  const links = scenarioLinks(scenario);
  if (links === null) return out;
  const values = parameterValues(links, resolver, (pointer, value) => out.set(pointer, value));
  for (const place of links.places) out.set(place.pointer, evaluateDerived(place.tree, (n) => values.get(n)!));
  return out;
}

const LIMIT_WORDS: Record<string, string> = { min: 'lowest', max: 'highest' };

/**
 * The checks of links on a schema-checked scenario: names, syntax and cycles; every derived
 * range finite; and every linked place's range within that place's own limits, found by
 * running `schemaProblems` (the scenario schema) over the range view. Returns the range view
 * for the remaining checks, or the problems.
 */
export function checkLinks(scenario: Scenario, schemaProblems: (value: unknown) => ScenarioProblem[]): { ok: true; view: Scenario } | { ok: false; problems: ScenarioProblem[] } {
  const { links, problems } = readLinks(scenario);
  if (problems.length > 0) return { ok: false, problems };
  linkCache.set(scenario, links);
  if (!hasLinkedForms(links)) return { ok: true, view: scenario };
  // A range drawn from a malformed distribution means nothing: report the distribution alone.
  const malformed: ScenarioProblem[] = [];
  for (const [name, spec] of links.drawn) {
    for (const p of findValueSpecProblems(spec, parameterPointer(name))) malformed.push({ pointer: p.pointer, message: `${p.message}; ${p.fix}` });
  }
  if (malformed.length > 0) return { ok: false, problems: malformed };
  const unbounded: ScenarioProblem[] = [];
  const describe = (place: LinkedPlace) => `${JSON.stringify(place.text)}`;
  for (const place of [...links.derived, ...links.places]) {
    const range = place.pointer.startsWith(`${PARAMS_POINTER}/`) ? links.interval.get(nameOf(place))! : placeInterval(links, place);
    if (!Number.isFinite(range.min) || !Number.isFinite(range.max)) {
      unbounded.push({
        pointer: place.textPointer,
        message: `${describe(place)} has no finite range over its parameters' ranges (a divisor that can be 0, or a result beyond the doubles); keep divisors away from 0, e.g. give the divisor's parameter a range above 0`,
      });
    }
  }
  if (unbounded.length > 0) return { ok: false, problems: unbounded };
  const view = linkedRangeView(scenario);
  const placed = new Map<string, LinkedPlace>(links.places.map((p) => [p.pointer, p]));
  const mapped: ScenarioProblem[] = [];
  for (const problem of schemaProblems(copyJson(view))) {
    const segments = pointerSegments(problem.pointer);
    const last = segments[segments.length - 1];
    const parent = childPointerOfSegments(segments.slice(0, -1));
    const place = placed.get(problem.pointer) ?? (last === 'min' || last === 'max' || last === 'kind' ? placed.get(parent) : undefined);
    if (place === undefined) {
      mapped.push(problem);
      continue;
    }
    const range = placeInterval(links, place);
    const reach = range.min === range.max ? `is ${range.min}` : `reaches [${range.min}, ${range.max}] by interval arithmetic over its parameters' ranges`;
    if (last === 'kind' && place.pointer !== problem.pointer) {
      mapped.push({ pointer: place.textPointer, message: `${describe(place)} need not give a whole number, but this place takes whole numbers; wrap it in round(...), or derive it from whole numbers with + - * only` });
    } else {
      const end = place.pointer === problem.pointer ? 'its value' : `its ${LIMIT_WORDS[last]} value`;
      const rule = problem.message.replace(/ \(got [^)]*\)/, '');
      mapped.push({ pointer: place.textPointer, message: `${describe(place)} ${reach}, but ${end} here ${rule}; change the expression or its parameters' ranges` });
    }
  }
  if (mapped.length > 0) return { ok: false, problems: mapped };
  return { ok: true, view };
}

function childPointerOfSegments(segments: readonly string[]): string {
  return segments.reduce<string>((pointer, segment) => childPointer(pointer, segment), '');
}
