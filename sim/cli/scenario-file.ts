// Reads and checks a scenario file named on the command line. Problems come back in the one
// wording the app also shows (file:line:column pointer: message), ready to print.
import { readFile, stat } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { checkScenarioText } from '../scenario/check-scenario.ts';
import type { Scenario } from '../scenario/scenario-types.ts';
import { formatProblems } from '../scenario/scenario-problem.ts';
import { CliUsageError } from './command.ts';

export interface LoadedScenario {
  scenario: Scenario;
  /** The path as the user wrote it, for messages. */
  displayName: string;
  absolutePath: string;
  directory: string;
}

export type ScenarioLoad = { ok: true; loaded: LoadedScenario } | { ok: false; report: string };

export async function loadScenarioFile(path: string, cwd: string): Promise<ScenarioLoad> {
  const absolutePath = resolve(cwd, path);
  let text: string;
  try {
    if ((await stat(absolutePath)).isDirectory()) throw new CliUsageError(`${path} is a folder; give a scenario .json file`);
    text = await readFile(absolutePath, 'utf8');
  } catch (error) {
    if (error instanceof CliUsageError) throw error;
    throw new CliUsageError(`cannot read the scenario file ${path}: ${(error as NodeJS.ErrnoException).code === 'ENOENT' ? 'it does not exist' : String((error as Error).message)}; check the path`);
  }
  const checked = checkScenarioText(text, path);
  if (!checked.ok) return { ok: false, report: formatProblems(checked.problems, path) };
  return { ok: true, loaded: { scenario: checked.scenario, displayName: path, absolutePath, directory: dirname(absolutePath) } };
}
