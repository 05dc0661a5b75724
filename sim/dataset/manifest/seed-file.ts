// seed.json: the recipe that regenerates a dataset bit for bit — the full resolved scenario
// (which holds the master seed, the episode count, the splits and the export options, repeated
// at the top for people reading it), the Pliant version that wrote it, and the input files the
// scenario replays, copied beside it with their SHA-256.
import { checkScenarioValue } from '../../scenario/check-scenario.ts';
import { SEED_COMPRESSION_BEFORE_CHOICE } from '../../scenario/export-compression.ts';
import { formatProblems } from '../../scenario/scenario-problem.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import { DatasetRequestError } from '../formats/dataset-request-error.ts';

export const SEED_FORMAT_VERSION = 1;

export interface SeedInput {
  /** The file name as the scenario writes it. */
  scenarioPath: string;
  /** The copy beside seed.json, relative to the dataset folder. */
  path: string;
  sha256: string;
  sizeBytes: number;
}

export interface SeedFile {
  seedFormat: number;
  pliantVersion: string;
  masterSeed: string;
  episodeCount: number;
  splits: Scenario['splits'];
  export: Scenario['export'];
  inputs: SeedInput[];
  scenario: Scenario;
}

export function masterSeedText(scenario: Scenario): string {
  return String(scenario.seed);
}

export function makeSeedFile(scenario: Scenario, inputs: SeedInput[], pliantVersion: string): SeedFile {
  return {
    seedFormat: SEED_FORMAT_VERSION,
    pliantVersion,
    masterSeed: masterSeedText(scenario),
    episodeCount: scenario.episodes,
    splits: scenario.splits,
    export: scenario.export,
    inputs,
    scenario,
  };
}

export function renderSeedFile(seed: SeedFile): string {
  return `${JSON.stringify(seed, null, 2)}\n`;
}

/** Reads seed.json text; every problem is reported with the file name and what to do. */
export function parseSeedFile(text: string, fileName: string): SeedFile {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new DatasetRequestError(`${fileName} is not valid JSON (${error instanceof Error ? error.message : String(error)}); it should be the seed.json a Pliant run wrote`);
  }
  const seed = value as Partial<SeedFile> | null;
  if (seed === null || typeof seed !== 'object' || Array.isArray(seed)) throw new DatasetRequestError(`${fileName} is not a seed file: expected a JSON object`);
  if (seed.seedFormat !== SEED_FORMAT_VERSION) {
    throw new DatasetRequestError(`${fileName} /seedFormat: this Pliant reads seed format ${SEED_FORMAT_VERSION} (got ${JSON.stringify(seed.seedFormat)}); is this a seed.json written by Pliant?`);
  }
  const checked = checkScenarioValue(withCompressionBeforeChoice(seed.scenario));
  if (!checked.ok) {
    const problems = checked.problems.map((p) => ({ ...p, pointer: `/scenario${p.pointer}` }));
    throw new DatasetRequestError(`${fileName} holds a scenario that does not check:\n${formatProblems(problems, fileName)}`);
  }
  const scenario = checked.scenario;
  // The copies at the top are for readers; the scenario decides. Edited copies would mislead.
  const mismatches: string[] = [];
  if (seed.masterSeed !== masterSeedText(scenario)) mismatches.push('/masterSeed');
  if (seed.episodeCount !== scenario.episodes) mismatches.push('/episodeCount');
  if (JSON.stringify(seed.splits) !== JSON.stringify(scenario.splits)) mismatches.push('/splits');
  if (JSON.stringify(withCompressionBeforeChoice({ export: seed.export }).export) !== JSON.stringify(scenario.export)) mismatches.push('/export');
  if (mismatches.length > 0) {
    throw new DatasetRequestError(`${fileName} ${mismatches.join(', ')}: disagree${mismatches.length === 1 ? 's' : ''} with the scenario inside it; edit /scenario instead (the copies at the top are only for reading)`);
  }
  const inputs = Array.isArray(seed.inputs) ? seed.inputs : [];
  for (const [i, input] of inputs.entries()) {
    if (typeof input?.scenarioPath !== 'string' || typeof input.path !== 'string' || !/^[0-9a-f]{64}$/.test(String(input.sha256))) {
      throw new DatasetRequestError(`${fileName} /inputs/${i}: needs scenarioPath, path and a SHA-256`);
    }
  }
  return { ...(seed as SeedFile), scenario, inputs };
}

/**
 * A seed file written before `export.compression` existed lacks the key, and its files were
 * written with the levels "small" stands for; the scenario's default ("fast") would regenerate
 * other bytes. So in a seed file, and only there, a missing key means "small".
 */
function withCompressionBeforeChoice<T>(scenario: T): T {
  if (scenario === null || typeof scenario !== 'object' || Array.isArray(scenario)) return scenario;
  const exportSpec = (scenario as { export?: unknown }).export;
  if (exportSpec === null || typeof exportSpec !== 'object' || Array.isArray(exportSpec) || Object.hasOwn(exportSpec, 'compression')) return scenario;
  return { ...scenario, export: { ...exportSpec, compression: SEED_COMPRESSION_BEFORE_CHOICE } };
}
