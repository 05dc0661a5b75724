// The generalisation gap: each held-out split's mean metrics against the in-distribution `test`
// split, as a difference (held-out − test) and a ratio (held-out / test), next to the held-out
// rules of the scenario that send episodes to that split. A held-out split's episodes are chosen
// by their parameters, so a large ratio says the model breaks outside the training range.
import type { HeldOutRule } from '../../scenario/scenario-types.ts';
import type { GroupSummary } from './split-summary.ts';

export interface GapMetric {
  metric: string;
  heldOut: number;
  test: number;
  difference: number;
  /** null when the test value is 0. */
  ratio: number | null;
}

export interface GapEntry {
  split: string;
  rules: HeldOutRule[];
  /** A readable form of the rules, e.g. "/system/partCount > 21". */
  ruleText: string;
  metrics: GapMetric[];
}

export const IN_DISTRIBUTION_SPLIT = 'test';

export function describeRule(rule: HeldOutRule): string {
  const parts: string[] = [];
  if (rule.above !== undefined) parts.push(`${rule.parameter} > ${rule.above}`);
  if (rule.below !== undefined) parts.push(`${rule.parameter} < ${rule.below}`);
  if (rule.inside !== undefined) parts.push(`${rule.parameter} in [${rule.inside[0]}, ${rule.inside[1]}]`);
  return parts.length > 0 ? parts.join(' and ') : `${rule.parameter} (any value)`;
}

/** The scenario's held-out rules from the manifest's resolved scenario, grouped by split in rule order. */
export function heldOutRulesBySplit(scenario: unknown): Map<string, HeldOutRule[]> {
  const rules = ((scenario as { splits?: { heldOut?: HeldOutRule[] } } | null)?.splits?.heldOut) ?? [];
  const bySplit = new Map<string, HeldOutRule[]>();
  for (const rule of rules) bySplit.set(rule.split, [...(bySplit.get(rule.split) ?? []), rule]);
  return bySplit;
}

function means(summary: GroupSummary): [string, number | undefined][] {
  return [
    ['one-step error / ℓ', summary.oneStepNormalisedError?.mean],
    ...summary.horizons.map((h): [string, number | undefined] => [`error / ℓ at horizon ${h.horizon}`, h.normalisedError?.mean]),
    ['mean rollout error / ℓ', summary.meanNormalisedError?.mean],
    ['valid prediction time (s)', summary.validPredictionTimeS?.mean],
  ];
}

/** One entry per held-out split that was scored, when the test split was scored too. */
export function generalisationGap(rulesBySplit: Map<string, HeldOutRule[]>, summaries: Map<string, GroupSummary>): GapEntry[] {
  const test = summaries.get(IN_DISTRIBUTION_SPLIT);
  if (!test || test.episodes === 0) return [];
  const entries: GapEntry[] = [];
  for (const [split, rules] of rulesBySplit) {
    const held = summaries.get(split);
    if (!held || held.episodes === 0) continue;
    const testMeans = new Map(means(test));
    const metrics: GapMetric[] = [];
    for (const [metric, value] of means(held)) {
      const reference = testMeans.get(metric);
      if (value === undefined || reference === undefined) continue;
      metrics.push({ metric, heldOut: value, test: reference, difference: value - reference, ratio: reference === 0 ? null : value / reference });
    }
    entries.push({ split, rules, ruleText: rules.map(describeRule).join(' or '), metrics });
  }
  return entries;
}
