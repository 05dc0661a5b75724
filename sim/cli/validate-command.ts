// `pliant validate SCENARIO`: checks a scenario file against the schema and the physical checks
// and prints every problem with its line, column and JSON pointer. Exit 0 when valid, 2 if not.
import { gatherInputs } from '../dataset/write/dataset-inputs.ts';
import { findThinLatticeWarnings } from '../scenario/thin-lattice-warnings.ts';
import type { CliCommand } from './command.ts';
import { CliUsageError } from './command.ts';
import { parseArguments } from './command-arguments.ts';
import { loadScenarioFile, reportingScenarioProblems } from './scenario-file.ts';

export const validateCommand: CliCommand = {
  name: 'validate',
  usage: [
    'Usage: pliant validate SCENARIO',
    '',
    'Checks SCENARIO (a scenario .json file) and prints each problem as',
    '  file:line:column /json/pointer: what is wrong and how to fix it',
    'Warnings (a valid scenario whose results may mislead, e.g. lattices thinner than 4 cells',
    'across, which bend too stiffly) are printed the same way after the result; they do not',
    'change the exit status.',
    'Exit status: 0 when the scenario is valid, 2 when it is not.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseArguments('validate', args, { valued: [], switches: [] });
    if (parsed.positionals.length !== 1) throw new CliUsageError('give exactly one scenario file: pliant validate SCENARIO');
    const [path] = parsed.positionals;
    const result = await loadScenarioFile(path, io.cwd);
    if (!result.ok) {
      io.stderr(`${result.report}\n`);
      return 2;
    }
    const loaded = result.loaded;
    // Replayed control tables are part of the scenario: check they can be read.
    const inputsReadable = await reportingScenarioProblems(io, loaded, async () => {
      await gatherInputs(loaded.scenario, { kind: 'scenario', scenarioDir: loaded.directory });
      return 0;
    });
    if (inputsReadable !== 0) return inputsReadable;
    const s = loaded.scenario;
    io.stdout(`${path}: valid — ${s.system.kind} sweep "${s.name}", ${s.episodes} episode${s.episodes === 1 ? '' : 's'}, seed ${s.seed}, ${s.time.recordedSteps} records of ${s.time.recordIntervalS} s\n`);
    const warnings = findThinLatticeWarnings(s);
    if (warnings.length > 0) io.stdout(`${loaded.report(warnings)}\n`);
    return 0;
  },
};
