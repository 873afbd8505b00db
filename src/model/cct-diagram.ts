/**
 * Continuous-cooling transformation (CCT) table of a steel: one point cooled at a constant rate
 * from an entry temperature to 20 °C, per rate, under the same kinetics, critical temperatures and
 * time scales the cooling solver uses (physics/austenite-decomposition.ts).
 *
 * The temperature path is prescribed, as a dilatometer imposes it: T(t) = T_entry − rate·t. The
 * latent heat the products release does NOT feed back into the temperature (no recalescence), so
 * the table describes the steel under a controlled path, not a strip on the run-out table.
 *
 * Discretisation: the path is cut into N equal temperature steps ΔT = (T_entry − T_end)/N with
 * N = ⌈(T_entry − T_end)/ΔT_max⌉ (ΔT_max = 0.1 K by default), each of duration Δt = ΔT/rate; one
 * decomposition advance()/accept() per step (midpoint temperature for the diffusional products,
 * exact Koistinen–Marburger integration for martensite). Every rate visits the same temperatures,
 * so Li's additivity clock at a given temperature scales exactly with 1/rate.
 *
 * Recorded per rate:
 * - start: the temperature at which 1 % of the volume has transformed (any product), linearly
 *   interpolated inside the step where the transformed fraction crosses 1 % (it never decreases),
 *   and the product it started as: the product that grew most in that step, i.e. the one forming
 *   at the start temperature (traces of others formed earlier may be present: a fast-cooled
 *   plain-carbon steel can hold 0.5 % pearlite from higher up when martensite takes it past 1 %);
 * - each product's start: where that product's own fraction reaches 1 % of the volume, likewise
 *   interpolated; null when it stays below 1 % (its final fraction is still reported);
 * - final fractions at T_end (ferrite, pearlite, bainite, martensite, retained austenite);
 * - the Maynier et al. (1978) hardness of the final mixture [HV] with the cooling rate at 700 °C
 *   equal to the constant rate (physics/hardness.ts); retained austenite has no Maynier term, so the
 *   hardness is that of the transformed products (null when nothing transformed, e.g. Ms < T_end).
 *
 * Entry temperature (cctEntryTemperature_C): the higher of the case's initial temperature and 50 K
 * above the highest critical temperature (Ae3, Ae1, Bs). Nothing forms above that top in the model,
 * so any entry at or above it gives the same table; starting below it would begin with an
 * undercooled austenite whose clocks are zero, which no continuous cooling produces.
 */
import { AusteniteDecomposition, type DecompositionSetup } from "../physics/austenite-decomposition.js";
import type { ValidityWarning } from "../physics/composition.js";
import { checkMaynierRanges, mixtureHardnessHV } from "../physics/hardness.js";
import { AUSTENITE, BAINITE, FERRITE, MARTENSITE, PEARLITE, PHASE_COUNT } from "../physics/phases.js";
import { KELVIN } from "./scenario.js";

/** Default cooling rates of the table [K/s]. */
export const DEFAULT_CCT_RATES_K_s: readonly number[] = [0.1, 0.3, 1, 3, 10, 30, 100, 300];
/** End temperature of every path [°C] (room temperature). */
export const CCT_END_C = 20;
/** Largest temperature step along the path [K]. */
export const CCT_MAX_STEP_K = 0.1;
/** Fraction of the volume that marks a start [−]. */
export const CCT_START_FRACTION = 0.01;
/** Margin of the default entry temperature above the highest critical temperature [K]. */
export const CCT_ENTRY_MARGIN_K = 50;

/** The products of a CCT row, in table order. */
export const CCT_PRODUCTS = ["ferrite", "pearlite", "bainite", "martensite"] as const;
export type CctProduct = (typeof CCT_PRODUCTS)[number];
const PRODUCT_COUNT = 4;

export interface CctFractions {
  readonly ferrite: number;
  readonly pearlite: number;
  readonly bainite: number;
  readonly martensite: number;
  /** Retained austenite at the end temperature [−]. */
  readonly austenite: number;
}

export interface CctRow {
  /** Constant cooling rate [K/s]. */
  readonly rate_K_s: number;
  /** Temperature at 1 % transformed [°C]; null if less than 1 % transformed down to the end. */
  readonly start_C: number | null;
  /** Product that grew most in the step where 1 % was reached; null with start_C. */
  readonly startProduct: CctProduct | null;
  /** Temperature at which each product reached 1 % of the volume [°C]; null if it did not. */
  readonly productStart_C: Readonly<Record<CctProduct, number | null>>;
  /** Fractions at the end temperature [−], summing to 1. */
  readonly fractions: CctFractions;
  /** Maynier et al. (1978) hardness of the transformed products [HV]; null if none formed. */
  readonly hardness_HV: number | null;
}

export interface CctOptions {
  /** Entry temperature [°C] (see cctEntryTemperature_C); must lie above endC. */
  readonly entry_C: number;
  /** End temperature [°C], default CCT_END_C. */
  readonly end_C?: number;
  /** Largest temperature step [K], default CCT_MAX_STEP_K. */
  readonly maxStep_K?: number;
}

export interface CctDiagram {
  readonly entry_C: number;
  readonly end_C: number;
  /** Temperature step actually used [K] (≤ maxStep_K). */
  readonly step_K: number;
  /** One row per rate, in the order given. */
  readonly rows: CctRow[];
  /** Validity warnings of the kinetics and of the hardness equations (composition ranges). */
  readonly warnings: readonly ValidityWarning[];
}

/** Default entry temperature [°C]: max(initial, max(Ae3, Ae1, Bs) + 50 K) (see the file comment). */
export function cctEntryTemperature_C(critical: DecompositionSetup["critical"], initial_C: number): number {
  const top = Math.max(critical.Ae3_C, critical.Ae1_C, critical.Bs_C);
  return Math.max(initial_C, top + CCT_ENTRY_MARGIN_K);
}

// Layout of the per-rate record filled by coolAtConstantRate.
const REC_START = 0; // overall start [K], NaN if none
const REC_START_PRODUCT = 1; // index into CCT_PRODUCTS, −1 if none
const REC_PRODUCT_START = 2; // + product index: that product's start [K], NaN if none
const RECORD_LENGTH = REC_PRODUCT_START + PRODUCT_COUNT;

/**
 * Cools the single node of `model` (reset here) from entry_K down by `steps` steps of step_K at
 * rate_K_s, and writes the starts into `record` (layout above). Allocation-free: `from` and `to`
 * are the model's one-node temperature buffers.
 */
function coolAtConstantRate(model: AusteniteDecomposition, entry_K: number, step_K: number, steps: number, rate_K_s: number, from: Float64Array, to: Float64Array, record: Float64Array): void {
  model.reset();
  record.fill(NaN);
  record[REC_START_PRODUCT] = -1;
  const dt_s = step_K / rate_K_s;
  const current = model.current;
  const austenite = current[AUSTENITE];
  for (let s = 1; s <= steps; s++) {
    const T_old = entry_K - (s - 1) * step_K;
    const T_new = entry_K - s * step_K;
    from[0] = T_old;
    to[0] = T_new;
    const transformedBefore = 1 - austenite[0];
    const f0 = current[FERRITE][0], p0 = current[PEARLITE][0], b0 = current[BAINITE][0], m0 = current[MARTENSITE][0];
    model.advance(from, to, dt_s);
    model.accept();
    const transformedAfter = 1 - austenite[0];
    if (Number.isNaN(record[REC_START]) && transformedAfter >= CCT_START_FRACTION) {
      record[REC_START] = crossing(T_old, T_new, transformedBefore, transformedAfter);
      record[REC_START_PRODUCT] = fastestProduct(current[FERRITE][0] - f0, current[PEARLITE][0] - p0, current[BAINITE][0] - b0, current[MARTENSITE][0] - m0);
    }
    recordProductStart(record, 0, f0, current[FERRITE][0], T_old, T_new);
    recordProductStart(record, 1, p0, current[PEARLITE][0], T_old, T_new);
    recordProductStart(record, 2, b0, current[BAINITE][0], T_old, T_new);
    recordProductStart(record, 3, m0, current[MARTENSITE][0], T_old, T_new);
  }
}

/** Index (CCT_PRODUCTS order) of the largest of the four products' gains; the first on a tie. */
function fastestProduct(ferrite: number, pearlite: number, bainite: number, martensite: number): number {
  let best = 0;
  let gain = ferrite;
  if (pearlite > gain) {
    best = 1;
    gain = pearlite;
  }
  if (bainite > gain) {
    best = 2;
    gain = bainite;
  }
  return martensite > gain ? 3 : best;
}

/** Records product p's start if its fraction crossed the start fraction in this step. */
function recordProductStart(record: Float64Array, p: number, before: number, after: number, T_old: number, T_new: number): void {
  const slot = REC_PRODUCT_START + p;
  if (Number.isNaN(record[slot]) && after >= CCT_START_FRACTION) record[slot] = crossing(T_old, T_new, before, after);
}

/** Temperature where a fraction going from before (< start) to after (≥ start) linearly reaches the start fraction. */
function crossing(T_old: number, T_new: number, before: number, after: number): number {
  const w = after > before ? (CCT_START_FRACTION - before) / (after - before) : 1;
  return T_old + (w < 0 ? 0 : w) * (T_new - T_old);
}

/** A recorded temperature [K] as °C, or null when not recorded (NaN). */
function celsiusOrNull(T_K: number): number | null {
  return Number.isNaN(T_K) ? null : T_K - KELVIN;
}

/**
 * The CCT table of a steel for the given constant cooling rates [K/s] (see the file comment).
 * @throws RangeError for a rate that is not a positive finite number, or a path that does not
 *   descend (the command line validates its options before calling).
 */
export function cctDiagram(setup: DecompositionSetup, rates_K_s: readonly number[], options: CctOptions): CctDiagram {
  const end_C = options.end_C ?? CCT_END_C;
  const maxStep_K = options.maxStep_K ?? CCT_MAX_STEP_K;
  const entry_C = options.entry_C;
  if (!(Number.isFinite(entry_C) && Number.isFinite(end_C) && entry_C > end_C)) throw new RangeError(`cct diagram: the entry temperature ${entry_C} °C must lie above the end ${end_C} °C`);
  if (!(maxStep_K > 0 && Number.isFinite(maxStep_K))) throw new RangeError(`cct diagram: the step must be positive (${maxStep_K} K)`);
  for (const r of rates_K_s) if (!(r > 0 && Number.isFinite(r))) throw new RangeError(`cct diagram: cooling rates must be positive and finite (${r} K/s)`);

  const steps = Math.ceil((entry_C - end_C) / maxStep_K);
  const step_K = (entry_C - end_C) / steps;
  const model = new AusteniteDecomposition(setup, 1);
  const from = new Float64Array(1);
  const to = new Float64Array(1);
  const record = new Float64Array(RECORD_LENGTH);
  const fractions = new Float64Array(PHASE_COUNT);
  const rows: CctRow[] = [];
  for (const rate_K_s of rates_K_s) {
    coolAtConstantRate(model, entry_C + KELVIN, step_K, steps, rate_K_s, from, to, record);
    for (let p = 0; p < PHASE_COUNT; p++) fractions[p] = model.current[p][0];
    const productStart_C = {} as Record<CctProduct, number | null>;
    CCT_PRODUCTS.forEach((name, p) => (productStart_C[name] = celsiusOrNull(record[REC_PRODUCT_START + p])));
    const startIndex = record[REC_START_PRODUCT];
    const transformed = 1 - fractions[AUSTENITE];
    rows.push({
      rate_K_s,
      start_C: celsiusOrNull(record[REC_START]),
      startProduct: startIndex >= 0 ? CCT_PRODUCTS[startIndex] : null,
      productStart_C,
      fractions: {
        ferrite: fractions[FERRITE],
        pearlite: fractions[PEARLITE],
        bainite: fractions[BAINITE],
        martensite: fractions[MARTENSITE],
        austenite: fractions[AUSTENITE],
      },
      // The retained-austenite warning mixtureHardnessHV raises is expected here (see the file comment).
      hardness_HV: transformed > 0 ? mixtureHardnessHV(setup.composition, rate_K_s, fractions).hardness_HV : null,
    });
  }
  return { entry_C, end_C, step_K, rows, warnings: [...model.warnings, ...checkMaynierRanges(setup.composition, [])] };
}
