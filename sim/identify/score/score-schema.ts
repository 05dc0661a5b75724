// The JSON Schema (draft 2020-12) every score.json satisfies, so another team's tools can check
// a score before reading it. `pliant score` checks its own output against it before writing.
import { SCORE_FORMAT_VERSION } from './score-document.ts';

const num = { type: 'number' };
const numOrNull = { type: ['number', 'null'] };
const count = { type: 'integer', minimum: 0 };
const text = { type: 'string' };
const statistics = {
  anyOf: [
    { type: 'null' },
    { type: 'object', additionalProperties: false, required: ['mean', 'median', 'p90'], properties: { mean: num, median: num, p90: num } },
  ],
};
const numbers = { type: 'array', items: num };
const numbersOrNull = { type: 'array', items: numOrNull };

const heldOutRule = {
  type: 'object',
  additionalProperties: false,
  required: ['split', 'parameter'],
  properties: {
    split: text,
    parameter: text,
    above: num,
    below: num,
    inside: { type: 'array', items: num, minItems: 2, maxItems: 2 },
  },
};

const episodeRow = {
  type: 'object',
  additionalProperties: false,
  required: ['id', 'split', 'recordedSteps', 'nodes', 'lengthScaleM', 'oneStepRmseM', 'horizonRmseM', 'meanNormalisedError',
    'validPredictionTimeS', 'validPredictionTimeReached', 'energyDriftJ', 'relativeEnergyDrift'],
  properties: {
    id: { type: 'string', pattern: '^ep-[0-9]{6,}$' },
    split: text,
    recordedSteps: { type: 'integer', minimum: 1 },
    nodes: { type: 'integer', minimum: 1 },
    lengthScaleM: { type: 'number', exclusiveMinimum: 0 },
    oneStepRmseM: { type: 'number', minimum: 0 },
    horizonRmseM: { type: 'array', items: { type: 'number', minimum: 0 } },
    meanNormalisedError: { type: 'number', minimum: 0 },
    validPredictionTimeS: { type: 'number', minimum: 0 },
    validPredictionTimeReached: { type: 'boolean' },
    energyDriftJ: numOrNull,
    relativeEnergyDrift: numOrNull,
  },
};

const groupSummary = {
  type: 'object',
  additionalProperties: false,
  required: ['episodes', 'meanRmseByStepM', 'meanNormalisedErrorByStep', 'episodesByStep', 'recordIntervalS', 'oneStepRmseM',
    'oneStepNormalisedError', 'horizons', 'meanNormalisedError', 'validPredictionTimeS', 'validPredictionTimeReachedFraction',
    'energyDriftJ', 'relativeEnergyDrift', 'episodesWithVelocities'],
  properties: {
    episodes: count,
    meanRmseByStepM: numbers,
    meanNormalisedErrorByStep: numbers,
    episodesByStep: { type: 'array', items: count },
    recordIntervalS: numOrNull,
    oneStepRmseM: statistics,
    oneStepNormalisedError: statistics,
    horizons: {
      type: 'array',
      items: {
        type: 'object',
        additionalProperties: false,
        required: ['horizon', 'rmseM', 'normalisedError'],
        properties: { horizon: text, rmseM: statistics, normalisedError: statistics },
      },
    },
    meanNormalisedError: statistics,
    validPredictionTimeS: statistics,
    validPredictionTimeReachedFraction: numOrNull,
    energyDriftJ: statistics,
    relativeEnergyDrift: statistics,
    episodesWithVelocities: count,
  },
};

export const SCORE_SCHEMA = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  $id: 'https://pliant.invalid/schema/score-1.json',
  title: 'Pliant score of a predictions folder against a dataset',
  type: 'object',
  additionalProperties: false,
  required: ['scoreFormat', 'pliantVersion', 'caution', 'dataset', 'predictions', 'settings', 'episodes', 'splits', 'overall', 'generalisationGap', 'parameters'],
  properties: {
    scoreFormat: { const: SCORE_FORMAT_VERSION },
    pliantVersion: text,
    caution: { type: 'string', minLength: 1 },
    dataset: {
      type: 'object',
      additionalProperties: false,
      required: ['name', 'masterSeed', 'episodeCount', 'manifestSha256', 'seedSha256'],
      properties: {
        name: text,
        masterSeed: text,
        episodeCount: count,
        manifestSha256: { type: 'string', pattern: '^[0-9a-f]{64}$' },
        seedSha256: { anyOf: [{ type: 'string', pattern: '^[0-9a-f]{64}$' }, { type: 'null' }] },
      },
    },
    predictions: {
      type: 'object',
      additionalProperties: false,
      required: ['model', 'description', 'episodeFiles', 'missing'],
      properties: {
        model: { type: 'string', minLength: 1 },
        description: text,
        episodeFiles: count,
        missing: {
          type: 'array',
          items: { type: 'object', additionalProperties: false, required: ['id', 'split'], properties: { id: { type: 'string', minLength: 1 }, split: { type: 'string', minLength: 1 } } },
        },
      },
    },
    settings: {
      type: 'object',
      additionalProperties: false,
      required: ['splits', 'horizons', 'validPredictionTimeThreshold', 'error', 'lengthScale', 'energy', 'parameterBins'],
      properties: {
        splits: { type: 'array', items: text, minItems: 1 },
        horizons: {
          type: 'array',
          minItems: 1,
          items: {
            type: 'object',
            additionalProperties: false,
            required: ['horizon', 'steps', 'seconds'],
            properties: { horizon: text, steps: { type: ['integer', 'null'], minimum: 1 }, seconds: { type: ['number', 'null'], exclusiveMinimum: 0 } },
          },
        },
        validPredictionTimeThreshold: { type: 'number', exclusiveMinimum: 0 },
        error: { const: 'rmse-per-node-euclidean' },
        lengthScale: { const: 'rms-radius-at-t0' },
        energy: { const: 'kinetic+elastic+gravitational+bending' },
        parameterBins: { type: 'integer', minimum: 1 },
      },
    },
    episodes: { type: 'array', items: episodeRow },
    splits: { type: 'object', additionalProperties: groupSummary },
    overall: groupSummary,
    generalisationGap: {
      type: 'object',
      additionalProperties: false,
      required: ['against', 'entries', 'note'],
      properties: {
        against: text,
        note: text,
        entries: {
          type: 'array',
          items: {
            type: 'object',
            additionalProperties: false,
            required: ['split', 'rules', 'ruleText', 'metrics'],
            properties: {
              split: text,
              rules: { type: 'array', items: heldOutRule, minItems: 1 },
              ruleText: text,
              metrics: {
                type: 'array',
                items: {
                  type: 'object',
                  additionalProperties: false,
                  required: ['metric', 'heldOut', 'test', 'difference', 'ratio'],
                  properties: { metric: text, heldOut: num, test: num, difference: num, ratio: numOrNull },
                },
              },
            },
          },
        },
      },
    },
    parameters: {
      type: 'array',
      items: {
        type: 'object',
        additionalProperties: false,
        required: ['label', 'unit', 'min', 'max', 'edges', 'splits'],
        properties: {
          label: text,
          unit: text,
          min: num,
          max: num,
          edges: numbers,
          splits: {
            type: 'object',
            additionalProperties: {
              type: 'object',
              additionalProperties: false,
              required: ['count', 'meanNormalisedError', 'validPredictionTimeS'],
              properties: { count: { type: 'array', items: count }, meanNormalisedError: numbersOrNull, validPredictionTimeS: numbersOrNull },
            },
          },
        },
      },
    },
  },
} as const;
