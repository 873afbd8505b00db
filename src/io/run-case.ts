/**
 * `recalesce run`: load, validate, simulate, write the result folder atomically.
 */
import { loadCase } from "./load-case.js";
import { coilSegments, entryProfileWarning, resolveCase, type ResolvedCase } from "./resolve-case.js";
import { runCoil, type SegmentResult } from "./coil.js";
import { resolveSection, runSectionCase, sectionCellSteps } from "./run-section.js";
import { simulate, type SimulationResult } from "../model/simulate.js";
import { ResultFolder, type TextStream } from "./result-folder.js";
import { DECIMALS, decimalsForColumn, fixed, round, significant } from "./format.js";
import { SAFETY_NOTICE } from "./safety.js";
import { KELVIN } from "../model/scenario.js";
import { PHASES } from "../physics/phases.js";
import { describeWarning } from "../physics/composition.js";
import { ProductTracker, type NodeProduct } from "../model/product.js";
import type { Case } from "./case-schema.js";
import { InputError } from "./errors.js";
import { readFileSync } from "node:fs";
import { writeChartIfAsked } from "./cooling-chart.js";

export interface RunOutcome {
  readonly summary: Record<string, unknown>;
  /** The 1-D result (absent for cross-sections, whose result is in the files). */
  readonly result?: SimulationResult;
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
      halved_steps: s.stats.halvings,
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

/** Writes the final through-thickness profile, one row per node (empty cell = not defined). */
function profileCsv(result: SimulationResult, products: NodeProduct[] | null): string {
  const s = result.solver;
  const transforming = s.fractions.length > 1;
  const cols = ["depth_mm", "T_C"];
  if (transforming) cols.push("ferrite", "pearlite", "bainite", "martensite", "austenite");
  if (products) cols.push("grain_um", "grain_floor_nm", "yield_MPa", "tensile_MPa", "hardness_HV");
  let out = csvHeader(cols);
  const opt = (v: number | null, d: number) => (v === null ? "" : fixed(v, d));
  for (let i = 0; i < s.nodes; i++) {
    const parts = [fixed(i * s.dx_m * 1000, 4), fixed(s.T[i] - KELVIN, DECIMALS.T_C)];
    if (transforming) for (const p of ["ferrite", "pearlite", "bainite", "martensite", "austenite"] as const) parts.push(fixed(s.fractions[PHASES.indexOf(p)][i], DECIMALS.fraction));
    if (products) {
      const q = products[i];
      parts.push(opt(q.grain_um, DECIMALS.grain_um), opt(q.grainFloor_nm, 2), opt(q.yield_MPa, DECIMALS.strength), opt(q.tensile_MPa, DECIMALS.strength), opt(q.hardness_HV, DECIMALS.strength));
    }
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
  penaltyDisabled = false,
): { result: SimulationResult; summary: Record<string, unknown>; readings: LineReadings; warnings: string[]; products: NodeProduct[] | null } {
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
  const tracker = productTracker(resolved);
  const result = simulate(resolved.scenario, sink, { onStart: tracker?.start.bind(tracker), onStep: tracker?.step.bind(tracker), onStageEnd });
  const warnings = resolved.steel ? resolved.steel.warnings.slice() : [];
  const st = result.solver.stats;
  if (st.unconvergedSteps > 0) {
    warnings.push(
      `${st.unconvergedSteps} of ${st.steps} steps did not reach the Picard tolerance even at 1/256 of the step (a jump in the kinetics, e.g. the temperature edge of a user kinetics table, can pin the temperature there); enthalpy is still conserved (energy ledger ${result.solver.ledgerError().toExponential(1)}), but extend the table or shorten the step`,
    );
  }
  const products = tracker ? tracker.finish(result.solver) : null;
  if (tracker) for (const w of tracker.warnings) warnings.push(describeWarning(w));
  const summary = buildSummary(c, resolved, result, warnings);
  if (resolved.steel) resolved.steel.extendSummary(summary, result);
  if (products && resolved.steel) {
    addProductSummary(summary, result, products, resolved.steel.grainModel);
    const wantPenalty = c.output.recalescence_penalty ?? true;
    if (wantPenalty && !penaltyDisabled && resolved.steel.latentHeat) addPenalty(summary, resolved, result, products);
  }
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
  return { result, summary, readings, warnings, products };
}

/** A product tracker for a transforming steel, else null. */
function productTracker(resolved: ResolvedCase): ProductTracker | null {
  const steel = resolved.steel;
  if (!steel || !steel.transformation) return null;
  return new ProductTracker(resolved.scenario.numerics.cells + 1, {
    composition: steel.composition,
    austeniteGrain_um: steel.austeniteGrain_um,
    retainedStrain: steel.retainedStrain,
    ae3_K: steel.critical.Ae3_C + KELVIN,
    grainModel: steel.grainModel,
    interfaceEnergy_J_m2: steel.interfaceEnergy_J_m2,
  });
}

type ProductField = "grain_um" | "yield_MPa" | "tensile_MPa" | "hardness_HV";
const PRODUCT_FIELDS: readonly ProductField[] = ["grain_um", "yield_MPa", "tensile_MPa", "hardness_HV"];

/** Node index nearest to a depth [m]. */
function nodeAt(result: SimulationResult, depth_m: number): number {
  return Math.min(result.solver.nodes - 1, Math.max(0, Math.round(depth_m / result.solver.dx_m)));
}

/** Top, centre, bottom and volume-weighted mean of a node property (mean over nodes that have one). */
function throughThickness(result: SimulationResult, values: ReadonlyArray<number | null>, decimals: number): Record<string, number | null> {
  const s = result.solver;
  let sum = 0;
  let weight = 0;
  for (let i = 0; i < s.nodes; i++) {
    const v = values[i];
    if (v === null) continue;
    sum += s.width[i] * v;
    weight += s.width[i];
  }
  const at = (i: number) => (values[i] === null ? null : round(values[i] as number, decimals));
  return { top: at(0), centre: at(nodeAt(result, s.thickness_m / 2)), bottom: at(s.nodes - 1), mean: weight > 0 ? round(sum / weight, decimals) : null };
}

function addProductSummary(summary: Record<string, unknown>, result: SimulationResult, products: NodeProduct[], grainModel: string): void {
  const final = summary.final as Record<string, unknown>;
  for (const f of PRODUCT_FIELDS) final[f] = throughThickness(result, products.map((p) => p[f]), f === "grain_um" ? DECIMALS.grain_um : DECIMALS.strength);
  final.grain_floor_nm = throughThickness(result, products.map((p) => p.grainFloor_nm), 2);
  // Flat per-place values for one-row-per-segment tables (coil.csv): grain_top_um … hardness_mean_HV.
  const product: Record<string, number | null> = {};
  for (const f of PRODUCT_FIELDS) {
    const cut = f.lastIndexOf("_");
    const [base, unit] = [f.slice(0, cut), f.slice(cut + 1)];
    for (const place of ["top", "centre", "bottom", "mean"]) product[`${base}_${place}_${unit}`] = (final[f] as Record<string, number | null>)[place];
  }
  final.product = product;
  const reasons = new Set<string>();
  for (const p of products) for (const r of p.reasons) reasons.add(r);
  summary.product = {
    grain_model: grainModel === "empirical" ? "empirical (Hodgson–Gibbs type; coefficients from memory)" : "mechanistic (grain-boundary nucleation, calibrated to the empirical relation)",
    strength_model: "Pickering (1978; full equations from memory) for ferrite–pearlite; Maynier, Jungmann & Dollet (1978) hardness with the TS ≈ 3.3 HV rule of thumb for bainite and martensite",
    notes: [...reasons].sort(),
  };
  const depths = summary.depths as Array<Record<string, unknown>>;
  result.depthRecords.forEach((r, j) => {
    const p = products[nodeAt(result, r.depth_m)];
    const d = depths[j];
    d.grain_um = p.grain_um === null ? null : round(p.grain_um, DECIMALS.grain_um);
    d.grain_floor_nm = p.grainFloor_nm === null ? null : round(p.grainFloor_nm, 2);
    d.ferrite_start_C = p.ferriteStart_C === null ? null : round(p.ferriteStart_C, DECIMALS.T_C);
    d.ferrite_half_C = p.ferriteHalf_C === null ? null : round(p.ferriteHalf_C, DECIMALS.T_C);
    d.cooling_rate_through_transformation_K_s = p.coolingRate_K_s === null ? null : round(p.coolingRate_K_s, DECIMALS.K);
  });
}

/**
 * The recalescence penalty: the same case with latent heat off, side by side per depth. The
 * difference is what the released heat cost in grain refinement and transformation temperature.
 */
function addPenalty(summary: Record<string, unknown>, resolved: ResolvedCase, result: SimulationResult, products: NodeProduct[]): void {
  const scenario = { ...resolved.scenario, material: { ...resolved.scenario.material, latentHeat: false } };
  const tracker = productTracker(resolved)!;
  const off = simulate(scenario, undefined, { onStart: tracker.start.bind(tracker), onStep: tracker.step.bind(tracker) });
  const offProducts = tracker.finish(off.solver);
  const r = (v: number | null, d: number) => (v === null ? null : round(v, d));
  summary.recalescence_penalty = result.depthRecords.map((rec) => {
    const i = nodeAt(result, rec.depth_m);
    const on = products[i];
    const no = offProducts[i];
    return {
      depth_mm: Number(rec.label),
      latent_heat_on: { ferrite_start_C: r(on.ferriteStart_C, DECIMALS.T_C), ferrite_half_C: r(on.ferriteHalf_C, DECIMALS.T_C), grain_um: r(on.grain_um, DECIMALS.grain_um) },
      latent_heat_off: { ferrite_start_C: r(no.ferriteStart_C, DECIMALS.T_C), ferrite_half_C: r(no.ferriteHalf_C, DECIMALS.T_C), grain_um: r(no.grain_um, DECIMALS.grain_um) },
      grain_coarsening_um: on.grain_um !== null && no.grain_um !== null ? round(on.grain_um - no.grain_um, DECIMALS.grain_um) : null,
      ferrite_half_raised_K: on.ferriteHalf_C !== null && no.ferriteHalf_C !== null ? round(on.ferriteHalf_C - no.ferriteHalf_C, DECIMALS.K) : null,
    };
  });
}

/** Runs a case file and writes DIR/summary.json, DIR/history.csv and DIR/profile.csv. */
export function runCaseFile(file: string, outDir: string, force = false, chart = false): RunOutcome {
  const c = loadCase(file);
  const resolved = resolveCase(file, c);
  guardWork(file, c, resolved, 1, force);
  const folder = new ResultFolder(outDir);
  try {
    const history: TextStream = folder.stream("history.csv");
    const { result, summary, warnings, products } = simulateResolved(c, resolved, (t) => history.write(t));
    history.close();
    folder.writeFile("summary.json", JSON.stringify(summary, null, 2) + "\n");
    folder.writeFile("profile.csv", profileCsv(result, products));
    writeChartIfAsked(chart, (n, t) => folder.writeFile(n, t), () => readFileSync(folder.path("history.csv"), "utf8"), summary);
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

/** Work a run may ask for without --force (stated in the README). */
export const WORK_LIMITS = { cells: 20000, cellSteps: 1e9 } as const;

/**
 * Up-front estimate of a run's work: cells × steps (× explicit sub-steps, from the stability limit
 * at the initial temperature) × coil segments (× 2 with the recalescence-penalty run).
 */
export function estimateWork(c: Case, resolved: ResolvedCase, segments: number): { cells: number; steps: number; cellSteps: number } {
  const sc = resolved.scenario;
  const total = sc.stages.reduce((a, st) => a + st.duration_s, 0);
  let steps = Math.ceil(total / sc.numerics.dt_s) + sc.stages.length;
  if (sc.numerics.scheme === "explicit") {
    const t = sc.material.tables;
    const j = Math.min(t.n - 2, Math.max(0, Math.floor((sc.initial_K - t.T0_K) / t.dT_K)));
    let alphaMax = 0;
    for (const d of t.data) alphaMax = Math.max(alphaMax, d[3 * j + 2] / d[3 * j + 1]);
    const dx = sc.thickness_m / sc.numerics.cells;
    const limit = (dx * dx) / (2 * alphaMax);
    steps = Math.max(steps, Math.ceil(total / (0.9 * limit)));
  }
  const penalty = resolved.steel?.transformation && (c.output.recalescence_penalty ?? true) ? 2 : 1;
  return { cells: sc.numerics.cells, steps, cellSteps: sc.numerics.cells * steps * segments * penalty };
}

/** Refuses absurd work before anything is written, naming the estimate. */
export function guardWork(file: string, c: Case, resolved: ResolvedCase, segments: number, force: boolean): void {
  if (force) return;
  const w = estimateWork(c, resolved, segments);
  if (w.cells > WORK_LIMITS.cells) {
    throw new InputError(file, "numerics.cells", `${w.cells} cells exceeds the limit of ${WORK_LIMITS.cells}; use fewer cells or --force`);
  }
  if (w.cellSteps > WORK_LIMITS.cellSteps) {
    throw new InputError(
      file,
      "numerics.time_step_s",
      `the run needs about ${w.cellSteps.toExponential(2)} cell-steps (${w.steps} steps × ${w.cells} cells${segments > 1 ? ` × ${segments} segments` : ""}), above the limit of ${WORK_LIMITS.cellSteps.toExponential(0)}; use a longer step, fewer cells, or --force`,
    );
  }
}

export interface RunOptions {
  readonly force?: boolean;
  /** Also write cooling.svg (the cooling-path chart). */
  readonly chart?: boolean;
  readonly workers?: number;
  readonly onProgress?: (done: number, total: number) => void;
}

/**
 * Runs any case. A coil case also writes DIR/coil.csv; its history, profile and main summary are
 * those of the body (middle) segment, and summary.coil gives head, body, tail and spread.
 */
export async function runCase(file: string, outDir: string, options: RunOptions = {}): Promise<RunOutcome> {
  const c = loadCase(file);
  if (c.product.section === "cross-section") {
    const s = resolveSection(c).scenario;
    const cellSteps = sectionCellSteps(s);
    if (!options.force && cellSteps > WORK_LIMITS.cellSteps) {
      throw new InputError(file, "numerics.time_step_s", `the run needs about ${cellSteps.toExponential(2)} cell-steps, above the limit of ${WORK_LIMITS.cellSteps.toExponential(0)}; use a longer step, fewer cells, or --force`);
    }
    const o = runSectionCase(file, c, outDir, options.chart ?? false);
    return { summary: o.summary, warnings: o.warnings };
  }
  if (!("line" in c.cooling) || !c.cooling.coil) return runCaseFile(file, outDir, options.force, options.chart);
  const segments = coilSegments(file, c.cooling.coil);
  const body = segments[Math.floor((segments.length - 1) / 2)];
  const resolved = resolveCase(file, c, { coilPosition_m: body.position_m, entry_C: body.entry_C, segment: body.index });
  guardWork(file, c, resolved, segments.length + 1, options.force ?? false);
  const rows = await runCoil(file, c, { workers: options.workers, onProgress: options.onProgress });
  const folder = new ResultFolder(outDir);
  try {
    const history: TextStream = folder.stream("history.csv");
    const { result, summary, warnings, products } = simulateResolved(c, resolved, (t) => history.write(t));
    history.close();
    summary.coil = coilSummary(rows);
    const entryWarning = entryProfileWarning(file, c.cooling.coil);
    if (entryWarning) warnings.push(entryWarning); // the same array as summary.warnings
    folder.writeFile("summary.json", JSON.stringify(summary, null, 2) + "\n");
    folder.writeFile("profile.csv", profileCsv(result, products));
    folder.writeFile("coil.csv", coilCsv(rows, resolved.line!.spec.pyrometers_m));
    writeChartIfAsked(options.chart ?? false, (n, t) => folder.writeFile(n, t), () => readFileSync(folder.path("history.csv"), "utf8"), summary);
    folder.commit();
    return { summary, result, warnings };
  } catch (e) {
    folder.abort();
    throw e;
  }
}
