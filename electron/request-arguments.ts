// Checks a request's argument object against its JSON Schema (draft 2020-12, ajv) before any
// handler sees it, and words each refusal so the caller learns which key is wrong and how to fix
// it. Schemas live in the bridge contract so the renderer can read the same rules.
import type { ErrorObject, ValidateFunction } from 'ajv';
import Ajv2020 from 'ajv/dist/2020.js';

import type { JsonSchema, RequestArgs, RequestName } from '../sim/bridge/bridge-contract.ts';
import { REQUEST_ARGUMENT_SCHEMAS, REQUEST_NAMES } from '../sim/bridge/bridge-contract.ts';
import { RequestError } from './request-error.ts';

/** Keys that would reach an object's prototype machinery if a handler ever spread or merged args. */
const PROTOTYPE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

export type ArgumentChecker = <K extends RequestName>(name: K, args: unknown) => RequestArgs<K>;

export function createArgumentChecker(): ArgumentChecker {
  // verbose keeps the offending value on each error so messages can say what was received.
  const ajv = new Ajv2020({ strict: true, allErrors: false, verbose: true });
  const validators = new Map<RequestName, ValidateFunction>();
  for (const name of REQUEST_NAMES) validators.set(name, ajv.compile(REQUEST_ARGUMENT_SCHEMAS[name]));

  return <K extends RequestName>(name: K, args: unknown): RequestArgs<K> => {
    refuseNonPlainObject(name, args);
    const validate = validators.get(name)!;
    if (!validate(args)) {
      const first = (validate.errors ?? [])[0];
      throw new RequestError('invalid-arguments', first ? describeError(name, first) : `Arguments of ${name} are not valid.`);
    }
    return args as RequestArgs<K>;
  };
}

function refuseNonPlainObject(name: RequestName, args: unknown): void {
  if (typeof args !== 'object' || args === null || Array.isArray(args)) {
    throw new RequestError('invalid-arguments', `Arguments of ${name} must be an object such as {}, not ${describeValue(args)}.`);
  }
  const proto = Object.getPrototypeOf(args);
  if (proto !== Object.prototype && proto !== null) {
    throw new RequestError('invalid-arguments', `Arguments of ${name} must be a plain JSON object.`);
  }
  for (const key of Object.keys(args)) {
    if (PROTOTYPE_KEYS.has(key)) {
      throw new RequestError('invalid-arguments', `Arguments of ${name} contain the key "${key}", which is never accepted. Remove it.`);
    }
  }
}

function describeError(name: RequestName, error: ErrorObject): string {
  const where = error.instancePath === '' ? `the arguments of ${name}` : `argument ${error.instancePath} of ${name}`;
  const params = error.params as Record<string, unknown>;
  const schema = error.parentSchema as JsonSchema | undefined;
  switch (error.keyword) {
    case 'additionalProperties': {
      const allowed = Object.keys(schema?.properties ?? {});
      const list = allowed.length ? allowed.join(', ') : 'no keys at all';
      return `Unexpected key "${String(params.additionalProperty)}" in ${where}. It accepts only: ${list}.`;
    }
    case 'required':
      return `Missing key "${String(params.missingProperty)}" in ${where}. Add it.`;
    case 'type':
      return `${capital(where)} must be ${article(String(params.type))} ${String(params.type)}, not ${describeValue(error.data)}.`;
    case 'maxLength':
      return `${capital(where)} is too long: at most ${String(params.limit)} characters are accepted, it has ${lengthOf(error.data)}.`;
    case 'minLength':
      return `${capital(where)} must not be empty.`;
    case 'pattern':
      return typeof error.data === 'string' && error.data.includes('\u0000')
        ? `${capital(where)} contains a NUL character, which no file name may hold. Remove it.`
        : `${capital(where)} has characters that are not allowed${schema?.description ? ` (${schema.description})` : ''}.`;
    case 'enum':
      return `${capital(where)} must be one of ${(schema?.enum ?? []).map((v) => JSON.stringify(v)).join(', ')}, not ${describeValue(error.data)}.`;
    case 'minimum':
      return `${capital(where)} must be at least ${String(params.limit)}, not ${describeValue(error.data)}.`;
    case 'maximum':
      return `${capital(where)} must be at most ${String(params.limit)}, not ${describeValue(error.data)}.`;
    default:
      return `${capital(where)} ${error.message ?? 'is not valid'}.`;
  }
}

/** Names a value's kind without echoing it: hostile input may be megabytes long. */
function describeValue(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'string') return value.length <= 40 ? JSON.stringify(value) : `a string of ${value.length} characters`;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  if (typeof value === 'object') return 'an object';
  return typeof value === 'undefined' ? 'nothing' : `a ${typeof value}`;
}

function lengthOf(value: unknown): string {
  return typeof value === 'string' ? String(value.length) : 'more';
}

function article(word: string): string {
  return /^[aeiou]/.test(word) ? 'an' : 'a';
}

function capital(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
