/**
 * Mixture properties of a phase mixture at given node temperatures, from PropertyTables:
 *
 *   E_i = Σ_p X_p,i E_p(T_i)   volumetric enthalpy [J/m³]
 *   C_i = Σ_p X_p,i C_p(T_i)   volumetric heat capacity [J/(m³·K)]
 *   k_i = Σ_p X_p,i k_p(T_i)   conductivity [W/(m·K)] (fraction-weighted arithmetic mean; adequate
 *                              given the ±5–10 % scatter of the data: physics.md §3, from memory)
 *
 * Each table is interpolated linearly between its grid points; beyond the grid E is extrapolated
 * with the end heat capacity and C, k are held (property-table.ts). With `latentHeat` false the
 * enthalpy and heat capacity of phase 0 serve every phase (no latent heat), while k stays the
 * mixture's. A single-phase table takes a loop without the mixture sum.
 *
 * The same arithmetic, in the same order, as ThroughThicknessSolver's private evaluation, so a
 * solver built on this kernel reproduces the 1-D solver to round-off (conduction2d.test.ts).
 * Allocation-free: writes E, C, k for nodes 0 … count−1 and returns nothing.
 */
import type { PropertyTables } from "./property-table.js";

/** Iteration and stability defaults shared by the 1-D and 2-D solvers. */
export const SOLVER_DEFAULTS = {
  /** Picard stop: largest temperature change between iterates [K] */
  tolerance_K: 1e-3,
  /** Iteration cap per step before the step is halved */
  maxIterations: 60,
  /** Fraction of the explicit stability limit used for sub-steps */
  explicitSafety: 0.9,
} as const;

export function evaluateMixture(
  tables: PropertyTables,
  latentHeat: boolean,
  count: number,
  T_K: Float64Array,
  fractions: readonly Float64Array[],
  E: Float64Array,
  C: Float64Array,
  k: Float64Array,
): void {
  if (tables.phases === 1) {
    evaluateSinglePhase(tables, count, T_K, E, C, k);
    return;
  }
  const T0 = tables.T0_K;
  const dT = tables.dT_K;
  const inv = 1 / dT;
  const last = tables.n - 1;
  const phases = tables.phases;
  const data0 = tables.data[0];
  for (let i = 0; i < count; i++) {
    const u = (T_K[i] - T0) * inv;
    let j = Math.floor(u);
    let extra = 0; // temperature beyond the grid [K]
    if (j < 0) {
      extra = u * dT;
      j = 0;
    } else if (j >= last) {
      extra = (u - last) * dT;
      j = last - 1;
    }
    const f = extra === 0 ? u - j : j === 0 ? 0 : 1;
    const o = 3 * j;
    let e = 0;
    let cap = 0;
    let cond = 0;
    for (let p = 0; p < phases; p++) {
      const x = fractions[p][i];
      if (x === 0) continue;
      const data = tables.data[p];
      cond += x * (data[o + 2] + f * (data[o + 5] - data[o + 2]));
      if (latentHeat) {
        const cp = data[o + 1] + f * (data[o + 4] - data[o + 1]);
        e += x * (data[o] + f * (data[o + 3] - data[o]) + extra * cp);
        cap += x * cp;
      }
    }
    if (!latentHeat) {
      const cp = data0[o + 1] + f * (data0[o + 4] - data0[o + 1]);
      e = data0[o] + f * (data0[o + 3] - data0[o]) + extra * cp;
      cap = cp;
    }
    E[i] = e;
    C[i] = cap;
    k[i] = cond;
  }
}

/** evaluateMixture for a single-phase material. */
function evaluateSinglePhase(tables: PropertyTables, count: number, T_K: Float64Array, E: Float64Array, C: Float64Array, k: Float64Array): void {
  const T0 = tables.T0_K;
  const dT = tables.dT_K;
  const inv = 1 / dT;
  const last = tables.n - 1;
  const data = tables.data[0];
  for (let i = 0; i < count; i++) {
    const u = (T_K[i] - T0) * inv;
    let j = Math.floor(u);
    let f = u - j;
    let extra = 0;
    if (j < 0) {
      extra = u * dT;
      j = 0;
      f = 0;
    } else if (j >= last) {
      extra = (u - last) * dT;
      j = last - 1;
      f = 1;
    }
    const o = 3 * j;
    const cp = data[o + 1] + f * (data[o + 4] - data[o + 1]);
    E[i] = data[o] + f * (data[o + 3] - data[o]) + extra * cp;
    C[i] = cp;
    k[i] = data[o + 2] + f * (data[o + 5] - data[o + 2]);
  }
}

/**
 * Newton slope for an enthalpy that moves with the phase fractions: with phase evolution,
 * E(T*, X(T*)) changes faster than C says, so the secant slope of E over the last two iterates
 * (E_prev at T_prev) replaces C where it is larger, capped at 1000·C. Only the convergence rate
 * changes; the fixed point is the same. Nodes whose iterate moved by ≤ 1e-9 K keep C.
 */
export function secantHeatCapacity(count: number, E: Float64Array, T: Float64Array, E_prev: Float64Array, T_prev: Float64Array, C: Float64Array): void {
  for (let i = 0; i < count; i++) {
    const dT = T[i] - T_prev[i];
    if (dT > 1e-9 || dT < -1e-9) {
      const slope = (E[i] - E_prev[i]) / dT;
      if (slope > C[i]) C[i] = slope < 1e3 * C[i] ? slope : 1e3 * C[i];
    }
  }
}
