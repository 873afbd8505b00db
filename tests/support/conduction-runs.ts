/**
 * Small helpers shared by the conduction verification tests: property tables of a material with
 * constant (or given) properties, an adiabatic face, a fixed-step march, and profile measures.
 * Unlike analytic.ts this file uses project code; it holds no reference values.
 */
import { ThroughThicknessSolver, type Scheme } from "../../src/numerics/conduction1d.js";
import { ConvectionRadiation, type FaceLaw } from "../../src/numerics/face-law.js";
import { buildPropertyTables, type PropertyTables } from "../../src/numerics/property-table.js";

/** The three time schemes, for tests that run each. */
export const SCHEMES: readonly Scheme[] = ["explicit", "implicit", "crank-nicolson"];

/** Round numbers of the order of hot steel; every check here holds for any constant values. */
export const STEEL_CONDUCTIVITY_W_mK = 30;
export const STEEL_HEAT_CAPACITY_J_m3K = 3.6e6;

/** Tables of one phase with constant ρc [J/(m³·K)] and k [W/(m·K)], flagged linear. */
export function constantTables(conductivity_W_mK: number, heatCapacity_J_m3K: number): PropertyTables {
  return buildPropertyTables([{ heatCapacity: () => heatCapacity_J_m3K, conductivity: () => conductivity_W_mK }], true);
}

/** A face through which no heat passes. */
export const ADIABATIC: FaceLaw = new ConvectionRadiation(0, 0, 0, 0);

/** A face that removes a constant flux q [W/m²] (negative q heats the piece). */
export function prescribedFlux(q_W_m2: number): FaceLaw {
  return new ConvectionRadiation(0, 0, 0, 0, q_W_m2);
}

export interface RunSpec {
  readonly thickness_m: number;
  readonly cells: number;
  readonly scheme: Scheme;
  readonly tables: PropertyTables;
  readonly initial_K: number | Float64Array;
  readonly tolerance_K?: number;
}

/** A new solver marched over duration_s in `steps` equal requested steps under fixed face laws. */
export function march(spec: RunSpec, duration_s: number, steps: number, top: FaceLaw, bottom: FaceLaw): ThroughThicknessSolver {
  const solver = new ThroughThicknessSolver(spec);
  advance(solver, duration_s, steps, top, bottom);
  return solver;
}

/** Advances an existing solver by duration_s in `steps` equal requested steps. */
export function advance(solver: ThroughThicknessSolver, duration_s: number, steps: number, top: FaceLaw, bottom: FaceLaw): void {
  const dt = duration_s / steps;
  for (let i = 0; i < steps; i++) solver.step(dt, top, bottom);
}

/** Node temperatures from a function of depth x [m] on a grid of `cells` cells over thickness_m. */
export function profile(thickness_m: number, cells: number, T_of_depth: (x_m: number) => number): Float64Array {
  const out = new Float64Array(cells + 1);
  for (let i = 0; i <= cells; i++) out[i] = T_of_depth((i * thickness_m) / cells);
  return out;
}

/** Largest |a_i − b_i|. */
export function maxAbsDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

/** Observed order of accuracy from errors at steps h, h/2, h/4 …: log2(e_k / e_{k+1}). */
export function observedOrders(errors: readonly number[]): number[] {
  const out: number[] = [];
  for (let i = 1; i < errors.length; i++) out.push(Math.log2(errors[i - 1] / errors[i]));
  return out;
}

/**
 * Depth [m] where the nodal profile first crosses `level_K` going down from the top face, by
 * linear interpolation between the two bracketing nodes; NaN if it never does.
 */
export function crossingDepth(T: Float64Array, dx_m: number, level_K: number): number {
  for (let i = 0; i + 1 < T.length; i++) {
    const a = T[i] - level_K;
    const b = T[i + 1] - level_K;
    if (a === 0) return i * dx_m;
    if (a * b < 0) return (i + a / (a - b)) * dx_m;
  }
  return NaN;
}
