/**
 * Athermal martensite: Koistinen & Marburger, Acta Metall. 7 (1959) 59.
 *
 * Closed form, fraction of the austenite present at Ms that has become martensite at T < Ms:
 *   f = 1 − exp(−α (Ms − T))      α ≈ 0.011 [1/K]
 * Rate form, used in the solver (physics.md §5.4; Hömberg, Acta Mater. 44 (1996) 4375):
 *   dX_M = α · X_γ · max(0, −dT)   below Ms, nothing on heating.
 * Over a step in which T falls from T_old to T_new, integrating the rate form exactly with X_γ
 * depleted by martensite alone gives ΔX_M = X_γ [1 − exp(−α ΔT)], ΔT = min(T_old, Ms) − T_new.
 * Validity: plain-carbon and low-alloy steels with lath/plate martensite, Ms above room
 * temperature; α = 0.011 fitted on 0.4–1.1 %C steels [from memory].
 */

/** Default Koistinen–Marburger coefficient α [1/K] (Koistinen & Marburger 1959). */
export const KM_COEFFICIENT_PER_K = 0.011;

/** Closed form f = 1 − exp(−α(Ms − T)) for T < Ms, else 0 [−]. Temperatures [K] or [°C] alike. */
export function kmFraction(Ms_K: number, T_K: number, alpha_perK: number = KM_COEFFICIENT_PER_K): number {
  return T_K < Ms_K ? -Math.expm1(-alpha_perK * (Ms_K - T_K)) : 0;
}

/** Temperature [K] at which the closed form reaches fraction f: T = Ms + ln(1 − f)/α. */
export function kmTemperatureForFraction(Ms_K: number, f: number, alpha_perK: number = KM_COEFFICIENT_PER_K): number {
  return Ms_K + Math.log1p(-f) / alpha_perK;
}

/**
 * Fraction of the current austenite that becomes martensite during a step from T_old to T_new
 * [K]: 1 − exp(−α · max(0, min(T_old, Ms) − T_new)) [−]. Zero on heating or above Ms. Multiply
 * by the austenite fraction present to get ΔX_M.
 */
export function kmStepConversion(Ms_K: number, T_old_K: number, T_new_K: number, alpha_perK: number = KM_COEFFICIENT_PER_K): number {
  const cooling = (T_old_K < Ms_K ? T_old_K : Ms_K) - T_new_K;
  return cooling > 0 ? -Math.expm1(-alpha_perK * cooling) : 0;
}
