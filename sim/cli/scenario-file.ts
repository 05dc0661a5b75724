// Reads and checks a scenario file named on the command line. Problems come back in the one
// wording the app also shows (file:line:column pointer: message), ready to print; problems found
// later (a replay file that cannot be read) are placed in the same file the same way.
import { dirname, resolve } from 'node:path';

import { MiB, PATH_IS_FOLDER_CODE, readBoundedText } from '../dataset/formats/bounded-text-file.ts';
import { DatasetRequestError } from '../dataset/formats/dataset-request-error.ts';
import { PliantError } from '../errors/pliant-error.ts';
import { systemErrorCode, systemErrorKind } from '../errors/system-error-kind.ts';
import { checkScenarioText } from '../scenario/check-scenario.ts';
import { parseJsonText, placeProblems } from '../scenario/json-source-map.ts';
import type { ScenarioProblem } from '../scenario/scenario-problem.ts';
import { formatProblems,ScenarioProblemError } from '../scenario/scenario-problem.ts';
import type { Scenario } from '../scenario/scenario-types.ts';
import type { CliIo } from './command.ts';
import { CliUsageError } from './command.ts';

/** Scenario files are short documents; replay arrays live in files of their own. */
export const MAX_SCENARIO_FILE_BYTES = 16 * MiB;

export interface LoadedScenario {
  scenario: Scenario;
  /** The path as the user wrote it, for messages. */
  displayName: string;
  absolutePath: string;
  directory: string;
  /** The problems as formatProblems lines, at their line and column in this file. */
  report(problems: readonly ScenarioProblem[]): string;
}

export type ScenarioLoad = { ok: true; loaded: LoadedScenario } | { ok: false; report: string };

export async function loadScenarioFile(path: string, cwd: string): Promise<ScenarioLoad> {
  const absolutePath = resolve(cwd, path);
  let text: string;
  try {
    text = readBoundedText(absolutePath, MAX_SCENARIO_FILE_BYTES, `the scenario file ${path}`);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw new CliUsageError(`${error.message}${error.errorCode === PATH_IS_FOLDER_CODE ? ' (a scenario .json file)' : ''}`);
    const code = systemErrorCode(error);
    const message = `cannot read the scenario file ${path}: ${code === 'ENOENT' ? 'it does not exist' : (error as Error).message}; check the path`;
    // No permission or a failing disk is the machine's state, not a usage mistake.
    if (code !== undefined && systemErrorKind(code) === 'environment') throw new PliantError('environment', 'scenario-unreadable', message);
    throw new CliUsageError(message);
  }
  const checked = checkScenarioText(text, path);
  if (!checked.ok) return { ok: false, report: formatProblems(checked.problems, path) };
  const parsed = parseJsonText(text, path);
  const report = (problems: readonly ScenarioProblem[]): string =>
    formatProblems(parsed.ok ? placeProblems(problems, parsed.sourceMap) : problems, path);
  return { ok: true, loaded: { scenario: checked.scenario, displayName: path, absolutePath, directory: dirname(absolutePath), report } };
}

/** Runs `body`; a ScenarioProblemError it throws is printed at its place in the file, exit 2. */
export async function reportingScenarioProblems(io: CliIo, loaded: LoadedScenario, body: () => Promise<number>): Promise<number> {
  try {
    return await body();
  } catch (error) {
    if (!(error instanceof ScenarioProblemError)) throw error;
    io.stderr(`${loaded.report(error.problems)}\n`);
    return 2;
  }
}
