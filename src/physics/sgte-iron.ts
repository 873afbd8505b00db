/**
 * Thermodynamics of pure iron: Gibbs energy, enthalpy and heat capacity of bcc (α/δ) and fcc (γ)
 * Fe from the SGTE unary database, with the Inden–Hillert–Jarl magnetic term, and the dilute
 * Fe–C driving force for ferrite.
 *
 * Source: A.T. Dinsdale, "SGTE data for pure elements", CALPHAD 15 (1991) 317–425. Per mole of
 * atoms, relative to the stable element reference (SER, bcc Fe at 298.15 K and 1 bar).
 * Validity: 298.15 ≤ T ≤ 1811 K (the polynomial's published interval); outside it the functions
 * still return the polynomial's value (an extrapolation) — use {@link checkSgteIronRange}.
 *
 * Non-magnetic part, G = a + bT + cT lnT + dT² + eT³ + f/T  [J/mol], so that
 *   H = a − cT − dT² − 2eT³ + 2f/T,   c_p = −c − 2dT − 6eT² − 2f/T².
 *
 * Magnetic part (Inden 1976 as simplified by Hillert & Jarl, CALPHAD 2 (1978) 227 [both citations
 * from memory]; the form SGTE uses, as given by Dinsdale 1991), τ = T/T*:
 *   G_mag = R T ln(β + 1) g(τ)
 *   A = 518/1125 + (11692/15975)(1/p − 1)      (11692, not the 11592 misprint circulating in code)
 *   τ < 1: g = 1 − [79/(140 p τ) + K(τ³/6 + τ⁹/135 + τ¹⁵/600)]/A,   K = (474/497)(1/p − 1)
 *   τ ≥ 1: g = −[τ⁻⁵/10 + τ⁻¹⁵/315 + τ⁻²⁵/1500]/A
 * and from H = −T² ∂(G/T)/∂T, c_p = ∂H/∂T:
 *   τ < 1: H_mag = −R ln(β+1) T* [79/(140p) − K(τ⁴/2 + τ¹⁰/15 + τ¹⁶/40)]/A
 *          c_p,mag = R ln(β+1) K (2τ³ + 2τ⁹/3 + 2τ¹⁵/5)/A
 *   τ ≥ 1: H_mag = −R ln(β+1) T* [τ⁻⁴/2 + τ⁻¹⁴/21 + τ⁻²⁴/60]/A
 *          c_p,mag = R ln(β+1) (2τ⁻⁵ + 2τ⁻¹⁵/3 + 2τ⁻²⁵/5)/A
 * H_mag is continuous at τ = 1; c_p,mag jumps there (a property of the model).
 */
import type { ValidityWarning } from "./composition.js";

/** Molar gas constant [J/(mol·K)] (CODATA 2018, exact). */
export const GAS_CONSTANT_J_molK = 8.314462618;
/** Molar mass of iron [kg/mol] (IUPAC standard atomic weight 55.845). */
export const IRON_MOLAR_MASS_kg_mol = 0.055845;
/** Molar mass of carbon [kg/mol] (IUPAC conventional atomic weight 12.011). */
export const CARBON_MOLAR_MASS_kg_mol = 0.012011;

/** Lower end of the SGTE polynomial interval for Fe [K] (Dinsdale 1991). */
export const SGTE_IRON_T_MIN_K = 298.15;
/** Upper end of the SGTE polynomial interval for Fe (melting point) [K] (Dinsdale 1991). */
export const SGTE_IRON_T_MAX_K = 1811;

// Non-magnetic bcc Fe, 298.15–1811 K [J/mol] (Dinsdale 1991).
const BCC_A = 1225.7;
const BCC_B = 124.134;
const BCC_C = -23.5143;
const BCC_D = -0.00439752;
const BCC_E = -5.8927e-8;
const BCC_F = 77359;

// fcc − bcc lattice stability, 298.15–1811 K [J/mol] (Dinsdale 1991): −1462.4 + 8.282T − 1.15T lnT + 6.4e−4T².
const FCC_A = BCC_A - 1462.4;
const FCC_B = BCC_B + 8.282;
const FCC_C = BCC_C - 1.15;
const FCC_D = BCC_D + 6.4e-4;
const FCC_E = BCC_E;
const FCC_F = BCC_F;

// Magnetic parameters (Dinsdale 1991): bcc ferromagnetic, Curie T_C = 1043 K, β = 2.22 μB, p = 0.40;
// fcc antiferromagnetic, Néel T_N = 67 K, β = 0.7 μB, p = 0.28.
/** Curie temperature of bcc iron in the SGTE description [K]. */
export const IRON_CURIE_K = 1043;
const BCC_BETA = 2.22;
const BCC_P = 0.4;
const FCC_NEEL_K = 67;
const FCC_BETA = 0.7;
const FCC_P = 0.28;

function ihjA(p: number): number {
  return 518 / 1125 + (11692 / 15975) * (1 / p - 1);
}
function ihjK(p: number): number {
  return (474 / 497) * (1 / p - 1);
}

/** Magnetic Gibbs energy G_mag = R T ln(β+1) g(T/T*) [J/mol]. */
function magneticGibbs_Jmol(T_K: number, Tstar_K: number, beta: number, p: number): number {
  const tau = T_K / Tstar_K;
  const A = ihjA(p);
  let g: number;
  if (tau < 1) {
    const t3 = tau * tau * tau;
    const t9 = t3 * t3 * t3;
    const t15 = t9 * t3 * t3;
    g = 1 - (79 / (140 * p * tau) + ihjK(p) * (t3 / 6 + t9 / 135 + t15 / 600)) / A;
  } else {
    const t5 = tau ** -5;
    const t15 = t5 * t5 * t5;
    const t25 = t15 * t5 * t5;
    g = -(t5 / 10 + t15 / 315 + t25 / 1500) / A;
  }
  return GAS_CONSTANT_J_molK * T_K * Math.log(beta + 1) * g;
}

/** Magnetic enthalpy H_mag = −R ln(β+1) T* τ² g'(τ) [J/mol]. */
function magneticEnthalpy_Jmol(T_K: number, Tstar_K: number, beta: number, p: number): number {
  const tau = T_K / Tstar_K;
  const A = ihjA(p);
  const scale = -GAS_CONSTANT_J_molK * Math.log(beta + 1) * Tstar_K / A;
  if (tau < 1) {
    const t4 = tau ** 4;
    const t10 = tau ** 10;
    const t16 = tau ** 16;
    return scale * (79 / (140 * p) - ihjK(p) * (t4 / 2 + t10 / 15 + t16 / 40));
  }
  return scale * (tau ** -4 / 2 + tau ** -14 / 21 + tau ** -24 / 60);
}

/** Magnetic heat capacity c_p,mag = dH_mag/dT [J/(mol·K)]. */
function magneticHeatCapacity_JmolK(T_K: number, Tstar_K: number, beta: number, p: number): number {
  const tau = T_K / Tstar_K;
  const scale = GAS_CONSTANT_J_molK * Math.log(beta + 1) / ihjA(p);
  if (tau < 1) return scale * ihjK(p) * (2 * tau ** 3 + (2 * tau ** 9) / 3 + (2 * tau ** 15) / 5);
  return scale * (2 * tau ** -5 + (2 * tau ** -15) / 3 + (2 * tau ** -25) / 5);
}

function polyGibbs(T: number, a: number, b: number, c: number, d: number, e: number, f: number): number {
  return a + b * T + c * T * Math.log(T) + d * T * T + e * T * T * T + f / T;
}
function polyEnthalpy(T: number, a: number, c: number, d: number, e: number, f: number): number {
  return a - c * T - d * T * T - 2 * e * T * T * T + (2 * f) / T;
}
function polyHeatCapacity(T: number, c: number, d: number, e: number, f: number): number {
  return -c - 2 * d * T - 6 * e * T * T - (2 * f) / (T * T);
}

/** Gibbs energy of bcc Fe incl. magnetic term [J/mol], SER reference; 298.15–1811 K (Dinsdale 1991). */
export function gibbsBcc_Jmol(T_K: number): number {
  return polyGibbs(T_K, BCC_A, BCC_B, BCC_C, BCC_D, BCC_E, BCC_F) + magneticGibbs_Jmol(T_K, IRON_CURIE_K, BCC_BETA, BCC_P);
}

/** Gibbs energy of fcc Fe incl. magnetic term [J/mol], SER reference; 298.15–1811 K (Dinsdale 1991). */
export function gibbsFcc_Jmol(T_K: number): number {
  return polyGibbs(T_K, FCC_A, FCC_B, FCC_C, FCC_D, FCC_E, FCC_F) + magneticGibbs_Jmol(T_K, FCC_NEEL_K, FCC_BETA, FCC_P);
}

/** Enthalpy of bcc Fe incl. magnetic term [J/mol], SER reference; 298.15–1811 K (Dinsdale 1991). */
export function enthalpyBcc_Jmol(T_K: number): number {
  return polyEnthalpy(T_K, BCC_A, BCC_C, BCC_D, BCC_E, BCC_F) + magneticEnthalpy_Jmol(T_K, IRON_CURIE_K, BCC_BETA, BCC_P);
}

/** Enthalpy of fcc Fe incl. magnetic term [J/mol], SER reference; 298.15–1811 K (Dinsdale 1991). */
export function enthalpyFcc_Jmol(T_K: number): number {
  return polyEnthalpy(T_K, FCC_A, FCC_C, FCC_D, FCC_E, FCC_F) + magneticEnthalpy_Jmol(T_K, FCC_NEEL_K, FCC_BETA, FCC_P);
}

/**
 * Isobaric heat capacity of bcc Fe incl. magnetic term [J/(mol·K)]; 298.15–1811 K (Dinsdale 1991).
 * At exactly T = 1043 K the value above the Curie point is returned (the model's c_p jumps there).
 */
export function heatCapacityBcc_JmolK(T_K: number): number {
  return polyHeatCapacity(T_K, BCC_C, BCC_D, BCC_E, BCC_F) + magneticHeatCapacity_JmolK(T_K, IRON_CURIE_K, BCC_BETA, BCC_P);
}

/** Isobaric heat capacity of fcc Fe incl. magnetic term [J/(mol·K)]; 298.15–1811 K (Dinsdale 1991). */
export function heatCapacityFcc_JmolK(T_K: number): number {
  return polyHeatCapacity(T_K, FCC_C, FCC_D, FCC_E, FCC_F) + magneticHeatCapacity_JmolK(T_K, FCC_NEEL_K, FCC_BETA, FCC_P);
}

/**
 * Carbon mole fraction x₀ of a binary Fe–C alloy from its carbon mass percent [wt%] (the other
 * elements are counted as iron): x₀ = (w/M_C) / (w/M_C + (100 − w)/M_Fe)  [–].
 */
export function carbonMoleFraction(carbon_wt: number): number {
  const nC = carbon_wt / CARBON_MOLAR_MASS_kg_mol;
  const nFe = (100 - carbon_wt) / IRON_MOLAR_MASS_kg_mol;
  return nC / (nC + nFe);
}

/**
 * Driving force for nucleating nearly carbon-free ferrite from austenite of carbon content
 * carbon_wt [wt%], per mole of atoms [J/mol]; negative = ferrite can form.
 *
 *   ΔG_m ≈ [G_bcc(T) − G_fcc(T)]_Fe + R T x₀/(1 − x₀)
 *
 * Dilute (Henrian, ideal interstitial) approximation for Fe–C; it agrees within a few J/mol with
 * the two-sublattice Fe–C description (Gustafson, Scand. J. Metall. 14 (1985) 259 [citation from
 * memory]) at 0.1–0.2 %C (physics.md §2 [calc]). Substitutional alloying is ignored, so for Mn
 * steels |ΔG| is an upper bound. Validity: T in 298.15–1811 K, dilute carbon (about ≤ 0.8 wt%).
 */
export function ferriteDrivingForce_Jmol(T_K: number, carbon_wt: number): number {
  const x0 = carbonMoleFraction(carbon_wt);
  return gibbsBcc_Jmol(T_K) - gibbsFcc_Jmol(T_K) + (GAS_CONSTANT_J_molK * T_K * x0) / (1 - x0);
}

/**
 * Pure-iron A3 temperature [K]: the root of G_fcc(T) = G_bcc(T) between 1000 and 1400 K, found by
 * bisection to 1e−9 K. The SGTE data give ≈ 1184.81 K (handbook A3 of iron 912 °C = 1185.15 K).
 */
export function pureIronA3_K(): number {
  let lo = 1000; // fcc − bcc > 0 here (bcc stable)
  let hi = 1400; // fcc − bcc < 0 here (fcc stable)
  const fLo = gibbsFcc_Jmol(lo) - gibbsBcc_Jmol(lo);
  if (!(fLo > 0) || !(gibbsFcc_Jmol(hi) - gibbsBcc_Jmol(hi) < 0)) throw new Error("pureIronA3_K: root not bracketed");
  while (hi - lo > 1e-9) {
    const mid = 0.5 * (lo + hi);
    if (gibbsFcc_Jmol(mid) - gibbsBcc_Jmol(mid) > 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * Pushes a {@link ValidityWarning} when T lies outside the SGTE polynomial interval for Fe,
 * 298.15–1811 K (Dinsdale 1991); returns `out`.
 */
export function checkSgteIronRange(T_K: number, out: ValidityWarning[]): ValidityWarning[] {
  if (T_K < SGTE_IRON_T_MIN_K || T_K > SGTE_IRON_T_MAX_K) {
    out.push({ kind: "validity", model: "SGTE unary Fe (Dinsdale 1991)", quantity: "temperature", value: T_K, min: SGTE_IRON_T_MIN_K, max: SGTE_IRON_T_MAX_K, unit: "K" });
  }
  return out;
}
