/**
 * User-supplied transformation kinetics: JMAK (Johnson–Mehl–Avrami–Kolmogorov) curves fitted to
 * isothermal start and finish times read off a TTT diagram, made non-isothermal by additivity.
 * The isothermal law is the classical one of Kolmogorov (1937), Johnson & Mehl (1939) and Avrami
 * (1939–1941) [years from memory].
 *
 * Isothermal:  Y(t) = 1 − exp(−k tⁿ)   [−], t [s], k [s⁻ⁿ]
 * From start/finish times t_s, t_f at normalised fractions Y_s, Y_f (physics.md §5.3):
 *   n = ln[ln(1 − Y_f)/ln(1 − Y_s)] / ln(t_f/t_s),   k = −ln(1 − Y_s)/t_sⁿ
 * Non-isothermal growth by the equivalent ("fictitious") time method of Hawbolt, Chau &
 * Brimacombe, Metall. Trans. A 14A (1983) 1803 [volume/page from memory]:
 *   t* = [−ln(1 − Y)/k(T)]^(1/n),   Y ← 1 − exp(−k(T)(t* + Δt)ⁿ)
 * Incubation by Scheil's sum Σ Δt/t_s(T) = 1 (Scheil 1935; physics.md §5.3).
 *
 * Temperature interpolation: n and ln k are interpolated linearly in T between table rows (ln k
 * because k spans decades; n because it is the Avrami exponent, roughly constant). t_s between rows
 * follows from the interpolated n and ln k, so incubation and growth use one consistent curve.
 * Outside the temperature span of the table the product neither incubates nor grows: a TTT
 * C-curve extrapolated beyond its data can invent fast transformation, whereas no transformation
 * is the conservative reading of a diagram that shows none there.
 */

/** Isothermal start/finish times of one product at several temperatures (a TTT diagram). */
export interface UserKineticsCurve {
  /** Normalised fraction at the start time, e.g. 0.01 [−]. */
  startFraction: number;
  /** Normalised fraction at the finish time, e.g. 0.99 [−]. */
  finishFraction: number;
  /** Rows in any order; temperatures distinct. */
  points: ReadonlyArray<{ T_C: number; start_s: number; finish_s: number }>;
}

/** JMAK coefficients of one isothermal curve: Y = 1 − exp(−exp(lnk) tⁿ). */
export interface JmakCoefficients {
  /** Avrami exponent n [−]. */
  readonly n: number;
  /** ln k, k in [s⁻ⁿ]. */
  readonly lnk: number;
}

/**
 * n and ln k from the times t_s < t_f [s] at which Y reaches Y_s < Y_f (both in (0, 1)).
 * @throws RangeError when the inputs cannot define a curve.
 */
export function jmakFromTimes(start_s: number, finish_s: number, startFraction: number, finishFraction: number): JmakCoefficients {
  if (!(startFraction > 0 && startFraction < finishFraction && finishFraction < 1)) {
    throw new RangeError(`JMAK: fractions must satisfy 0 < start (${startFraction}) < finish (${finishFraction}) < 1`);
  }
  if (!(start_s > 0 && finish_s > start_s && Number.isFinite(finish_s))) {
    throw new RangeError(`JMAK: times must satisfy 0 < start_s (${start_s}) < finish_s (${finish_s}) < ∞`);
  }
  const n = Math.log(Math.log1p(-finishFraction) / Math.log1p(-startFraction)) / Math.log(finish_s / start_s);
  const lnk = Math.log(-Math.log1p(-startFraction)) - n * Math.log(start_s);
  return { n, lnk };
}

/** Isothermal fraction Y = 1 − exp(−k tⁿ) [−] at time t [s]. */
export function jmakFraction(t_s: number, n: number, lnk: number): number {
  if (!(t_s > 0)) return 0;
  return -Math.expm1(-Math.exp(lnk + n * Math.log(t_s)));
}

/** Isothermal time [s] to reach Y: t = [−ln(1 − Y)/k]^(1/n) (0 at Y ≤ 0, ∞ at Y ≥ 1). */
export function jmakTime_s(Y: number, n: number, lnk: number): number {
  if (!(Y > 0)) return 0;
  if (Y >= 1) return Infinity;
  return Math.exp((Math.log(-Math.log1p(-Y)) - lnk) / n);
}

/**
 * One growth step by the equivalent-time method: the fraction Y reached so far defines the
 * fictitious time t* on the curve (n, ln k) of the step's temperature, then Y(t* + Δt).
 * Exact for isothermal holding; no allocation.
 */
export function jmakGrow(Y: number, n: number, lnk: number, dt_s: number): number {
  if (Y >= 1) return 1;
  return jmakFraction(jmakTime_s(Y, n, lnk) + dt_s, n, lnk);
}

/** A TTT table turned into JMAK rows, sorted by temperature, ready for interpolation. */
export interface JmakTable {
  /** Row temperatures, ascending [K]. */
  readonly T_K: Float64Array;
  readonly n: Float64Array;
  readonly lnk: Float64Array;
  /** ln(−ln(1 − Y_s)), to recover the start time: ln t_s = (lnStart − ln k)/n. */
  readonly lnStart: number;
  readonly startFraction: number;
}

/**
 * Builds the JMAK table of a curve, with every time multiplied by timeScale (calibration;
 * n unchanged, ln k − n ln timeScale).
 * @throws RangeError for fewer than 2 rows, repeated temperatures, or rows jmakFromTimes refuses.
 */
export function jmakTable(curve: UserKineticsCurve, timeScale = 1): JmakTable {
  if (curve.points.length < 2) throw new RangeError("JMAK table: at least two temperatures are needed");
  if (!(timeScale > 0 && Number.isFinite(timeScale))) throw new RangeError(`JMAK table: time scale must be positive (${timeScale})`);
  const rows = [...curve.points].sort((a, b) => a.T_C - b.T_C);
  const m = rows.length;
  const T_K = new Float64Array(m);
  const n = new Float64Array(m);
  const lnk = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    if (i > 0 && rows[i].T_C === rows[i - 1].T_C) throw new RangeError(`JMAK table: temperature ${rows[i].T_C} °C appears twice`);
    const c = jmakFromTimes(rows[i].start_s * timeScale, rows[i].finish_s * timeScale, curve.startFraction, curve.finishFraction);
    T_K[i] = rows[i].T_C + 273.15;
    n[i] = c.n;
    lnk[i] = c.lnk;
  }
  return { T_K, n, lnk, lnStart: Math.log(-Math.log1p(-curve.startFraction)), startFraction: curve.startFraction };
}

/**
 * Index i of the row interval [T_K[i], T_K[i+1]] containing T [K], or −1 outside the table
 * (no transformation there). Linear scan: tables have a handful of rows.
 */
export function jmakInterval(table: JmakTable, T_K: number): number {
  const temps = table.T_K;
  const last = temps.length - 1;
  if (!(T_K >= temps[0] && T_K <= temps[last])) return -1;
  let i = 0;
  while (i < last - 1 && T_K > temps[i + 1]) i++;
  return i;
}

/** Interpolation weight of T within interval i (0 at row i, 1 at row i+1). */
export function jmakWeight(table: JmakTable, i: number, T_K: number): number {
  return (T_K - table.T_K[i]) / (table.T_K[i + 1] - table.T_K[i]);
}
