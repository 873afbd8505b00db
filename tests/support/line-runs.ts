/**
 * Helpers for run-out-table tests: run a case given as plain JSON data through the same path as
 * `recalesce run` (validate → resolve → simulate) without writing files, and read the streamed
 * history back as numbers by column name. Uses project code only; it holds no reference values.
 */
import { readFileSync } from "node:fs";
import { validateCase } from "../../src/io/load-case.js";
import { resolveCase, type PointOptions, type ResolvedCase } from "../../src/io/resolve-case.js";
import { simulateResolved, type LineReadings } from "../../src/io/run-case.js";
import type { Case } from "../../src/io/case-schema.js";
import type { SimulationResult } from "../../src/model/simulate.js";

/** History rows as numbers, with the CSV header. */
export interface History {
  readonly columns: readonly string[];
  readonly rows: readonly number[][];
}

export interface LineRun {
  readonly kase: Case;
  readonly resolved: ResolvedCase;
  readonly result: SimulationResult;
  readonly summary: Record<string, unknown>;
  readonly readings: LineReadings;
  readonly history: History;
}

/** A case file of the repository as plain data (a fresh copy each call, free to modify). */
export function readCaseData(path: string): Record<string, any> {
  return JSON.parse(readFileSync(path, "utf8"));
}

/** Validates `data` as if read from `file` and resolves it (stages, line, tracked point) without simulating. */
export function resolveData(data: unknown, options: PointOptions = {}, file = "test-case.json"): { kase: Case; resolved: ResolvedCase } {
  const kase = validateCase(file, data);
  return { kase, resolved: resolveCase(file, kase, options) };
}

/** Validates `data` as if read from `file` and simulates it, keeping the history in memory. */
export function runData(data: unknown, options: PointOptions = {}, file = "test-case.json"): LineRun {
  const { kase, resolved } = resolveData(data, options, file);
  let text = "";
  const { result, summary, readings } = simulateResolved(kase, resolved, (t) => {
    text += t;
  });
  const lines = text.trim().split("\n");
  const history = { columns: lines[0].split(","), rows: lines.slice(1).map((l) => l.split(",").map(Number)) };
  return { kase, resolved, result, summary, readings, history };
}

/** One history column by name. */
export function column(h: History, name: string): number[] {
  const j = h.columns.indexOf(name);
  if (j < 0) throw new Error(`no column ${name} in ${h.columns.join(",")}`);
  return h.rows.map((r) => r[j]);
}

/** Final mean temperature of a run [°C] (the coiling temperature of a line run). */
export function finalMean_C(run: LineRun): number {
  return (run.summary.final as { T_C: { mean: number } }).T_C.mean;
}
