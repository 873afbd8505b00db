/**
 * Vickers hardness of the transformation products from composition and cooling rate, their
 * fraction-weighted mixture, and a named hardness → tensile-strength conversion.
 *
 * Source: P. Maynier, B. Jungmann & J. Dollet, "Creusot-Loire system for the prediction of the
 * mechanical properties of low alloy steel products", in Hardenability Concepts with Applications
 * to Steel, D.V. Doane & J.S. Kirkaldy (eds.), AIME (1978). Coefficients: stated by this module's
 * author to be reproduced identically in several independent public sources (the example given,
 * Scand. J. Metall. 33 (2004) 98, is cited from memory and was not re-checked in the audit).
 * physics.md does not list these equations, so their [pub] status rests on this note alone until
 * they are added there with check values. Composition in wt%, V_r = cooling rate at 700 °C in
 * °C/h, log = log10:
 *
 *   HV_M  = 127 + 949C + 27Si + 11Mn + 8Ni + 16Cr + 21 log V_r
 *   HV_B  = −323 + 185C + 330Si + 153Mn + 65Ni + 144Cr + 191Mo
 *           + (89 + 53C − 55Si − 22Mn − 10Ni − 20Cr − 33Mo) log V_r
 *   HV_FP = 42 + 223C + 53Si + 30Mn + 12.6Ni + 7Cr + 19Mo + (10 − 19Si + 4Ni + 8Cr + 130V) log V_r
 *   HV    = X_M HV_M + X_B HV_B + (X_F + X_P) HV_FP
 *
 * Confidence: coefficients as above (not in physics.md); the validity range below is from
 * memory (C 0.1–0.5, Si ≤ 1, Mn ≤ 2, Ni ≤ 4, Cr ≤ 3, Mo ≤ 1, V ≤ 0.2, Mn + Ni + Cr + Mo ≤ 5 wt%).
 * Lean strip grades (C < 0.1) lie outside it and get a warning.
 */
import { checkRanges, type Composition, type ValidityWarning } from "./composition.js";
import { AUSTENITE, BAINITE, FERRITE, MARTENSITE, PEARLITE, PHASE_COUNT } from "./phases.js";
import { ModelInputError } from "./grain-floor.js";

const MODEL = "Maynier–Jungmann–Dollet hardness (1978)";
const SECONDS_PER_HOUR = 3600;

/** Composition range of the Maynier equations [wt%] (from memory, unconfirmed). */
export const MAYNIER_RANGES: Readonly<Partial<Record<keyof Composition, readonly [number, number]>>> = {
  C: [0.1, 0.5],
  Si: [0, 1],
  Mn: [0, 2],
  Ni: [0, 4],
  Cr: [0, 3],
  Mo: [0, 1],
  V: [0, 0.2],
};
/** Upper bound of Mn + Ni + Cr + Mo for the Maynier equations [wt%] (from memory). */
export const MAYNIER_SUM_MAX_wt = 5;

/** log10 of the cooling rate at 700 °C expressed in °C/h (Maynier's V_r). */
function logMaynierRate(coolingRateAt700C_K_s: number): number {
  if (!(coolingRateAt700C_K_s > 0) || !Number.isFinite(coolingRateAt700C_K_s)) {
    throw new ModelInputError(MODEL, "coolingRateAt700C_K_s", "> 0 K/s", coolingRateAt700C_K_s);
  }
  return Math.log10(coolingRateAt700C_K_s * SECONDS_PER_HOUR);
}

/** Martensite hardness [HV] (Maynier et al. 1978); rate = cooling rate at 700 °C [K/s]. */
export function maynierMartensiteHV(c: Composition, coolingRateAt700C_K_s: number): number {
  const logV = logMaynierRate(coolingRateAt700C_K_s);
  return 127 + 949 * c.C + 27 * c.Si + 11 * c.Mn + 8 * c.Ni + 16 * c.Cr + 21 * logV;
}

/** Bainite hardness [HV] (Maynier et al. 1978); rate = cooling rate at 700 °C [K/s]. */
export function maynierBainiteHV(c: Composition, coolingRateAt700C_K_s: number): number {
  const logV = logMaynierRate(coolingRateAt700C_K_s);
  const base = -323 + 185 * c.C + 330 * c.Si + 153 * c.Mn + 65 * c.Ni + 144 * c.Cr + 191 * c.Mo;
  const slope = 89 + 53 * c.C - 55 * c.Si - 22 * c.Mn - 10 * c.Ni - 20 * c.Cr - 33 * c.Mo;
  return base + slope * logV;
}

/** Ferrite–pearlite hardness [HV] (Maynier et al. 1978); rate = cooling rate at 700 °C [K/s]. */
export function maynierFerritePearliteHV(c: Composition, coolingRateAt700C_K_s: number): number {
  const logV = logMaynierRate(coolingRateAt700C_K_s);
  const base = 42 + 223 * c.C + 53 * c.Si + 30 * c.Mn + 12.6 * c.Ni + 7 * c.Cr + 19 * c.Mo;
  const slope = 10 - 19 * c.Si + 4 * c.Ni + 8 * c.Cr + 130 * c.V;
  return base + slope * logV;
}

/** Pushes a warning for each element (and for Mn + Ni + Cr + Mo) outside the Maynier range. */
export function checkMaynierRanges(c: Composition, out: ValidityWarning[]): ValidityWarning[] {
  checkRanges(MODEL, c, MAYNIER_RANGES, out);
  const sum = c.Mn + c.Ni + c.Cr + c.Mo;
  if (sum > MAYNIER_SUM_MAX_wt) out.push({ kind: "validity", model: MODEL, quantity: "Mn + Ni + Cr + Mo", value: sum, min: 0, max: MAYNIER_SUM_MAX_wt, unit: "wt%" });
  return out;
}

export interface HardnessResult {
  /** Mixture hardness [HV]. */
  readonly hardness_HV: number;
  readonly warnings: ValidityWarning[];
}

/**
 * Fraction-weighted hardness [HV] of a product mixture:
 *   HV = (X_M HV_M + X_B HV_B + (X_F + X_P) HV_FP) / (X_M + X_B + X_F + X_P)
 * `fractions` in PHASES order (austenite, ferrite, pearlite, bainite, martensite), each in [0, 1].
 * Maynier gives no equation for retained austenite: the products are renormalised over the
 * transformed fraction and a ValidityWarning reports any austenite left (expected range 0–0).
 *
 * @throws ModelInputError when fractions has the wrong length, a fraction lies outside [0, 1], or
 *   nothing has transformed.
 */
export function mixtureHardnessHV(c: Composition, coolingRateAt700C_K_s: number, fractions: ArrayLike<number>): HardnessResult {
  if (fractions.length !== PHASE_COUNT) throw new ModelInputError(MODEL, "fractions.length", `${PHASE_COUNT} (PHASES order)`, fractions.length);
  for (let i = 0; i < PHASE_COUNT; i++) {
    if (!(fractions[i] >= 0 && fractions[i] <= 1)) throw new ModelInputError(MODEL, `fractions[${i}]`, "in [0, 1]", fractions[i]);
  }
  const xFP = fractions[FERRITE] + fractions[PEARLITE];
  const xB = fractions[BAINITE];
  const xM = fractions[MARTENSITE];
  const transformed = xFP + xB + xM;
  if (!(transformed > 0)) throw new ModelInputError(MODEL, "fractions", "some transformed product (ferrite, pearlite, bainite or martensite)", transformed);

  const warnings = checkMaynierRanges(c, []);
  const austenite = fractions[AUSTENITE];
  if (austenite > 0) warnings.push({ kind: "validity", model: MODEL, quantity: "retained austenite fraction", value: austenite, min: 0, max: 0, unit: "–" });

  const sum = xM * maynierMartensiteHV(c, coolingRateAt700C_K_s) + xB * maynierBainiteHV(c, coolingRateAt700C_K_s) + xFP * maynierFerritePearliteHV(c, coolingRateAt700C_K_s);
  return { hardness_HV: sum / transformed, warnings };
}

/**
 * Tensile strength from Vickers hardness by the rule TS ≈ 3.3 · HV [MPa] (Tabor-type rule of
 * thumb for carbon and low-alloy steels: TS [kgf/mm²] ≈ HV/3, i.e. 9.807/3 ≈ 3.27 MPa per HV,
 * rounded to 3.3 — common practice (no source)). Scatter of such conversions is about ±10 %; for
 * acceptance use the ISO 18265 tables instead. Validity (common practice): about 100–500 HV.
 */
export const HARDNESS_TO_TENSILE_MPa_per_HV = 3.3;

/** Tensile strength [MPa] from hardness [HV] by the TS ≈ 3.3·HV rule (see the constant's note). */
export function tensileFromHardnessRule_MPa(hardness_HV: number): number {
  return HARDNESS_TO_TENSILE_MPa_per_HV * hardness_HV;
}
