// Checks a parsed manifest.json against MANIFEST_SCHEMA and words each failure with the JSON
// pointer of the offending member, so `pliant verify` can say exactly what is wrong.
import type { ErrorObject, ValidateFunction } from 'ajv';
import Ajv2020 from 'ajv/dist/2020.js';

import type { DatasetManifest } from './dataset-manifest.ts';
import { MANIFEST_SCHEMA } from './manifest-schema.ts';

let ajv: Ajv2020 | undefined;

function validator(piece = ''): ValidateFunction {
  if (!ajv) {
    // strictTypes would demand a type beside every if/then; the schema states types in the branches.
    ajv = new Ajv2020({ strict: true, strictTypes: false, allErrors: true });
    ajv.addSchema(MANIFEST_SCHEMA);
  }
  let validate = pieceValidators.get(piece);
  if (!validate) pieceValidators.set(piece, (validate = ajv.getSchema(`${MANIFEST_SCHEMA.$id}${piece}`)!));
  return validate;
}
const pieceValidators = new Map<string, ValidateFunction>();

/** The parts of a manifest a streaming reader checks one at a time, and where each sits in the schema. */
const PIECES = {
  head: '',
  documents: '#/properties/documents',
  run: '#/properties/run',
  episode: '#/properties/episodes/items',
  file: '#/properties/files/items',
  'episode-id': '#/properties/files/items/properties/episodes/items',
  array: '#/properties/files/items/properties/arrays/items',
} as const;

export type ManifestPiece = keyof typeof PIECES;

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
  return problemsAgainst(validator(), value);
}

/**
 * Problems with one piece of a manifest, pointers relative to the piece. The head is checked as
 * a manifest whose lists are empty, so its required members and their types are the schema's.
 */
export function manifestPieceProblems(piece: ManifestPiece, value: unknown): string[] {
  if (piece === 'head') {
    const whole = value !== null && typeof value === 'object' ? { ...value, episodes: [], files: [], documents: [], run: {} } : value;
    return problemsAgainst(validator(), whole);
  }
  return problemsAgainst(validator(PIECES[piece]), value);
}

function problemsAgainst(validate: ValidateFunction, value: unknown): string[] {
  if (validate(value)) return [];
  // if/then failures repeat the underlying error; keep the informative ones.
  const errors = (validate.errors ?? []).filter((e) => e.keyword !== 'if');
  return [...new Set(errors.map(describe))];
}

export function isManifest(value: unknown): value is DatasetManifest {
  return manifestProblems(value).length === 0;
}
