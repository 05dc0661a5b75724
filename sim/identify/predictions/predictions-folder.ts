// What a predictions folder holds before any of it is decoded: the episode ids it has a file for
// (`<episode id>.npz`) and the model's name and description from the optional predictions.json.
// Listing first lets a scorer name every missing or extra episode before it reads one array.
import { readdirSync, statSync } from 'node:fs';
import { basename, join } from 'node:path';

import { MiB, readBoundedText } from '../../dataset/formats/bounded-text-file.ts';
import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';
import { PredictionsError } from './predictions-error.ts';

export const PREDICTIONS_FORMAT_VERSION = 1;
export const PREDICTIONS_DESCRIPTION_FILE = 'predictions.json';
const EPISODE_FILE = /^(ep-[0-9]{6,})\.npz$/;

export interface PredictionsFolder {
  dir: string;
  /** Episode ids with a file, sorted as text (which sorts them by index). */
  episodeIds: string[];
  /** From predictions.json, else the folder's own name. */
  model: string;
  description: string;
}

export function predictionFilePath(folder: PredictionsFolder, episodeId: string): string {
  return join(folder.dir, `${episodeId}.npz`);
}

function describedModel(dir: string): { model: string; description: string } | null {
  const path = join(dir, PREDICTIONS_DESCRIPTION_FILE);
  let text: string;
  try {
    text = readBoundedText(path, 1 * MiB, path);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw new PredictionsError(`${error.message} (${PREDICTIONS_DESCRIPTION_FILE} is a short JSON description)`);
    return null;
  }
  const fix = `write it as {"predictionsFormat": ${PREDICTIONS_FORMAT_VERSION}, "model": "short name", "description": "free text"} or remove it`;
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new PredictionsError(`${path} is not valid JSON (${error instanceof Error ? error.message : String(error)}); ${fix}`);
  }
  const record = value as Record<string, unknown>;
  if (value === null || typeof value !== 'object' || Array.isArray(value)) throw new PredictionsError(`${path} is not a JSON object; ${fix}`);
  if (record.predictionsFormat !== PREDICTIONS_FORMAT_VERSION) {
    throw new PredictionsError(`${path}: "predictionsFormat" is ${JSON.stringify(record.predictionsFormat)}, but this Pliant reads format ${PREDICTIONS_FORMAT_VERSION}; ${fix}`);
  }
  if (typeof record.model !== 'string' || record.model.trim() === '' || record.model.length > 120) {
    throw new PredictionsError(`${path}: "model" must be a short non-empty text (at most 120 characters); ${fix}`);
  }
  if (record.description !== undefined && typeof record.description !== 'string') {
    throw new PredictionsError(`${path}: "description" must be text; ${fix}`);
  }
  const unknown = Object.keys(record).filter((k) => !['predictionsFormat', 'model', 'description'].includes(k));
  if (unknown.length > 0) throw new PredictionsError(`${path}: unknown member ${JSON.stringify(unknown[0])}; ${fix}`);
  return { model: record.model.trim(), description: (record.description as string | undefined) ?? '' };
}

/** Lists `dir` as a predictions folder; refuses anything that is not one. */
export function readPredictionsFolder(dir: string): PredictionsFolder {
  let isFolder: boolean;
  try {
    isFolder = statSync(dir).isDirectory();
  } catch {
    throw new PredictionsError(`${dir} does not exist; give the folder holding one <episode id>.npz per predicted episode`);
  }
  if (!isFolder) throw new PredictionsError(`${dir} is a file, not a predictions folder; give the folder holding one <episode id>.npz per predicted episode (ep-000042.npz)`);
  let names: string[];
  try {
    names = readdirSync(dir).sort();
  } catch (error) {
    throw new PredictionsError(`${dir} cannot be listed (${(error as { code?: string }).code ?? String(error)}); make the folder readable`);
  }
  const episodeIds: string[] = [];
  for (const name of names) {
    const match = EPISODE_FILE.exec(name);
    if (match) {
      episodeIds.push(match[1]);
      continue;
    }
    if (name.toLowerCase().endsWith('.npz')) {
      throw new PredictionsError(`${join(dir, name)}: "${name}" is not named for an episode; name each prediction <episode id>.npz, e.g. ep-000042.npz`);
    }
  }
  if (names.includes('manifest.json') && names.includes('seed.json')) {
    throw new PredictionsError(`${dir} is a dataset folder, not a predictions folder; give the dataset first and the predictions folder second: pliant score DATASET PREDICTIONS --out REPORT_DIR`);
  }
  if (episodeIds.length === 0) {
    throw new PredictionsError(`${dir} is not a predictions folder: it holds no <episode id>.npz file; write one per predicted episode (see "Predictions folders" in sim/dataset/LAYOUT.md)`);
  }
  const described = describedModel(dir);
  return { dir, episodeIds, model: described?.model ?? basename(dir), description: described?.description ?? '' };
}
