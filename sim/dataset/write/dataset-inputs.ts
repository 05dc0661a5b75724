// The files a scenario replays (recorded control tables in .npy files): read them before any
// folder is made, so a missing or malformed file is reported as a scenario problem at the
// member that names it, and keep their bytes to copy into the dataset's inputs/ folder, so that
// seed.json alone regenerates the dataset. When regenerating from a seed file the copies are
// read instead, and their SHA-256 must match what the seed file recorded.
import { readFile } from 'node:fs/promises';
import { basename, isAbsolute, join, resolve } from 'node:path';

import { ScenarioProblemError } from '../../scenario/scenario-problem.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';
import { sha256Hex } from '../formats/file-digest.ts';
import { INPUTS_FOLDER } from '../manifest/dataset-files.ts';
import type { SeedInput } from '../manifest/seed-file.ts';
import { readNpyTable } from './npy-table.ts';
import type { ReplayData } from './replay-inputs.ts';
import { replayFilesOf,ReplayTable } from './replay-inputs.ts';

export interface GatheredInputs {
  table: ReplayTable;
  /** What seed.json records about each input. */
  seedInputs: SeedInput[];
  /** The bytes to copy, by their path in the dataset folder. */
  copies: Array<{ path: string; bytes: Uint8Array }>;
}

/** Where the files come from: beside the scenario file, or the copies beside a seed file. */
export type InputSource =
  | { kind: 'scenario'; scenarioDir: string }
  | { kind: 'seed'; seedDir: string; seedName: string; inputs: SeedInput[] };

function copyNames(files: string[]): string[] {
  const used = new Set<string>();
  return files.map((file, i) => {
    let name = basename(file);
    if (used.has(name)) name = `${i}-${name}`;
    used.add(name);
    return `${INPUTS_FOLDER}/${name}`;
  });
}

export async function gatherInputs(scenario: Scenario, source: InputSource): Promise<GatheredInputs> {
  const references = replayFilesOf(scenario);
  const names = copyNames(references.map((r) => r.file));
  const entries: Array<[string, ReplayData]> = [];
  const seedInputs: SeedInput[] = [];
  const copies: GatheredInputs['copies'] = [];
  for (const [i, reference] of references.entries()) {
    // A problem with a file the scenario names is the scenario's, reported at its pointer; a
    // problem with a copy beside a seed file is the seed file's.
    const refuse = (problem: string): never => {
      if (source.kind === 'scenario') throw new ScenarioProblemError([{ pointer: reference.pointer, message: problem }]);
      throw new DatasetRequestError(`${source.seedName} /inputs (${reference.file}): ${problem}`);
    };
    let path: string;
    let expected: string | undefined;
    if (source.kind === 'scenario') {
      path = isAbsolute(reference.file) ? reference.file : resolve(source.scenarioDir, reference.file);
    } else {
      const input = source.inputs.find((x) => x.scenarioPath === reference.file);
      if (!input) throw new DatasetRequestError(`${source.seedName}: the scenario replays "${reference.file}" (${reference.pointer}) but /inputs does not list it; the seed file is incomplete`);
      path = join(source.seedDir, input.path);
      expected = input.sha256;
    }
    let bytes: Uint8Array = new Uint8Array(0);
    try {
      bytes = await readFile(path);
    } catch {
      refuse(`cannot read the replay file ${path}; give a path to an existing .npy file, relative to the scenario file`);
    }
    const sha256 = sha256Hex(bytes);
    if (expected !== undefined && sha256 !== expected) {
      refuse(`${path} has SHA-256 ${sha256}, but the seed file recorded ${expected}; the copy was changed, so the dataset cannot be regenerated from it`);
    }
    let table: ReplayData = { data: new Float64Array(0), rows: 0, columns: 0 };
    try {
      table = readNpyTable(bytes, path);
    } catch (error) {
      refuse(`not a usable .npy table: ${error instanceof Error ? error.message : String(error)}`);
    }
    entries.push([reference.file, table]);
    seedInputs.push({ scenarioPath: reference.file, path: names[i], sha256, sizeBytes: bytes.length });
    copies.push({ path: names[i], bytes });
  }
  return { table: new ReplayTable(entries), seedInputs, copies };
}
