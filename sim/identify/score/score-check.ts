// Checks a score document against SCORE_SCHEMA, wording each failure with its JSON pointer
// (as manifest-check.ts does for manifests).
import type { ErrorObject, ValidateFunction } from 'ajv';
import Ajv2020 from 'ajv/dist/2020.js';

import { SCORE_SCHEMA } from './score-schema.ts';

let compiled: ValidateFunction | undefined;

function validator(): ValidateFunction {
  compiled ??= new Ajv2020({ strict: true, strictTypes: false, allErrors: true }).compile(SCORE_SCHEMA);
  return compiled;
}

function describe(error: ErrorObject): string {
  return `${error.instancePath === '' ? '/' : error.instancePath}: ${error.message ?? 'is not valid'}`;
}

/** Problems as "pointer: message" lines; empty when the document is valid. */
export function scoreProblems(value: unknown): string[] {
  const validate = validator();
  if (validate(value)) return [];
  return [...new Set((validate.errors ?? []).map(describe))];
}
