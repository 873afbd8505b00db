/**
 * Temperature tables of the material properties the solver needs, per phase, on one uniform grid:
 *
 *   E_p(T)  volumetric enthalpy [J/m³] (any fixed reference; only differences matter),
 *   C_p(T)  volumetric heat capacity ρ·c_p [J/(m³·K)] (= dE_p/dT),
 *   k_p(T)  thermal conductivity [W/(m·K)].
 *
 * The solver works with the mixture E = Σ X_p E_p(T), C = Σ X_p C_p(T), k = Σ X_p k_p(T) over the
 * phase fractions X_p (one phase for a material that does not transform). Tabulating once on a
 * fine grid keeps transcendental functions (SGTE enthalpies, correlations) out of the time loop:
 * a lookup is one floor and three linear interpolations.
 *
 * Layout: for phase p, `data[p]` holds triples (E, C, k) at T_i = T0 + i·ΔT, i = 0 … n−1, so one
 * lookup touches two adjacent triples. Beyond the grid E is extrapolated linearly with the end
 * heat capacity and C, k are held constant.
 */
export interface PropertyTables {
  readonly phases: number;
  /** First grid temperature [K] */
  readonly T0_K: number;
  /** Grid spacing [K] */
  readonly dT_K: number;
  /** Number of grid points */
  readonly n: number;
  /** data[p][3i] = E, data[p][3i+1] = C, data[p][3i+2] = k */
  readonly data: Float64Array[];
  /** True when every property of every phase is independent of temperature (linear problem). */
  readonly constant: boolean;
}

/** Properties of one phase as functions of temperature, used only while building tables. */
export interface PhaseProperties {
  /** Volumetric heat capacity ρ·c_p [J/(m³·K)] at T [K]. */
  heatCapacity(T_K: number): number;
  /** Thermal conductivity [W/(m·K)] at T [K]. */
  conductivity(T_K: number): number;
  /** Volumetric enthalpy [J/m³] at T [K]; when absent it is integrated from heatCapacity. */
  enthalpy?(T_K: number): number;
}

export const TABLE_T0_K = 200;
export const TABLE_T1_K = 2000;
export const TABLE_DT_K = 0.5;

/**
 * Tabulates phase properties. When a phase gives no enthalpy function, E is the integral of C by
 * the composite Simpson rule on each grid interval (exact for piecewise-quadratic C such as the
 * product of two piecewise-linear ρ and c tables with matching breakpoints; otherwise error
 * O(ΔT⁵ C'''') per interval).
 */
export function buildPropertyTables(phases: readonly PhaseProperties[], constant = false): PropertyTables {
  const n = Math.round((TABLE_T1_K - TABLE_T0_K) / TABLE_DT_K) + 1;
  const data = phases.map((ph) => {
    const arr = new Float64Array(3 * n);
    let E = 0;
    for (let i = 0; i < n; i++) {
      const T = TABLE_T0_K + i * TABLE_DT_K;
      if (ph.enthalpy) E = ph.enthalpy(T);
      else if (i > 0) {
        const Tl = T - TABLE_DT_K;
        E += (TABLE_DT_K / 6) * (ph.heatCapacity(Tl) + 4 * ph.heatCapacity(Tl + TABLE_DT_K / 2) + ph.heatCapacity(T));
      }
      arr[3 * i] = E;
      arr[3 * i + 1] = ph.heatCapacity(T);
      arr[3 * i + 2] = ph.conductivity(T);
    }
    return arr;
  });
  return { phases: phases.length, T0_K: TABLE_T0_K, dT_K: TABLE_DT_K, n, data, constant };
}

/**
 * A property given as a constant or as `[T_C, value]` pairs: piecewise linear between the pairs,
 * constant beyond the ends. Pairs must be sorted by strictly increasing temperature (the schema
 * checks this at the edge).
 */
export type TabulatedOrConstant = number | ReadonlyArray<readonly [number, number]>;

/** Evaluates a constant-or-table property at a temperature in °C. */
export function evaluateProperty(p: TabulatedOrConstant, T_C: number): number {
  if (typeof p === "number") return p;
  const n = p.length;
  if (T_C <= p[0][0]) return p[0][1];
  if (T_C >= p[n - 1][0]) return p[n - 1][1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (p[mid][0] <= T_C) lo = mid;
    else hi = mid;
  }
  const [T0, v0] = p[lo];
  const [T1, v1] = p[hi];
  return v0 + ((v1 - v0) * (T_C - T0)) / (T1 - T0);
}

/** The temperatures (°C) at which a property's slope changes. */
export function breakpoints_C(p: TabulatedOrConstant): number[] {
  return typeof p === "number" ? [] : p.map((pair) => pair[0]);
}
