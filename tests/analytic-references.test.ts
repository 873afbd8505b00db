import { describe, it, expect } from "vitest";
import { erf, erfc, semiInfiniteConvection, slabEigenvalues, slabTheta } from "./support/analytic.js";

// The conduction tests trust tests/support/analytic.ts; these checks tie it to printed values first.

describe("slab series of Carslaw & Jaeger §3.11 / Incropera eq. 5.39 (tests/support/analytic.ts)", () => {
  // [calc, physics.md §8]: ζ₁ and C₁ printed to 5 decimals, so half a unit in the 5th is 5e-6.
  const PRINTED = 5e-6;

  it.each([
    [0.1, 0.31105, 1.01609],
    [1, 0.86033, 1.11913],
    [10, 1.42887, 1.26196],
  ])("gives the first eigenvalue and coefficient of physics.md §8 at Bi = %s", (Bi, zeta1, C1) => {
    const [z] = slabEigenvalues(Bi, 1);
    const C = (4 * Math.sin(z)) / (2 * z + Math.sin(2 * z));
    expect(Math.abs(z - zeta1)).toBeLessThanOrEqual(PRINTED);
    expect(Math.abs(C - C1)).toBeLessThanOrEqual(PRINTED);
  });

  it("finds roots of ζ tan ζ = Bi, one in each interval ((n−1)π, (n−1)π + π/2)", () => {
    // The defining equation; bisection to the last bit leaves a residual of round-off only.
    for (const Bi of [0.1, 1, 10]) {
      const zetas = slabEigenvalues(Bi, 50);
      zetas.forEach((z, i) => {
        expect(z).toBeGreaterThan(i * Math.PI);
        expect(z).toBeLessThan(i * Math.PI + Math.PI / 2);
        // Residual z sin z − Bi cos z at a root known to ~1e-15 relative: |d/dz| ≤ 60, so ≤ 1e-11.
        expect(Math.abs(z * Math.sin(z) - Bi * Math.cos(z))).toBeLessThanOrEqual(1e-11);
      });
    }
  });

  it.each([
    [1, 0.2, 0.95064, 0.64339],
    [1, 1.0, 0.53386, 0.34818],
    [10, 0.5, 0.45464, 0.06433],
  ])("gives θ* at the centre and surface of physics.md §8 for Bi = %s, Fo = %s", (Bi, Fo, centre, surface) => {
    // [calc, physics.md §8], printed to 5 decimals: half a unit is 5e-6.
    expect(Math.abs(slabTheta(Bi, Fo, 0) - centre)).toBeLessThanOrEqual(PRINTED);
    expect(Math.abs(slabTheta(Bi, Fo, 1) - surface)).toBeLessThanOrEqual(PRINTED);
  });

  it("starts from θ* = 1 inside the slab (the series reproduces the uniform initial state)", () => {
    // Carslaw & Jaeger §3.11: Σ C_n cos(ζ_n x*) = 1 for |x*| < 1. Truncated after 2000 terms the
    // observed residual at x* ≤ 0.5 is 2.5e-8; 1e-6 leaves a margin of 40.
    for (const xStar of [0, 0.25, 0.5]) expect(Math.abs(slabTheta(1, 0, xStar, 2000) - 1)).toBeLessThanOrEqual(1e-6);
  });
});

describe("error function (tests/support/analytic.ts)", () => {
  it.each([
    [0.1, 0.112462916],
    [0.5, 0.5204998778],
    [1.0, 0.8427007929],
    [1.5, 0.9661051465],
    [2.0, 0.995322265],
  ])("matches Abramowitz & Stegun Table 7.1 at x = %s", (x, value) => {
    // A&S Table 7.1 to 10 decimals (values from memory; they agree with the C library's erf as
    // printed by Python's math.erf). Half a unit in the 10th decimal: 5e-11.
    expect(Math.abs(erf(x) - value)).toBeLessThanOrEqual(5e-11);
    expect(Math.abs(erf(-x) + value)).toBeLessThanOrEqual(5e-11); // erf is odd (A&S 7.1.9)
  });

  it("gives erfc in the continued-fraction range beyond x = 3 to 12 significant digits", () => {
    // erfc 3 = 2.209049699858544e-5, erfc 4 = 1.541725790028002e-8 (from memory; agree with the
    // C library's erfc). The branch claims ~1e-13 relative; 1e-12 leaves a margin of ten.
    expect(Math.abs(erfc(3) / 2.209049699858544e-5 - 1)).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(erfc(4) / 1.541725790028002e-8 - 1)).toBeLessThanOrEqual(1e-12);
    // The two branches meet at x = 3: the slope there is (2/√π)e^{−9} = 1.4e-4, so the true change
    // over 2e-9 is 3e-13; 1e-12 bounds any jump between the series and the continued fraction.
    expect(Math.abs(erf(3 - 1e-9) - erf(3 + 1e-9))).toBeLessThanOrEqual(1e-12);
  });
});

describe("semi-infinite solid with surface convection, Incropera eq. 5.60 (tests/support/analytic.ts)", () => {
  const k = 30;
  const alpha = 30 / 3.6e6;

  it("tends to the fixed-surface erfc solution as h grows (Incropera eq. 5.57, case 1)", () => {
    // The second term is ~ exp(hx/k + b²) erfc(η + b) ~ 1/(b√π)·exp(−η²) for b = h√(αt)/k → ∞:
    // with b ≈ 4.3e3 that is ≤ 1.3e-4 (observed 1.31e-4 at the surface); 2e-4 is that bound with
    // margin. exp(hx/k + b²) alone overflows here, so this also checks the scaled evaluation.
    const t = 20;
    for (const x of [0, 0.005, 0.01, 0.02]) {
      const eta = x / (2 * Math.sqrt(alpha * t));
      const value = semiInfiniteConvection(x, t, 1e7, k, alpha);
      expect(Number.isFinite(value)).toBe(true);
      expect(Math.abs(value - erfc(eta))).toBeLessThanOrEqual(2e-4);
    }
  });

  it("gives no change with h = 0 and the closed surface value 1 − exp(b²)erfc(b) for finite h", () => {
    // h = 0: erfc(η) − erfc(η) exactly. Finite h: the surface lags the medium (eq. 5.60 at x = 0
    // is 1 − exp(b²)erfc(b)); b = 1 gives 1 − e·erfc(1) = 0.572416 with erfc 1 = 0.1572992071
    // from A&S Table 7.1 (10 decimals: e × 5e-11 rounding, so 1e-9 with margin).
    expect(semiInfiniteConvection(0.004, 10, 0, k, alpha)).toBe(0);
    const h = k / Math.sqrt(alpha * 10); // b = 1
    expect(Math.abs(semiInfiniteConvection(0, 10, h, k, alpha) - (1 - Math.E * 0.1572992071))).toBeLessThanOrEqual(1e-9);
  });
});
