// Whether the scenario's sub-steps keep semi-implicit Euler stable for every system it can
// draw: the stability bound of the demanding corner (stiffest, lightest, most damped) gives
// the smallest critical step, which a fixed sub-step count must undercut and "auto" must reach
// within the sub-step limit.
import { accuracySubsteps } from '../core/accuracy-substeps.ts';
import { autoSubsteps, stabilityBound } from '../core/stability-bound.ts';
import type { BuiltSystem } from '../systems/built-system.ts';
import { DemandingCorner } from './demanding-corner.ts';
import { resolveWorld } from './resolve-world.ts';
import { MAX_SUBSTEPS } from './scenario-limits.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';

function formatSeconds(s: number): string {
  return `${Number(s.toPrecision(3))} s`;
}

export function findStabilityProblems(scenario: Scenario, demandingSystems: readonly BuiltSystem[], cornerWords: string): ScenarioProblem[] {
  const airDragPerS = resolveWorld(scenario.world, new DemandingCorner('demanding')).airDragPerS;
  let criticalDtS = Infinity;
  let worst = demandingSystems[0];
  for (const system of demandingSystems) {
    const bound = stabilityBound(system.model, airDragPerS);
    if (bound.criticalDtS < criticalDtS) {
      criticalDtS = bound.criticalDtS;
      worst = system;
    }
  }
  if (worst === undefined || !Number.isFinite(criticalDtS)) return [];
  const { recordIntervalS, substeps, autoSafety } = scenario.time;
  const where = cornerWords ? ` (${cornerWords})` : '';
  if (typeof substeps === 'object') {
    const bound = stabilityBound(worst.model, airDragPerS);
    const needed = Math.max(autoSubsteps(recordIntervalS, bound, autoSafety), accuracySubsteps(recordIntervalS, bound, substeps.accuracy));
    if (needed <= MAX_SUBSTEPS) return [];
    return [
      {
        pointer: '/time/substeps/accuracy',
        message:
          `accuracy ${substeps.accuracy} would need ${needed} sub-steps per record interval for the stiffest, lightest system this scenario can draw${where} ` +
          `(ω_max = ${bound.omegaMaxRadPerS.toPrecision(4)} rad/s); the limit is ${MAX_SUBSTEPS}. Loosen the accuracy target, shorten recordIntervalS, or make the stiffest case softer or heavier`,
      },
    ];
  }
  if (substeps === 'auto') {
    const needed = autoSubsteps(recordIntervalS, stabilityBound(worst.model, airDragPerS), autoSafety);
    if (needed <= MAX_SUBSTEPS) return [];
    return [
      {
        pointer: '/time/substeps',
        message:
          `"auto" would need ${needed} sub-steps per record interval for the stiffest, lightest system this scenario can draw${where}, ` +
          `whose critical time step is ${formatSeconds(criticalDtS)}; the limit is ${MAX_SUBSTEPS}. Shorten recordIntervalS, or make the stiffest case softer or heavier`,
      },
    ];
  }
  const dtS = recordIntervalS / substeps;
  if (dtS < criticalDtS) return [];
  const minimum = Math.floor(recordIntervalS / criticalDtS) + 1;
  return [
    {
      pointer: '/time/substeps',
      message:
        `${substeps} sub-step${substeps === 1 ? '' : 's'} per record interval give dt = ${formatSeconds(dtS)}, but the stiffest, lightest system this scenario can draw${where} ` +
        `is stable only for dt below ${formatSeconds(criticalDtS)}; use at least ${minimum} sub-steps (more for accuracy), or "auto"`,
    },
  ];
}
