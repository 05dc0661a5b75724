// Turns the dataset pipeline's own errors into the contract's error codes, so the renderer can
// tell "not there" (not-found) from "there but not a readable dataset" (invalid-dataset) and a
// bad sort column (invalid-arguments). The pipeline's messages already say what, where and how
// to fix it; only their first letter and final full stop are adjusted to read as sentences.
import { DatasetNotFoundError } from '../sim/dataset/dataset-not-found-error.ts';
import { DatasetReadError } from '../sim/dataset/dataset-read-error.ts';
import { DatasetRequestError } from '../sim/dataset/dataset-request-error.ts';
import { UnknownSortKeyError } from '../sim/dataset/episode-listing.ts';
import type { RequestErrorCode } from '../sim/bridge/bridge-contract.ts';
import { appMessageOf } from './app-run-words.ts';
import { RequestError } from './request-error.ts';

/** Error class names as they survive a worker thread's postMessage, where only the name and message cross. */
export const DATASET_ERROR_CODES: Readonly<Record<string, RequestErrorCode>> = {
  DatasetNotFoundError: 'not-found',
  DatasetRequestError: 'invalid-dataset',
  DatasetReadError: 'invalid-dataset',
  UnknownSortKeyError: 'invalid-arguments',
};

/** The RequestError for a pipeline error; anything else is returned unchanged for the registry to report. */
export function translateDatasetError(error: unknown): unknown {
  const known = error instanceof DatasetNotFoundError || error instanceof DatasetRequestError || error instanceof DatasetReadError || error instanceof UnknownSortKeyError;
  return known ? new RequestError(DATASET_ERROR_CODES[error.name], asSentence(appMessageOf(error))) : error;
}

export function asSentence(text: string): string {
  const trimmed = text.trim();
  const capital = trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}
