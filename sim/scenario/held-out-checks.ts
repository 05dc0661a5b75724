// Held-out rules must name a parameter that really varies between episodes and must be able to
// match some of its values; otherwise the split they promise would be empty or everything.
import type { NumericValueSpec } from '../random/distribution.ts';
import { specBounds } from '../random/distribution.ts';
import { isConstant } from '../random/distribution.ts';
import { closestName } from './closest-name.ts';
import type { ParameterSite } from './demanding-corner.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { HeldOutRule } from './scenario-types.ts';
import { ruleMatches } from './split-assignment.ts';

export function findHeldOutProblems(rules: readonly HeldOutRule[], sites: readonly ParameterSite[]): ScenarioProblem[] {
  const problems: ScenarioProblem[] = [];
  const sampled = sites.filter((s) => !isConstant(s.spec)).map((s) => s.pointer);
  rules.forEach((rule, i) => {
    const at = `/splits/heldOut/${i}`;
    if (rule.above === undefined && rule.below === undefined && rule.inside === undefined) {
      problems.push({ pointer: at, message: 'gives no condition; add "above", "below" or "inside" (several must all hold)' });
      return;
    }
    if (rule.inside !== undefined && rule.inside[0] > rule.inside[1]) {
      problems.push({ pointer: `${at}/inside`, message: `runs from ${rule.inside[0]} down to ${rule.inside[1]}; write the lower end first` });
      return;
    }
    const site = sites.find((s) => s.pointer === rule.parameter);
    if (site === undefined) {
      const suggestion = closestName(rule.parameter, sampled);
      const known = sampled.length > 0 ? `the sampled parameters are ${sampled.map((p) => `"${p}"`).join(', ')}` : 'this scenario samples no parameters yet (every value is a plain number)';
      const controls = rule.parameter.startsWith('/controls/') ? 'control-signal parameters are drawn per channel and cannot hold episodes out; ' : '';
      problems.push({
        pointer: `${at}/parameter`,
        message: `"${rule.parameter}" is not a parameter of this scenario; ${controls}${suggestion !== undefined ? `did you mean "${suggestion}"?` : known}`,
      });
      return;
    }
    if (isConstant(site.spec)) {
      problems.push({
        pointer: `${at}/parameter`,
        message: `"${rule.parameter}" is fixed at ${site.value} in every episode, so this rule would hold out all episodes or none; make it a distribution or remove the rule`,
      });
      return;
    }
    if (!canMatch(rule, site.spec)) {
      const { min, max } = specBounds(site.spec);
      problems.push({ pointer: at, message: `can never match: "${rule.parameter}" is drawn from [${min}, ${max}]; change the rule's limits` });
    }
  });
  return problems;
}

function canMatch(rule: HeldOutRule, spec: NumericValueSpec): boolean {
  if (typeof spec === 'number') return ruleMatches(rule, spec);
  if (spec.kind === 'categorical') return spec.values.some((v, i) => (spec.weights === undefined || spec.weights[i] > 0) && ruleMatches(rule, v));
  let lower = Math.max(spec.min, rule.inside?.[0] ?? -Infinity);
  let upper = Math.min(spec.max, rule.inside?.[1] ?? Infinity);
  let lowerOpen = false;
  let upperOpen = false;
  if (rule.above !== undefined && rule.above >= lower) {
    lower = rule.above;
    lowerOpen = true;
  }
  if (rule.below !== undefined && rule.below <= upper) {
    upper = rule.below;
    upperOpen = true;
  }
  if (spec.kind === 'integer') {
    const first = lowerOpen ? Math.floor(lower) + 1 : Math.ceil(lower);
    const last = upperOpen ? Math.ceil(upper) - 1 : Math.floor(upper);
    return first <= last;
  }
  return lower < upper || (lower === upper && !lowerOpen && !upperOpen);
}
