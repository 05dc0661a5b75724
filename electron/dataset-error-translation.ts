// The app's one mapping from an error's kind and stable code (sim/errors/pliant-error.ts) to the
// bridge contract's error codes, so the renderer can tell "not there" (not-found) from "there but
// not a readable dataset" (invalid-dataset), a bad argument (invalid-arguments) and the machine's
// refusals (permission-denied, io-error). Codes the table does not name fall back on the kind:
// a user's mistake is invalid-arguments, the environment's is io-error, a bug is internal. The
// pipeline's messages already say what, where and how to fix it; only their first letter and
// final full stop are adjusted to read as sentences.
import type { RequestErrorCode } from '../sim/bridge/bridge-contract.ts';
import type { ErrorReport } from '../sim/errors/error-report.ts';
import type { ErrorKind } from '../sim/errors/pliant-error.ts';
import { PliantError } from '../sim/errors/pliant-error.ts';
import { appMessageOf } from './app-run-words.ts';
import { RequestError } from './request-error.ts';

/** Stable error codes with a more telling contract code than their kind's. */
const REQUEST_CODE_BY_ERROR_CODE: Readonly<Record<string, RequestErrorCode>> = {
  'dataset-not-found': 'not-found',
  'dataset-request': 'invalid-dataset',
  'path-is-folder': 'invalid-dataset',
  'dataset-read': 'invalid-dataset',
  'json-damaged': 'invalid-dataset',
  'missing-picture-array': 'invalid-dataset',
  'unknown-sort-key': 'invalid-arguments',
  'write-disk-full': 'io-error',
  'write-not-writable': 'permission-denied',
  'write-missing-folder': 'not-found',
  'write-not-a-folder': 'not-found',
  'write-in-the-way': 'already-exists',
  'write-too-large': 'too-large',
  'npz-too-large': 'too-large',
};

export const REQUEST_CODE_BY_KIND: Readonly<Record<ErrorKind, RequestErrorCode>> = {
  user: 'invalid-arguments',
  environment: 'io-error',
  bug: 'internal',
};

/** The contract code for an error's report. */
export function requestErrorCodeOf(report: Pick<ErrorReport, 'kind' | 'errorCode'>): RequestErrorCode {
  if (report.kind === 'bug') return 'internal';
  return REQUEST_CODE_BY_ERROR_CODE[report.errorCode] ?? REQUEST_CODE_BY_KIND[report.kind];
}

/** The RequestError for one of Pliant's own expected errors; bugs and anything else are returned unchanged for the registry to report. */
export function translateDatasetError(error: unknown): unknown {
  if (!(error instanceof PliantError) || error.kind === 'bug') return error;
  return new RequestError(requestErrorCodeOf(error), asSentence(appMessageOf(error)));
}

export function asSentence(text: string): string {
  const trimmed = text.trim();
  const capital = trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}
