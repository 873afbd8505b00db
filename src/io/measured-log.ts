/**
 * A measured pyrometer log for calibration: `position_m,T_C` (one strip point) or
 * `segment,position_m,T_C` (a coil; segments numbered from 1 as in coil.csv). Readings are top-
 * surface temperatures. Rows are named by their line number in the file (the header is row 1).
 */
import { parse as parseCsv } from "csv-parse/sync";
import { InputError } from "./errors.js";
import { readTextFile } from "./load-case.js";

export interface MeasuredReading {
  /** Line number in the file (header = 1). */
  readonly row: number;
  /** 1-based coil segment, or null for a strip case. */
  readonly segment: number | null;
  /** Table position [m] */
  readonly position_m: number;
  /** Measured top-surface temperature [°C] */
  readonly T_C: number;
}

export interface LogLimits {
  /** Line length [m]: positions must lie in [0, length]. */
  readonly length_m: number;
  /** Number of coil segments, or null for a strip case. */
  readonly segments: number | null;
}

export function readMeasuredLog(file: string, limits: LogLimits): MeasuredReading[] {
  const text = readTextFile(file);
  let records: Array<{ record: string[]; info: { lines: number } }>;
  try {
    records = parseCsv(text, { skip_empty_lines: true, trim: true, relax_column_count: true, info: true }) as unknown as typeof records;
  } catch (e) {
    throw new InputError(file, "", `malformed CSV: ${(e as Error).message.split("\n")[0]}`);
  }
  const coil = limits.segments !== null;
  const expected = coil ? "segment,position_m,T_C" : "position_m,T_C";
  if (records.length === 0) throw new InputError(file, "header", `file is empty; expected columns ${expected}`);
  const header = records[0].record;
  const known = ["segment", "position_m", "T_C"];
  const unknown = header.find((h) => !known.includes(h));
  if (unknown !== undefined) throw new InputError(file, "header", `unknown column "${unknown}"; expected ${expected}`);
  const col = (name: string) => header.indexOf(name);
  if (col("position_m") < 0 || col("T_C") < 0) throw new InputError(file, "header", `missing column ${col("position_m") < 0 ? "position_m" : "T_C"}; expected ${expected}`);
  if (coil && col("segment") < 0) throw new InputError(file, "header", `missing column segment; the case is a coil, expected ${expected}`);
  if (!coil && col("segment") >= 0) throw new InputError(file, "header", `column segment given but the case is not a coil; expected ${expected}`);
  if (records.length < 2) throw new InputError(file, "", `no readings; expected rows of ${expected}`);
  const out: MeasuredReading[] = [];
  for (const { record, info } of records.slice(1)) {
    const where = `row ${info.lines}`;
    if (record.length !== header.length) throw new InputError(file, where, `has ${record.length} fields; expected ${header.length} (${expected})`);
    const num = (name: string, unit: string): number => {
      const raw = record[col(name)];
      const v = raw === "" ? NaN : Number(raw);
      if (!Number.isFinite(v)) throw new InputError(file, where, `${name} "${raw}" is not a number; expected ${unit}`);
      return v;
    };
    let segment: number | null = null;
    if (coil) {
      segment = num("segment", `a segment number 1–${limits.segments}`);
      if (!Number.isInteger(segment) || segment < 1 || segment > limits.segments!) throw new InputError(file, where, `segment ${segment} does not exist; expected a whole number 1–${limits.segments}`);
    }
    const position_m = num("position_m", "a table position [m]");
    if (position_m < 0 || position_m > limits.length_m) throw new InputError(file, where, `position_m ${position_m} lies outside the line; expected 0–${limits.length_m} m`);
    const T_C = num("T_C", "a temperature [°C]");
    if (!(T_C > 0 && T_C <= 1500)) throw new InputError(file, where, `T_C ${T_C} outside 0–1500 °C`);
    out.push({ row: info.lines, segment, position_m, T_C });
  }
  return out;
}
