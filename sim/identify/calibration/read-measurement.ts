// Reads a measurement from its descriptor (JSON) and table (CSV with a header, NPY or NPZ) and
// checks everything a calibration relies on, so that a mistake is reported at its place
// (descriptor line:column and JSON pointer, CSV line and column name, NPZ member) with a fix.
import { dirname, resolve } from 'node:path';

import Ajv2020 from 'ajv/dist/2020.js';

import { MiB, readBoundedBytes, readBoundedText } from '../../dataset/formats/bounded-text-file.ts';
import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';
import type { NamedArray } from '../../dataset/formats/named-array.ts';
import { decodeNpy } from '../../dataset/formats/npy.ts';
import { decodeNpz } from '../../dataset/formats/npz.ts';
import { closestName } from '../../scenario/closest-name.ts';
import { parseJsonText, placeProblems } from '../../scenario/json-source-map.ts';
import { formatProblems } from '../../scenario/scenario-problem.ts';
import { CalibrationInputError } from './calibration-input-error.ts';

/** A bench descriptor or CSV table: far below V8's longest string. */
const MAX_MEASUREMENT_TEXT_BYTES = 256 * MiB;
/** An NPY/NPZ table: 1 GiB is hours of marker tracks at high rate, and still fits in memory. */
const MAX_MEASUREMENT_ARRAY_BYTES = 1024 * MiB;
import type { MeasuredDrive, Measurement, MeasurementMarker } from './measurement.ts';
import { parseMeasurementCsv } from './measurement-csv.ts';
import { MEASUREMENT_SCHEMA } from './measurement-schema.ts';

interface Descriptor {
  description: string;
  sampleRateHz: number;
  table: string;
  markers: MeasurementMarker[];
  drive?: Record<string, string | number>;
  knownParameters?: Record<string, number>;
}

const AXES = ['x', 'y', 'z'] as const;

export async function readMeasurement(path: string, cwd: string): Promise<Measurement> {
  const absolute = resolve(cwd, path);
  const text = await readText(absolute, path, 'measurement descriptor');
  const descriptor = checkDescriptor(text, path);
  const tablePath = resolve(dirname(absolute), descriptor.table);
  const shownTable = descriptor.table;
  const drive = descriptor.drive ?? {};
  let frameCount: number;
  let positionsM: Float64Array;
  const driveValues: MeasuredDrive[] = [];
  if (descriptor.table.endsWith('.csv')) {
    const table = parseMeasurementCsv(await readText(tablePath, shownTable, 'measurement table'), shownTable);
    const wanted = new Map<string, string>([['time_s', 'the frame times, s']]);
    for (const marker of descriptor.markers) for (const axis of AXES) wanted.set(`${marker.name}_${axis}_m`, `marker "${marker.name}" ${axis}, m`);
    for (const [channel, column] of Object.entries(drive)) {
      if (typeof column !== 'string') throw new CalibrationInputError(`${path} /drive/${channel}: a CSV table names its drive columns by header name, not by index (got ${column}); write the column's name, e.g. "${channel.replace(/-/g, '_')}"`);
      wanted.set(column, `the drive of channel "${channel}"`);
    }
    for (const [name, meaning] of wanted) {
      if (!table.header.includes(name)) {
        const near = closestName(name, table.header.filter((column) => !wanted.has(column)));
        throw new CalibrationInputError(`${shownTable}:1: the header has no column "${name}" (${meaning})${near ? `; did you mean "${near}"?` : '.'} The header has: ${table.header.join(', ')}`);
      }
    }
    for (const [index, name] of table.header.entries()) {
      if (!wanted.has(name)) {
        const near = closestName(name, [...wanted.keys()]);
        throw new CalibrationInputError(`${shownTable}:1: column ${index + 1} "${name}" is not a marker coordinate, time or drive column of ${path}${near ? `; did you mean "${near}"?` : '.'} Remove it or name it in the descriptor`);
      }
    }
    frameCount = table.rows;
    const column = (name: string) => table.columns[table.header.indexOf(name)];
    checkTimes(column('time_s'), descriptor.sampleRateHz, shownTable, table.firstDataLine);
    positionsM = new Float64Array(frameCount * descriptor.markers.length * 3);
    descriptor.markers.forEach((marker, m) => {
      AXES.forEach((axis, a) => {
        const values = column(`${marker.name}_${axis}_m`);
        for (let s = 0; s < frameCount; s++) positionsM[(s * descriptor.markers.length + m) * 3 + a] = values[s];
      });
    });
    for (const [channel, name] of Object.entries(drive)) driveValues.push({ channel, values: column(name as string) });
  } else {
    const arrays = await readArrays(tablePath, shownTable);
    const positions = arrays.find((a) => a.name === 'positions_m') ?? (descriptor.table.endsWith('.npy') ? arrays[0] : undefined);
    if (positions === undefined) throw new CalibrationInputError(`${shownTable}: the archive has no member "positions_m" (members: ${arrays.map((a) => a.name).join(', ')}); save the marker positions as positions_m with shape (frames, markers, 3)`);
    const shape = positions.shape;
    if (shape.length !== 3 || shape[1] !== descriptor.markers.length || shape[2] !== 3) {
      throw new CalibrationInputError(`${shownTable} ${positions.name}: the array has shape (${shape.join(', ')}); it must be (frames, ${descriptor.markers.length}, 3): one row per frame, one entry per marker of ${path}, x y z in m`);
    }
    frameCount = shape[0];
    positionsM = Float64Array.from(positions.data as ArrayLike<number>);
    const entries = Object.entries(drive);
    if (entries.length > 0) {
      const table = arrays.find((a) => a.name === 'drive');
      if (table === undefined) throw new CalibrationInputError(`${shownTable}: ${path} names drive columns, but the table has no member "drive"; save the drive as an NPZ member "drive" with shape (frames, columns)`);
      if (table.shape.length !== 2 || table.shape[0] !== frameCount) throw new CalibrationInputError(`${shownTable} drive: the array has shape (${table.shape.join(', ')}); it must be (${frameCount}, columns), one row per frame`);
      for (const [channel, column] of entries) {
        if (typeof column !== 'number' || column >= table.shape[1]) throw new CalibrationInputError(`${path} /drive/${channel}: an NPZ drive is named by column index from 0 to ${table.shape[1] - 1} (got ${JSON.stringify(column)})`);
        const values = new Float64Array(frameCount);
        for (let s = 0; s < frameCount; s++) values[s] = Number(table.data[s * table.shape[1] + column]);
        checkFinite(values, `${shownTable} drive column ${column}`, (s) => `row ${s}`);
        driveValues.push({ channel, values });
      }
    }
    checkFinite(positionsM, `${shownTable} ${positions.name}`, (i) => {
      const per = descriptor.markers.length * 3;
      return `frame ${Math.floor(i / per)}, marker "${descriptor.markers[Math.floor((i % per) / 3)].name}", ${AXES[i % 3]}`;
    });
  }
  if (frameCount < 2) {
    throw new CalibrationInputError(`${shownTable}: the table has ${frameCount} frame${frameCount === 1 ? '' : 's'}, shorter than one record interval (1/${descriptor.sampleRateHz} s); a calibration needs at least two frames, and many more to say anything`);
  }
  return {
    source: path,
    description: descriptor.description,
    sampleRateHz: descriptor.sampleRateHz,
    markers: descriptor.markers,
    frameCount,
    positionsM,
    drive: driveValues,
    knownParameters: descriptor.knownParameters ?? {},
  };
}

async function readText(absolute: string, shown: string, what: string): Promise<string> {
  try {
    return readBoundedText(absolute, MAX_MEASUREMENT_TEXT_BYTES, `the ${what} ${shown}`);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw new CalibrationInputError(error.message);
    const code = (error as NodeJS.ErrnoException).code;
    throw new CalibrationInputError(`cannot read the ${what} ${shown}: ${code === 'ENOENT' ? 'it does not exist' : code === 'EISDIR' ? 'it is a folder' : (error as Error).message}; check the path`);
  }
}

async function readArrays(absolute: string, shown: string): Promise<NamedArray[]> {
  let bytes: Uint8Array;
  try {
    bytes = readBoundedBytes(absolute, MAX_MEASUREMENT_ARRAY_BYTES, `the measurement table ${shown}`);
  } catch (error) {
    if (error instanceof DatasetRequestError) throw new CalibrationInputError(error.message);
    const code = (error as NodeJS.ErrnoException).code;
    throw new CalibrationInputError(`cannot read the measurement table ${shown}: ${code === 'ENOENT' ? 'it does not exist' : (error as Error).message}; check the path`);
  }
  try {
    return shown.endsWith('.npz') ? decodeNpz(bytes, shown) : [decodeNpy(bytes, shown, 'positions_m')];
  } catch (error) {
    throw new CalibrationInputError(`${shown}: ${(error as Error).message}`);
  }
}

let validator: ReturnType<Ajv2020['compile']> | undefined;

function checkDescriptor(text: string, path: string): Descriptor {
  const parsed = parseJsonText(text, path);
  if (!parsed.ok) throw new CalibrationInputError(formatProblems(parsed.problems, path));
  if (validator === undefined) validator = new Ajv2020({ allErrors: true, strict: true, allowUnionTypes: true }).compile(MEASUREMENT_SCHEMA);
  if (!validator(parsed.value)) {
    const problems = (validator.errors ?? []).map((e) => {
      const pointer = e.keyword === 'additionalProperties' ? `${e.instancePath}/${(e.params as { additionalProperty: string }).additionalProperty}` : e.instancePath;
      const what = e.keyword === 'additionalProperties' ? 'is not a member of a measurement descriptor; see sim/identify/calibration/MEASUREMENT.md' : e.keyword === 'required' ? `${e.message}; see sim/identify/calibration/MEASUREMENT.md` : `${e.message}`;
      return { pointer, message: what };
    });
    throw new CalibrationInputError(formatProblems(placeProblems(problems, parsed.sourceMap), path));
  }
  const descriptor = parsed.value as Descriptor;
  const names = new Set<string>();
  descriptor.markers.forEach((marker, i) => {
    if (names.has(marker.name)) throw new CalibrationInputError(formatProblems(placeProblems([{ pointer: `/markers/${i}/name`, message: `marker name "${marker.name}" is used twice; give each marker its own name` }], parsed.sourceMap), path));
    names.add(marker.name);
  });
  return descriptor;
}

function checkTimes(times: Float64Array, rateHz: number, shown: string, firstDataLine: number): void {
  const intervalS = 1 / rateHz;
  for (let s = 1; s < times.length; s++) {
    const expected = times[0] + s * intervalS;
    if (Math.abs(times[s] - expected) > 1e-3 * intervalS) {
      throw new CalibrationInputError(`${shown}:${firstDataLine + s} column time_s: ${times[s]} s, but frames at ${rateHz} Hz from ${times[0]} s put this frame at ${expected} s; the table must have evenly spaced frames at the descriptor's sampleRateHz (resample it, or correct sampleRateHz)`);
    }
  }
}

function checkFinite(values: Float64Array, where: string, at: (i: number) => string): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) throw new CalibrationInputError(`${where}: ${values[i]} at ${at(i)}; every value must be a finite number (a calibration cannot use frames with lost markers: cut the table to the frames where every marker was seen)`);
  }
}
