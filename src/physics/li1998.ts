/**
 * Austenite-decomposition kinetics of Li, Niebuhr, Meekisho & Atteridge, "A computational model
 * for the prediction of steel hardenability", Metall. Mater. Trans. B 29B (1998) 661 — a rework of
 * Kirkaldy & Venugopalan (1983; physics.md §5.2 tags that model [mem], and nothing of it is used here).
 *
 * Isothermal time to reach a fraction X of a product (physics.md §5.1):
 *
 *   τ_F(X,T) = FC · S(X) / [2^(0.41 G) (Ae3 − T)³ exp(−Q/RT)]    [s]
 *   τ_P(X,T) = PC · S(X) / [2^(0.32 G) (Ae1 − T)³ exp(−Q/RT)]
 *   τ_B(X,T) = BC · S(X) / [2^(0.29 G) (Bs  − T)² exp(−Q/RT)]
 *   S(X) = ∫₀^X dx / [x^(0.4(1−x)) (1−x)^(0.4x)]                 [−]
 *
 * with G the ASTM E112 grain-size number of the prior austenite, undercoolings in K, T in K, and
 * Q/R = 27 500 cal/mol / 1.987 cal/(mol·K) ≈ 13 840 K. The rate factorises,
 * dX/dt = 1/[K(T) S'(X)] with K(T) = τ(X,T)/S(X), so Scheil additivity is exact: θ = ∫ dt/K(T),
 * X = S⁻¹(θ).
 *
 * Validity: the composition range of the paper's calibration set of low-alloy steels (see
 * LI1998_COMPOSITION_RANGE, from memory); only below the product's start temperature.
 */
import { checkRanges, type Composition, type Element, type ValidityWarning } from "./composition.js";

/** Model name used in warnings. */
export const LI1998_MODEL = "Li et al. austenite decomposition (1998)";

/** Q/R of Li et al. (1998): 27 500 cal/mol over R = 1.987 cal/(mol·K) [K]. */
export const LI1998_ACTIVATION_TEMPERATURE_K = 27500 / 1.987;

/**
 * Composition range [wt%] over which the model is treated as calibrated. From memory (the paper's
 * table of calibration steels was not available to check): plain-carbon and low-alloy
 * hardenable steels. Outside it the model extrapolates; a warning is raised, nothing is refused.
 */
export const LI1998_COMPOSITION_RANGE: Partial<Record<Element, readonly [number, number]>> = {
  C: [0.1, 0.6],
  Mn: [0.2, 2.0],
  Si: [0, 1.0],
  Ni: [0, 3.5],
  Cr: [0, 1.5],
  Mo: [0, 0.6],
};

/** The three diffusional products of the model. */
export type LiProduct = "ferrite" | "pearlite" | "bainite";

/** Grain-size exponent a in 2^(a G) and undercooling power m in ΔT^m, per product (Li 1998). */
export const LI1998_PRODUCT_CONSTANTS: Readonly<Record<LiProduct, { readonly grainExponent: number; readonly undercoolingPower: number }>> = {
  ferrite: { grainExponent: 0.41, undercoolingPower: 3 },
  pearlite: { grainExponent: 0.32, undercoolingPower: 3 },
  bainite: { grainExponent: 0.29, undercoolingPower: 2 },
};

/** Composition factors FC, PC, BC of Li et al. (1998) [s·K^m, with m the undercooling power]. */
export interface LiCompositionFactors {
  readonly ferrite: number;
  readonly pearlite: number;
  readonly bainite: number;
}

/**
 * FC = exp(1.00 + 6.31C + 1.78Mn + 0.31Si + 1.12Ni + 2.70Cr + 4.06Mo)
 * PC = exp(−4.25 + 4.12C + 4.36Mn + 0.44Si + 1.71Ni + 3.33Cr + 5.19√Mo)
 * BC = exp(−10.23 + 10.18C + 0.85Mn + 0.55Ni + 0.90Cr + 0.36Mo)
 * (Li et al. 1998; wt%). Validity: LI1998_COMPOSITION_RANGE.
 */
export function liCompositionFactors(c: Composition): LiCompositionFactors {
  return {
    ferrite: Math.exp(1.0 + 6.31 * c.C + 1.78 * c.Mn + 0.31 * c.Si + 1.12 * c.Ni + 2.7 * c.Cr + 4.06 * c.Mo),
    pearlite: Math.exp(-4.25 + 4.12 * c.C + 4.36 * c.Mn + 0.44 * c.Si + 1.71 * c.Ni + 3.33 * c.Cr + 5.19 * Math.sqrt(c.Mo)),
    bainite: Math.exp(-10.23 + 10.18 * c.C + 0.85 * c.Mn + 0.55 * c.Ni + 0.9 * c.Cr + 0.36 * c.Mo),
  };
}

/** Pushes a ValidityWarning for each element outside LI1998_COMPOSITION_RANGE. */
export function checkLi1998Composition(c: Composition, out: ValidityWarning[]): ValidityWarning[] {
  return checkRanges(LI1998_MODEL, c, LI1998_COMPOSITION_RANGE, out);
}

/**
 * K(T) = τ(X,T)/S(X) = factor / [2^(a G) ΔT^m exp(−Q/RT)] [s]: the time per unit of S.
 * Returns +Infinity when the undercooling ΔT [K] is not positive (no transformation).
 *
 * @param factor FC, PC or BC.
 * @param astmGrainNumber G (ASTM E112) of the prior austenite.
 * @param undercooling_K Ae3 − T, Ae1 − T or Bs − T [K].
 * @param T_K temperature [K].
 */
export function liTimeConstant_s(product: LiProduct, factor: number, astmGrainNumber: number, undercooling_K: number, T_K: number): number {
  if (!(undercooling_K > 0)) return Infinity;
  const { grainExponent, undercoolingPower } = LI1998_PRODUCT_CONSTANTS[product];
  return factor / (2 ** (grainExponent * astmGrainNumber) * undercooling_K ** undercoolingPower * Math.exp(-LI1998_ACTIVATION_TEMPERATURE_K / T_K));
}

/** Isothermal time to reach fraction X, τ(X,T) = S(X)·K(T) [s] (Li et al. 1998). */
export function liIsothermalTime_s(product: LiProduct, X: number, factor: number, astmGrainNumber: number, undercooling_K: number, T_K: number): number {
  return liIntegral(X) * liTimeConstant_s(product, factor, astmGrainNumber, undercooling_K, T_K);
}

/** The integrand 1/[x^(0.4(1−x)) (1−x)^(0.4x)] of S, dS/dX [−]. */
export function liIntegrand(x: number): number {
  return Math.exp(-0.4 * (1 - x) * Math.log(x) - 0.4 * x * Math.log1p(-x));
}

// Gauss–Legendre rule (nodes and weights on [−1, 1]) by Newton iteration on P_n.
function gaussLegendre(order: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(order);
  const weights = new Float64Array(order);
  for (let i = 0; i < order; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (order + 0.5));
    let dp = 0;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= order; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      dp = (order * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    nodes[i] = x;
    weights[i] = 2 / ((1 - x * x) * dp * dp);
  }
  return { nodes, weights };
}

const GL = gaussLegendre(20);
const PANELS = 4;

/**
 * S(X) for 0 ≤ X ≤ 1/2 by composite 4×20-point Gauss–Legendre after the substitution x = s⁵,
 * which removes the x^−0.4 singularity: S = ∫₀^{X^(1/5)} 5 s² s^(2x) (1−x)^(−0.4x) ds, a smooth
 * integrand (relative error ≈ 1e−15).
 */
function integralLowerHalf(X: number): number {
  if (X <= 0) return 0;
  const sMax = X ** 0.2;
  const h = sMax / PANELS;
  let sum = 0;
  for (let p = 0; p < PANELS; p++) {
    const mid = (p + 0.5) * h;
    for (let j = 0; j < GL.nodes.length; j++) {
      const s = mid + 0.5 * h * GL.nodes[j];
      const x = s ** 5;
      sum += GL.weights[j] * 5 * s * s * Math.exp(2 * x * Math.log(s) - 0.4 * x * Math.log1p(-x));
    }
  }
  return 0.5 * h * sum;
}

/** S(1) = 2 S(1/2) ≈ 2.051764 (the integrand is symmetric about X = 1/2). */
export const LI1998_S1 = 2 * integralLowerHalf(0.5);

/**
 * S(X) = ∫₀^X dx / [x^(0.4(1−x)) (1−x)^(0.4x)], 0 ≤ X ≤ 1 (Li et al. 1998), by Gauss–Legendre
 * quadrature (relative error ≈ 1e−15); the upper half from the symmetry S(X) = S(1) − S(1−X).
 * Not for hot loops (≈ 80 exp/log per call); use liIntegralInverse there.
 */
export function liIntegral(X: number): number {
  if (X <= 0) return 0;
  if (X >= 1) return LI1998_S1;
  return X <= 0.5 ? integralLowerHalf(X) : LI1998_S1 - integralLowerHalf(1 - X);
}

// Inverse tables on the lower half θ ∈ [0, S(1)/2], uniform in θ, with exact slopes.
// Near θ = 0, X(θ) ≈ (0.6θ)^(5/3) has a singular second derivative, so the first NEAR_INTERVALS
// intervals interpolate u = X^0.6 instead (smooth, u ≈ 0.6θ; du/dθ = 1/(dS/du),
// dS/du = (5/3) u^((2/3)X) (1−X)^(−0.4X)) and return u^(5/3). Elsewhere X itself is interpolated
// with dX/dθ = 1/S'(X) = x^(0.4(1−x)) (1−x)^(0.4x), which saves the pow.
const TABLE_INTERVALS = 512;
const NEAR_INTERVALS = 16;
const HALF_S = 0.5 * LI1998_S1;
const TABLE_STEP = HALF_S / TABLE_INTERVALS;
const NEAR_THETA = NEAR_INTERVALS * TABLE_STEP;
const TABLE_U = new Float64Array(TABLE_INTERVALS + 1);
const TABLE_U_SLOPE = new Float64Array(TABLE_INTERVALS + 1);
const TABLE_X = new Float64Array(TABLE_INTERVALS + 1);
const TABLE_X_SLOPE = new Float64Array(TABLE_INTERVALS + 1);

function slopeUOfTheta(u: number): number {
  if (u <= 0) return 0.6;
  const x = u ** (5 / 3);
  return 0.6 * Math.exp(-(2 / 3) * x * Math.log(u) + 0.4 * x * Math.log1p(-x));
}

(function buildInverseTables(): void {
  let u = 0;
  for (let i = 0; i <= TABLE_INTERVALS; i++) {
    const theta = i * TABLE_STEP;
    // Newton on S(u^(5/3)) = θ, started from the previous node's value plus one Euler step.
    for (let iter = 0; iter < 50; iter++) {
      const du = (integralLowerHalf(u ** (5 / 3)) - theta) * slopeUOfTheta(u);
      u -= du;
      if (u < 0) u = 0;
      if (Math.abs(du) < 1e-15) break;
    }
    TABLE_U[i] = u;
    TABLE_U_SLOPE[i] = slopeUOfTheta(u);
    TABLE_X[i] = u ** (5 / 3);
    TABLE_X_SLOPE[i] = i === 0 ? 0 : 1 / liIntegrand(TABLE_X[i]);
    u += TABLE_STEP * TABLE_U_SLOPE[i];
  }
})();

/** Cubic Hermite interpolation of (values, slopes) tabulated on the uniform θ grid. */
function hermite(values: Float64Array, slopes: Float64Array, theta: number): number {
  const q = theta / TABLE_STEP;
  let i = Math.floor(q);
  if (i >= TABLE_INTERVALS) i = TABLE_INTERVALS - 1;
  const t = q - i;
  const t2 = t * t;
  const t3 = t2 * t;
  return (
    (2 * t3 - 3 * t2 + 1) * values[i] +
    (t3 - 2 * t2 + t) * TABLE_STEP * slopes[i] +
    (-2 * t3 + 3 * t2) * values[i + 1] +
    (t3 - t2) * TABLE_STEP * slopes[i + 1]
  );
}

/** X(θ) on the lower half, 0 ≤ θ ≤ S(1)/2. */
function lowerHalfInverse(theta: number): number {
  if (theta >= NEAR_THETA) return hermite(TABLE_X, TABLE_X_SLOPE, theta);
  const u = hermite(TABLE_U, TABLE_U_SLOPE, theta);
  const cubeRoot = Math.cbrt(u); // u^(5/3) = u·∛u², several times faster than pow in V8
  return u * cubeRoot * cubeRoot;
}

/**
 * X = S⁻¹(θ) [−] for θ ≥ 0: 0 at θ ≤ 0, 1 at θ ≥ S(1). Cubic Hermite interpolation of a
 * 512-interval table against θ with exact slopes (of u = X^0.6 near θ = 0, of X elsewhere), the
 * upper half by the symmetry of S; absolute error below 1e−10 in X (checked in
 * tests/li1998.test.ts). No allocation, a cube root only near X = 0 or 1: fit for hot loops.
 */
export function liIntegralInverse(theta: number): number {
  if (!(theta > 0)) return 0;
  if (theta >= LI1998_S1) return 1;
  if (theta <= HALF_S) return lowerHalfInverse(theta);
  return 1 - lowerHalfInverse(LI1998_S1 - theta);
}
