// The "Design" section of a dataset card, for a scenario that has a "design" key: which design
// placed the episodes, over which parameters in which order, and how evenly the points cover
// the unit cube (squared centred L2 discrepancy, next to the mean for independent draws). It is
// computed from the resolved scenario alone, so every copy of the dataset gets the same text.
import { designCoverage } from '../../design/design-coverage.ts';
import { designParameters, scenarioDesignPlan } from '../../scenario/design/scenario-design.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import { formatLabelNumber } from './text-histogram.ts';

function code(pointer: string): string {
  return `\`${pointer}\``;
}

/** Lines of the section, or none when the scenario has no "design" key. */
export function designCardSection(resolvedScenario: unknown): string[] {
  const scenario = resolvedScenario as Scenario;
  if (scenario.design === undefined) return [];
  const lines = ['', '## Design', ''];
  const plan = scenarioDesignPlan(scenario);
  if (plan === null) {
    lines.push('Kind: **independent draws**. Every parameter of every episode is drawn on its own from its distribution, from the episode\'s own random stream.');
    return lines;
  }
  const all = designParameters(scenario).map((p) => p.pointer);
  const free = all.filter((p) => !plan.pointers.includes(p));
  if (plan.kind === 'grid') {
    const levels = plan.pointers.map((p, k) => `${code(p)} ${plan.levels?.[k]}`).join(', ');
    lines.push(`Kind: **full-factorial grid**: every combination of the levels ${levels}, one episode each; level k of L sits at probability (k + 1/2) / L of its parameter's distribution. Episodes run through the combinations with the last parameter changing fastest.`);
  } else if (plan.kind === 'latin-hypercube') {
    lines.push(`Kind: **Latin hypercube** (McKay, Beckman & Conover 1979): each parameter's distribution is cut into ${plan.points} equally likely strata and each stratum is used by exactly one episode, at a uniformly drawn place inside it; strata are matched across parameters at random.`);
  } else {
    lines.push(`Kind: **scrambled Sobol sequence**: direction numbers of Joe & Kuo (2008, new-joe-kuo-6.21201), dimension k for the k-th parameter below, with a random linear matrix scramble and digital shift (Matoušek 1998) drawn from the master seed; episode i is point i.${isPowerOfTwo(plan.points) ? '' : ` ${plan.points} is not a power of two; Sobol points balance exactly only at powers of two.`}`);
  }
  lines.push('', `Dimension ${plan.pointers.length}, ${plan.points} points (one per episode, rejected episodes included). Parameters, in design order (JSON pointers sorted): ${plan.pointers.map(code).join(', ')}.`);
  if (free.length > 0) lines.push('', `Drawn independently (not part of the design): ${free.map(code).join(', ')}. Control-signal parameters are always drawn independently.`);
  else lines.push('', 'Control-signal parameters are always drawn independently.');
  lines.push('', 'Each design coordinate u in [0, 1) becomes a value through its parameter\'s distribution (inverse CDF): uniform and log-uniform in closed form, the truncated normal by solving its distribution function, integer and categorical values by the stratum u falls in.');
  const coverage = designCoverage(plan);
  if (coverage !== null) {
    const over = coverage.pointsMeasured === plan.points ? `all ${plan.points} points` : `the first ${coverage.pointsMeasured} points (the measure costs n² × d operations)`;
    lines.push(
      '',
      `Coverage: squared centred L2 discrepancy CD² = ${formatLabelNumber(Number(coverage.centredDiscrepancySquared.toPrecision(6)))} over ${over} in the unit cube (Hickernell 1998; the value \`scipy.stats.qmc.discrepancy(points, method="CD")\` returns). Lower is more even; independent uniform draws of as many points average ${formatLabelNumber(Number(coverage.independentMean.toPrecision(6)))}.`,
    );
  }
  return lines;
}

function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(Math.log2(n));
}
