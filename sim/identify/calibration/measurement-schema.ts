// JSON Schema (draft 2020-12) of a measurement descriptor, the small JSON file that says what a
// bench table holds. MEASUREMENT.md describes the format with an example.

export const MEASUREMENT_FORMAT = 1;

export const MEASUREMENT_SCHEMA = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  type: 'object',
  additionalProperties: false,
  required: ['measurementFormat', 'description', 'sampleRateHz', 'table', 'markers'],
  properties: {
    measurementFormat: { const: MEASUREMENT_FORMAT, description: 'Version of this format: 1.' },
    description: { type: 'string', minLength: 1, description: 'What was measured, how, and whether the data are real or invented.' },
    sampleRateHz: { type: 'number', exclusiveMinimum: 0, description: 'Frames per second of the table; frames are evenly spaced.' },
    table: { type: 'string', minLength: 1, pattern: '\\.(csv|npy|npz)$', description: 'The table file, relative to this descriptor: .csv, .npy or .npz.' },
    markers: {
      type: 'array',
      minItems: 1,
      items: {
        type: 'object',
        additionalProperties: false,
        required: ['name', 'node'],
        properties: {
          name: { type: 'string', pattern: '^[A-Za-z][A-Za-z0-9-]*$', description: 'Marker name; its CSV columns are <name>_x_m, <name>_y_m, <name>_z_m.' },
          node: { type: 'integer', minimum: 0, description: 'Index of the model node the marker sits on.' },
        },
      },
    },
    drive: {
      type: 'object',
      description: 'Recorded signal of each control channel, by channel name: a CSV column name, or a column index of the NPZ member "drive".',
      additionalProperties: { type: ['string', 'integer'], minimum: 0, minLength: 1 },
    },
    knownParameters: {
      type: 'object',
      description: 'Values the bench knows directly, by the JSON pointer of the scenario parameter; used as given and not fitted.',
      propertyNames: { pattern: '^/' },
      additionalProperties: { type: 'number' },
    },
  },
} as const;
