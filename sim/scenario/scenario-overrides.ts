// Command-line flags that replace a scenario's episode count, seed or export format. The result
// is checked again like a file, so a flag cannot produce a scenario a file could not.
import { checkScenarioValue } from './check-scenario.ts';
import { ScenarioProblemError } from './scenario-problem.ts';
import type { ExportSpec, Scenario } from './scenario-types.ts';

export interface ScenarioOverrides {
  episodes?: number;
  /** A whole number, or a decimal string up to 2^64 − 1. */
  seed?: number | string;
  format?: ExportSpec['format'];
}

/** Throws ScenarioProblemError (pointers /episodes, /seed, /export/format) for a bad flag value. */
export function withOverrides(scenario: Scenario, overrides: ScenarioOverrides): Scenario {
  const changed: Scenario = { ...scenario, export: { ...scenario.export } };
  if (overrides.episodes !== undefined) changed.episodes = overrides.episodes;
  if (overrides.seed !== undefined) changed.seed = typeof overrides.seed === 'string' && /^(0|[1-9][0-9]*)$/.test(overrides.seed) && Number(overrides.seed) <= Number.MAX_SAFE_INTEGER ? Number(overrides.seed) : overrides.seed;
  if (overrides.format !== undefined) changed.export.format = overrides.format;
  const checked = checkScenarioValue(changed);
  if (!checked.ok) throw new ScenarioProblemError(checked.problems);
  return checked.scenario;
}
