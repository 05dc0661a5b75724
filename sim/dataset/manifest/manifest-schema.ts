// The JSON Schema (draft 2020-12) every manifest.json must satisfy. Shipped with Pliant so a
// reader in any language can check a dataset folder before trusting it; `pliant verify` checks
// it first, then every checksum.
import { EXPORT_COMPRESSIONS } from '../../scenario/export-compression.ts';
import { MANIFEST_FORMAT_VERSION } from './dataset-manifest.ts';

const sha256 = { type: 'string', pattern: '^[0-9a-f]{64}$', description: 'SHA-256 of the file, lower-case hex' };
const relativePath = {
  type: 'string',
  pattern: '^(?!/)(?!.*(^|/)\\.\\.(/|$))[^\\\\]+$',
  description: "path relative to the dataset folder, '/' separated, never leaving it",
};
const count = { type: 'integer', minimum: 0 };
const episodeIdText = { type: 'string', pattern: '^ep-[0-9]{6,}$' };
const labelValue = { description: 'a sampled value: number, string, flag, null, or a list or object of them' };

const fileRecord = {
  type: 'object',
  required: ['path', 'sha256', 'sizeBytes'],
  properties: { path: relativePath, sha256, sizeBytes: count },
};

const arrayRecord = {
  type: 'object',
  additionalProperties: false,
  required: ['name', 'dtype', 'shape', 'unit', 'meaning'],
  properties: {
    name: { type: 'string', minLength: 1 },
    dtype: { enum: ['float32', 'float64', 'int32', 'uint8', 'int16'] },
    shape: { type: 'array', items: count },
    unit: { type: 'string' },
    meaning: { type: 'string', minLength: 1 },
  },
};

const rejection = {
  type: 'object',
  additionalProperties: false,
  required: ['kind', 'step', 'node', 'spring', 'value', 'dtS', 'criticalDtS', 'message', 'likelyCause'],
  properties: {
    kind: { enum: ['non-finite', 'over-stretch', 'over-speed'] },
    step: count,
    node: count,
    spring: { anyOf: [count, { type: 'null' }] },
    value: { type: ['number', 'null'] },
    dtS: { type: 'number', exclusiveMinimum: 0 },
    criticalDtS: { type: 'number' },
    message: { type: 'string', minLength: 1 },
    likelyCause: { type: 'string', minLength: 1 },
  },
};

const numberList = { type: 'array', items: { type: 'number' } };
const columnMoments = {
  type: 'object',
  additionalProperties: false,
  required: ['count', 'mean', 'm2', 'min', 'max'],
  properties: { count: { type: 'integer', minimum: 1 }, mean: numberList, m2: numberList, min: numberList, max: numberList },
};
const columnStatistics = {
  type: 'object',
  additionalProperties: false,
  required: ['count', 'mean', 'std', 'min', 'max'],
  properties: { count: { type: 'integer', minimum: 1 }, mean: numberList, std: numberList, min: numberList, max: numberList },
};

const episodeRecord = {
  type: 'object',
  additionalProperties: false,
  required: ['id', 'index', 'split', 'seed', 'status', 'rejection', 'systemKind', 'labels', 'simulation', 'controlChannels', 'files'],
  properties: {
    id: episodeIdText,
    index: count,
    split: { type: 'string', minLength: 1 },
    seed: {
      type: 'object',
      additionalProperties: false,
      required: ['masterSeed', 'episodeIndex'],
      properties: { masterSeed: { type: 'string', pattern: '^(0|[1-9][0-9]*)$' }, episodeIndex: count },
    },
    status: { enum: ['ok', 'rejected'] },
    rejection: { anyOf: [rejection, { type: 'null' }] },
    systemKind: { enum: ['chain', 'lattice'] },
    labels: { type: 'object', additionalProperties: labelValue },
    simulation: {
      type: 'object',
      additionalProperties: false,
      required: ['nodeCount', 'springCount', 'cellCount', 'substeps', 'dtS', 'criticalDtS', 'recordIntervalS', 'recordedSteps'],
      properties: {
        nodeCount: count,
        springCount: count,
        cellCount: count,
        substeps: { type: 'integer', minimum: 1 },
        dtS: { type: 'number', exclusiveMinimum: 0 },
        criticalDtS: { type: 'number' },
        recordIntervalS: { type: 'number', exclusiveMinimum: 0 },
        recordedSteps: { type: 'integer', minimum: 1 },
      },
    },
    arrayMoments: {
      type: 'object',
      additionalProperties: false,
      properties: { positions: columnMoments, velocities: columnMoments, controls: columnMoments },
    },
    controlChannels: {
      type: 'array',
      items: {
        type: 'object',
        required: ['index', 'name', 'kind', 'unit', 'description'],
        properties: {
          index: count,
          name: { type: 'string' },
          kind: { enum: ['handle-force', 'driven-offset', 'actuator'] },
          unit: { enum: ['N', 'm', '1'] },
          description: { type: 'string' },
          // Where a channel acts; optional so manifests written before these fields still read.
          axis: { enum: ['x', 'y', 'z', null] },
          node: { type: ['integer', 'null'], minimum: 0 },
          clamp: { type: ['string', 'null'] },
        },
      },
    },
    files: { type: 'array', items: relativePath },
  },
  // A rejected episode has a reason and no files; a good one has files and no reason.
  if: { properties: { status: { const: 'rejected' } } },
  then: { properties: { rejection: rejection, files: { maxItems: 0 } } },
  else: { properties: { rejection: { type: 'null' }, files: { minItems: 1 } } },
};

export const MANIFEST_SCHEMA = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  $id: 'https://pliant.invalid/schema/manifest-1.json',
  title: 'Pliant dataset manifest',
  description: 'manifest.json of a Pliant dataset folder (see sim/dataset/LAYOUT.md)',
  type: 'object',
  additionalProperties: false,
  required: ['manifestFormat', 'pliantVersion', 'name', 'description', 'masterSeed', 'episodeCount', 'shard', 'export', 'splits', 'scenario', 'episodes', 'files', 'documents', 'run'],
  properties: {
    manifestFormat: { const: MANIFEST_FORMAT_VERSION },
    pliantVersion: { type: 'string', minLength: 1 },
    name: { type: 'string' },
    description: { type: 'string' },
    masterSeed: { type: 'string', pattern: '^(0|[1-9][0-9]*)$', description: 'master seed as a decimal string, 0 to 2^64 − 1' },
    episodeCount: { type: 'integer', minimum: 1, description: 'episodes in the whole sweep (all shards)' },
    shard: {
      anyOf: [
        { type: 'null' },
        {
          type: 'object',
          additionalProperties: false,
          required: ['index', 'count'],
          properties: { index: count, count: { type: 'integer', minimum: 2 } },
        },
      ],
    },
    export: {
      type: 'object',
      additionalProperties: false,
      required: ['format', 'dtype'],
      properties: {
        format: { enum: ['npz', 'hdf5', 'both'] },
        dtype: { enum: ['float32', 'float64'] },
        // Absent in manifests written before the choice existed (their files used "small").
        compression: { enum: [...EXPORT_COMPRESSIONS] },
        levels: {
          type: 'object',
          additionalProperties: false,
          required: ['npzDeflateLevel', 'hdf5DeflateLevel', 'hdf5MinCompressedBytes'],
          properties: {
            npzDeflateLevel: { type: 'integer', minimum: 0, maximum: 9 },
            hdf5DeflateLevel: { type: 'integer', minimum: 0, maximum: 9 },
            hdf5MinCompressedBytes: { type: 'integer', minimum: 0 },
          },
        },
      },
    },
    splits: {
      type: 'object',
      additionalProperties: {
        type: 'object',
        additionalProperties: false,
        required: ['ok', 'rejected'],
        properties: { ok: count, rejected: count },
      },
    },
    normalisation: {
      type: 'object',
      description: 'per split, per-column statistics of positions, velocities and controls over its recorded episodes (absent in older manifests)',
      additionalProperties: {
        type: 'object',
        additionalProperties: false,
        properties: { positions: columnStatistics, velocities: columnStatistics, controls: columnStatistics },
      },
    },
    scenario: { type: 'object', description: 'the resolved scenario the episodes were sampled from' },
    episodes: { type: 'array', items: episodeRecord },
    episodeRecordsSha256: { type: 'string', pattern: '^[0-9a-f]{64}$', description: 'SHA-256 over the episode records, each as JSON.stringify gives it plus a line feed (absent in older manifests)' },
    files: {
      type: 'array',
      items: {
        type: 'object',
        additionalProperties: false,
        required: ['path', 'sha256', 'sizeBytes', 'kind', 'split', 'episodes', 'arrays'],
        properties: {
          ...fileRecord.properties,
          kind: { enum: ['episode-npz', 'split-hdf5'] },
          split: { type: 'string', minLength: 1 },
          episodes: { type: 'array', items: episodeIdText, minItems: 1 },
          arrays: { type: 'array', items: arrayRecord, minItems: 1 },
        },
      },
    },
    documents: {
      type: 'array',
      items: {
        type: 'object',
        additionalProperties: false,
        required: ['path', 'sha256', 'sizeBytes'],
        properties: {
          ...fileRecord.properties,
          kind: { const: 'input' },
          scenarioPath: { type: 'string', minLength: 1 },
        },
      },
    },
    run: { type: 'object', description: 'when, where and how this copy was made; covered by no checksum' },
  },
} as const;
