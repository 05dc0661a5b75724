// The IdentificationReader seam filled from the files the identification workbench writes:
// score.json and REPORT.md of a score report, one episode of a predictions folder (the NPZ
// contract of sim/dataset/LAYOUT.md, "Predictions folder"), and calibration.json of a
// calibration report. Sizes are checked before anything is read, and a file that is there but
// wrong is reported as such ('invalid-dataset'), never shown as if it were good.
import { readFile, stat } from 'node:fs/promises';

import type { CalibrationReport, ScoreDocumentView } from '../sim/bridge/bridge-contract.ts';
import { containedPath } from '../sim/dataset/formats/contained-path.ts';
import { decodeNpz } from '../sim/dataset/formats/npz.ts';
import { scoreProblems } from '../sim/identify/score/score-check.ts';
import type { ScoreDocument } from '../sim/identify/score/score-document.ts';
import { shown } from './allowed-folders.ts';
import { translateDatasetError } from './dataset-error-translation.ts';
import { encodeArray } from './encoded-array.ts';
import { RequestError } from './request-error.ts';
import type { IdentificationReader } from './request-services.ts';

/** A score.json of 100,000 episodes is some 40 MB; beyond this it is not a report Pliant wrote. */
const MAX_REPORT_JSON_BYTES = 256 * 1024 * 1024;
const MAX_REPORT_MARKDOWN_BYTES = 16 * 1024 * 1024;
/** One predicted episode: far beyond a 2,000-node, 1,000-step float64 rollout (48 MB). */
const MAX_PREDICTION_FILE_BYTES = 1024 * 1024 * 1024;

async function regularFileSize(path: string, what: string, fix: string): Promise<number> {
  const info = await stat(path).catch(() => null);
  if (!info) throw new RequestError('not-found', `${shown(path)} is missing: ${fix}`);
  if (!info.isFile()) throw new RequestError('invalid-dataset', `${shown(path)} is not a regular file, so it cannot be the ${what}. ${fix}`);
  return info.size;
}

async function readBounded(path: string, maxBytes: number, what: string, fix: string): Promise<Buffer> {
  const size = await regularFileSize(path, what, fix);
  if (size > maxBytes) throw new RequestError('too-large', `${shown(path)} is ${size} bytes, more than any ${what} Pliant writes (${maxBytes}). ${fix}`);
  return readFile(path);
}

/** A file inside a chosen report or predictions folder, refused when a link leads it out of the folder. */
async function inside(dir: string, name: string): Promise<string> {
  try {
    return await containedPath(dir, name);
  } catch (error) {
    throw translateDatasetError(error);
  }
}

async function optionalText(path: string): Promise<string> {
  const info = await stat(path).catch(() => null);
  if (!info || !info.isFile() || info.size > MAX_REPORT_MARKDOWN_BYTES) return '';
  return readFile(path, 'utf8');
}

function parsedJson(bytes: Buffer, path: string, what: string): unknown {
  try {
    return JSON.parse(bytes.toString('utf8'));
  } catch (error) {
    throw new RequestError('invalid-dataset', `${shown(path)} is not valid JSON (${(error as Error).message}), so it is not a ${what} Pliant wrote.`);
  }
}

/** The screen's view of score.json; the compiler checks here that every document `pliant score` writes fits it. */
function scoreView(document: ScoreDocument): ScoreDocumentView {
  return document;
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

export const SIM_IDENTIFICATION_READER: IdentificationReader = {
  async score(reportDir) {
    const path = await inside(reportDir, 'score.json');
    const fix = 'open the folder `pliant score … --out DIR` (or a score job) wrote.';
    const document = parsedJson(await readBounded(path, MAX_REPORT_JSON_BYTES, 'score report', fix), path, 'score report');
    // The same JSON Schema `pliant score` checks before it writes, so the screen only shows reports it can read whole.
    const problems = scoreProblems(document);
    if (problems.length > 0) {
      throw new RequestError('invalid-dataset', `${shown(path)} is not a score report of this Pliant: ${problems.slice(0, 3).join('; ')}${problems.length > 3 ? ` and ${problems.length - 3} more` : ''}. ${fix}`);
    }
    return { path: reportDir, score: scoreView(document as ScoreDocument), reportMarkdown: await optionalText(await inside(reportDir, 'REPORT.md')) };
  },

  async predictionArrays(predictionsDir, episodeId) {
    const path = await inside(predictionsDir, `${episodeId}.npz`);
    const fix = `the predictions folder needs one ${episodeId}.npz holding "positions" (T+1, N, 3); see LAYOUT.md, "Predictions folder".`;
    const bytes = await readBounded(path, MAX_PREDICTION_FILE_BYTES, 'predicted episode', fix);
    let arrays;
    try {
      arrays = decodeNpz(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), path);
    } catch (error) {
      throw translateDatasetError(error);
    }
    const wanted = arrays.filter((a) => a.name === 'positions' || a.name === 'velocities');
    const positions = wanted.find((a) => a.name === 'positions');
    if (!positions) throw new RequestError('invalid-dataset', `${shown(path)} has no "positions" array: ${fix}`);
    for (const array of wanted) {
      if (array.shape.length !== 3 || array.shape[2] !== 3 || (array.dtype !== 'float32' && array.dtype !== 'float64')) {
        throw new RequestError('invalid-dataset', `${shown(path)}: "${array.name}" is ${array.dtype} [${array.shape.join(', ')}], not float32 or float64 (T+1, N, 3): ${fix}`);
      }
    }
    return {
      episodeId,
      arrays: wanted.map((a) => encodeArray({ name: a.name, dtype: a.dtype, shape: a.shape, unit: a.name === 'positions' ? 'm' : 'm/s', data: a.data })),
      controlChannels: [],
    };
  },

  async calibration(reportDir): Promise<CalibrationReport> {
    const path = await inside(reportDir, 'calibration.json');
    const fix = 'open the report folder `pliant calibrate` wrote.';
    const document = parsedJson(await readBounded(path, MAX_REPORT_JSON_BYTES, 'calibration report', fix), path, 'calibration report');
    if (!isObject(document) || document.calibrationFormat !== 1 || !Array.isArray(document.parameters) || !isObject(document.residualOverTime)) {
      throw new RequestError('invalid-dataset', `${shown(path)} is not a calibration report of this Pliant (calibrationFormat 1 with parameters and residualOverTime). ${fix}`);
    }
    const residual = document.residualOverTime as { timeS?: unknown; fittedRmsM?: unknown };
    const numbers = (value: unknown): number[] => (Array.isArray(value) ? value.map((v) => (typeof v === 'number' ? v : Number.NaN)) : []);
    return {
      path: reportDir,
      parameters: (document.parameters as Record<string, unknown>[]).map((p) => ({
        pointer: String(p.pointer ?? ''),
        unit: String(p.unit ?? ''),
        value: typeof p.value === 'number' ? p.value : null,
        standardError: typeof p.standardError === 'number' ? p.standardError : null,
        identifiable: p.identifiable === true,
        note: typeof p.notIdentifiableBecause === 'string' ? p.notIdentifiableBecause : '',
      })),
      residualTimeS: numbers(residual.timeS),
      residualRmsM: numbers(residual.fittedRmsM),
      reportMarkdown: await optionalText(await inside(reportDir, 'REPORT.md')),
    };
  },
};
