/**
 * `recalesce run`: load, validate, simulate, write the result folder atomically.
 */
import { loadCase } from "./load-case.js";
import { coilSegments, resolveCase, type ResolvedCase } from "./resolve-case.js";
import { runCoil, type SegmentResult } from "./coil.js";
import { simulate, type SimulationResult } from "../model/simulate.js";
import { ResultFolder, type TextStream } from "./result-folder.js";
import { DECIMALS, decimalsForColumn, fixed, round, significant } from "./format.js";
import { SAFETY_NOTICE } from "./safety.js";
import { KELVIN } from "../model/scenario.js";
import { PHASES } from "../physics/phases.js";
import type { Case } from "./case-schema.js";

export interface RunOutcome {
  readonly summary: Record<string, unknown>;
  readonly result: SimulationResult;
  readonly warnings: string[];
}

/** Temperature [°C] at a depth [m] by linear interpolation between nodes. */
export function temperatureAt_C(result: SimulationResult, depth_m: number): number {
  const s = result.solver;
  const u = depth_m / s.dx_m;
  const i = Math.min(Math.floor(u), s.nodes - 2);
  const f = u - i;
  return s.T[i] + f * (s.T[i + 1] - s.T[i]) - KELVIN;
}

/** Phase fractions at a depth [m], linearly interpolated between nodes. */
export function fractionsAt(result: SimulationResult, depth_m: number): Record<string, number> {
  const s = result.solver;
  const u = depth_m / s.dx_m;
  const i = Math.min(Math.floor(u), s.nodes - 2);
  const f = u - i;
  const out: Record<string, number> = {};
  for (const p of ["ferrite", "pearlite", "bainite", "martensite", "austenite"] as const) {
    const X = s.fractions[PHASES.indexOf(p)];
    out[p] = round(X[i] + f * (X[i + 1] - X[i]), DECIMALS.fraction);
  }
  return out;
}

/** Mass (volume) averaged phase fractions of the final state. */
export function meanFractions(result: SimulationResult): Record<string, number> {
  const s = result.solver;
  const out: Record<string, number> = {};
  if (s.fractions.length !== PHASES.length) return out;
  for (const p of ["ferrite", "pearlite", "bainite", "martensite", "austenite"] as const) {
    const X = s.fractions[PHASES.indexOf(p)];
    let sum = 0;
    for (let i = 0; i < s.nodes; i++) sum += s.width[i] * X[i];
    out[p] = round(sum / s.thickness_m, DECIMALS.fraction);
  }
  return out;
}

export function buildSummary(c: Case, resolved: ResolvedCase, result: SimulationResult, warnings: string[]): Record<string, unknown> {
  const s = result.solver;
  const L = s.thickness_m;
  const T = (d: number) => round(temperatureAt_C(result, d), DECIMALS.T_C);
  const dH = s.enthalpy_J_m2() - s.initialEnthalpy_J_m2;
  const summary: Record<string, unknown> = {
    title: c.title,
    caution: SAFETY_NOTICE,
    end_time_s: round(result.end_s, DECIMALS.time_s),
    final: {
      T_C: { top: T(0), centre: T(L / 2), bottom: T(L), mean: round(s.meanTemperature_K() - KELVIN, DECIMALS.T_C) },
      ...(s.fractions.length > 1 ? { phases: meanFractions(result) } : {}),
    },
    energy: {
      relative_error: significant(s.ledgerError(), 3),
      enthalpy_change_J_m2: significant(dH),
      heat_out_top_J_m2: significant(s.heatOutTop_J_m2),
      heat_out_bottom_J_m2: significant(s.heatOutBottom_J_m2),
    },
    numerics: {
      scheme: resolved.scenario.numerics.scheme,
      cells: resolved.scenario.numerics.cells,
      time_step_s: resolved.scenario.numerics.dt_s,
      steps: s.stats.steps,
      sub_steps: s.stats.substeps,
      picard_iterations: s.stats.iterations,
      max_iterations_in_a_step: s.stats.maxIterationsInStep,
      unconverged_steps: s.stats.unconvergedSteps,
      picard_tolerance_K: resolved.scenario.numerics.tolerance_K,
    },
    depths: result.depthRecords.map((r) => ({
      depth_mm: Number(r.label),
      recalescence_K: round(r.recalescence_K, DECIMALS.K),
      recalescence_time_s: r.recalescenceTime_s === null ? null : round(r.recalescenceTime_s, DECIMALS.time_s),
      ...(s.fractions.length > 1
        ? {
            phases: fractionsAt(result, r.depth_m),
            transformation_start: r.start ? { time_s: round(r.start.time_s, DECIMALS.time_s), T_C: round(r.start.T_C, DECIMALS.T_C) } : null,
            transformation_finish: r.finish ? { time_s: round(r.finish.time_s, DECIMALS.time_s), T_C: round(r.finish.T_C, DECIMALS.T_C) } : null,
          }
        : {}),
    })),
    warnings,
  };
  return summary;
}

function csvHeader(columns: string[]): string {
  return columns.join(",") + "\n";
}

/** Writes the final through-thickness profile, one row per node. */
function profileCsv(result: SimulationResult): string {
  const s = result.solver;
  const transforming = s.fractions.length > 1;
  const cols = ["depth_mm", "T_C"];
  if (transforming) cols.push("ferrite", "pearlite", "bainite", "martensite", "austenite");
  let out = csvHeader(cols);
  for (let i = 0; i < s.nodes; i++) {
    const parts = [fixed(i * s.dx_m * 1000, 4), fixed(s.T[i] - KELVIN, DECIMALS.T_C)];
    if (transforming) for (const p of ["ferrite", "pearlite", "bainite", "martensite", "austenite"] as const) parts.push(fixed(s.fractions[PHASES.indexOf(p)][i], DECIMALS.fraction));
    out += parts.join(",") + "\n";
  }
  return out;
}

/** Pyrometer readings (top surface) of a line run [°C], in the order of the line's pyrometers. */
export interface LineReadings {
  readonly pyrometers_C: number[];
}

/**
 * Simulates one resolved case (one strip point), streaming history rows as text to `write`
 * (header first). Returns the result, the summary object and the pyrometer readings.
 */
export function simulateResolved(
  c: Case,
  resolved: ResolvedCase,
  write?: (text: string) => void,
): { result: SimulationResult; summary: Record<string, unknown>; readings: LineReadings; warnings: string[] } {
  const cols = resolved.steel ? resolved.steel.historyColumns(resolved.scenario) : [...resolved.scenario.output.depthLabels.map((d) => `T_${d}mm_C`), "T_mean_C"];
  const decimals = cols.map(decimalsForColumn);
  const point = resolved.line?.point;
  let sink;
  if (write) {
    write(csvHeader(point ? ["time_s", "position_m", ...cols] : ["time_s", ...cols]));
    sink = {
      row(time_s: number, values: Float64Array) {
        let line = fixed(time_s, DECIMALS.time_s);
        if (point) line += "," + fixed(point.positionAt(time_s), DECIMALS.position_m);
        for (let q = 0; q < values.length; q++) line += "," + fixed(values[q], decimals[q]);
        write(line + "\n");
      },
    };
  }
  const readings: LineReadings = { pyrometers_C: point ? point.pyrometersAtEntry.map(() => 0) : [] };
  if (point) for (const i of point.pyrometersAtEntry) readings.pyrometers_C[i] = resolved.scenario.initial_K - KELVIN;
  // Mean-temperature drop while under water, for the mean cooling rate under water.
  let waterDrop_K = 0;
  let stageStartMean_K = resolved.scenario.initial_K;
  const onStageEnd = point
    ? (k: number, solver: SimulationResult["solver"]) => {
        for (const i of point.pyrometerAfterStage[k]) readings.pyrometers_C[i] = solver.T[0] - KELVIN;
        const mean = solver.meanTemperature_K();
        if (point.stageWet[k]) waterDrop_K += stageStartMean_K - mean;
        stageStartMean_K = mean;
      }
    : undefined;
  const result = simulate(resolved.scenario, sink, undefined, onStageEnd);
  const warnings = resolved.steel ? resolved.steel.warnings.slice() : [];
  const summary = buildSummary(c, resolved, result, warnings);
  if (resolved.steel) resolved.steel.extendSummary(summary, result);
  if (point && resolved.line) {
    const final = (summary.final as { T_C: Record<string, number> }).T_C;
    summary.coiling = { T_C: { ...final } };
    summary.pyrometers = resolved.line.spec.pyrometers_m.map((x, i) => ({ position_m: x, T_C: round(readings.pyrometers_C[i], DECIMALS.T_C) }));
    summary.line = {
      length_m: resolved.line.spec.length_m,
      time_on_table_s: round(point.tableTime_s, DECIMALS.time_s),
      time_under_water_s: round(point.waterTime_s, DECIMALS.time_s),
      mean_cooling_rate_under_water_K_s: point.waterTime_s > 0 ? round(waterDrop_K / point.waterTime_s, DECIMALS.K) : null,
    };
  }
  return { result, summary, readings, warnings };
}

/** Runs a case file and writes DIR/summary.json, DIR/history.csv and DIR/profile.csv. */
export function runCaseFile(file: string, outDir: string): RunOutcome {
  const c = loadCase(file);
  const resolved = resolveCase(file, c);
  const folder = new ResultFolder(outDir);
  try {
    const history: TextStream = folder.stream("history.csv");
    const { result, summary, warnings } = simulateResolved(c, resolved, (t) => history.write(t));
    history.close();
    folder.writeFile("summary.json", JSON.stringify(summary, null, 2) + "\n");
    folder.writeFile("profile.csv", profileCsv(result));
    folder.commit();
    return { summary, result, warnings };
  } catch (e) {
    folder.abort();
    throw e;
  }
}

/** coil.csv: one row per segment. */
export function coilCsv(rows: readonly SegmentResult[], pyrometers_m: readonly number[]): string {
  const phases = rows[0]?.phases ? Object.keys(rows[0].phases) : [];
  const product = rows[0]?.product ? Object.keys(rows[0].product) : [];
  const cols = [
    "segment",
    "position_m",
    "entry_C",
    ...pyrometers_m.map((x) => `pyrometer_${x}m_C`),
    "coiling_top_C",
    "coiling_centre_C",
    "coiling_bottom_C",
    "coiling_mean_C",
    "time_on_table_s",
    "time_under_water_s",
    "cooling_rate_under_water_K_s",
    ...phases,
    ...product,
  ];
  let out = csvHeader(cols);
  for (const r of rows) {
    const parts = [
      String(r.segment + 1),
      fixed(r.position_m, DECIMALS.position_m),
      fixed(r.entry_C, DECIMALS.T_C),
      ...r.pyrometers_C.map((v) => fixed(v, DECIMALS.T_C)),
      fixed(r.coiling_C.top, DECIMALS.T_C),
      fixed(r.coiling_C.centre, DECIMALS.T_C),
      fixed(r.coiling_C.bottom, DECIMALS.T_C),
      fixed(r.coiling_C.mean, DECIMALS.T_C),
      fixed(r.time_on_table_s, DECIMALS.time_s),
      fixed(r.time_under_water_s, DECIMALS.time_s),
      r.cooling_rate_under_water_K_s === null ? "" : fixed(r.cooling_rate_under_water_K_s, DECIMALS.K),
      ...phases.map((p) => fixed(r.phases![p], DECIMALS.fraction)),
      ...product.map((p) => (r.product![p] === null ? "" : fixed(r.product![p] as number, decimalsForColumn(p)))),
    ];
    out += parts.join(",") + "\n";
  }
  return out;
}

/** Head (first segment), body (middle segment), tail (last segment) and the spread of the coil. */
export function coilSummary(rows: readonly SegmentResult[]): Record<string, unknown> {
  const means = rows.map((r) => r.coiling_C.mean);
  const pick = (r: SegmentResult) => ({ segment: r.segment + 1, position_m: r.position_m, coiling_mean_C: r.coiling_C.mean, coiling_top_C: r.coiling_C.top });
  return {
    segments: rows.length,
    head: pick(rows[0]),
    body: pick(rows[Math.floor((rows.length - 1) / 2)]),
    tail: pick(rows[rows.length - 1]),
    coiling_mean_C: { min: round(Math.min(...means), DECIMALS.T_C), max: round(Math.max(...means), DECIMALS.T_C), spread_K: round(Math.max(...means) - Math.min(...means), DECIMALS.K) },
    worst_energy_relative_error: significant(Math.max(...rows.map((r) => r.energy_relative_error)), 3),
  };
}

export interface RunOptions {
  readonly workers?: number;
  readonly onProgress?: (done: number, total: number) => void;
}

/**
 * Runs any case. A coil case also writes DIR/coil.csv; its history, profile and main summary are
 * those of the body (middle) segment, and summary.coil gives head, body, tail and spread.
 */
export async function runCase(file: string, outDir: string, options: RunOptions = {}): Promise<RunOutcome> {
  const c = loadCase(file);
  if (!("line" in c.cooling) || !c.cooling.coil) return runCaseFile(file, outDir);
  const segments = coilSegments(file, c.cooling.coil);
  const body = segments[Math.floor((segments.length - 1) / 2)];
  const resolved = resolveCase(file, c, { coilPosition_m: body.position_m, entry_C: body.entry_C });
  const rows = await runCoil(file, c, { workers: options.workers, onProgress: options.onProgress });
  const folder = new ResultFolder(outDir);
  try {
    const history: TextStream = folder.stream("history.csv");
    const { result, summary, warnings } = simulateResolved(c, resolved, (t) => history.write(t));
    history.close();
    summary.coil = coilSummary(rows);
    folder.writeFile("summary.json", JSON.stringify(summary, null, 2) + "\n");
    folder.writeFile("profile.csv", profileCsv(result));
    folder.writeFile("coil.csv", coilCsv(rows, resolved.line!.spec.pyrometers_m));
    folder.commit();
    return { summary, result, warnings };
  } catch (e) {
    folder.abort();
    throw e;
  }
}
