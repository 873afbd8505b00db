/**
 * Dry air at 1 atm: thermal conductivity k [W/(m·K)], kinematic viscosity ν [m²/s], thermal
 * diffusivity α [m²/s] and Prandtl number Pr [-] versus temperature [K], for the film-temperature
 * properties of the convection correlations.
 *
 * Source: F.P. Incropera, D.P. DeWitt, T.L. Bergman, A.S. Lavine, Fundamentals of Heat and Mass
 * Transfer, 6th ed. (2007), Table A.4 "Thermophysical properties of gases at atmospheric
 * pressure", air. The rows 250–1500 K are stored as printed (ν·10⁶, k·10³, α·10⁶, Pr); they were
 * recalled and then compared digit by digit with an independent public copy of the table. (The 7th
 * edition revised the rows at and below 250 K slightly; film temperatures on a run-out table lie
 * above 290 K, where the editions agree.)
 *
 * Between rows the properties are interpolated linearly in T, so each property is continuous and
 * its derivative is piecewise constant (the right-hand slope is returned at a row).
 * Validity: 250 ≤ T ≤ 1500 K (the rows stored). Outside, the end segment is extrapolated and
 * {@link checkAirPropertyRange} reports it.
 */
import type { ValidityWarning } from "./composition.js";

/** Lowest tabulated temperature [K]. */
export const AIR_TABLE_T_MIN_K = 250;
/** Highest tabulated temperature [K]. */
export const AIR_TABLE_T_MAX_K = 1500;

// Incropera & DeWitt 6th ed. Table A.4, air, as printed (scaled columns).
const T_ROWS_K = Float64Array.of(
  250, 300, 350, 400, 450, 500, 550, 600, 650, 700, 750, 800, 850, 900, 950, 1000, 1100, 1200, 1300, 1400, 1500,
);
const NU_E6_m2_s = Float64Array.of(
  11.44, 15.89, 20.92, 26.41, 32.39, 38.79, 45.57, 52.69, 60.21, 68.1, 76.37, 84.93, 93.8, 102.9, 112.2, 121.9, 141.8, 162.9, 185.1, 213, 240,
);
const K_E3_W_mK = Float64Array.of(
  22.3, 26.3, 30.0, 33.8, 37.3, 40.7, 43.9, 46.9, 49.7, 52.4, 54.9, 57.3, 59.6, 62.0, 64.3, 66.7, 71.5, 76.3, 82, 91, 100,
);
const ALPHA_E6_m2_s = Float64Array.of(
  15.9, 22.5, 29.9, 38.3, 47.2, 56.7, 66.7, 76.9, 87.3, 98.0, 109, 120, 131, 143, 155, 168, 195, 224, 257, 303, 350,
);
const PRANDTL = Float64Array.of(
  0.720, 0.707, 0.700, 0.690, 0.686, 0.684, 0.683, 0.685, 0.690, 0.695, 0.702, 0.709, 0.716, 0.720, 0.723, 0.726, 0.728, 0.728, 0.719, 0.703, 0.685,
);

/** Slot of k [W/(m·K)] in the array filled by {@link airPropertiesInto}; slot + 4 holds dk/dT. */
export const AIR_K = 0;
/** Slot of ν [m²/s]; slot + 4 holds dν/dT [m²/(s·K)]. */
export const AIR_NU = 1;
/** Slot of α [m²/s]; slot + 4 holds dα/dT [m²/(s·K)]. */
export const AIR_ALPHA = 2;
/** Slot of Pr [-]; slot + 4 holds dPr/dT [1/K]. */
export const AIR_PR = 3;
/** Offset from a property's slot to its temperature derivative's slot. */
export const AIR_DERIVATIVE_OFFSET = 4;
/** Length of the array {@link airPropertiesInto} fills. */
export const AIR_PROPERTY_SLOTS = 8;

/** Index i of the table segment [T_i, T_i+1] used at T (end segments beyond the table). */
function segmentIndex(T_K: number): number {
  const last = T_ROWS_K.length - 2;
  if (T_K <= T_ROWS_K[0]) return 0;
  if (T_K >= T_ROWS_K[last + 1]) return last;
  let lo = 0;
  let hi = last + 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (T_ROWS_K[mid] <= T_K) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Fills `out` (length ≥ {@link AIR_PROPERTY_SLOTS}) with k [W/(m·K)], ν [m²/s], α [m²/s], Pr [-]
 * of air at T [K] and, four slots further on, their derivatives with respect to T; returns `out`.
 * Linear interpolation in Incropera & DeWitt (2007) Table A.4; allocation-free.
 */
export function airPropertiesInto(T_K: number, out: Float64Array): Float64Array {
  const i = segmentIndex(T_K);
  const T0 = T_ROWS_K[i];
  const inv = 1 / (T_ROWS_K[i + 1] - T0);
  const t = (T_K - T0) * inv;
  const dk = (K_E3_W_mK[i + 1] - K_E3_W_mK[i]) * 1e-3;
  const dnu = (NU_E6_m2_s[i + 1] - NU_E6_m2_s[i]) * 1e-6;
  const dalpha = (ALPHA_E6_m2_s[i + 1] - ALPHA_E6_m2_s[i]) * 1e-6;
  const dPr = PRANDTL[i + 1] - PRANDTL[i];
  out[AIR_K] = K_E3_W_mK[i] * 1e-3 + t * dk;
  out[AIR_NU] = NU_E6_m2_s[i] * 1e-6 + t * dnu;
  out[AIR_ALPHA] = ALPHA_E6_m2_s[i] * 1e-6 + t * dalpha;
  out[AIR_PR] = PRANDTL[i] + t * dPr;
  out[AIR_K + AIR_DERIVATIVE_OFFSET] = dk * inv;
  out[AIR_NU + AIR_DERIVATIVE_OFFSET] = dnu * inv;
  out[AIR_ALPHA + AIR_DERIVATIVE_OFFSET] = dalpha * inv;
  out[AIR_PR + AIR_DERIVATIVE_OFFSET] = dPr * inv;
  return out;
}

/** Air properties at one temperature, for set-up code and reports (allocates). */
export interface AirProperties {
  /** Thermal conductivity k [W/(m·K)] */
  readonly k_W_mK: number;
  /** Kinematic viscosity ν [m²/s] */
  readonly nu_m2_s: number;
  /** Thermal diffusivity α [m²/s] */
  readonly alpha_m2_s: number;
  /** Prandtl number Pr [-] */
  readonly Pr: number;
}

/** k, ν, α and Pr of dry air at 1 atm and T [K] (Incropera & DeWitt 2007, Table A.4). */
export function airProperties(T_K: number): AirProperties {
  const p = airPropertiesInto(T_K, new Float64Array(AIR_PROPERTY_SLOTS));
  return { k_W_mK: p[AIR_K], nu_m2_s: p[AIR_NU], alpha_m2_s: p[AIR_ALPHA], Pr: p[AIR_PR] };
}

/**
 * Pushes a {@link ValidityWarning} when T lies outside the tabulated 250–1500 K; returns `out`.
 * `model` names the user of the properties, e.g. "McAdams hot plate facing up (1954)".
 */
export function checkAirPropertyRange(T_K: number, model: string, out: ValidityWarning[]): ValidityWarning[] {
  if (T_K < AIR_TABLE_T_MIN_K || T_K > AIR_TABLE_T_MAX_K) {
    out.push({
      kind: "validity",
      model: `${model}: air properties, Incropera & DeWitt Table A.4 (2007)`,
      quantity: "film temperature",
      value: T_K,
      min: AIR_TABLE_T_MIN_K,
      max: AIR_TABLE_T_MAX_K,
      unit: "K",
    });
  }
  return out;
}
