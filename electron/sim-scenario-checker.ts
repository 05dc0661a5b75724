// The ScenarioChecker seam filled with the scenario pipeline's own checker (sim/scenario), so
// scenario.check in the app reports exactly what `pliant check` reports on the command line.
import type { ScenarioProblem } from '../sim/bridge/bridge-contract.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import type { ScenarioChecker } from './request-services.ts';

export const SIM_SCENARIO_CHECKER: ScenarioChecker = {
  async check(text, fileName) {
    const checked = checkScenarioText(text, fileName);
    if (checked.ok) return { ok: true, problems: [] };
    return {
      ok: false,
      problems: checked.problems.map((p) => {
        const problem: ScenarioProblem = { pointer: p.pointer, message: p.message };
        if (p.line !== undefined) problem.line = p.line;
        if (p.column !== undefined) problem.column = p.column;
        return problem;
      }),
    };
  },
};
