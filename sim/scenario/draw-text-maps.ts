// Turns a checked scenario's text material maps into the numeric maps they draw, in place, so
// every later check, the sampler and the seed file see numbers only. Used by the checker and
// by the page's preview worker, which cannot run the checker (see renderer/preview).
import type { ScenarioProblem } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';
import { isTextMaterialMap, numericMaterialMap } from './text-material-map.ts';

/** Replaces every text map by the numeric map it draws, so later checks and the seed file see numbers. */
export function drawTextMaps(scenario: Scenario): ScenarioProblem[] {
  const system = scenario.system;
  if (system.kind !== 'lattice' || !('maps' in system.shape)) return [];
  const names = system.materials.map((m) => m.name);
  const problems: ScenarioProblem[] = [];
  system.shape.maps = system.shape.maps.map((map, i) => {
    if (!isTextMaterialMap(map)) return map;
    const drawn = numericMaterialMap(map, names, `/system/shape/maps/${i}`);
    problems.push(...drawn.problems);
    return drawn.map;
  });
  return problems;
}

