// Checks of a start pose against the systems it would move: held (pinned or driven) nodes
// never move, so a translation needs a body with none, and a rotation a body with at most one
// held place (the pivot). Checked on the systems the checks build at both ends of every range.
import { isConstant, specBounds } from '../random/distribution.ts';
import type { NumericValueSpec } from '../random/distribution.ts';
import { NODE_DRIVEN, NODE_PINNED } from '../core/model.ts';
import type { BuiltSystem } from '../systems/built-system.ts';
import { MAX_SETTLE_INTERVALS } from './scenario-limits.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';

function canBeNonZero(spec: NumericValueSpec): boolean {
  const { min, max } = specBounds(spec);
  return !(isConstant(spec) && min === 0 && max === 0);
}

export function findStartStateProblems(scenario: Scenario, systems: readonly BuiltSystem[]): ScenarioProblem[] {
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
  return problems;
}
