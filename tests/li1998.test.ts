import { describe, it, expect } from "vitest";
import { fullComposition, type ValidityWarning } from "../src/physics/composition.js";
import {
  LI1998_S1,
  checkLi1998Composition,
  liCompositionFactors,
  liIntegral,
  liIntegralInverse,
  liIntegrand,
  liIsothermalTime_s,
  liTimeConstant_s,
} from "../src/physics/li1998.js";

// Values tagged [calc] come from physics.md §5.1 (computed there from the Li et al. 1998
// integral), printed to 6 decimals: tolerance = half a unit in the 6th decimal, +1 % for float noise.
const HALF_UNIT_6 = 0.5e-6 * 1.01;

/** Adaptive Simpson quadrature of g on [a, b] to absolute tolerance eps (test-only, independent of the module). */
function adaptiveSimpson(g: (t: number) => number, a: number, b: number, eps: number): number {
  const simpson = (fa: number, fm: number, fb: number, h: number): number => (h / 6) * (fa + 4 * fm + fb);
  const recurse = (a0: number, b0: number, fa: number, fm: number, fb: number, whole: number, tol: number, depth: number): number => {
    const m = 0.5 * (a0 + b0);
    const lm = 0.5 * (a0 + m);
    const rm = 0.5 * (m + b0);
    const flm = g(lm);
    const frm = g(rm);
    const left = simpson(fa, flm, fm, m - a0);
    const right = simpson(fm, frm, fb, b0 - m);
    if (depth > 50 || Math.abs(left + right - whole) <= 15 * tol) return left + right + (left + right - whole) / 15;
    return recurse(a0, m, fa, flm, fm, left, tol / 2, depth + 1) + recurse(m, b0, fm, frm, fb, right, tol / 2, depth + 1);
  };
  const fa = g(a);
  const fb = g(b);
  const fm = g(0.5 * (a + b));
  return recurse(a, b, fa, fm, fb, simpson(fa, fm, fb, b - a), eps, 0);
}

/**
 * S(X) by adaptive Simpson of the integrand as printed by Li et al. (1998),
 * 1/[x^(0.4(1−x)) (1−x)^(0.4x)], with x = t^2.5 near 0 and 1 − x = t^2.5 near 1 to tame the
 * endpoint singularities (a different substitution from the module's).
 */
function referenceS(X: number): number {
  const raw = (x: number, oneMinusX: number): number => 1 / (Math.pow(x, 0.4 * oneMinusX) * Math.pow(oneMinusX, 0.4 * x));
  const lower = (upper: number): number =>
    adaptiveSimpson((t) => (t === 0 ? 0 : 2.5 * t ** 1.5 * raw(t ** 2.5, 1 - t ** 2.5)), 0, upper ** 0.4, 1e-13);
  if (X <= 0.5) return lower(X);
  // ∫_{0.5}^{X} dx with 1 − x = y = t^2.5, dx = −2.5 t^1.5 dt.
  const upperPiece = adaptiveSimpson((t) => (t === 0 ? 0 : 2.5 * t ** 1.5 * raw(1 - t ** 2.5, t ** 2.5)), (1 - X) ** 0.4, 0.5 ** 0.4, 1e-13);
  return lower(0.5) + upperPiece;
}

describe("Li et al. (1998) integral S(X)", () => {
  it("matches the physics.md §5.1 table: S(0.01) = 0.104340, S(0.5) = 1.025882, S(0.99) = 1.947424, S(1) = 2.051764", () => {
    expect(Math.abs(liIntegral(0.01) - 0.10434)).toBeLessThanOrEqual(HALF_UNIT_6);
    expect(Math.abs(liIntegral(0.5) - 1.025882)).toBeLessThanOrEqual(HALF_UNIT_6);
    expect(Math.abs(liIntegral(0.99) - 1.947424)).toBeLessThanOrEqual(HALF_UNIT_6);
    expect(Math.abs(liIntegral(1) - 2.051764)).toBeLessThanOrEqual(HALF_UNIT_6);
    expect(Math.abs(LI1998_S1 - 2.051764)).toBeLessThanOrEqual(HALF_UNIT_6);
  });

  it("agrees with an independent adaptive-Simpson quadrature of the published integrand on both halves", () => {
    // Both are converged quadratures of the same integral (Simpson asked for 1e−13 absolute); 1e−10
    // relative leaves room for the Simpson error estimate being optimistic by 100× near t = 0.
    for (const X of [1e-4, 0.003, 0.05, 0.2, 0.37, 0.5, 0.63, 0.8, 0.95, 0.999, 1 - 1e-6]) {
      const ref = referenceS(X);
      expect(Math.abs(liIntegral(X) - ref) / ref).toBeLessThanOrEqual(1e-10);
    }
  });

  it("is symmetric, S(X) + S(1 − X) = S(1), by the independent quadrature (and the integrand is symmetric pointwise)", () => {
    // Analytic identity (the integrand is invariant under x ↔ 1 − x); quadrature error bound as above.
    const S1 = referenceS(1);
    for (const X of [0.01, 0.1, 0.25, 0.4]) {
      expect(Math.abs(referenceS(X) + referenceS(1 - X) - S1) / S1).toBeLessThanOrEqual(1e-8);
      // Pointwise: two evaluations of the same expression at mirrored points, round-off only.
      expect(Math.abs(liIntegrand(X) - liIntegrand(1 - X)) / liIntegrand(X)).toBeLessThanOrEqual(1e-14);
    }
    expect(Math.abs(S1 - LI1998_S1) / LI1998_S1).toBeLessThanOrEqual(1e-8);
  });

  it("approaches X^0.6/0.6 for small X, with relative deviation below 2·X·|ln X|", () => {
    // Expanding x^(0.4x)(1−x)^(−0.4x) = 1 + 0.4x ln x + O(x) gives S = (X^0.6/0.6)(1 + O(X ln X));
    // the bound 2·X·|ln X| is a loose multiple of the first-order term 0.15·X·|ln X| plus the O(X) term.
    for (const X of [1e-8, 1e-6, 1e-4, 1e-3]) {
      const asymptote = X ** 0.6 / 0.6;
      expect(Math.abs(liIntegral(X) / asymptote - 1)).toBeLessThanOrEqual(2 * X * Math.abs(Math.log(X)));
    }
    // And not trivially: at X = 0.01 the deviation is already visible (> 0.5 %).
    expect(Math.abs(liIntegral(0.01) / (0.01 ** 0.6 / 0.6) - 1)).toBeGreaterThan(0.005);
  });
});

describe("Li et al. (1998) inverse S⁻¹(θ)", () => {
  it("inverts S to better than 1e−9 in X everywhere on (0, 1)", () => {
    // Requirement: 1e−7; the Hermite table is built to ≈ 3e−11 (measured), 1e−9 leaves margin.
    let worst = 0;
    for (let i = 1; i < 20000; i++) {
      const X = i / 20000;
      worst = Math.max(worst, Math.abs(liIntegralInverse(liIntegral(X)) - X));
    }
    for (const X of [1e-9, 1e-7, 1e-5, 1 - 1e-5, 1 - 1e-7]) worst = Math.max(worst, Math.abs(liIntegralInverse(liIntegral(X)) - X));
    expect(worst).toBeLessThanOrEqual(1e-9);
  });

  it("is 0 for θ ≤ 0, 1 for θ ≥ S(1), and non-decreasing in between", () => {
    expect(liIntegralInverse(0)).toBe(0);
    expect(liIntegralInverse(-1)).toBe(0);
    expect(liIntegralInverse(LI1998_S1)).toBe(1);
    expect(liIntegralInverse(10)).toBe(1);
    let previous = 0;
    let decreases = 0;
    for (let i = 1; i <= 100000; i++) {
      const X = liIntegralInverse((i / 100000) * LI1998_S1);
      if (X < previous) decreases++;
      previous = X;
    }
    expect(decreases).toBe(0);
  });
});

describe("Li et al. (1998) isothermal times", () => {
  // 0.45C-0.75Mn-0.25Si, ASTM 8; Ae3 = 785.0 °C, Ae1 = 722.2 °C, Bs (Li) = 584.6 °C [calc, physics.md §4].
  const steel = fullComposition({ C: 0.45, Mn: 0.75, Si: 0.25 });
  const G = 8;
  const factors = liCompositionFactors(steel);

  it("gives τ(99 %)/τ(1 %) = 18.664 at every temperature for every product", () => {
    // [calc, physics.md §5.1] printed to 3 decimals: half a unit = 5e−4.
    for (const T_C of [500, 650, 700]) {
      const T_K = T_C + 273.15;
      const ratio = liIsothermalTime_s("ferrite", 0.99, factors.ferrite, G, 785 - T_C, T_K) / liIsothermalTime_s("ferrite", 0.01, factors.ferrite, G, 785 - T_C, T_K);
      expect(Math.abs(ratio - 18.664)).toBeLessThanOrEqual(5e-4);
      const ratioB = liIsothermalTime_s("bainite", 0.99, factors.bainite, G, 100, T_K) / liIsothermalTime_s("bainite", 0.01, factors.bainite, G, 100, T_K);
      expect(Math.abs(ratioB - 18.664)).toBeLessThanOrEqual(5e-4);
    }
  });

  it("reproduces τ_F, τ_P, τ_B re-derived from the published formulas with an independent quadrature of S", () => {
    // Factors written out from Li et al. (1998) as printed in physics.md §5.1, Q/R = 27500/1.987 K.
    const { C, Mn, Si, Ni, Cr, Mo } = steel;
    const FC = Math.exp(1.0 + 6.31 * C + 1.78 * Mn + 0.31 * Si + 1.12 * Ni + 2.7 * Cr + 4.06 * Mo);
    const PC = Math.exp(-4.25 + 4.12 * C + 4.36 * Mn + 0.44 * Si + 1.71 * Ni + 3.33 * Cr + 5.19 * Math.sqrt(Mo));
    const BC = Math.exp(-10.23 + 10.18 * C + 0.85 * Mn + 0.55 * Ni + 0.9 * Cr + 0.36 * Mo);
    const arrhenius = (T_K: number): number => Math.exp(-27500 / (1.987 * T_K));
    // Relative 1e−9: both sides are exact formulas over converged quadratures (see above, 1e−10),
    // times a handful of exp with 1e−16 relative round-off.
    for (const X of [0.01, 0.3, 0.5, 0.9, 0.99]) {
      const S = referenceS(X);
      const T_F = 700 + 273.15;
      const expectedF = (FC * S) / (2 ** (0.41 * G) * (785 - 700) ** 3 * arrhenius(T_F));
      expect(Math.abs(liIsothermalTime_s("ferrite", X, factors.ferrite, G, 785 - 700, T_F) / expectedF - 1)).toBeLessThanOrEqual(1e-9);
      const T_P = 650 + 273.15;
      const expectedP = (PC * S) / (2 ** (0.32 * G) * (722.2 - 650) ** 3 * arrhenius(T_P));
      expect(Math.abs(liIsothermalTime_s("pearlite", X, factors.pearlite, G, 722.2 - 650, T_P) / expectedP - 1)).toBeLessThanOrEqual(1e-9);
      const T_B = 450 + 273.15;
      const expectedB = (BC * S) / (2 ** (0.29 * G) * (584.6 - 450) ** 2 * arrhenius(T_B));
      expect(Math.abs(liIsothermalTime_s("bainite", X, factors.bainite, G, 584.6 - 450, T_B) / expectedB - 1)).toBeLessThanOrEqual(1e-9);
    }
  });

  it("never transforms without undercooling (infinite time at or above the start temperature)", () => {
    expect(liTimeConstant_s("ferrite", factors.ferrite, G, 0, 1058)).toBe(Infinity);
    expect(liTimeConstant_s("pearlite", factors.pearlite, G, -5, 1000)).toBe(Infinity);
  });

  it("warns (without refusing) when the composition lies outside the calibration range", () => {
    const inside: ValidityWarning[] = [];
    checkLi1998Composition(steel, inside);
    expect(inside).toEqual([]);
    const outside: ValidityWarning[] = [];
    checkLi1998Composition(fullComposition({ C: 0.03, Mn: 0.2 }), outside);
    expect(outside.map((w) => w.quantity)).toEqual(["C"]);
    expect(outside[0].kind).toBe("validity");
  });
});
