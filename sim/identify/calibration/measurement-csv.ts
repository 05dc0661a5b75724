// The CSV form of a measurement table: one header line of column names, then one line per
// frame of comma-separated numbers (RFC 4180 without quoting, which numbers never need). Every
// mistake is reported at its line and column name.
import { CalibrationInputError } from './calibration-input-error.ts';

export interface MeasurementCsv {
  header: string[];
  /** One Float64Array per column, one entry per frame. */
  columns: Float64Array[];
  rows: number;
  /** 1-based line of the first frame. */
  firstDataLine: number;
}

export function parseMeasurementCsv(text: string, shown: string): MeasurementCsv {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop();
  if (lines.length === 0) throw new CalibrationInputError(`${shown}: the file is empty; it needs a header line (time_s, then <marker>_x_m, <marker>_y_m, <marker>_z_m per marker) and one line per frame`);
  const header = lines[0].split(',').map((name) => name.trim());
  header.forEach((name, i) => {
    if (name === '') throw new CalibrationInputError(`${shown}:1: column ${i + 1} of the header has no name; name every column`);
    if (header.indexOf(name) !== i) throw new CalibrationInputError(`${shown}:1: column "${name}" appears twice in the header; give each column once`);
  });
  const rows = lines.length - 1;
  const columns = header.map(() => new Float64Array(rows));
  for (let r = 0; r < rows; r++) {
    const line = r + 2;
    const cells = lines[r + 1].split(',');
    if (cells.length !== header.length) throw new CalibrationInputError(`${shown}:${line}: the line has ${cells.length} values, the header ${header.length} columns; every frame needs one value per column`);
    cells.forEach((cell, c) => {
      const trimmed = cell.trim();
      const value = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(trimmed) ? Number(trimmed) : NaN;
      if (!Number.isFinite(value)) {
        throw new CalibrationInputError(`${shown}:${line} column ${header[c]}: "${trimmed}" is not a finite number; every value must be a number (a calibration cannot use frames with lost markers: cut the table to the frames where every marker was seen)`);
      }
      columns[c][r] = value;
    });
  }
  return { header, columns, rows, firstDataLine: 2 };
}
