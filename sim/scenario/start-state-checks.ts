// Checks of a start pose against the systems it would move: held (pinned or driven) nodes
// never move, so a translation needs a body with none, a rotation a body with at most one
// held place (the pivot) and a curve a chain held at node 0 at most; an arc's parts must fit
// as chords of its circle, and a mode start must stay within the size Pliant decomposes.
// Checked on the systems the checks build at both ends of every range.
import { NODE_DRIVEN, NODE_PINNED } from '../core/model.ts';
import type { NumericValueSpec } from '../random/distribution.ts';
import { isConstant, specBounds } from '../random/distribution.ts';
import type { BuiltSystem } from '../systems/built-system.ts';
import { DemandingCorner } from './demanding-corner.ts';
import { resolveStartState } from './resolve-start-state.ts';
import { MAX_MODE_COORDINATES, MAX_SETTLE_INTERVALS } from './scenario-limits.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';
import { bendPlaneUnit, chainLine } from './start-curve.ts';

function canBeNonZero(spec: NumericValueSpec): boolean {
  const { min, max } = specBounds(spec);
  return !(isConstant(spec) && min === 0 && max === 0);
}

/** `maxNodes`: the most nodes any system of the scenario can have (for the mode size limit). */
export function findStartStateProblems(scenario: Scenario, systems: readonly BuiltSystem[], maxNodes: number): ScenarioProblem[] {
  const start = scenario.initialState;
  const problems: ScenarioProblem[] = [];
  let held = 0;
  let heldPlaces = 0;
  for (const system of systems) {
    const model = system.model;
    const places = new Set<string>();
    let count = 0;
    for (let i = 0; i < model.nodeCount; i++) {
      if (!(model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN))) continue;
      count++;
      places.add(`${model.positionM[3 * i]},${model.positionM[3 * i + 1]},${model.positionM[3 * i + 2]}`);
    }
    held = Math.max(held, count);
    heldPlaces = Math.max(heldPlaces, places.size);
  }
  if (held > 0 && start.translationM.some(canBeNonZero)) {
    problems.push({ pointer: '/initialState/translationM', message: `shifts a system with ${held} pinned or driven node${held === 1 ? '' : 's'}, which never move; leave translationM at [0, 0, 0] and move the system with /system/originM instead` });
  }
  if (heldPlaces > 1 && canBeNonZero(start.rotationRad)) {
    problems.push({ pointer: '/initialState/rotationRad', message: `turns a system held at ${heldPlaces} places; it can only turn about one held node, so leave rotationRad at 0 or hold the system at one place` });
  }
  // Settling runs in record intervals, so a tiny interval turns a few seconds of settling into
  // an endless run before the first record.
  const longestSettleS = specBounds(start.settleS).max;
  const settleIntervals = Math.ceil(longestSettleS / scenario.time.recordIntervalS);
  if (longestSettleS > 0 && !(settleIntervals <= MAX_SETTLE_INTERVALS)) {
    problems.push({
      pointer: '/initialState/settleS',
      message: `settles for up to ${longestSettleS} s in record intervals of ${scenario.time.recordIntervalS} s, which is ${Number.isFinite(settleIntervals) ? settleIntervals.toPrecision(3) : "too many"} intervals, more than the ${MAX_SETTLE_INTERVALS} Pliant runs before recording; settle for less time or record less often (a longer /time/recordIntervalS)`,
    });
  }
  problems.push(...findCurveProblems(scenario, systems), ...findModeProblems(scenario, systems, maxNodes));
  return problems;
}

function findCurveProblems(scenario: Scenario, systems: readonly BuiltSystem[]): ScenarioProblem[] {
  const curve = scenario.initialState.curve;
  if (curve === undefined) return [];
  const system = scenario.system;
  if (system.kind !== 'chain') return [{ pointer: '/initialState/curve', message: 'bends a chain, but this system is a lattice; leave curve out (a lattice can start turned with rotationRad, or in one of its modes with mode)' }];
  const problems: ScenarioProblem[] = [];
  const heldBeyondTop = new Set<number>();
  for (const built of systems) {
    for (let i = 1; i < built.model.nodeCount; i++) if (built.model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN)) heldBeyondTop.add(i);
  }
  if (heldBeyondTop.size > 0) {
    problems.push({ pointer: '/initialState/curve', message: `bends the chain from node 0, but node${heldBeyondTop.size === 1 ? '' : 's'} ${[...heldBeyondTop].slice(0, 5).join(', ')} ${heldBeyondTop.size === 1 ? "is" : "are"} pinned or driven, and held nodes never move; hold the chain at node 0 only (anchor "top-pinned", "top-driven" or "free", no pinnedNodes or drivenNodes) or leave curve out` });
  }
  if (curve.kind === 'arc') {
    const longestPartM = specBounds(system.lengthM).max / specBounds(system.partCount).min;
    const { min, max } = specBounds(curve.curvaturePerM);
    const sharpest = Math.max(Math.abs(min), Math.abs(max));
    if (!(sharpest * longestPartM <= 2)) {
      problems.push({ pointer: '/initialState/curve/curvaturePerM', message: `can be ${sharpest} 1/m, a circle of radius ${(1 / sharpest).toPrecision(3)} m, but a part can be ${longestPartM.toPrecision(3)} m long and a part is a chord of the circle, at most its diameter; keep |curvaturePerM| ≤ 2 / (lengthM / partCount) = ${(2 / longestPartM).toPrecision(3)} 1/m or use more parts` });
    }
  }
  for (const corner of ['demanding', 'gentle'] as const) {
    const resolved = resolveStartState(scenario.initialState, new DemandingCorner(corner)).curve;
    const built = systems[0];
    if (resolved === null || built === undefined) continue;
    if (bendPlaneUnit(chainLine(built.model).directionUnit, resolved.bendDirectionUnit) === null) {
      problems.push({ pointer: '/initialState/curve/bendDirectionUnit', message: 'is along the chain\'s direction (/system/directionUnit), so it gives no plane to bend in; give a direction across the chain, e.g. [1, 0, 0] for a chain hanging along y' });
      break;
    }
  }
  return problems;
}

function findModeProblems(scenario: Scenario, systems: readonly BuiltSystem[], maxNodes: number): ScenarioProblem[] {
  const mode = scenario.initialState.mode;
  if (mode === undefined) return [];
  const flat = scenario.system.kind === 'lattice' && systems.length > 0 && systems.every((built) => {
    const x = built.model.positionM;
    for (let i = 1; i < built.model.nodeCount; i++) if (x[3 * i + 2] !== x[2]) return false;
    return true;
  });
  const axisCount = mode.axes.filter((axis) => !(flat && axis === 'z')).length;
  const coordinates = maxNodes * axisCount;
  if (coordinates > MAX_MODE_COORDINATES) {
    return [{
      pointer: '/initialState/mode',
      message: `linearises up to ${coordinates} coordinates (${maxNodes} nodes × ${axisCount} axes), above the ${MAX_MODE_COORDINATES} Pliant decomposes (a dense eigen-decomposition per episode, whose time grows as the cube of the size: some 2 s at ${MAX_MODE_COORDINATES}); use fewer parts or cells, or fewer axes in /initialState/mode/axes (e.g. ["x", "y"] for a chain swinging in the x-y plane)`,
    }];
  }
  if (scenario.system.kind !== 'chain') return [];
  const highest = specBounds(mode.index).max;
  let fewest = Infinity;
  for (const built of systems) {
    let free = 0;
    for (let i = 0; i < built.model.nodeCount; i++) if (!(built.model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN))) free++;
    fewest = Math.min(fewest, free * mode.axes.length);
  }
  if (highest > fewest) {
    return [{ pointer: '/initialState/mode/index', message: `can be ${highest}, but the smallest chain here has ${fewest} free coordinates along ${JSON.stringify(mode.axes)}, so at most ${fewest} modes; choose a lower index` }];
  }
  return [];
}
