/**
 * Critical temperatures of low-alloy steels from empirical composition formulas: Ae1, Ae3
 * (equilibrium), Bs (bainite start), Ms (martensite start) and Ar3 (ferrite start on slow cooling).
 * All compositions in wt%, all results in °C (these are edge quantities; convert to K at the
 * caller). Each formula warns (never clamps) when the composition lies outside its fitted range.
 */
import { checkRanges, type Composition, type Element, type ValidityWarning } from "./composition.js";

type Ranges = Partial<Record<Element, readonly [number, number]>>;

/**
 * Composition range of the steels behind Andrews' Ae1/Ae3 regressions [wt%]
 * (K.W. Andrews, JISI 203 (1965) 721) — from memory, not checked against the paper:
 * low-alloy steels with C ≤ 0.6, Mn ≤ 4.9, Si ≤ 1.9, Ni ≤ 5.0, Cr ≤ 5.0, Mo ≤ 5.4.
 */
export const ANDREWS_AE_RANGES_wt: Ranges = { C: [0, 0.6], Mn: [0, 4.9], Si: [0, 1.9], Ni: [0, 5], Cr: [0, 5], Mo: [0, 5.4] };

/**
 * Composition range for Andrews' linear Ms [wt%] (Andrews 1965) — from memory, not checked:
 * C 0.11–0.6, Mn ≤ 4.9, Si ≤ 1.9, Ni ≤ 5.0, Cr ≤ 5.0, Mo ≤ 5.4.
 */
export const ANDREWS_MS_RANGES_wt: Ranges = { C: [0.11, 0.6], Mn: [0, 4.9], Si: [0, 1.9], Ni: [0, 5], Cr: [0, 5], Mo: [0, 5.4] };

/**
 * Composition range of the 65 steels of Steven & Haynes (JISI 183 (1956) 349) [wt%] — from memory,
 * not checked: C 0.1–0.55, Mn 0.2–1.7, Ni ≤ 5.0, Cr ≤ 3.5, Mo ≤ 1.0.
 */
export const STEVEN_HAYNES_RANGES_wt: Ranges = { C: [0.1, 0.55], Mn: [0.2, 1.7], Ni: [0, 5], Cr: [0, 3.5], Mo: [0, 1] };

/**
 * No range is published for the Bs form used with Li et al. (1998). Assumption: the Steven–Haynes
 * range (same kind of hardenable low-alloy steels), so that leaner or richer steels are flagged.
 */
export const LI_BS_RANGES_wt: Ranges = STEVEN_HAYNES_RANGES_wt;

/**
 * Composition range of Ouchi et al.'s Ar3 data [wt%] — from memory, low confidence: C 0.04–0.17,
 * Mn 0.4–1.5, Cu ≤ 0.5, Cr ≤ 0.5, Ni ≤ 0.5, Mo ≤ 0.3 (controlled-rolled plate steels).
 */
export const OUCHI_AR3_RANGES_wt: Ranges = { C: [0.04, 0.17], Mn: [0.4, 1.5], Cu: [0, 0.5], Cr: [0, 0.5], Ni: [0, 0.5], Mo: [0, 0.3] };

/**
 * Ae1, lower equilibrium critical temperature [°C] (K.W. Andrews, JISI 203 (1965) 721):
 *   Ae1 = 723 − 10.7Mn − 16.9Ni + 29.1Si + 16.9Cr + 290As + 6.38W     (wt%)
 * Validity: {@link ANDREWS_AE_RANGES_wt} (from memory).
 */
export function andrewsAe1_C(c: Composition): number {
  return 723 - 10.7 * c.Mn - 16.9 * c.Ni + 29.1 * c.Si + 16.9 * c.Cr + 290 * c.As + 6.38 * c.W;
}

/**
 * Ae3, upper equilibrium critical temperature, 7-term form [°C] (Andrews 1965):
 *   Ae3 = 910 − 203√C − 15.2Ni + 44.7Si + 104V + 31.5Mo + 13.1W     (wt%)
 * Validity: {@link ANDREWS_AE_RANGES_wt} (from memory).
 */
export function andrewsAe3_C(c: Composition): number {
  return 910 - 203 * Math.sqrt(c.C) - 15.2 * c.Ni + 44.7 * c.Si + 104 * c.V + 31.5 * c.Mo + 13.1 * c.W;
}

/**
 * Ae3 with Andrews' extension terms [°C] (Andrews 1965):
 *   Ae3 = 7-term form − 30Mn − 11Cr − 20Cu + 700P + 400Al + 120As + 400Ti     (wt%)
 * Signs as in physics.md §4 (Al, P, Ti raise A3; Mn, Cr, Cu lower it); secondary sources print
 * them inconsistently. Near the eutectoid this Ae3 can fall below Ae1 — the caller must then give
 * zero equilibrium ferrite. Validity: {@link ANDREWS_AE_RANGES_wt} (from memory).
 */
export function andrewsAe3Extended_C(c: Composition): number {
  return andrewsAe3_C(c) - 30 * c.Mn - 11 * c.Cr - 20 * c.Cu + 700 * c.P + 400 * c.Al + 120 * c.As + 400 * c.Ti;
}

/**
 * Martensite start, Andrews' linear formula [°C] (Andrews 1965):
 *   Ms = 539 − 423C − 30.4Mn − 17.7Ni − 12.1Cr − 7.5Mo     (wt%)
 * Validity: {@link ANDREWS_MS_RANGES_wt} (from memory).
 */
export function andrewsMs_C(c: Composition): number {
  return 539 - 423 * c.C - 30.4 * c.Mn - 17.7 * c.Ni - 12.1 * c.Cr - 7.5 * c.Mo;
}

/**
 * Bainite start [°C] (W. Steven & A.G. Haynes, JISI 183 (1956) 349; regression on 65 steels):
 *   Bs = 830 − 270C − 90Mn − 37Ni − 70Cr − 83Mo     (wt%)
 * Validity: {@link STEVEN_HAYNES_RANGES_wt} (from memory).
 */
export function stevenHaynesBs_C(c: Composition): number {
  return 830 - 270 * c.C - 90 * c.Mn - 37 * c.Ni - 70 * c.Cr - 83 * c.Mo;
}

/**
 * Bainite start as used with the Li et al. (1998) kinetics [°C] (Li, Niebuhr, Meekisho &
 * Atteridge, Metall. Mater. Trans. B 29B (1998) 661, as implemented in several independent codes):
 *   Bs = 637 − 58C − 35Mn − 15Ni − 34Cr − 41Mo     (wt%)
 * It resembles the Kirkaldy–Venugopalan (1984) Bs, 656 − 58C − 35Mn − 75Si − 15Ni − 34Cr − 41Mo
 * (from memory), without the Si term and with a lower constant. Validity: none published;
 * {@link LI_BS_RANGES_wt} (assumption).
 */
export function liBs_C(c: Composition): number {
  return 637 - 58 * c.C - 35 * c.Mn - 15 * c.Ni - 34 * c.Cr - 41 * c.Mo;
}

/**
 * Ar3, start of ferrite on slow (air) cooling of plate [°C] (Ouchi, Sampei & Kozasu, Trans. ISIJ
 * 22 (1982) 214 — from memory, not checked):
 *   Ar3 = 910 − 310C − 80Mn − 20Cu − 15Cr − 55Ni − 80Mo + 0.35(t − 8)     (wt%, t in mm)
 * Validity: {@link OUCHI_AR3_RANGES_wt} (from memory); plate thickness about 8–30 mm (from memory).
 */
export function ouchiAr3_C(c: Composition, thickness_mm: number): number {
  return 910 - 310 * c.C - 80 * c.Mn - 20 * c.Cu - 15 * c.Cr - 55 * c.Ni - 80 * c.Mo + 0.35 * (thickness_mm - 8);
}

/** Which Ae3 and Bs formula {@link criticalTemperatures} uses. */
export interface CriticalTemperatureChoice {
  readonly ae3: "andrews" | "andrews-extended";
  readonly bs: "steven-haynes" | "li";
}

/** Critical temperatures of one steel [°C] and the validity warnings of the formulas used. */
export interface CriticalTemperatures {
  readonly Ae3_C: number;
  readonly Ae1_C: number;
  readonly Bs_C: number;
  readonly Ms_C: number;
  readonly warnings: ValidityWarning[];
}

/**
 * Ae3, Ae1, Bs and Ms [°C] of a composition with the chosen formulas, plus a
 * {@link ValidityWarning} for every element outside each used formula's range. Never clamps.
 */
export function criticalTemperatures(comp: Composition, choice: CriticalTemperatureChoice): CriticalTemperatures {
  const warnings: ValidityWarning[] = [];
  const extended = choice.ae3 === "andrews-extended";
  checkRanges(extended ? "Andrews Ae3 with extension terms (1965)" : "Andrews Ae3 (1965)", comp, ANDREWS_AE_RANGES_wt, warnings);
  checkRanges("Andrews Ae1 (1965)", comp, ANDREWS_AE_RANGES_wt, warnings);
  const li = choice.bs === "li";
  checkRanges(li ? "Bs used with Li et al. (1998)" : "Steven & Haynes Bs (1956)", comp, li ? LI_BS_RANGES_wt : STEVEN_HAYNES_RANGES_wt, warnings);
  checkRanges("Andrews Ms (1965)", comp, ANDREWS_MS_RANGES_wt, warnings);
  return {
    Ae3_C: extended ? andrewsAe3Extended_C(comp) : andrewsAe3_C(comp),
    Ae1_C: andrewsAe1_C(comp),
    Bs_C: li ? liBs_C(comp) : stevenHaynesBs_C(comp),
    Ms_C: andrewsMs_C(comp),
    warnings,
  };
}

/** Pushes a warning for each element outside Ouchi's range and for a thickness outside 8–30 mm (from memory). */
export function checkOuchiAr3Range(comp: Composition, thickness_mm: number, out: ValidityWarning[]): ValidityWarning[] {
  const model = "Ouchi et al. Ar3 (1982)";
  checkRanges(model, comp, OUCHI_AR3_RANGES_wt, out);
  if (thickness_mm < 8 || thickness_mm > 30) out.push({ kind: "validity", model, quantity: "thickness", value: thickness_mm, min: 8, max: 30, unit: "mm" });
  return out;
}
