// JSON Schema (draft 2020-12) of a control spec, as plain objects for the scenario schema to
// embed per channel. Structure only: ranges that must not overlap, the Nyquist limit and the
// first step-list time are checked by findControlSpecProblems, which knows the record interval.
import type { JsonSchema } from '../random/value-spec-schema.ts';
import { valueSpecSchema } from '../random/value-spec-schema.ts';
import { CONTROL_KINDS, MAX_COMPONENT_COUNT, MAX_STEP_COUNT } from './control-spec.ts';

export interface ControlSpecSchemaOptions {
  /** The channel's SI unit: 'N', 'm', or '1' for a dimensionless actuator command. */
  unit?: string;
}

function unitWords(unit: string | undefined): string {
  if (unit === undefined) return "the channel's unit (N for forces, m for displacements, dimensionless for actuators)";
  return unit === '1' ? 'dimensionless units' : unit;
}

function kindBranch(kind: string, members: Record<string, JsonSchema>, required: string[], clip: JsonSchema): JsonSchema {
  return {
    if: { properties: { kind: { const: kind } }, required: ['kind'] },
    then: {
      properties: { kind: { const: kind }, ...members, clip },
      required: ['kind', ...required],
      additionalProperties: false,
    },
  };
}

/** Schema of one channel's control spec; `description` says what the channel drives. */
export function controlSpecSchemaFor(description: string, options: ControlSpecSchemaOptions = {}): JsonSchema {
  const unit = unitWords(options.unit);
  const level = (what: string): JsonSchema => valueSpecSchema(`${what}, in ${unit}.`);
  const frequency = (what: string): JsonSchema => valueSpecSchema(`${what}, in Hz; at most half the record rate.`, { minimum: 0 });
  const phase = valueSpecSchema('Phase at t = 0, in rad (default 0).', { default: 0 });
  const offset = valueSpecSchema(`Constant added to the oscillation, in ${unit} (default 0).`, { default: 0 });
  const clip: JsonSchema = {
    type: 'object',
    description: `Limits applied to the finished signal, in ${unit}.`,
    properties: { min: level('Lowest value the signal may take'), max: level('Highest value the signal may take') },
    minProperties: 1,
    additionalProperties: false,
  };
  const branches: JsonSchema[] = [
    kindBranch('none', {}, [], clip),
    kindBranch('constant', { value: level('Value held for the whole episode') }, ['value'], clip),
    kindBranch(
      'piecewise-constant',
      {
        holdS: valueSpecSchema('Time each level is held, in s; at least the record interval.', { exclusiveMinimum: 0 }),
        min: level('Lower end of the uniform range of levels'),
        max: level('Upper end of the uniform range of levels'),
      },
      ['holdS', 'min', 'max'],
      clip,
    ),
    kindBranch(
      'ornstein-uhlenbeck',
      {
        meanValue: level('Level the process reverts to'),
        std: valueSpecSchema(`Stationary standard deviation, in ${unit}.`, { minimum: 0 }),
        timeConstantS: valueSpecSchema('Correlation time (autocorrelation falls by 1/e over it), in s.', { exclusiveMinimum: 0 }),
      },
      ['meanValue', 'std', 'timeConstantS'],
      clip,
    ),
    kindBranch(
      'band-limited',
      {
        cutoffHz: frequency('Highest component frequency'),
        std: valueSpecSchema(`Standard deviation of the summed signal, in ${unit}.`, { minimum: 0 }),
        componentCount: valueSpecSchema('Number of random-phase sinusoids, evenly spaced up to the cutoff.', {
          integer: true,
          minimum: 1,
          maximum: MAX_COMPONENT_COUNT,
        }),
      },
      ['cutoffHz', 'std', 'componentCount'],
      clip,
    ),
    kindBranch(
      'sinusoid',
      { amplitude: level('Amplitude'), frequencyHz: frequency('Frequency'), phaseRad: phase, offset },
      ['amplitude', 'frequencyHz'],
      clip,
    ),
    kindBranch(
      'chirp',
      {
        amplitude: level('Amplitude'),
        startFrequencyHz: frequency('Frequency at the start of the episode'),
        endFrequencyHz: frequency('Frequency at the end of the episode (linear sweep)'),
        phaseRad: phase,
        offset,
      },
      ['amplitude', 'startFrequencyHz', 'endFrequencyHz'],
      clip,
    ),
    kindBranch(
      'steps',
      {
        stepCount: valueSpecSchema('Number of switches, at uniformly random times in the episode.', { integer: true, minimum: 0, maximum: MAX_STEP_COUNT }),
        min: level('Lower end of the uniform range of levels'),
        max: level('Upper end of the uniform range of levels'),
      },
      ['stepCount', 'min', 'max'],
      clip,
    ),
    kindBranch(
      'step-list',
      {
        timesS: {
          type: 'array',
          minItems: 1,
          items: valueSpecSchema('Time from which the matching value holds, in s; the first is 0.', { minimum: 0 }),
          description: 'Switching times in s, in order, starting at 0.',
        },
        values: { type: 'array', minItems: 1, items: level('Value from the matching time on'), description: 'One value per time.' },
      },
      ['timesS', 'values'],
      clip,
    ),
    kindBranch(
      'replay',
      {
        file: { type: 'string', minLength: 1, description: 'NPY file with one row per record, relative to the scenario file.' },
        column: { type: 'integer', minimum: 0, description: 'Column of the table to play back, counting from 0.' },
      },
      ['file', 'column'],
      clip,
    ),
  ];
  return {
    type: 'object',
    description: `${description} Values in ${unit}; held constant between records.`,
    required: ['kind'],
    properties: { kind: { enum: [...CONTROL_KINDS] } },
    allOf: branches,
  };
}

/** The control spec schema with the unit left to the channel. */
export const controlSpecSchema: JsonSchema = controlSpecSchemaFor('Control signal of one channel over an episode.');
