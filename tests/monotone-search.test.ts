/**
 * Searches on falling functions (src/io/monotone-search.ts), against answers known by construction:
 * step functions whose crossing is placed by hand, and a linear function whose root is exact.
 */
import { describe, expect, it } from "vitest";
import { firstAtOrBelow, solveFalling } from "../src/io/monotone-search.js";

/** A falling staircase 1000 − 20 n, counting its calls. */
function staircase() {
  const calls: number[] = [];
  return { calls, f: (n: number) => (calls.push(n), 1000 - 20 * n) };
}

describe("the crossing of a falling function of a whole number", () => {
  it("is the smallest n at or below the target, found by bisection or by galloping from any guess", () => {
    // 1000 − 20 n ≤ 610 ⇔ n ≥ 19.5 ⇒ 20.
    for (const guess of [undefined, 0, 5, 19, 20, 21, 40]) expect(firstAtOrBelow(staircase().f, 40, 610, guess)).toBe(20);
  });
  it("is max + 1 when even the last value is above the target, and 0 when the first is already below", () => {
    expect(firstAtOrBelow(staircase().f, 40, 100)).toBe(41);
    expect(firstAtOrBelow(staircase().f, 40, 100, 3)).toBe(41);
    expect(firstAtOrBelow(staircase().f, 40, 2000)).toBe(0);
    expect(firstAtOrBelow(staircase().f, 40, 2000, 30)).toBe(0);
  });
  it("costs a few calls from a good guess and about log2(max) without one", () => {
    const near = staircase();
    firstAtOrBelow(near.f, 40, 610, 20);
    expect(near.calls.length).toBeLessThanOrEqual(2); // f(20) ≤ target, f(19) > target
    const cold = staircase();
    firstAtOrBelow(cold.f, 40, 610);
    expect(cold.calls.length).toBeLessThanOrEqual(Math.ceil(Math.log2(42))); // bisection of [−1, 41]
  });
});

describe("solving a falling function of a scale on a grid", () => {
  it("finds the root of a linear function to within one grid step", () => {
    // g(s) = 700 − 100 s = 600 at s = 1: exact, reached on the 0.001 grid.
    const sol = solveFalling((s) => 700 - 100 * s, 0.5, 1.5, 600, 0.05, 0.001, [[1.2, 580]]);
    expect(sol.converged).toBe(true);
    expect(Math.abs(sol.s - 1)).toBeLessThanOrEqual(0.001);
  });
  it("stays on the grid for a curved function and meets the tolerance", () => {
    // g(s) = 800 − 200 √s = 600 at s = 1; tolerance 0.1 K ⇒ |s − 1| ≤ ~0.001.
    const sol = solveFalling((s) => 800 - 200 * Math.sqrt(s), 0.5, 1.5, 600, 0.1, 0.001);
    expect(sol.converged).toBe(true);
    expect(Math.abs(sol.value - 600)).toBeLessThanOrEqual(0.1);
    expect(Math.round(sol.s * 1000) / 1000).toBe(sol.s);
  });
  it("returns the nearer bound, not converged, when the target lies outside the range", () => {
    const sol = solveFalling((s) => 700 - 100 * s, 0.5, 1.5, 500, 1, 0.001);
    expect(sol).toEqual({ s: 1.5, value: 550, converged: false });
  });
});
