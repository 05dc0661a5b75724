// A scenario's design, built once per scenario object and process: its distributed parameters
// (every non-constant value the sampler visits, with the sub-stream its independent draws use),
// the plan of sim/design/design-plan.ts, and the unit-cube coordinates of one episode keyed by
// pointer. Everything comes from (seed, episodes, parameters), never from which episodes a
// shard or worker happens to run.
import type { DesignPlan } from '../../design/design-plan.ts';
import { planDesign } from '../../design/design-plan.ts';
import type { DesignParameter } from '../../design/design-spec.ts';
import { isConstant } from '../../random/distribution.ts';
import { linkedPointers } from '../linked-parameters.ts';
import { parameterSubStream } from '../parameter-streams.ts';
import { parameterSites } from '../physical-checks.ts';
import type { Scenario } from '../scenario-types.ts';

/** The scenario's distributed parameters, each once, in the order the sampler visits them. */
export function designParameters(scenario: Scenario): DesignParameter[] {
  // A value that follows from named parameters is placed through them, not on its own.
  const seen = linkedPointers(scenario);
  const out: DesignParameter[] = [];
  for (const site of parameterSites(scenario)) {
    if (isConstant(site.spec) || seen.has(site.pointer)) continue;
    seen.add(site.pointer);
    out.push({ pointer: site.pointer, spec: site.spec, subStream: parameterSubStream(site.pointer) });
  }
  return out;
}

const plans = new WeakMap<Scenario, DesignPlan | null>();

/** The scenario's design plan; null without a design or for "independent". */
export function scenarioDesignPlan(scenario: Scenario): DesignPlan | null {
  if (scenario.design === undefined || scenario.design.kind === 'independent') return null;
  let plan = plans.get(scenario);
  if (plan === undefined) {
    plan = planDesign(scenario.design, scenario.seed, scenario.episodes, designParameters(scenario));
    plans.set(scenario, plan);
  }
  return plan;
}

/** Unit-cube coordinate of each designed parameter of episode `index`; undefined when nothing is designed. */
export function designCoordinates(scenario: Scenario, index: number): ReadonlyMap<string, number> | undefined {
  const plan = scenarioDesignPlan(scenario);
  if (plan === null) return undefined;
  const coordinates = plan.coordinates(index);
  return new Map(plan.pointers.map((pointer, k) => [pointer, coordinates[k]]));
}
