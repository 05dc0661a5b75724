// Splits planned over the whole sweep, for a scenario whose "splits" give exact "counts" or a
// "stratify" block: held-out rules first (as always), then the remaining episodes are put in an
// order (random, or by stratum and random within it) and dealt to train, validation and test in
// exact numbers (split-dealing.ts). The plan is a function of the scenario alone: every
// episode's parameter values at the pointers that matter are computed here from their own
// streams (or the design) without simulating anything, and each episode's place in the random
// order is the first draw of its split stream's sub-stream 1. So it does not depend on
// sharding, workers, resume or which episodes the simulation later rejects.
// Memory: built once per scenario object and process; about 13 bytes per episode plus 8 per
// stratifying parameter while building, 1 byte per episode kept.
import type { NumericValueSpec } from '../../random/distribution.ts';
import { sampleValue } from '../../random/distribution.ts';
import { valueAtProbability } from '../../random/inverse-cdf.ts';
import { RandomStream, StreamPurpose } from '../../random/random-stream.ts';
import { designCoordinates } from '../design/scenario-design.ts';
import { EpisodeDraws } from '../episode-draws.ts';
import { linkedPointers, linkedValuesOfEpisode } from '../linked-parameters.ts';
import { parameterStream } from '../parameter-streams.ts';
import { parameterSites } from '../physical-checks.ts';
import type { Scenario, SplitsSpec } from '../scenario-types.ts';
import { ruleMatches,SPLIT_ORDER } from '../split-assignment.ts';
import { countsFromFractions, dealInOrder } from './split-dealing.ts';

/** Largest sweep whose splits can be planned (the plan holds one byte per episode). */
export const MAX_PLANNED_SPLIT_EPISODES = 1_000_000;
/** Sub-stream of the split purpose whose first draw orders the episodes. */
export const SPLIT_ORDER_SUB_STREAM = 1;
/** Strata per stratifying parameter when "bins" is not given. */
export const DEFAULT_STRATA_BINS = 4;

export interface SplitPlan {
  /** Split names; `assignment[i]` indexes into it. */
  names: string[];
  assignment: Uint8Array;
  /** Episodes left for train, validation and test once the held-out rules have taken theirs. */
  available: number;
  /** Exact counts of train, validation and test, in SPLIT_ORDER. */
  counts: number[];
}

/** True when the scenario asks for planned splits; otherwise each episode draws its own. */
export function usesPlannedSplits(splits: SplitsSpec): boolean {
  return splits.counts !== undefined || splits.stratify !== undefined;
}

/** Counts in SPLIT_ORDER for `available` episodes; a count left out takes the rest. Null when they cannot fit. */
export function resolvedCounts(splits: SplitsSpec, available: number): number[] | null {
  if (splits.counts === undefined) return countsFromFractions(SPLIT_ORDER.map((s) => splits.fractions[s]), available);
  const given = SPLIT_ORDER.map((s) => splits.counts?.[s]);
  const missing = given.filter((c) => c === undefined).length;
  const sum = given.reduce<number>((a, c) => a + (c ?? 0), 0);
  if (missing > 1) return null;
  if (missing === 0) return sum === available ? (given as number[]) : null;
  if (sum > available) return null;
  return given.map((c) => c ?? available - sum);
}

/** Value of a parameter in episode `index`, exactly as sampling the episode would give it. */
export function episodeParameterValue(scenario: Scenario, index: number, pointer: string, spec: NumericValueSpec, design: ReadonlyMap<string, number> | undefined): number {
  const coordinate = design?.get(pointer);
  return coordinate === undefined ? sampleValue(spec, parameterStream(scenario.seed, index, pointer), pointer) : (valueAtProbability(spec, coordinate, pointer) as number);
}

const plans = new WeakMap<Scenario, SplitPlan | null>();

/** The plan; null when the scenario does not ask for one or its counts cannot fit (see the checks). */
export function scenarioSplitPlan(scenario: Scenario): SplitPlan | null {
  if (!usesPlannedSplits(scenario.splits)) return null;
  let plan = plans.get(scenario);
  if (plan === undefined) {
    plan = buildPlan(scenario);
    plans.set(scenario, plan);
  }
  return plan;
}

/** Held-out split of every episode (index into `names`, or -1 for none), and the names. */
export function heldOutSplits(scenario: Scenario): { names: string[]; split: Int16Array; values: Map<string, Float64Array> } {
  const n = scenario.episodes;
  const splits = scenario.splits;
  const wanted = new Set<string>([...splits.heldOut.map((r) => r.parameter), ...(splits.stratify?.parameters ?? [])]);
  const specs = new Map<string, NumericValueSpec>();
  for (const site of parameterSites(scenario)) if (wanted.has(site.pointer) && !specs.has(site.pointer)) specs.set(site.pointer, site.spec);
  const values = new Map<string, Float64Array>();
  for (const pointer of specs.keys()) values.set(pointer, new Float64Array(n));
  const names: string[] = [...SPLIT_ORDER];
  const split = new Int16Array(n).fill(-1);
  const linked = linkedPointers(scenario);
  const needsLinks = [...specs.keys()].some((pointer) => linked.has(pointer));
  for (let i = 0; i < n; i++) {
    const design = designCoordinates(scenario, i);
    // A value that follows from named parameters comes from them, as sampling computes it.
    const derived = needsLinks ? linkedValuesOfEpisode(scenario, new EpisodeDraws(scenario.seed, i, design)) : undefined;
    for (const [pointer, spec] of specs) values.get(pointer)![i] = derived?.get(pointer) ?? episodeParameterValue(scenario, i, pointer, spec, design);
    for (const rule of splits.heldOut) {
      const column = values.get(rule.parameter);
      if (column === undefined || !ruleMatches(rule, column[i])) continue;
      let at = names.indexOf(rule.split);
      if (at < 0) at = names.push(rule.split) - 1;
      split[i] = at;
      break;
    }
  }
  return { names, split, values };
}

function buildPlan(scenario: Scenario): SplitPlan | null {
  const n = scenario.episodes;
  if (n > MAX_PLANNED_SPLIT_EPISODES) return null;
  const { names, split, values } = heldOutSplits(scenario);
  const remaining: number[] = [];
  for (let i = 0; i < n; i++) if (split[i] < 0) remaining.push(i);
  const counts = resolvedCounts(scenario.splits, remaining.length);
  if (counts === null) return null;
  const rank = new Float64Array(n);
  for (const i of remaining) rank[i] = new RandomStream(scenario.seed, i, StreamPurpose.split, SPLIT_ORDER_SUB_STREAM).nextFloat64();
  const byRank = (a: number, b: number): number => rank[a] - rank[b] || a - b;
  const stratify = scenario.splits.stratify;
  let order: number[];
  if (stratify !== undefined && remaining.length > 0) {
    const bins = stratify.bins ?? DEFAULT_STRATA_BINS;
    const key = new Map<number, number[]>(remaining.map((i) => [i, []]));
    for (const pointer of stratify.parameters) {
      const column = values.get(pointer)!;
      const sorted = [...remaining].sort((a, b) => column[a] - column[b] || byRank(a, b));
      sorted.forEach((i, position) => key.get(i)!.push(Math.floor((position * bins) / sorted.length)));
    }
    order = [...remaining].sort((a, b) => {
      const ka = key.get(a)!;
      const kb = key.get(b)!;
      for (let p = 0; p < ka.length; p++) if (ka[p] !== kb[p]) return ka[p] - kb[p];
      return byRank(a, b);
    });
  } else {
    order = [...remaining].sort(byRank);
  }
  const dealt = dealInOrder(counts, order.length);
  const assignment = new Uint8Array(n);
  for (let i = 0; i < n; i++) if (split[i] >= 0) assignment[i] = split[i];
  order.forEach((episode, position) => {
    assignment[episode] = dealt[position];
  });
  return { names, assignment, available: remaining.length, counts };
}

/** The planned split of episode `index`. */
export function plannedSplit(plan: SplitPlan, index: number): string {
  return plan.names[plan.assignment[index]];
}

