/**
 * Regularised least squares (src/io/levenberg-marquardt.ts) against closed forms: ordinary linear
 * regression (normal equations, covariance s²(XᵀX)⁻¹, Draper & Smith, Applied Regression Analysis,
 * 3rd ed. 1998, ch. 5 — edition and chapter from memory) and ridge regression ((XᵀX + λI)⁻¹Xᵀy, Hoerl & Kennard 1970), and an exponential decay
 * recovered exactly from noise-free data.
 */
import { describe, expect, it } from "vitest";
import { fitLeastSquares, solveDense } from "../src/io/levenberg-marquardt.js";

const xs = [0, 1, 2, 3, 4, 5];
const ys = [1.1, 2.9, 5.2, 6.8, 9.1, 10.9]; // about 1 + 2x with scatter
const linear = async (thetas: readonly number[][]) => thetas.map(([a, b]) => xs.map((x, i) => a + b * x - ys[i]));
const options = { weights: [0, 0], centres: [0, 0], step: 1e-6, maxIterations: 20, stepTolerance: 1e-12 };

/** Closed-form straight-line fit and its covariance. */
function ols() {
  const n = xs.length;
  const sx = xs.reduce((s, x) => s + x, 0);
  const sxx = xs.reduce((s, x) => s + x * x, 0);
  const sy = ys.reduce((s, y) => s + y, 0);
  const sxy = xs.reduce((s, x, i) => s + x * ys[i], 0);
  const det = n * sxx - sx * sx;
  const b = (n * sxy - sx * sy) / det;
  const a = (sy - b * sx) / n;
  const rss = xs.reduce((s, x, i) => s + (a + b * x - ys[i]) ** 2, 0);
  const s2 = rss / (n - 2);
  return { a, b, sa: Math.sqrt((s2 * sxx) / det), sb: Math.sqrt((s2 * n) / det) };
}

describe("least squares", () => {
  it("reproduces the straight-line fit and its standard errors", async () => {
    const fit = await fitLeastSquares(linear, [0, 0], options);
    const ref = ols();
    // Linear residuals: the forward difference is exact up to round-off of a 1e-6 step (~1e-9 relative).
    expect(fit.theta[0]).toBeCloseTo(ref.a, 6);
    expect(fit.theta[1]).toBeCloseTo(ref.b, 6);
    expect(fit.sigma[0]).toBeCloseTo(ref.sa, 6);
    expect(fit.sigma[1]).toBeCloseTo(ref.sb, 6);
    expect(fit.degreesOfFreedom).toBeCloseTo(4, 9); // n − p with no regularisation
  });

  it("with Tikhonov weights gives the ridge solution (XᵀX + λI)⁻¹Xᵀy", async () => {
    const lambda = 5;
    const fit = await fitLeastSquares(linear, [0, 0], { ...options, weights: [lambda, lambda] });
    const n = xs.length;
    const sx = xs.reduce((s, x) => s + x, 0);
    const sxx = xs.reduce((s, x) => s + x * x, 0);
    const XtY = [ys.reduce((s, y) => s + y, 0), xs.reduce((s, x, i) => s + x * ys[i], 0)];
    const ref = solveDense([[n + lambda, sx], [sx, sxx + lambda]], XtY)!;
    // Still linear residuals: as above, limited by the 1e-6 forward-difference step (6 decimals).
    expect(fit.theta[0]).toBeCloseTo(ref[0], 6);
    expect(fit.theta[1]).toBeCloseTo(ref[1], 6);
    expect(fit.degreesOfFreedom).toBeGreaterThan(4); // shrinkage frees degrees of freedom
  });

  it("recovers the rate of an exponential decay from noise-free data", async () => {
    // y = 800 exp(−0.3 t): a nonlinear fit of ln k started from k = 0.1.
    const ts = [0.5, 1, 2, 4, 8];
    const res = async (thetas: readonly number[][]) => thetas.map(([lnk]) => ts.map((t) => 800 * Math.exp(-Math.exp(lnk) * t) - 800 * Math.exp(-0.3 * t)));
    const fit = await fitLeastSquares(res, [Math.log(0.1)], { weights: [0], centres: [0], step: 1e-6, maxIterations: 50, stepTolerance: 1e-10 });
    expect(Math.exp(fit.theta[0])).toBeCloseTo(0.3, 6); // noise-free: limited by the stopping step
  });

  it("names a parameter nothing depends on", async () => {
    // The residuals use only the first parameter; the second is free and unregularised.
    const fit = await fitLeastSquares(async (thetas) => thetas.map(([a]) => [a - 1, a - 2]), [0, 0], options);
    expect(fit.unidentified).toEqual([1]);
    expect(fit.theta[0]).toBeCloseTo(1.5, 9); // mean of 1 and 2
  });
});
