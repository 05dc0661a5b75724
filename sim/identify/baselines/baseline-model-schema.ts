// JSON Schema (draft 2020-12) of a baseline model file, checked with ajv whenever one is read,
// so a hand-edited or truncated file is refused with the JSON pointer of what is wrong.
import { BASELINE_MODEL_FORMAT, BASELINE_MODEL_NAMES } from './baseline-model.ts';

const nullableNumber = { type: ['number', 'null'] };

const parameter = {
  type: 'object',
  required: ['name', 'unit', 'estimate', 'standardError', 'truth', 'truthRange', 'absoluteError', 'relativeError'],
  additionalProperties: false,
  properties: {
    name: { type: 'string' },
    unit: { type: 'string' },
    estimate: nullableNumber,
    standardError: nullableNumber,
    truth: nullableNumber,
    truthRange: { type: ['array', 'null'], items: { type: 'number' }, minItems: 2, maxItems: 2 },
    absoluteError: nullableNumber,
    relativeError: nullableNumber,
  },
};

const identification = {
  type: 'object',
  required: ['episode', 'split', 'rows', 'freeNodes', 'excludedNodes', 'contactExclusions', 'condition', 'residualRmsN', 'parameters'],
  additionalProperties: false,
  properties: {
    episode: { type: 'string' },
    split: { type: 'string' },
    rows: { type: 'integer', minimum: 0 },
    freeNodes: { type: 'integer', minimum: 0 },
    excludedNodes: { type: 'integer', minimum: 0 },
    contactExclusions: { type: 'integer', minimum: 0 },
    condition: nullableNumber,
    residualRmsN: nullableNumber,
    parameters: { type: 'array', items: parameter },
  },
};

const linearGroup = {
  type: 'object',
  required: ['nodeCount', 'channelCount', 'episodes', 'snapshotCount', 'singularValues', 'rank', 'rankTolerance', 'spectralRadius', 'oneStepRms', 'operator'],
  additionalProperties: false,
  properties: {
    nodeCount: { type: 'integer', minimum: 1 },
    channelCount: { type: 'integer', minimum: 0 },
    episodes: { type: 'array', items: { type: 'string' }, minItems: 1 },
    snapshotCount: { type: 'integer', minimum: 1 },
    singularValues: { type: 'array', items: { type: 'number' } },
    rank: { type: 'integer', minimum: 0 },
    rankTolerance: { type: 'number' },
    spectralRadius: { type: 'number' },
    oneStepRms: { type: 'number' },
    operator: {
      type: 'object',
      required: ['rows', 'columns', 'data'],
      additionalProperties: false,
      properties: {
        rows: { type: 'integer', minimum: 1 },
        columns: { type: 'integer', minimum: 1 },
        data: { type: 'array', items: { type: 'number' } },
      },
    },
  },
};

export const BASELINE_MODEL_SCHEMA = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  title: 'Pliant baseline model',
  type: 'object',
  required: ['baselineModelFormat', 'model', 'pliantVersion', 'dataset', 'fittedOn', 'safetyCaution'],
  additionalProperties: false,
  properties: {
    baselineModelFormat: { const: BASELINE_MODEL_FORMAT },
    model: { enum: [...BASELINE_MODEL_NAMES] },
    pliantVersion: { type: 'string' },
    dataset: {
      type: 'object',
      required: ['name', 'masterSeed', 'episodeCount', 'exportDtype'],
      additionalProperties: false,
      properties: {
        name: { type: 'string' },
        masterSeed: { type: 'string' },
        episodeCount: { type: 'integer', minimum: 0 },
        exportDtype: { type: 'string' },
      },
    },
    fittedOn: {
      type: 'object',
      required: ['splits', 'episodes'],
      additionalProperties: false,
      properties: { splits: { type: 'array', items: { type: 'string' } }, episodes: { type: 'array', items: { type: 'string' } } },
    },
    safetyCaution: { type: 'string' },
    linear: {
      type: 'object',
      required: ['delays', 'affine', 'stateForm', 'rankRule', 'groups'],
      additionalProperties: false,
      properties: {
        delays: { type: 'integer', minimum: 0 },
        affine: { type: 'boolean' },
        stateForm: { enum: ['relative', 'absolute'] },
        rankRule: { type: 'string' },
        groups: { type: 'array', items: linearGroup },
      },
    },
    greyBox: {
      type: 'object',
      required: ['episodes', 'summary', 'warnings'],
      additionalProperties: false,
      properties: {
        episodes: { type: 'array', items: identification },
        summary: {
          type: 'array',
          items: {
            type: 'object',
            required: ['name', 'unit', 'episodes', 'medianRelativeError', 'maxRelativeError', 'maxAbsoluteError'],
            additionalProperties: false,
            properties: { name: { type: 'string' }, unit: { type: 'string' }, episodes: { type: 'integer' }, medianRelativeError: nullableNumber, maxRelativeError: nullableNumber, maxAbsoluteError: nullableNumber },
          },
        },
        warnings: { type: 'array', items: { type: 'string' } },
      },
    },
  },
  allOf: [
    { if: { properties: { model: { const: 'linear' } } }, then: { required: ['linear'] } },
    { if: { properties: { model: { const: 'grey-box' } } }, then: { required: ['greyBox'] } },
  ],
} as const;
