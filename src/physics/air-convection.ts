/**
 * Heat loss of a hot strip or plate face to still air: grey radiation plus one convection
 * correlation, as heat-transfer coefficients h [W/(m²·K)] and as a {@link FluxLaw}.
 *
 * Air properties k, ν, α, Pr are taken at the film temperature T_f = (T_s + T_∞)/2 from
 * {@link airPropertiesInto} (Incropera & DeWitt 2007, Table A.4); β = 1/T_f (ideal gas).
 * Rayleigh number Ra_L = g β |T_s − T_∞| L³ / (ν α), g = 9.80665 m/s².
 *
 * Natural convection, horizontal plate, L = A/P (W.H. McAdams, Heat Transmission, 3rd ed. 1954,
 * as recommended by Incropera & DeWitt 2007 §9.6.2):
 *   hot face up (or cold face down):  Nu = 0.54 Ra^¼  for 10⁴ ≤ Ra ≤ 10⁷
 *                                     Nu = 0.15 Ra^⅓  for 10⁷ ≤ Ra ≤ 10¹¹
 *   hot face down (or cold face up):  Nu = 0.27 Ra^¼  for 10⁵ ≤ Ra ≤ 10¹⁰
 * The two upward laws differ by 6 % at Ra = 10⁷; to keep q continuous in T_s the upward Nu is
 * max(0.54 Ra^¼, 0.15 Ra^⅓), which switches where they cross, Ra* = (0.54/0.15)¹² ≈ 4.7·10⁶.
 *
 * Natural convection, vertical plate of height L (S.W. Churchill & H.H.S. Chu, Int. J. Heat Mass
 * Transfer 18 (1975) 1323), for 10⁻¹ ≤ Ra ≤ 10¹²:
 *   Nu = {0.825 + 0.387 Ra^⅙ / [1 + (0.492/Pr)^(9/16)]^(8/27)}²
 *
 * Forced convection of a sheet moving at speed U through still air (laminar boundary layer of a
 * continuous moving surface; B.C. Sakiadis, AIChE J. 7 (1961) 26 and 221 [citation from memory]):
 *   Nu_x / Re_x^½ = c(Pr),  c(0.70) = 0.3492 (physics.md §6 [calc]; agrees with Tsou, Sparrow &
 *   Goldstein, Int. J. Heat Mass Transfer 10 (1967) 219 [from memory]),
 *   c(1) = −f''(0) = 0.44375 (at Pr = 1 the temperature profile equals the velocity profile).
 * Between these, c(Pr) = 0.3492 (Pr/0.7)^m with m = ln(0.44375/0.3492)/ln(1/0.7) ≈ 0.672, which
 * agrees with the similarity solution to 0.1 % for 0.68 ≤ Pr ≤ 0.74 (all of air's Table A.4 range).
 * Averaged over a length L from the start of the boundary layer: h̄ = 2 c k Re_L^½ / L,
 * Re_L = U L / ν. Laminar only: above Re_L = 5·10⁵ (the flat-plate transition value of
 * Incropera & DeWitt 2007 §6.3.1, used here for a moving surface as common practice (no source))
 * a warning is returned.
 *
 * Radiation: q_rad = ε σ (T_s⁴ − T_sur⁴), ε = 0.8 default for oxidised hot strip (common practice,
 * physics.md §6).
 *
 * Inputs outside a correlation's range give {@link ValidityWarning} values, never a clamp.
 */
import type { FluxLaw } from "../numerics/face-law.js";
import { STEFAN_BOLTZMANN } from "../numerics/face-law.js";
import type { ValidityWarning } from "./composition.js";
import {
  AIR_ALPHA,
  AIR_DERIVATIVE_OFFSET,
  AIR_K,
  AIR_NU,
  AIR_PR,
  AIR_PROPERTY_SLOTS,
  airPropertiesInto,
  checkAirPropertyRange,
} from "./air-properties.js";

/** Standard acceleration of gravity g [m/s²] (CGPM 1901, exact). */
export const STANDARD_GRAVITY_m_s2 = 9.80665;

/** Which way a horizontal face looks: "up" is the top face of the strip, "down" the bottom face. */
export type HorizontalFacing = "up" | "down";

/** Rayleigh number where 0.54 Ra^¼ and 0.15 Ra^⅓ cross, (0.54/0.15)¹² [-]. */
export const MCADAMS_UPWARD_SWITCH_RA = Math.pow(0.54 / 0.15, 12);

/** Sakiadis coefficient Nu_x/Re_x^½ at Pr = 0.70 (physics.md §6 [calc]). */
export const SAKIADIS_NU_AT_PR_07 = 0.3492;
/** −f''(0) of the Sakiadis moving-surface boundary layer = Nu_x/Re_x^½ at Pr = 1 [from memory]. */
export const SAKIADIS_WALL_SHEAR = 0.44375;
const SAKIADIS_PR_EXPONENT = Math.log(SAKIADIS_WALL_SHEAR / SAKIADIS_NU_AT_PR_07) / Math.log(1 / 0.7);

/** Laminar limit of Re_L used for the moving-sheet warning [-] (common practice, no source). */
export const MOVING_SHEET_RE_MAX = 5e5;

const MCADAMS_UP_MODEL = "McAdams hot plate facing up (1954)";
const MCADAMS_DOWN_MODEL = "McAdams hot plate facing down (1954)";
const CHURCHILL_CHU_MODEL = "Churchill–Chu vertical plate (1975)";
const SAKIADIS_MODEL = "Sakiadis moving sheet, laminar (1961)";

/** Characteristic length L = A/P of a w × l rectangle [m] (McAdams' horizontal-plate length). */
export function horizontalPlateLength_m(width_m: number, length_m: number): number {
  return (width_m * length_m) / (2 * (width_m + length_m));
}

/** Nu_x/Re_x^½ of the Sakiadis boundary layer at Prandtl number Pr, c = 0.3492 (Pr/0.7)^0.672 [-]. */
export function sakiadisCoefficient(Pr: number): number {
  return SAKIADIS_NU_AT_PR_07 * Math.pow(Pr / 0.7, SAKIADIS_PR_EXPONENT);
}

/** Rayleigh number Ra_L = g β |T_s − T_∞| L³/(ν α) with film properties and β = 1/T_f [-]. */
export function rayleighNumber(T_surface_K: number, T_air_K: number, length_m: number): number {
  return filmRayleigh(T_surface_K, T_air_K, length_m, new Float64Array(AIR_PROPERTY_SLOTS));
}

/** Fills `p` with the film-temperature air properties and returns Ra_L [-]. */
function filmRayleigh(Ts: number, Ta: number, L: number, p: Float64Array): number {
  const Tf = 0.5 * (Ts + Ta);
  airPropertiesInto(Tf, p);
  return (STANDARD_GRAVITY_m_s2 * Math.abs(Ts - Ta) * L * L * L) / (Tf * p[AIR_NU] * p[AIR_ALPHA]);
}

/** True when the buoyant boundary layer leaves the face upward (hot face up, or cold face down). */
function isUnstable(facing: HorizontalFacing, Ts: number, Ta: number): boolean {
  return (facing === "up") === (Ts >= Ta);
}

/** ½ (1/T_f + ν'/ν + α'/α): minus d ln Ra/dT_s apart from the ΔT term [1/K]. */
function rayleighPropertyLogSlope(Tf: number, p: Float64Array): number {
  return 0.5 * (1 / Tf + p[AIR_NU + AIR_DERIVATIVE_OFFSET] / p[AIR_NU] + p[AIR_ALPHA + AIR_DERIVATIVE_OFFSET] / p[AIR_ALPHA]);
}

/**
 * Convective flux of a horizontal plate to air, q = h (T_s − T_∞) [W/m²], to out[0], and dq/dT_s
 * [W/(m²·K)] to out[1]. With Nu = C Ra^n and h = k Nu / L,
 *   dq/dT_s = h [1 + n (1 − ΔT s) + ΔT k'/(2k)],  s = ½ (1/T_f + ν'/ν + α'/α),
 * which stays finite as ΔT → 0 (h ∝ |ΔT|^n → 0). `p` is scratch of length AIR_PROPERTY_SLOTS.
 */
export function horizontalPlateFlux(
  T_surface_K: number,
  T_air_K: number,
  length_m: number,
  facing: HorizontalFacing,
  p: Float64Array,
  out: Float64Array,
): Float64Array {
  const Ra = filmRayleigh(T_surface_K, T_air_K, length_m, p);
  const Tf = 0.5 * (T_surface_K + T_air_K);
  const dT = T_surface_K - T_air_K;
  let C = 0.27;
  let n = 0.25;
  if (isUnstable(facing, T_surface_K, T_air_K)) {
    if (Ra > MCADAMS_UPWARD_SWITCH_RA) {
      C = 0.15;
      n = 1 / 3;
    } else C = 0.54;
  }
  const k = p[AIR_K];
  const h = (C * Math.pow(Ra, n) * k) / length_m;
  const s = rayleighPropertyLogSlope(Tf, p);
  out[0] = h * dT;
  out[1] = h * (1 + n * (1 - dT * s) + (dT * p[AIR_K + AIR_DERIVATIVE_OFFSET]) / (2 * k));
  return out;
}

/**
 * Convective flux of a vertical plate of height L to air by Churchill & Chu (1975): q [W/m²] to
 * out[0], dq/dT_s [W/(m²·K)] to out[1]. With S = Ra^⅙/ψ, ψ = [1 + a]^(8/27), a = (0.492/Pr)^(9/16),
 * Nu = (0.825 + 0.387 S)², the derivative uses
 *   ΔT d ln S/dT_s = (1 − ΔT s)/6 + ΔT a/(1 + a) Pr'/(12 Pr),  s as in {@link horizontalPlateFlux}.
 */
export function verticalPlateFlux(
  T_surface_K: number,
  T_air_K: number,
  height_m: number,
  p: Float64Array,
  out: Float64Array,
): Float64Array {
  const Ra = filmRayleigh(T_surface_K, T_air_K, height_m, p);
  const Tf = 0.5 * (T_surface_K + T_air_K);
  const dT = T_surface_K - T_air_K;
  const Pr = p[AIR_PR];
  const a = Math.pow(0.492 / Pr, 9 / 16);
  const S = Math.pow(Ra, 1 / 6) / Math.pow(1 + a, 8 / 27);
  const root = 0.825 + 0.387 * S;
  const k = p[AIR_K];
  const h = (root * root * k) / height_m;
  const dTdlnS = (1 - dT * rayleighPropertyLogSlope(Tf, p)) / 6 + (dT * a * p[AIR_PR + AIR_DERIVATIVE_OFFSET]) / ((1 + a) * 12 * Pr);
  out[0] = h * dT;
  out[1] = h * (1 + (dT * p[AIR_K + AIR_DERIVATIVE_OFFSET]) / (2 * k)) + (2 * root * 0.387 * S * dTdlnS * k) / height_m;
  return out;
}

/**
 * Convective flux of a sheet moving at U through still air, Sakiadis laminar layer averaged over
 * length L: q = h̄ ΔT [W/m²] to out[0], dq/dT_s [W/(m²·K)] to out[1], with h̄ = 2 c(Pr) k Re_L^½/L,
 *   dh̄/dT_s = h̄ ½ (k'/k + m Pr'/Pr − ½ ν'/ν)  (m the exponent of c(Pr); primes d/dT_f).
 */
export function movingSheetFlux(
  T_surface_K: number,
  T_air_K: number,
  speed_m_s: number,
  length_m: number,
  p: Float64Array,
  out: Float64Array,
): Float64Array {
  airPropertiesInto(0.5 * (T_surface_K + T_air_K), p);
  const dT = T_surface_K - T_air_K;
  const k = p[AIR_K];
  const nu = p[AIR_NU];
  const Pr = p[AIR_PR];
  const h = (2 * sakiadisCoefficient(Pr) * k * Math.sqrt((speed_m_s * length_m) / nu)) / length_m;
  const dlnh =
    0.5 *
    (p[AIR_K + AIR_DERIVATIVE_OFFSET] / k +
      (SAKIADIS_PR_EXPONENT * p[AIR_PR + AIR_DERIVATIVE_OFFSET]) / Pr -
      (0.5 * p[AIR_NU + AIR_DERIVATIVE_OFFSET]) / nu);
  out[0] = h * dT;
  out[1] = h * (1 + dT * dlnh);
  return out;
}

/** h = q/ΔT of a flux kernel, or the ΔT → 0 limit dq/dT_s when T_s = T_∞. */
function htcFrom(out: Float64Array, dT: number): number {
  return dT === 0 ? out[1] : out[0] / dT;
}

/**
 * Natural-convection h [W/(m²·K)] of a horizontal face, McAdams (1954), L = A/P [m]. Pushes a
 * warning to `warnings` when Ra or the film temperature lies outside the correlation's range.
 */
export function horizontalPlateHtc_W_m2K(
  T_surface_K: number,
  T_air_K: number,
  length_m: number,
  facing: HorizontalFacing,
  warnings?: ValidityWarning[],
): number {
  const out = horizontalPlateFlux(T_surface_K, T_air_K, length_m, facing, new Float64Array(AIR_PROPERTY_SLOTS), new Float64Array(2));
  if (warnings) checkHorizontalPlate(T_surface_K, T_air_K, length_m, facing, warnings);
  return htcFrom(out, T_surface_K - T_air_K);
}

/** Natural-convection h [W/(m²·K)] of a vertical face of height L [m], Churchill & Chu (1975). */
export function verticalPlateHtc_W_m2K(T_surface_K: number, T_air_K: number, height_m: number, warnings?: ValidityWarning[]): number {
  const out = verticalPlateFlux(T_surface_K, T_air_K, height_m, new Float64Array(AIR_PROPERTY_SLOTS), new Float64Array(2));
  if (warnings) checkVerticalPlate(T_surface_K, T_air_K, height_m, warnings);
  return htcFrom(out, T_surface_K - T_air_K);
}

/** Mean h [W/(m²·K)] over length L [m] of a sheet moving at U [m/s] in still air (Sakiadis). */
export function movingSheetHtc_W_m2K(
  T_surface_K: number,
  T_air_K: number,
  speed_m_s: number,
  length_m: number,
  warnings?: ValidityWarning[],
): number {
  const out = movingSheetFlux(T_surface_K, T_air_K, speed_m_s, length_m, new Float64Array(AIR_PROPERTY_SLOTS), new Float64Array(2));
  if (warnings) checkMovingSheet(T_surface_K, T_air_K, speed_m_s, length_m, warnings);
  return htcFrom(out, T_surface_K - T_air_K);
}

function pushRange(out: ValidityWarning[], model: string, quantity: string, value: number, min: number, max: number): void {
  if (value < min || value > max) out.push({ kind: "validity", model, quantity, value, min, max, unit: "-" });
}

/** Warnings for McAdams' horizontal-plate correlations at this state; returns `out`. */
export function checkHorizontalPlate(
  T_surface_K: number,
  T_air_K: number,
  length_m: number,
  facing: HorizontalFacing,
  out: ValidityWarning[],
): ValidityWarning[] {
  const Ra = rayleighNumber(T_surface_K, T_air_K, length_m);
  if (isUnstable(facing, T_surface_K, T_air_K)) pushRange(out, MCADAMS_UP_MODEL, "Ra", Ra, 1e4, 1e11);
  else pushRange(out, MCADAMS_DOWN_MODEL, "Ra", Ra, 1e5, 1e10);
  return checkAirPropertyRange(0.5 * (T_surface_K + T_air_K), facing === "up" ? MCADAMS_UP_MODEL : MCADAMS_DOWN_MODEL, out);
}

/** Warnings for Churchill & Chu's vertical-plate correlation at this state; returns `out`. */
export function checkVerticalPlate(T_surface_K: number, T_air_K: number, height_m: number, out: ValidityWarning[]): ValidityWarning[] {
  pushRange(out, CHURCHILL_CHU_MODEL, "Ra", rayleighNumber(T_surface_K, T_air_K, height_m), 0.1, 1e12);
  return checkAirPropertyRange(0.5 * (T_surface_K + T_air_K), CHURCHILL_CHU_MODEL, out);
}

/** Warnings for the laminar moving-sheet correlation at this state; returns `out`. */
export function checkMovingSheet(
  T_surface_K: number,
  T_air_K: number,
  speed_m_s: number,
  length_m: number,
  out: ValidityWarning[],
): ValidityWarning[] {
  const Tf = 0.5 * (T_surface_K + T_air_K);
  const p = airPropertiesInto(Tf, new Float64Array(AIR_PROPERTY_SLOTS));
  pushRange(out, SAKIADIS_MODEL, "Re_L", (speed_m_s * length_m) / p[AIR_NU], 0, MOVING_SHEET_RE_MAX);
  return checkAirPropertyRange(Tf, SAKIADIS_MODEL, out);
}

/** Which convection correlation an air-cooled face uses. */
export type AirConvection =
  | { readonly kind: "natural"; readonly facing: HorizontalFacing; readonly width_m: number; readonly length_m: number }
  | { readonly kind: "vertical"; readonly height_m: number }
  | { readonly kind: "moving-sheet"; readonly speed_m_s: number; readonly length_m: number }
  | { readonly kind: "none" };

/** Settings of an {@link AirCoolingFace}. */
export interface AirCoolingOptions {
  /** Still-air temperature T_∞ [K] */
  readonly air_K: number;
  /** Radiation surroundings T_sur [K]; defaults to the air temperature. */
  readonly surroundings_K?: number;
  /** Total hemispherical emissivity ε [-], 0 < ε ≤ 1; default 0.8 (common practice). */
  readonly emissivity?: number;
  readonly convection: AirConvection;
}

/** Default emissivity of oxidised hot strip [-] (common practice, physics.md §6). */
export const DEFAULT_STRIP_EMISSIVITY = 0.8;

function requirePositive(name: string, value: number): void {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be a positive finite number, got ${value}`);
}

/**
 * A face cooling in still air: q = ε σ (T_s⁴ − T_sur⁴) + q_conv(T_s) [W/m²], with the chosen
 * correlation (see the file comment) and dq/dT_s = 4 ε σ T_s³ + dq_conv/dT_s [W/(m²·K)].
 * `evaluate` is allocation-free; `validity` reports the ranges at a given surface temperature.
 */
export class AirCoolingFace implements FluxLaw {
  readonly kind = "flux" as const;
  readonly air_K: number;
  readonly surroundings_K: number;
  readonly emissivity: number;
  readonly convection: AirConvection;
  /** Characteristic length of the correlation [m] (A/P for "natural", L otherwise). */
  readonly length_m: number;
  private readonly props = new Float64Array(AIR_PROPERTY_SLOTS);
  private readonly conv = new Float64Array(2);

  constructor(options: AirCoolingOptions) {
    requirePositive("air temperature [K]", options.air_K);
    this.air_K = options.air_K;
    this.surroundings_K = options.surroundings_K ?? options.air_K;
    requirePositive("surroundings temperature [K]", this.surroundings_K);
    this.emissivity = options.emissivity ?? DEFAULT_STRIP_EMISSIVITY;
    if (!(this.emissivity > 0 && this.emissivity <= 1)) throw new RangeError(`emissivity must lie in (0, 1], got ${this.emissivity}`);
    this.convection = options.convection;
    const c = options.convection;
    if (c.kind === "natural") {
      requirePositive("plate width [m]", c.width_m);
      requirePositive("plate length [m]", c.length_m);
      this.length_m = horizontalPlateLength_m(c.width_m, c.length_m);
    } else if (c.kind === "vertical") {
      requirePositive("plate height [m]", c.height_m);
      this.length_m = c.height_m;
    } else if (c.kind === "moving-sheet") {
      requirePositive("strip speed [m/s]", c.speed_m_s);
      requirePositive("boundary-layer length [m]", c.length_m);
      this.length_m = c.length_m;
    } else this.length_m = 0;
  }

  evaluate(T_surface_K: number, out: Float64Array): void {
    const es = this.emissivity * STEFAN_BOLTZMANN;
    const Tsur = this.surroundings_K;
    const T2 = T_surface_K * T_surface_K;
    let q = es * (T2 * T2 - Tsur * Tsur * Tsur * Tsur);
    let dq = 4 * es * T2 * T_surface_K;
    const c = this.convection;
    if (c.kind !== "none") {
      if (c.kind === "natural") horizontalPlateFlux(T_surface_K, this.air_K, this.length_m, c.facing, this.props, this.conv);
      else if (c.kind === "vertical") verticalPlateFlux(T_surface_K, this.air_K, this.length_m, this.props, this.conv);
      else movingSheetFlux(T_surface_K, this.air_K, c.speed_m_s, this.length_m, this.props, this.conv);
      q += this.conv[0];
      dq += this.conv[1];
    }
    out[0] = q;
    out[1] = dq;
  }

  /** Pushes the correlation's range warnings at surface temperature T_s [K]; returns `out`. */
  validity(T_surface_K: number, out: ValidityWarning[]): ValidityWarning[] {
    const c = this.convection;
    if (c.kind === "natural") return checkHorizontalPlate(T_surface_K, this.air_K, this.length_m, c.facing, out);
    if (c.kind === "vertical") return checkVerticalPlate(T_surface_K, this.air_K, this.length_m, out);
    if (c.kind === "moving-sheet") return checkMovingSheet(T_surface_K, this.air_K, c.speed_m_s, this.length_m, out);
    return out;
  }
}
