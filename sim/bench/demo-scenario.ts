// The Korrin Bay demo scenarios in scenarios/, as the pipeline benchmark cases use them: read and
// checked exactly as `pliant generate` reads and checks a scenario file.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

import { checkScenarioText } from '../scenario/check-scenario.ts';
import { formatProblems } from '../scenario/scenario-problem.ts';
import type { Scenario } from '../scenario/scenario-types.ts';

export const DEMO_SCENARIO_NAMES = ['korrin-tether', 'korrin-fin', 'korrin-eel'] as const;
export type DemoScenarioName = (typeof DEMO_SCENARIO_NAMES)[number];

export function demoScenarioPath(name: DemoScenarioName): string {
  return fileURLToPath(new URL(`../../scenarios/${name}.json`, import.meta.url));
}

export function demoScenarioFolder(): string {
  return fileURLToPath(new URL('../../scenarios/', import.meta.url));
}

/** The checked scenario; a demo file that fails its checks is a defect of this repository, so it throws. */
export function loadDemoScenario(name: DemoScenarioName): Scenario {
  const path = demoScenarioPath(name);
  const checked = checkScenarioText(readFileSync(path, 'utf8'), path);
  if (!checked.ok) throw new Error(`the demo scenario does not pass its checks; run \`pliant validate ${path}\`:\n${formatProblems(checked.problems, path)}`);
  return checked.scenario;
}
