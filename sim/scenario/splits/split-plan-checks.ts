// Checks of planned splits: counts that can be met (which needs the held-out episodes counted,
// so it runs the plan's parameter pass), at most one split left to take the rest, stratifying
// parameters that really vary, and a sweep small enough to plan.
import { isConstant } from '../../random/distribution.ts';
import { closestName } from '../closest-name.ts';
import type { ParameterSite } from '../demanding-corner.ts';
import type { ScenarioProblem } from '../scenario-problem.ts';
import type { Scenario } from '../scenario-types.ts';
import { SPLIT_ORDER } from '../split-assignment.ts';
import { heldOutSplits, MAX_PLANNED_SPLIT_EPISODES, resolvedCounts, usesPlannedSplits } from './planned-splits.ts';

export function findSplitPlanProblems(scenario: Scenario, sites: readonly ParameterSite[]): ScenarioProblem[] {
  const splits = scenario.splits;
  if (!usesPlannedSplits(splits)) return [];
  const problems: ScenarioProblem[] = [];
  if (scenario.episodes > MAX_PLANNED_SPLIT_EPISODES) {
    problems.push({
      pointer: '/splits',
      message: `exact counts and stratified splits are planned over the whole sweep, at most ${MAX_PLANNED_SPLIT_EPISODES} episodes, and this one has ${scenario.episodes}; use fractions (each episode draws its own split) or fewer episodes`,
    });
    return problems;
  }
  const distributed = sites.filter((s) => !isConstant(s.spec)).map((s) => s.pointer);
  (splits.stratify?.parameters ?? []).forEach((pointer, k) => {
    if (distributed.includes(pointer)) return;
    const fixed = sites.some((s) => s.pointer === pointer);
    const suggestion = closestName(pointer, distributed);
    problems.push({
      pointer: `/splits/stratify/parameters/${k}`,
      message: fixed
        ? `"${pointer}" has the same value in every episode, so it has no strata; name a parameter given as a distribution`
        : `"${pointer}" is not a parameter of this scenario; ${suggestion !== undefined ? `did you mean "${suggestion}"?` : `distributed parameters here: ${distributed.join(', ') || 'none'}`}`,
    });
  });
  const counts = splits.counts;
  if (counts !== undefined && SPLIT_ORDER.filter((s) => counts[s] === undefined).length > 1) {
    problems.push({ pointer: '/splits/counts', message: `leaves out ${SPLIT_ORDER.filter((s) => counts[s] === undefined).join(' and ')}; give every split a count, or leave out exactly one, which then takes the rest` });
  }
  if (problems.length > 0 || counts === undefined) return problems;
  const { split } = heldOutSplits(scenario);
  let heldOut = 0;
  for (let i = 0; i < split.length; i++) if (split[i] >= 0) heldOut++;
  const available = scenario.episodes - heldOut;
  if (resolvedCounts(splits, available) === null) {
    const given = SPLIT_ORDER.filter((s) => counts[s] !== undefined);
    const sum = given.reduce((a, s) => a + (counts[s] ?? 0), 0);
    const left = given.length === 3 ? 'give one split no count so that it takes the rest, or ' : '';
    problems.push({
      pointer: '/splits/counts',
      message:
        `${given.map((s) => `${s} ${counts[s]}`).join(' + ')} = ${sum}, but ${available} episodes are left for them ` +
        `(${scenario.episodes} episodes, ${heldOut} held out by /splits/heldOut with this seed); ${left}make the counts ${given.length === 3 ? 'add up to' : 'add up to at most'} ${available}`,
    });
  }
  return problems;
}
