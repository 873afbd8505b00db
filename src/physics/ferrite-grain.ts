/**
 * Ferrite grain size of C–Mn steel from its cooling path: the empirical Hodgson–Gibbs-type relation.
 *
 * Source: P.D. Hodgson & R.K. Gibbs, ISIJ Int. 32 (1992) 1329 [from memory — coefficients as in
 * physics.md §7, which tags them [mem]; one independent public implementation carries the same
 * numbers, but the paper itself has not been checked]:
 *
 *   Ceq = C + Mn/6                                                             [wt%]
 *   Ceq < 0.35: d_α = (−0.4 + 6.37 Ceq) + (24.2 − 59.0 Ceq) Ṫ^−½ + 22 [1 − exp(−0.015 d_γ)]
 *   Ceq ≥ 0.35: d_α = (22.6 − 57.0 Ceq) + 3.0 Ṫ^−½ + 22 [1 − exp(−0.015 d_γ)]
 *   with retained strain ε_r:  d_α ← d_α (1 − 0.45 √ε_r)
 *
 * d_α ferrite grain size [µm] (mean linear intercept), Ṫ cooling rate through the transformation
 * [K/s], d_γ prior austenite grain size [µm], ε_r retained (unrecrystallised) strain [–].
 *
 * Where the cooling rate is taken (this project's convention): Ṫ is the mean cooling rate of the
 * node between the ferrite-start point — the first moment its ferrite fraction reaches 1 % of its
 * final ferrite fraction — and the moment it reaches 50 % of its final ferrite fraction:
 *   Ṫ = (T_start − T_half) / (t_half − t_start).
 * Compute it with {@link transformationCoolingRate_K_s}. This window captures the nucleation-
 * dominated first half of the transformation (which sets the grain count) and excludes the
 * recalescence plateau of the second half. For constant-rate cooling it equals that rate.
 *
 * Fitted range assumed here (from memory, not confirmed against the paper): Ṫ 0.1–100 K/s,
 * Ceq 0.05–0.50 wt%. Outside it a ValidityWarning is returned, the value is still computed.
 */
import type { Composition, ValidityWarning } from "./composition.js";
import { ModelInputError } from "./grain-floor.js";

const MODEL = "Hodgson–Gibbs ferrite grain size (1992)";

/** Assumed fitted cooling-rate range [K/s] (from memory, unconfirmed). */
export const HG_COOLING_RATE_RANGE_K_s: readonly [number, number] = [0.1, 100];
/** Assumed fitted carbon-equivalent range [wt%] (from memory, unconfirmed). */
export const HG_CARBON_EQUIVALENT_RANGE_wt: readonly [number, number] = [0.05, 0.5];

export interface HodgsonGibbsInput {
  /** Ceq = C + Mn/6 [wt%], see {@link carbonEquivalentHG}. */
  readonly carbonEquivalent: number;
  /** Cooling rate through the transformation [K/s], > 0; see {@link transformationCoolingRate_K_s}. */
  readonly coolingRate_K_s: number;
  /** Prior austenite grain size [µm], ≥ 0. */
  readonly austeniteGrain_um: number;
  /** Retained strain in the austenite at transformation [–], in [0, 1]. */
  readonly retainedStrain: number;
}

export interface FerriteGrainResult {
  /** Ferrite grain size (mean linear intercept) [µm]. */
  readonly grain_um: number;
  readonly warnings: ValidityWarning[];
}

/** Carbon equivalent of the Hodgson–Gibbs relation, Ceq = C + Mn/6 [wt%]. */
export function carbonEquivalentHG(comp: Composition): number {
  return comp.C + comp.Mn / 6;
}

/**
 * Mean cooling rate between two points of a node's cooling path [K/s]:
 *   Ṫ = (T_start − T_half) / (t_half − t_start)
 * Intended points: ferrite start (1 % of the final ferrite) and 50 % of the final ferrite (see the
 * file header). The result is ≤ 0 when recalescence heated the node across the window; the
 * empirical relation is then undefined and {@link hodgsonGibbsFerriteGrain_um} refuses it.
 *
 * @throws ModelInputError when t_half ≤ t_start.
 */
export function transformationCoolingRate_K_s(ferriteStart_K: number, ferriteStart_s: number, ferriteHalf_K: number, ferriteHalf_s: number): number {
  if (!(ferriteHalf_s > ferriteStart_s)) {
    throw new ModelInputError(MODEL, "ferriteHalf_s", `> ferriteStart_s = ${ferriteStart_s} s`, ferriteHalf_s);
  }
  return (ferriteStart_K - ferriteHalf_K) / (ferriteHalf_s - ferriteStart_s);
}

function rangeWarning(quantity: string, value: number, range: readonly [number, number], unit: string, out: ValidityWarning[]): void {
  if (value < range[0] || value > range[1]) out.push({ kind: "validity", model: MODEL, quantity, value, min: range[0], max: range[1], unit });
}

/**
 * Ferrite grain size [µm] by the Hodgson–Gibbs relation (formula in the file header).
 *
 * @throws ModelInputError when retainedStrain ∉ [0, 1], coolingRate_K_s ≤ 0, austeniteGrain_um < 0,
 *   or the relation extrapolates to a grain size ≤ 0 (far outside its range).
 */
export function hodgsonGibbsFerriteGrain_um(input: HodgsonGibbsInput): FerriteGrainResult {
  const { carbonEquivalent: ceq, coolingRate_K_s: rate, austeniteGrain_um: dGamma, retainedStrain: strain } = input;
  if (!(strain >= 0 && strain <= 1)) throw new ModelInputError(MODEL, "retainedStrain", "in [0, 1]", strain);
  if (!(rate > 0) || !Number.isFinite(rate)) throw new ModelInputError(MODEL, "coolingRate_K_s", "> 0 K/s (cooling through the transformation)", rate);
  if (!(dGamma >= 0) || !Number.isFinite(dGamma)) throw new ModelInputError(MODEL, "austeniteGrain_um", ">= 0 µm", dGamma);
  if (!Number.isFinite(ceq)) throw new ModelInputError(MODEL, "carbonEquivalent", "a finite wt%", ceq);

  const warnings: ValidityWarning[] = [];
  rangeWarning("cooling rate", rate, HG_COOLING_RATE_RANGE_K_s, "K/s", warnings);
  rangeWarning("Ceq = C + Mn/6", ceq, HG_CARBON_EQUIVALENT_RANGE_wt, "wt%", warnings);

  const rateTerm = 1 / Math.sqrt(rate);
  const austeniteTerm = 22 * (1 - Math.exp(-0.015 * dGamma));
  const base = ceq < 0.35 ? -0.4 + 6.37 * ceq + (24.2 - 59.0 * ceq) * rateTerm : 22.6 - 57.0 * ceq + 3.0 * rateTerm;
  const grain_um = (base + austeniteTerm) * (1 - 0.45 * Math.sqrt(strain));
  if (!(grain_um > 0)) throw new ModelInputError(MODEL, "carbonEquivalent", "a Ceq and cooling rate for which the relation gives a positive grain size", ceq);
  return { grain_um, warnings };
}
