// The scenario-level checks of a design: the design's own problems (sim/design) for the
// scenario's distributed parameters, with a spelling suggestion for a mistyped grid pointer.
import { findDesignProblems } from '../../design/design-problems.ts';
import { isConstant } from '../../random/distribution.ts';
import { closestName } from '../closest-name.ts';
import type { ParameterSite } from '../demanding-corner.ts';
import { parameterSubStream } from '../parameter-streams.ts';
import type { ScenarioProblem } from '../scenario-problem.ts';
import type { Scenario } from '../scenario-types.ts';

export function findScenarioDesignProblems(scenario: Scenario, sites: readonly ParameterSite[]): ScenarioProblem[] {
  const design = scenario.design;
  if (design === undefined) return [];
  const seen = new Set<string>();
  const parameters = sites
    .filter((s) => !isConstant(s.spec) && !seen.has(s.pointer) && seen.add(s.pointer))
    .map((s) => ({ pointer: s.pointer, spec: s.spec, subStream: parameterSubStream(s.pointer) }));
  const known = parameters.map((p) => p.pointer);
  return findDesignProblems(design, scenario.episodes, parameters).map((problem) => {
    const gridKey = /^\/design\/levels\/(.+)$/.exec(problem.pointer);
    if (gridKey === null || !problem.message.includes('is not a distributed parameter')) return problem;
    const written = gridKey[1].replace(/~1/g, '/').replace(/~0/g, '~');
    const suggestion = closestName(written, known);
    return suggestion === undefined ? problem : { ...problem, message: `${problem.message}; did you mean "${suggestion}"?` };
  });
}
