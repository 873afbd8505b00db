/**
 * Per-phase specific enthalpy h_i(T) [J/kg], specific heat c_p,i(T) [J/(kg·K)] and thermal
 * conductivity k_i(T) [W/(m·K)] for the five phases of phases.ts. The caller forms the mixture
 * h = Σ X_i h_i, c_eff = Σ X_i c_p,i, k = Σ X_i k_i; latent heat then follows as h_γ(T) − h_i(T).
 *
 * Enthalpies come from SGTE pure iron (Dinsdale 1991, see sgte-iron.ts) per unit mass, relative
 * to bcc Fe at 298.15 K: austenite = fcc, ferrite = bcc (magnetic term included, so ferrite formed
 * below the Curie point releases its magnetic ordering enthalpy too). Valid 298.15–1811 K; a few
 * kelvin below 298.15 K the polynomial is extrapolated (see checkSgteIronRange).
 *
 * These are single-phase values: never add a latent-heat source on top of an "apparent" c_p.
 */
import type { ValidityWarning } from "./composition.js";
import { AUSTENITE, BAINITE, FERRITE, PEARLITE, PHASES } from "./phases.js";
import {
  IRON_MOLAR_MASS_kg_mol,
  enthalpyBcc_Jmol,
  enthalpyFcc_Jmol,
  heatCapacityBcc_JmolK,
  heatCapacityFcc_JmolK,
} from "./sgte-iron.js";

/** Stored-energy fractions of the displacive products; each in [0, 1]. */
export interface PhaseThermoOptions {
  /** Fraction of h_γ − h_α that bainite keeps as stored energy [–]; default {@link DEFAULT_BAINITE_STORED_FRACTION}. */
  bainiteStoredFraction?: number;
  /** Fraction of h_γ − h_α that martensite keeps as stored energy [–]; default {@link DEFAULT_MARTENSITE_STORED_FRACTION}. */
  martensiteStoredFraction?: number;
}

/**
 * Default stored-energy fraction of bainite [–]. Assumption, from memory: the stored energy of
 * bainite is about 400 J/mol (H.K.D.H. Bhadeshia, Bainite in Steels, 2nd ed. 2001 — value, edition
 * and year from memory), against h_γ − h_α ≈ 6600 J/mol at
 * 800 K, i.e. about 6 %; rounded to 0.05. No confirmed published latent heat exists.
 */
export const DEFAULT_BAINITE_STORED_FRACTION = 0.05;

/**
 * Default stored-energy fraction of martensite [–]. Assumption, from memory: about 700 J/mol is
 * stored in martensite (carbon supersaturation, dislocations, twin and lath interfaces), against
 * h_γ − h_α ≈ 7500 J/mol at 650 K, i.e. about 9 %; rounded to 0.10.
 */
export const DEFAULT_MARTENSITE_STORED_FRACTION = 0.1;

/** Eutectoid temperature at which Hagel, Pound & Mehl measured the pearlite reaction heat [K] (727 °C). */
export const HAGEL_TEMPERATURE_K = 1000.15;

/**
 * Heat released by austenite → pearlite in plain eutectoid steel at 727 °C [J/kg]:
 * 19.6 cal/g × 4.184 J/cal = 82.0 J/g (Hagel, Pound & Mehl, Acta Metall. 4 (1956) 37).
 * (18 cal/g with 1.85 % Mn or 0.51 % Mo — not modelled.)
 */
export const HAGEL_PEARLITE_HEAT_J_kg = 19.6 * 4.184 * 1000;

/** Mass-specific enthalpy of austenite (fcc Fe) [J/kg]. */
function austeniteEnthalpy_J_kg(T_K: number): number {
  return enthalpyFcc_Jmol(T_K) / IRON_MOLAR_MASS_kg_mol;
}

/** Mass-specific enthalpy of ferrite (bcc Fe) [J/kg]. */
function ferriteEnthalpy_J_kg(T_K: number): number {
  return enthalpyBcc_Jmol(T_K) / IRON_MOLAR_MASS_kg_mol;
}

/**
 * Constant offset of pearlite below ferrite [J/kg]:
 *   Δh_P = q_Hagel − [h_γ(1000.15 K) − h_α(1000.15 K)] ≈ 82.0 − 67.4 = 14.6 kJ/kg.
 * Pearlite model (choice documented here): h_P(T) = h_α(T) − Δh_P, i.e. ferrite enthalpy plus a
 * temperature-independent term for taking the carbon out of austenite into cementite. Then
 * c_p,P = c_p,α (cementite's c_p per kg taken equal to ferrite's — assumption) and
 * h_γ − h_P = 82 J/g exactly at 727 °C (Hagel, Pound & Mehl 1956). The alternative, scaling
 * h_γ − h_α by 82/67.4 ≈ 1.22, would inflate the ferrite's magnetic c_p peak by 22 %.
 */
export const PEARLITE_ENTHALPY_OFFSET_J_kg =
  HAGEL_PEARLITE_HEAT_J_kg - (austeniteEnthalpy_J_kg(HAGEL_TEMPERATURE_K) - ferriteEnthalpy_J_kg(HAGEL_TEMPERATURE_K));

function storedFraction(value: number | undefined, fallback: number, name: string): number {
  const f = value ?? fallback;
  if (!(f >= 0 && f <= 1)) throw new RangeError(`${name} must lie in [0, 1], got ${f}`);
  return f;
}

/** Stored-energy fraction of bainite or martensite from the options or the defaults [–]. */
function displaciveStoredFraction(phase: number, opts: PhaseThermoOptions | undefined): number {
  return phase === BAINITE
    ? storedFraction(opts?.bainiteStoredFraction, DEFAULT_BAINITE_STORED_FRACTION, "bainiteStoredFraction")
    : storedFraction(opts?.martensiteStoredFraction, DEFAULT_MARTENSITE_STORED_FRACTION, "martensiteStoredFraction");
}

function checkPhase(phase: number): void {
  if (!(phase >= 0 && phase < PHASES.length && Number.isInteger(phase))) throw new RangeError(`unknown phase index ${phase}`);
}

/**
 * Specific enthalpy of one phase [J/kg], reference bcc Fe at 298.15 K (SGTE SER), at T_K [K]:
 *   austenite  h_γ = H_fcc / M_Fe                      (Dinsdale 1991)
 *   ferrite    h_α = H_bcc / M_Fe                      (Dinsdale 1991)
 *   pearlite   h_P = h_α − Δh_P, see {@link PEARLITE_ENTHALPY_OFFSET_J_kg} (Hagel, Pound & Mehl 1956)
 *   bainite    h_B = h_γ − (1 − s_B)(h_γ − h_α),  s_B stored fraction (assumption, from memory)
 *   martensite h_M = h_γ − (1 − s_M)(h_γ − h_α),  s_M stored fraction (assumption, from memory)
 * Validity: 298.15–1811 K (SGTE). Throws RangeError for an unknown phase or a stored fraction
 * outside [0, 1] (a configuration error, not a model extrapolation).
 */
export function phaseEnthalpy_J_kg(phase: number, T_K: number, opts?: PhaseThermoOptions): number {
  checkPhase(phase);
  if (phase === AUSTENITE) return austeniteEnthalpy_J_kg(T_K);
  if (phase === FERRITE) return ferriteEnthalpy_J_kg(T_K);
  if (phase === PEARLITE) return ferriteEnthalpy_J_kg(T_K) - PEARLITE_ENTHALPY_OFFSET_J_kg;
  const s = displaciveStoredFraction(phase, opts);
  const hGamma = austeniteEnthalpy_J_kg(T_K);
  return hGamma - (1 - s) * (hGamma - ferriteEnthalpy_J_kg(T_K));
}

/**
 * Specific heat of one phase [J/(kg·K)], the exact temperature derivative of
 * {@link phaseEnthalpy_J_kg}: c_γ = c_p,fcc/M_Fe, c_α = c_P = c_p,bcc/M_Fe,
 * c_B,M = c_γ − (1 − s)(c_γ − c_α). Ferrite, pearlite, bainite and martensite inherit the jump of
 * the bcc magnetic c_p at the Curie point 1043 K (H stays continuous). Validity: 298.15–1811 K.
 */
export function phaseSpecificHeat_J_kgK(phase: number, T_K: number, opts?: PhaseThermoOptions): number {
  checkPhase(phase);
  const cAlpha = heatCapacityBcc_JmolK(T_K) / IRON_MOLAR_MASS_kg_mol;
  if (phase === FERRITE || phase === PEARLITE) return cAlpha;
  const cGamma = heatCapacityFcc_JmolK(T_K) / IRON_MOLAR_MASS_kg_mol;
  if (phase === AUSTENITE) return cGamma;
  const s = displaciveStoredFraction(phase, opts);
  return cGamma - (1 - s) * (cGamma - cAlpha);
}

/**
 * Austenite conductivity, EN 1993-1-2:2005 §3.4.1.3 plateau for 800–1200 °C [W/(m·K)]; austenite
 * ≈ 26–30 and nearly carbon-independent above 850 °C (BISRA 1953 compilation, from memory).
 */
export const AUSTENITE_CONDUCTIVITY_W_mK = 27.3;

/** Carbon content of ferrite assigned for conductivity [wt%] (Fe–C diagram, ≈ 0.02 %C). */
export const FERRITE_CARBON_wt = 0.02;
/** Carbon content of pearlite assigned for conductivity [wt%] (eutectoid, Fe–Fe₃C diagram). */
export const PEARLITE_CARBON_wt = 0.77;

/**
 * Room-temperature (20 °C) conductivity of a plain-carbon ferrite–pearlite steel [W/(m·K)]:
 *   k₂₀(C) = 65.76 − 22.80·C     (C in wt%)
 * Least-squares line through the Heat and Mass Transfer Data Book values at 20 °C (physics.md §3
 * [pub]; author, edition and year are not recorded there — to be completed): AISI 1010
 * (≈ 0.10 %C, nominal — common practice (no source)) 63.9, 0.5 %C 53.6, 1.0 %C 43.3; residuals
 * ≤ 1.5 %. Valid for plain C steels (Mn ≤ 1 %, Si ≤ 0.1 %), 0.02–1.0 %C; Mn and Si lower k
 * further and are not represented.
 */
export function ferritePearliteConductivity20C_W_mK(carbon_wt: number): number {
  return 65.76 - 22.8 * carbon_wt;
}

/** EN 1993-1-2:2005 §3.4.1.3 carbon-steel conductivity [W/(m·K)], θ in °C: 54 − 3.33e−2 θ below 800 °C, 27.3 above. */
export function eurocodeSteelConductivity_W_mK(theta_C: number): number {
  return theta_C < 800 ? 54 - 3.33e-2 * theta_C : AUSTENITE_CONDUCTIVITY_W_mK;
}

/**
 * Conductivity of a ferritic (bcc-based) aggregate of carbon content C at θ = T − 273.15 [°C]:
 *   k(θ, C) = k_EN(θ) + [k₂₀(C) − k_EN(20)]·(800 − θ)/780     for θ < 800 °C
 *   k(θ, C) = 27.3                                           for θ ≥ 800 °C
 * i.e. the EN 1993-1-2 curve, shifted at 20 °C to the Data Book value for that carbon, with the
 * shift fading linearly to zero at 800 °C, where carbon steels' conductivities converge (BISRA
 * compilation — from memory; the EN curve itself makes no carbon distinction).
 */
function ferriticConductivity_W_mK(theta_C: number, carbon_wt: number): number {
  if (theta_C >= 800) return AUSTENITE_CONDUCTIVITY_W_mK;
  const shift = ferritePearliteConductivity20C_W_mK(carbon_wt) - eurocodeSteelConductivity_W_mK(20);
  return eurocodeSteelConductivity_W_mK(theta_C) + (shift * (800 - theta_C)) / 780;
}

/**
 * Thermal conductivity of one phase [W/(m·K)] at T_K [K]; carbon_wt is the steel's carbon [wt%].
 *   austenite: 27.3, constant (EN 1993-1-2:2005 plateau 800–1200 °C; austenite ≈ 26–30 and nearly
 *     carbon-independent, BISRA — from memory). Below 800 °C (metastable austenite) the constant
 *     is extrapolated (assumption; real austenite is probably a little lower there).
 *   ferrite:    ferritic aggregate at C = 0.02 (its own carbon)
 *   pearlite:   ferritic aggregate at C = 0.77 (eutectoid)
 *     — because k₂₀ is linear in C, the lever-rule mixture of ferrite and pearlite reproduces the
 *       aggregate value of the steel's carbon.
 *   bainite, martensite: ferritic aggregate at the steel's carbon (carbon stays in the product;
 *     the extra lattice distortion of martensite is not represented — assumption).
 * Validity: ferritic phases 20–800 °C, austenite 800–1200 °C (see {@link checkPhaseConductivityRange}).
 */
export function phaseConductivity_W_mK(phase: number, T_K: number, carbon_wt: number): number {
  checkPhase(phase);
  if (phase === AUSTENITE) return AUSTENITE_CONDUCTIVITY_W_mK;
  const theta_C = T_K - 273.15;
  if (phase === FERRITE) return ferriticConductivity_W_mK(theta_C, FERRITE_CARBON_wt);
  if (phase === PEARLITE) return ferriticConductivity_W_mK(theta_C, PEARLITE_CARBON_wt);
  return ferriticConductivity_W_mK(theta_C, carbon_wt);
}

/**
 * Pushes a {@link ValidityWarning} when T lies outside the sourced range of the phase's
 * conductivity: 20–800 °C for ferrite, pearlite, bainite, martensite; 800–1200 °C for austenite
 * (EN 1993-1-2:2005 §3.4.1.3). Returns `out`.
 */
export function checkPhaseConductivityRange(phase: number, T_K: number, out: ValidityWarning[]): ValidityWarning[] {
  checkPhase(phase);
  const austenite = phase === AUSTENITE;
  const min = austenite ? 1073.15 : 293.15;
  const max = austenite ? 1473.15 : 1073.15;
  if (T_K < min || T_K > max) {
    out.push({ kind: "validity", model: `${PHASES[phase]} conductivity (EN 1993-1-2:2005)`, quantity: "temperature", value: T_K, min, max, unit: "K" });
  }
  return out;
}
