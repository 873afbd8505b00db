/**
 * Run-out-table water cooling: a parameterised boiling curve q(T_s) [W/m²] for three kinds of
 * wetted face, and a {@link FluxLaw} built on it.
 *
 * Regions (physics.md §6, qualitative picture after Gradeck et al., IJHMT 54 (2011) 5527 and
 * Leocadio et al., Phys. Fluids 30 (2018) 122102):
 *   "impingement" — top face under a laminar jet or curtain (highest flux);
 *   "wetted"      — top face downstream, parallel flow of the water layer;
 *   "spray"       — bottom face under sprays, the water falls away.
 *
 * Boiling curve, as the surface cools (T_w water, T_B onset of nucleate boiling, T_C temperature of
 * the critical heat flux q_C, T_D rewetting temperature):
 *   T_s ≤ T_B        single-phase convection   q = h_sp (T_s − T_w)
 *   T_B < T_s ≤ T_C  nucleate boiling          cubic Hermite from (T_B, q_B, slope h_sp) to (T_C, q_C, slope 0)
 *   T_C < T_s ≤ T_D  transition boiling        cubic Hermite from (T_C, q_C, slope 0) to (T_D, q_D, slope h_fb)
 *   T_s > T_D        film boiling              q = h_fb (T_s − T_w)
 * with q_B = h_sp (T_B − T_w) and q_D = h_fb (T_D − T_w), so q and dq/dT_s are continuous
 * everywhere (C¹). The nucleate segment is monotone when h_sp (T_C − T_B) ≤ 3 (q_C − q_B)
 * (Fritsch & Carlson, SIAM J. Numer. Anal. 17 (1980) 238 — citation from memory; the condition is
 * α = h_sp(T_C − T_B)/(q_C − q_B) ≤ 3 with β = 0), which is enforced; its maximum is then
 * q_C at T_C. The transition segment ends with the film-boiling slope, so the minimum heat flux
 * (Leidenfrost point) lies slightly below T_D and stays above q_D − (4/27)(T_D − T_C) h_fb > 0.
 *
 * Operating conditions scale the whole curve:
 *   q(T_s; W, T_w) = M · (W/W_ref)^m · [1 − a (T_w − 273.15 K)] / [1 − a (T_ref − 273.15 K)] · q_curve(T_s; T_w)
 * with water flux density W [L/(m²·s)], region exponent m (≈ 0.35 laminar, 0.55 sprays; physics.md
 * §6 [from memory]), water-temperature coefficient a [1/K] (0.0075, from the Shimada–Mitsutsuka
 * correlation [from memory]) and calibration multiplier M (mills adapt per-bank multipliers to the
 * measured coiling temperature). Warmer water lowers q twice: through the factor and through the
 * smaller T_s − T_w. The anchor temperatures do not move with W or T_w (in reality the rewetting
 * temperature rises with water flux and subcooling): override them per case.
 *
 * Spray film boiling is built on Shimada & Mitsutsuka, Tetsu-to-Hagané 52 (1966) [citation and
 * formula from memory]: h = 1.57 W^0.55 (1 − 0.0075 θ_w) kW/(m²·K), θ_w water temperature [°C];
 * with M = 1 the "spray" curve reproduces it exactly in film boiling for every W and θ_w.
 * Alternative: Bolle & Moureau (1976) h = 0.423 W^0.556 kW/(m²·K) for 1 < W < 7 L/(m²·s),
 * 627 < T_s < 927 °C [from memory], see {@link bolleMoureauHtc_W_m2K}.
 */
import type { FluxLaw } from "../numerics/face-law.js";
import type { ValidityWarning } from "./composition.js";

/** Kinds of water-cooled face on a run-out table. */
export const WATER_REGIONS = ["impingement", "wetted", "spray"] as const;
export type WaterRegion = (typeof WATER_REGIONS)[number];

/** 0 °C [K]. */
const CELSIUS_ZERO_K = 273.15;
/** Boiling point of water at 1 atm [K] (99.97 °C on ITS-90; 100 °C is close enough here). */
export const WATER_SATURATION_K = 373.15;

/** All parameters of one region's boiling curve. Temperatures [K], fluxes [W/m²], W [L/(m²·s)]. */
export interface WaterCurveParams {
  /** Name used in warnings. */
  readonly name: string;
  /** Water flux density W_ref at which the anchors below hold [L/(m²·s)] */
  readonly referenceWaterFlux_L_m2s: number;
  /** Exponent m of the flux scaling (W/W_ref)^m [-] */
  readonly waterFluxExponent: number;
  /** Water temperature T_ref at which the anchors below hold [K] */
  readonly referenceWater_K: number;
  /** Coefficient a of the water-temperature factor 1 − a (T_w − 273.15 K) [1/K] */
  readonly waterTemperatureCoefficient_per_K: number;
  /** Single-phase convection coefficient h_sp below the onset of boiling [W/(m²·K)] */
  readonly singlePhaseHtc_W_m2K: number;
  /** Surface temperature T_B at the onset of nucleate boiling [K] */
  readonly nucleateOnset_K: number;
  /** Critical (maximum) heat flux q_C [W/m²] */
  readonly criticalHeatFlux_W_m2: number;
  /** Surface temperature T_C of the critical heat flux [K] */
  readonly criticalHeatFlux_K: number;
  /** Rewetting temperature T_D: film boiling above it [K] */
  readonly rewetting_K: number;
  /** Film-boiling heat-transfer coefficient h_fb [W/(m²·K)] */
  readonly filmBoilingHtc_W_m2K: number;
  /** Lowest water flux density the parameters are meant for [L/(m²·s)] */
  readonly waterFluxMin_L_m2s: number;
  /** Highest water flux density the parameters are meant for [L/(m²·s)] */
  readonly waterFluxMax_L_m2s: number;
  /** Lowest water temperature the parameters are meant for [K] */
  readonly waterMin_K: number;
  /** Highest water temperature the parameters are meant for [K] */
  readonly waterMax_K: number;
}

/**
 * Shimada & Mitsutsuka (1966) spray heat-transfer coefficient [W/(m²·K)]:
 * h = 1570 W^0.55 (1 − 0.0075 θ_w), W [L/(m²·s)], θ_w = T_w − 273.15 K [°C] (formula from memory).
 */
export function shimadaMitsutsukaHtc_W_m2K(waterFlux_L_m2s: number, water_K: number): number {
  return 1570 * Math.pow(waterFlux_L_m2s, 0.55) * (1 - 0.0075 * (water_K - CELSIUS_ZERO_K));
}

/**
 * Bolle & Moureau (1976) spray heat-transfer coefficient in film boiling [W/(m²·K)]:
 * h = 423 W^0.556, fitted for 1 < W < 7 L/(m²·s) and 627 < T_s < 927 °C (from memory). Pushes a
 * warning when W lies outside its range.
 */
export function bolleMoureauHtc_W_m2K(waterFlux_L_m2s: number, warnings?: ValidityWarning[]): number {
  if (warnings && (waterFlux_L_m2s < 1 || waterFlux_L_m2s > 7)) {
    warnings.push({ kind: "validity", model: "Bolle–Moureau spray (1976)", quantity: "water flux density", value: waterFlux_L_m2s, min: 1, max: 7, unit: "L/(m²·s)" });
  }
  return 423 * Math.pow(waterFlux_L_m2s, 0.556);
}

/**
 * Water flux density W [L/(m²·s)] of one header whose flow Q [m³/h] wets a zone of the strip
 * width × zone length [m]: W = Q·1000/3600 / (width · length).
 */
export function waterFluxDensity_L_m2s(flow_m3_h: number, width_m: number, zoneLength_m: number): number {
  return (flow_m3_h * 1000) / 3600 / (width_m * zoneLength_m);
}

/** 30 °C: the middle of the usual run-out-table water temperature, 25–40 °C (physics.md §9, common practice). */
const REFERENCE_WATER_K = 303.15;
/** Onset of nucleate boiling at 10 K wall superheat [K] (from memory: a few K to ~10 K superheat). */
const NUCLEATE_ONSET_K = 383.15;
/** Water-temperature coefficient of Shimada & Mitsutsuka, used for every region [1/K] (from memory). */
const SHIMADA_WATER_COEFFICIENT_per_K = 0.0075;

/**
 * Default curves. Every value is [from memory] unless tagged otherwise: they reproduce the typical
 * magnitudes of physics.md §6 (film-boiling h: impingement 5–30, parallel flow 0.5–3, bottom sprays
 * 0.5–5 kW/(m²·K); pool CHF of saturated water 1.1–1.3 MW/m², exceeded by subcooled, moving water)
 * and must be calibrated per line through the multiplier or overrides.
 */
export const DEFAULT_WATER_CURVE: Readonly<Record<WaterRegion, WaterCurveParams>> = {
  impingement: {
    name: "run-out-table water, impingement zone",
    referenceWaterFlux_L_m2s: 100, // a curtain of 10 L/(s·m) (0.6 m³/min per metre, physics.md §9) over a 0.1 m zone [from memory]
    waterFluxExponent: 0.35, // laminar jets, physics.md §6 [from memory]
    referenceWater_K: REFERENCE_WATER_K, // 30 °C, common practice
    waterTemperatureCoefficient_per_K: SHIMADA_WATER_COEFFICIENT_per_K, // borrowed from Shimada–Mitsutsuka [from memory]
    singlePhaseHtc_W_m2K: 10e3, // stagnation-zone single-phase h of laminar water jets, order 10 kW/(m²·K) [from memory]
    nucleateOnset_K: NUCLEATE_ONSET_K, // 110 °C [from memory]
    criticalHeatFlux_W_m2: 8e6, // peak fluxes of several MW/m² under jets on hot steel [from memory]
    criticalHeatFlux_K: 573.15, // 300 °C [from memory]
    rewetting_K: 973.15, // 700 °C: jets wet the stagnation zone at high temperature [from memory]
    filmBoilingHtc_W_m2K: 6e3, // physics.md §6 impingement 5–30 kW/(m²·K) [from memory]
    waterFluxMin_L_m2s: 20, // [from memory]
    waterFluxMax_L_m2s: 500, // [from memory]
    waterMin_K: 283.15, // 10 °C, around the usual 25–40 °C (common practice)
    waterMax_K: 323.15, // 50 °C, common practice
  },
  wetted: {
    name: "run-out-table water, parallel-flow zone",
    referenceWaterFlux_L_m2s: 10, // the same curtain spread over about 1 m of strip [from memory]
    waterFluxExponent: 0.35, // laminar flow, physics.md §6 [from memory]
    referenceWater_K: REFERENCE_WATER_K, // 30 °C, common practice
    waterTemperatureCoefficient_per_K: SHIMADA_WATER_COEFFICIENT_per_K, // borrowed from Shimada–Mitsutsuka [from memory]
    singlePhaseHtc_W_m2K: 3e3, // [from memory]
    nucleateOnset_K: NUCLEATE_ONSET_K, // 110 °C [from memory]
    criticalHeatFlux_W_m2: 2e6, // above the saturated pool CHF 1.1–1.3 MW/m² (physics.md §6): subcooled flowing water [from memory]
    criticalHeatFlux_K: 473.15, // 200 °C [from memory]
    rewetting_K: 823.15, // 550 °C [from memory]
    filmBoilingHtc_W_m2K: 1e3, // physics.md §6 parallel-flow film 0.5–3 kW/(m²·K) [from memory]
    waterFluxMin_L_m2s: 2, // [from memory]
    waterFluxMax_L_m2s: 50, // [from memory]
    waterMin_K: 283.15, // common practice
    waterMax_K: 323.15, // common practice
  },
  spray: {
    name: "run-out-table water, bottom sprays",
    referenceWaterFlux_L_m2s: 5, // inside Bolle–Moureau's 1–7 L/(m²·s) [from memory]
    waterFluxExponent: 0.55, // Shimada–Mitsutsuka [from memory]
    referenceWater_K: REFERENCE_WATER_K, // 30 °C, common practice
    waterTemperatureCoefficient_per_K: SHIMADA_WATER_COEFFICIENT_per_K, // Shimada–Mitsutsuka [from memory]
    singlePhaseHtc_W_m2K: 5e3, // [from memory]
    nucleateOnset_K: NUCLEATE_ONSET_K, // 110 °C [from memory]
    criticalHeatFlux_W_m2: 4e6, // [from memory]; must exceed the film flux up to 1000 °C (2.9 MW/m² here)
    criticalHeatFlux_K: 573.15, // 300 °C [from memory]
    rewetting_K: 873.15, // 600 °C [from memory]; spray Leidenfrost temperatures range 150 to > 1000 °C (Hnizdil et al., Metals 2020 — citation from memory, not checked)
    filmBoilingHtc_W_m2K: shimadaMitsutsukaHtc_W_m2K(5, REFERENCE_WATER_K), // 2.95 kW/(m²·K), Shimada–Mitsutsuka at W_ref, 30 °C
    waterFluxMin_L_m2s: 1, // [from memory]
    waterFluxMax_L_m2s: 20, // [from memory]
    waterMin_K: 283.15, // common practice
    waterMax_K: 323.15, // common practice
  },
};

/** 1 − a (T_w − 273.15 K): the water-temperature factor [-]. */
function waterTemperatureFactor(params: WaterCurveParams, water_K: number): number {
  return 1 - params.waterTemperatureCoefficient_per_K * (water_K - CELSIUS_ZERO_K);
}

function fail(params: WaterCurveParams, message: string): never {
  throw new RangeError(`${params.name}: ${message}`);
}

/**
 * Throws a RangeError when the curve cannot be built for water at T_w [K]: non-positive values,
 * anchors out of order (T_w < T_B < T_C < T_D), q_C not above q_B and q_D, a nucleate segment that
 * would overshoot q_C, or water not subcooled.
 */
export function validateWaterCurve(params: WaterCurveParams, water_K: number): void {
  const positive: (keyof WaterCurveParams)[] = [
    "referenceWaterFlux_L_m2s",
    "referenceWater_K",
    "singlePhaseHtc_W_m2K",
    "criticalHeatFlux_W_m2",
    "filmBoilingHtc_W_m2K",
  ];
  for (const key of positive) {
    const v = params[key];
    if (typeof v !== "number" || !(v > 0) || !Number.isFinite(v)) fail(params, `${key} must be a positive number, got ${String(v)}`);
  }
  if (!(params.waterFluxExponent >= 0)) fail(params, `waterFluxExponent must be ≥ 0, got ${params.waterFluxExponent}`);
  if (!(water_K > CELSIUS_ZERO_K && water_K < WATER_SATURATION_K)) fail(params, `water temperature ${water_K} K is not liquid subcooled water at 1 atm`);
  if (!(waterTemperatureFactor(params, water_K) > 0 && waterTemperatureFactor(params, params.referenceWater_K) > 0)) {
    fail(params, "water-temperature factor 1 − a (T_w − 273.15 K) must stay positive");
  }
  const { nucleateOnset_K: TB, criticalHeatFlux_K: TC, rewetting_K: TD } = params;
  if (!(water_K < TB && TB < TC && TC < TD)) fail(params, `need T_w < T_onset < T_CHF < T_rewet, got ${water_K} / ${TB} / ${TC} / ${TD} K`);
  const qB = params.singlePhaseHtc_W_m2K * (TB - water_K);
  const qC = params.criticalHeatFlux_W_m2;
  const qD = params.filmBoilingHtc_W_m2K * (TD - water_K);
  if (!(qB < qC && qD < qC)) fail(params, `critical heat flux ${qC} W/m² must exceed the onset flux ${qB} and the rewetting flux ${qD} W/m²`);
  if (params.singlePhaseHtc_W_m2K * (TC - TB) > 3 * (qC - qB)) fail(params, "nucleate segment would overshoot the critical heat flux: lower h_sp or raise q_CHF");
}

/**
 * A region's default curve with `overrides` applied (undefined entries ignored), validated at the
 * reference water temperature; returns a new frozen object.
 */
export function resolveWaterCurve(region: WaterRegion, overrides: Partial<WaterCurveParams> = {}): WaterCurveParams {
  const merged: Record<string, unknown> = { ...DEFAULT_WATER_CURVE[region] };
  for (const [key, value] of Object.entries(overrides)) if (value !== undefined) merged[key] = value;
  const params = Object.freeze(merged) as unknown as WaterCurveParams;
  validateWaterCurve(params, params.referenceWater_K);
  return params;
}

/** Cubic Hermite on [T0, T1] through (q0, slope m0) and (q1, slope m1): q to out[0], dq/dT to out[1]. */
function hermite(T: number, T0: number, T1: number, q0: number, q1: number, m0: number, m1: number, out: Float64Array): void {
  const H = T1 - T0;
  const t = (T - T0) / H;
  const t2 = t * t;
  const t3 = t2 * t;
  out[0] = (2 * t3 - 3 * t2 + 1) * q0 + (t3 - 2 * t2 + t) * H * m0 + (3 * t2 - 2 * t3) * q1 + (t3 - t2) * H * m1;
  out[1] = ((6 * t2 - 6 * t) * (q0 - q1)) / H + (3 * t2 - 4 * t + 1) * m0 + (3 * t2 - 2 * t) * m1;
}

/** Operating point of a {@link WaterBoilingFace}. */
export interface WaterBoilingOptions {
  /** Resolved curve, e.g. from {@link resolveWaterCurve}. */
  readonly curve: WaterCurveParams;
  /** Water flux density W [L/(m²·s)] */
  readonly waterFlux_L_m2s: number;
  /** Water temperature T_w [K] */
  readonly water_K: number;
  /** Calibration multiplier M on the flux [-], default 1. */
  readonly multiplier?: number;
}

/**
 * A water-cooled face: q(T_s) of the boiling curve in the file comment [W/m²] and its derivative
 * [W/(m²·K)]. All anchors are scaled once in the constructor; `evaluate` is allocation-free.
 */
export class WaterBoilingFace implements FluxLaw {
  readonly kind = "flux" as const;
  readonly curve: WaterCurveParams;
  readonly waterFlux_L_m2s: number;
  readonly water_K: number;
  readonly multiplier: number;
  /** M (W/W_ref)^m · water-temperature factor ratio: multiplies the whole curve [-]. */
  readonly scale: number;
  private readonly onset_K: number;
  private readonly chf_K: number;
  private readonly rewet_K: number;
  private readonly singlePhase: number;
  private readonly film: number;
  private readonly qOnset: number;
  private readonly qChf: number;
  private readonly qRewet: number;

  constructor(options: WaterBoilingOptions) {
    const c = options.curve;
    validateWaterCurve(c, options.water_K);
    const M = options.multiplier ?? 1;
    if (!(M >= 0) || !Number.isFinite(M)) throw new RangeError(`${c.name}: multiplier must be ≥ 0, got ${M}`);
    if (!(options.waterFlux_L_m2s >= 0)) throw new RangeError(`${c.name}: water flux density must be ≥ 0, got ${options.waterFlux_L_m2s}`);
    this.curve = c;
    this.waterFlux_L_m2s = options.waterFlux_L_m2s;
    this.water_K = options.water_K;
    this.multiplier = M;
    this.scale =
      M *
      Math.pow(options.waterFlux_L_m2s / c.referenceWaterFlux_L_m2s, c.waterFluxExponent) *
      (waterTemperatureFactor(c, options.water_K) / waterTemperatureFactor(c, c.referenceWater_K));
    this.onset_K = c.nucleateOnset_K;
    this.chf_K = c.criticalHeatFlux_K;
    this.rewet_K = c.rewetting_K;
    this.singlePhase = this.scale * c.singlePhaseHtc_W_m2K;
    this.film = this.scale * c.filmBoilingHtc_W_m2K;
    this.qOnset = this.singlePhase * (c.nucleateOnset_K - options.water_K);
    this.qChf = this.scale * c.criticalHeatFlux_W_m2;
    this.qRewet = this.film * (c.rewetting_K - options.water_K);
  }

  evaluate(T_surface_K: number, out: Float64Array): void {
    const T = T_surface_K;
    if (T <= this.onset_K) {
      out[0] = this.singlePhase * (T - this.water_K);
      out[1] = this.singlePhase;
    } else if (T <= this.chf_K) {
      hermite(T, this.onset_K, this.chf_K, this.qOnset, this.qChf, this.singlePhase, 0, out);
    } else if (T <= this.rewet_K) {
      hermite(T, this.chf_K, this.rewet_K, this.qChf, this.qRewet, 0, this.film, out);
    } else {
      out[0] = this.film * (T - this.water_K);
      out[1] = this.film;
    }
  }

  /** Pushes warnings for W and T_w outside the curve's intended ranges; returns `out`. */
  validity(out: ValidityWarning[]): ValidityWarning[] {
    const c = this.curve;
    const W = this.waterFlux_L_m2s;
    if (W < c.waterFluxMin_L_m2s || W > c.waterFluxMax_L_m2s) {
      out.push({ kind: "validity", model: c.name, quantity: "water flux density", value: W, min: c.waterFluxMin_L_m2s, max: c.waterFluxMax_L_m2s, unit: "L/(m²·s)" });
    }
    if (this.water_K < c.waterMin_K || this.water_K > c.waterMax_K) {
      out.push({ kind: "validity", model: c.name, quantity: "water temperature", value: this.water_K, min: c.waterMin_K, max: c.waterMax_K, unit: "K" });
    }
    return out;
  }
}
