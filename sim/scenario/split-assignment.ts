// Which split an episode belongs to: the first held-out rule its sampled parameters match,
// otherwise the split whose cumulative fraction the episode's split draw falls under. The
// draw is taken for every episode so that editing the rules never reshuffles the others.
import type { RandomStream } from '../random/random-stream.ts';
import type { HeldOutRule, SplitName, SplitsSpec } from './scenario-types.ts';

export const SPLIT_ORDER: readonly SplitName[] = ['train', 'validation', 'test'];

export function ruleMatches(rule: HeldOutRule, value: number): boolean {
  if (rule.above !== undefined && !(value > rule.above)) return false;
  if (rule.below !== undefined && !(value < rule.below)) return false;
  if (rule.inside !== undefined && !(value >= rule.inside[0] && value <= rule.inside[1])) return false;
  return true;
}

/** `valueOf` gives the episode's sampled value at a parameter pointer. */
export function assignSplit(splits: SplitsSpec, valueOf: (pointer: string) => number | undefined, stream: RandomStream): string {
  const u = stream.nextFloat64();
  for (const rule of splits.heldOut) {
    const value = valueOf(rule.parameter);
    if (value !== undefined && ruleMatches(rule, value)) return rule.split;
  }
  let cumulative = 0;
  let last: SplitName = 'train';
  for (const name of SPLIT_ORDER) {
    const fraction = splits.fractions[name];
    if (!(fraction > 0)) continue;
    cumulative += fraction;
    last = name;
    if (u < cumulative) return name;
  }
  // Fractions that sum to 1 within rounding can leave u just above the running sum.
  return last;
}
