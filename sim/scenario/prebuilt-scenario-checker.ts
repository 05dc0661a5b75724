// A place for the scenario checker compiled ahead of time. ajv compiles SCENARIO_SCHEMA into a
// checking function on first use, a fifth of a second or more at every start of a short command
// (`pliant validate`). The prebuilt command line (sim/cli/cli-bundle.mjs) writes that same
// function's code once, when it builds the bundle (sim/cli/scenario-checker-code.ts), and hands
// it in here; schema-problems.ts then uses it instead of compiling. Its schema nodes are looked
// up in the live SCENARIO_SCHEMA by path, so each error's parentSchema is the very node the
// error messages are worked out from, as when ajv compiles here. Without one, ajv compiles as
// before. Kept apart from schema-problems.ts so that registering one does not load ajv.
import type { ValidateFunction } from 'ajv';

/** Makes the checking function, given the lookup of a schema node by its path in SCENARIO_SCHEMA. */
export type ScenarioCheckerFactory = (schemaAt: (path: readonly string[]) => unknown) => ValidateFunction;

let load: (() => ScenarioCheckerFactory | undefined) | undefined;

/** Registers a loader of the prebuilt checker; it is called once, when a scenario is first checked. */
export function usePrebuiltScenarioChecker(loader: () => ScenarioCheckerFactory | undefined): void {
  load = loader;
}

/** The prebuilt checker's factory, or undefined when none is registered or it cannot be loaded. */
export function prebuiltScenarioChecker(): ScenarioCheckerFactory | undefined {
  try {
    return load?.();
  } catch {
    return undefined;
  }
}
