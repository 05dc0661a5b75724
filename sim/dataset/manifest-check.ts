// Checks a parsed manifest.json against MANIFEST_SCHEMA and words each failure with the JSON
// pointer of the offending member, so `pliant verify` can say exactly what is wrong.
import Ajv2020 from 'ajv/dist/2020.js';
import type { ErrorObject, ValidateFunction } from 'ajv';
import { MANIFEST_SCHEMA } from './manifest-schema.ts';
import type { DatasetManifest } from './dataset-manifest.ts';

let compiled: ValidateFunction | undefined;

function validator(): ValidateFunction {
  // strictTypes would demand a type beside every if/then; the schema states types in the branches.
  compiled ??= new Ajv2020({ strict: true, strictTypes: false, allErrors: true }).compile(MANIFEST_SCHEMA);
  return compiled;
}

function describe(error: ErrorObject): string {
  const where = error.instancePath === '' ? '/' : error.instancePath;
  const extra = error.keyword === 'additionalProperties'
    ? ` ("${(error.params as { additionalProperty: string }).additionalProperty}")`
    : error.keyword === 'enum'
      ? ` (one of ${(error.params as { allowedValues: unknown[] }).allowedValues.map((v) => JSON.stringify(v)).join(', ')})`
      : '';
  return `${where}: ${error.message ?? 'is not valid'}${extra}`;
}

/** Problems with the manifest, as "pointer: message" lines; empty when it is valid. */
export function manifestProblems(value: unknown): string[] {
  const validate = validator();
  if (validate(value)) return [];
  // if/then failures repeat the underlying error; keep the informative ones.
  const errors = (validate.errors ?? []).filter((e) => e.keyword !== 'if');
  return [...new Set(errors.map(describe))];
}

export function isManifest(value: unknown): value is DatasetManifest {
  return manifestProblems(value).length === 0;
}
