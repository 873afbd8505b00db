/**
 * Runs a scenario: steps the through-thickness solver stage by stage, lands exactly on every stage
 * boundary (a boundary condition never changes inside a step), and samples the state at the output
 * depths. History rows at the output interval are linearly interpolated in time between the two
 * steps that bracket them, so the step sequence (and so the result) does not depend on the output
 * interval. Rows go straight to a sink, never into memory, so memory does not grow with time.
 */
import { ThroughThicknessSolver } from "../numerics/conduction1d.js";
import type { Scenario } from "./scenario.js";
import { KELVIN } from "./scenario.js";
import { PHASES } from "../physics/phases.js";

/** Receives history rows as they are produced. */
export interface HistorySink {
  row(time_s: number, values: Float64Array): void;
}

/** Per output depth: what happened there. */
export interface DepthRecord {
  readonly depth_m: number;
  readonly label: string;
  /** Largest temperature rise after a running minimum [K], and when it peaked [s]. */
  recalescence_K: number;
  recalescenceTime_s: number | null;
  /** Transformation start (1 % of the austenite transformed) and finish (99 % transformed); null if never reached. */
  start: { time_s: number; T_C: number } | null;
  finish: { time_s: number; T_C: number } | null;
}

export interface SimulationResult {
  readonly solver: ThroughThicknessSolver;
  readonly end_s: number;
  readonly depthRecords: DepthRecord[];
  /** Column names of the history rows (without time_s). */
  readonly columns: string[];
  /** Largest requested time step actually used [s]. */
  readonly dt_s: number;
}

/** Names of the history columns after `time_s`, in order. */
export function historyColumns(scenario: Scenario, transforming: boolean): string[] {
  const cols = scenario.output.depthLabels.map((d) => `T_${d}mm_C`);
  cols.push("T_mean_C");
  if (transforming) {
    for (const d of scenario.output.depthLabels) for (const p of ORDER) cols.push(`${p}_${d}mm`);
  }
  return cols;
}

/** Column order of phases in history (austenite last, as the case reader expects it). */
const ORDER = ["ferrite", "pearlite", "bainite", "martensite", "austenite"] as const;
const ORDER_INDEX = ORDER.map((p) => PHASES.indexOf(p));

/**
 * Samples the solver state at the output depths into `out`: temperatures [°C], mean [°C], then
 * per depth the five phase fractions in ORDER.
 */
function sample(solver: ThroughThicknessSolver, depths: readonly number[], transforming: boolean, out: Float64Array): void {
  const n = solver.nodes;
  const dx = solver.dx_m;
  const T = solver.T;
  const m = depths.length;
  for (let j = 0; j < m; j++) {
    const u = depths[j] / dx;
    const i = Math.min(Math.floor(u), n - 2);
    const f = u - i;
    out[j] = T[i] + f * (T[i + 1] - T[i]) - KELVIN;
  }
  out[m] = solver.meanTemperature_K() - KELVIN;
  if (!transforming) return;
  let o = m + 1;
  for (let j = 0; j < m; j++) {
    const u = depths[j] / dx;
    const i = Math.min(Math.floor(u), n - 2);
    const f = u - i;
    for (let q = 0; q < ORDER_INDEX.length; q++) {
      const X = solver.fractions[ORDER_INDEX[q]];
      out[o++] = X[i] + f * (X[i + 1] - X[i]);
    }
  }
}

/** Callbacks into a running simulation (none may keep references to the solver's arrays). */
export interface SimulationHooks {
  /** Before the first step, with the initial state. */
  onStart?(solver: ThroughThicknessSolver): void;
  /** After every accepted step. */
  onStep?(solver: ThroughThicknessSolver): void;
  /** After the last step of each stage. */
  onStageEnd?(stageIndex: number, solver: ThroughThicknessSolver): void;
}

export function simulate(
  scenario: Scenario,
  sink?: HistorySink,
  hooks?: SimulationHooks | ((solver: ThroughThicknessSolver) => void),
  onStageEndArg?: (stageIndex: number, solver: ThroughThicknessSolver) => void,
): SimulationResult {
  const h: SimulationHooks = typeof hooks === "function" ? { onStep: hooks, onStageEnd: onStageEndArg } : { ...(hooks ?? {}), ...(onStageEndArg ? { onStageEnd: onStageEndArg } : {}) };
  const onStep = h.onStep?.bind(h);
  const onStageEnd = h.onStageEnd?.bind(h);
  const nodes = scenario.numerics.cells + 1;
  const evolution = scenario.material.createEvolution?.(nodes);
  const transforming = evolution !== undefined;
  const solver = new ThroughThicknessSolver({
    thickness_m: scenario.thickness_m,
    cells: scenario.numerics.cells,
    scheme: scenario.numerics.scheme,
    tables: scenario.material.tables,
    initial_K: scenario.initial_K,
    evolution,
    latentHeat: scenario.material.latentHeat,
    tolerance_K: scenario.numerics.tolerance_K,
    maxIterations: scenario.numerics.maxIterations,
  });
  const depths = scenario.output.depths_m;
  const columns = historyColumns(scenario, transforming);
  const width = columns.length;
  let prev = new Float64Array(width);
  let cur = new Float64Array(width);
  const row = new Float64Array(width);
  const records: DepthRecord[] = depths.map((d, j) => ({
    depth_m: d,
    label: scenario.output.depthLabels[j],
    recalescence_K: 0,
    recalescenceTime_s: null,
    start: null,
    finish: null,
  }));
  const runningMin = new Float64Array(depths.length).fill(Infinity);
  const transformedPrev = new Float64Array(depths.length);

  const total = scenario.stages.reduce((s, st) => s + st.duration_s, 0);
  const interval = scenario.output.interval_s;
  let nextOutput = 0;
  sample(solver, depths, transforming, cur);
  h.onStart?.(solver);
  if (sink) {
    sink.row(0, cur);
    nextOutput = interval;
  }
  // Output times are k·interval; compare with a relative slack so that round-off in the sum of
  // steps never skips or duplicates a row.
  const slack = 1e-9 * Math.max(1, total);
  let t = 0;
  let stageEnd = 0;
  for (let si = 0; si < scenario.stages.length; si++) {
    const stage = scenario.stages[si];
    stageEnd += stage.duration_s;
    while (t < stageEnd - slack) {
      const dt = Math.min(scenario.numerics.dt_s, stageEnd - t);
      const swap = prev;
      prev = cur;
      cur = swap;
      solver.step(dt, stage.top, stage.bottom);
      const tNew = stageEnd - t - dt <= slack ? stageEnd : t + dt;
      sample(solver, depths, transforming, cur);
      track(records, cur, runningMin, transformedPrev, depths.length, transforming, tNew, prev, t);
      if (sink) {
        while (nextOutput <= tNew + slack && nextOutput <= total + slack) {
          const w = dt > 0 ? Math.min(1, Math.max(0, (nextOutput - t) / (tNew - t))) : 1;
          for (let q = 0; q < width; q++) row[q] = prev[q] + w * (cur[q] - prev[q]);
          sink.row(Math.min(nextOutput, total), row);
          nextOutput += interval;
        }
      }
      t = tNew;
      onStep?.(solver);
    }
    onStageEnd?.(si, solver);
  }
  // The end time always gets a row, even when it is not a multiple of the interval.
  if (sink && nextOutput - interval < total - slack) sink.row(total, cur);
  return { solver, end_s: total, depthRecords: records, columns, dt_s: scenario.numerics.dt_s };
}

/** Updates recalescence and transformation start/finish per output depth after a step. */
function track(
  records: DepthRecord[],
  cur: Float64Array,
  runningMin: Float64Array,
  transformedPrev: Float64Array,
  m: number,
  transforming: boolean,
  t: number,
  prev: Float64Array,
  tPrev: number,
): void {
  for (let j = 0; j < m; j++) {
    const T = cur[j];
    if (T < runningMin[j]) runningMin[j] = T;
    const rise = T - runningMin[j];
    const r = records[j];
    if (rise > r.recalescence_K) {
      r.recalescence_K = rise;
      r.recalescenceTime_s = t;
    }
    if (!transforming) continue;
    const austenite = cur[m + 1 + j * 5 + 4];
    const transformed = 1 - austenite;
    const before = transformedPrev[j];
    if (r.start === null && transformed >= 0.01) {
      const w = (0.01 - before) / (transformed - before || 1);
      r.start = { time_s: tPrev + w * (t - tPrev), T_C: prev[j] + w * (T - prev[j]) };
    }
    if (r.finish === null && transformed >= 0.99) {
      const w = (0.99 - before) / (transformed - before || 1);
      r.finish = { time_s: tPrev + w * (t - tPrev), T_C: prev[j] + w * (T - prev[j]) };
    }
    transformedPrev[j] = transformed;
  }
}
