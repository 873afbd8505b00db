/**
 * Boundary laws for one face of the piece. A face either has a prescribed surface temperature, or
 * a heat-flux law q(T_s): the heat flux LEAVING the piece [W/m²] as a function of the surface
 * temperature T_s [K]. Solvers linearise the law about the current iterate,
 * q(T) ≈ q(T*) + q'(T*)(T − T*), so every law returns both q and dq/dT_s.
 *
 * Laws are small objects evaluated once per face per iteration, never per cell, so a virtual call
 * costs nothing next to the tridiagonal solve.
 */

/** Heat-flux law of a face: `evaluate` writes q [W/m²] to out[0] and dq/dT_s [W/(m²·K)] to out[1]. */
export interface FluxLaw {
  readonly kind: "flux";
  evaluate(T_surface_K: number, out: Float64Array): void;
}

/** Prescribed surface temperature [K]. */
export interface FixedTemperature {
  readonly kind: "fixed";
  readonly T_K: number;
}

export type FaceLaw = FluxLaw | FixedTemperature;

/** Stefan–Boltzmann constant σ [W/(m²·K⁴)] (CODATA 2018). */
export const STEFAN_BOLTZMANN = 5.670374419e-8;

/**
 * Convection to a medium plus grey radiation to surroundings, plus a constant extra flux:
 * q = h (T − T_medium) + ε σ (T⁴ − T_sur⁴) + q0.
 */
export class ConvectionRadiation implements FluxLaw {
  readonly kind = "flux" as const;
  constructor(
    /** Heat-transfer coefficient h [W/(m²·K)] */ readonly htc_W_m2K: number,
    /** Medium temperature [K] */ readonly medium_K: number,
    /** Emissivity ε [-] */ readonly emissivity: number,
    /** Surroundings temperature for radiation [K] */ readonly surroundings_K: number,
    /** Constant flux leaving the face [W/m²] */ readonly extraFlux_W_m2 = 0,
  ) {}
  evaluate(T: number, out: Float64Array): void {
    const es = this.emissivity * STEFAN_BOLTZMANN;
    const Ts = this.surroundings_K;
    const T2 = T * T;
    out[0] = this.htc_W_m2K * (T - this.medium_K) + es * (T2 * T2 - Ts * Ts * Ts * Ts) + this.extraFlux_W_m2;
    out[1] = this.htc_W_m2K + 4 * es * T2 * T;
  }
}

/** The flux law's effective heat-transfer coefficient for the explicit stability limit [W/(m²·K)]. */
export function effectiveHtc(law: FluxLaw, T_K: number, scratch: Float64Array): number {
  law.evaluate(T_K, scratch);
  return Math.max(0, scratch[1]);
}
