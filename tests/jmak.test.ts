import { describe, it, expect } from "vitest";
import { jmakFraction, jmakFromTimes, jmakGrow, jmakInterval, jmakTable, jmakTime_s, jmakWeight, type UserKineticsCurve } from "../src/physics/jmak.js";

// Invented TTT rows for a demo steel (not from any real diagram).
const curve: UserKineticsCurve = {
  startFraction: 0.01,
  finishFraction: 0.99,
  points: [
    { T_C: 700, start_s: 20, finish_s: 400 },
    { T_C: 600, start_s: 1.5, finish_s: 30 },
    { T_C: 650, start_s: 4, finish_s: 90 },
  ],
};

describe("JMAK constants from start and finish times (physics.md §5.3)", () => {
  it("gives n·ln(t99/t1) = 6.127329 and k·t1ⁿ = 0.01005034 for 1 %/99 %", () => {
    // [calc, physics.md §5.3], printed to 6 and 8 significant decimals: half a unit in the last
    // printed digit (+1 % for float noise).
    for (const [t1, t99] of [[1, 10], [3.5, 80], [100, 5000]] as const) {
      const { n, lnk } = jmakFromTimes(t1, t99, 0.01, 0.99);
      expect(Math.abs(n * Math.log(t99 / t1) - 6.127329)).toBeLessThanOrEqual(0.5e-6 * 1.01);
      expect(Math.abs(Math.exp(lnk) * t1 ** n - 0.01005034)).toBeLessThanOrEqual(0.5e-8 * 1.01);
    }
  });

  it("round-trips every row of a table: Y(t_s) = Y_s and Y(t_f) = Y_f", () => {
    // Definition of the fit, evaluated back through exp/log: round-off only, 1e−12 absolute.
    const table = jmakTable(curve);
    for (const row of curve.points) {
      const T_K = row.T_C + 273.15;
      const i = jmakInterval(table, T_K);
      const w = jmakWeight(table, i, T_K);
      const n = table.n[i] + w * (table.n[i + 1] - table.n[i]);
      const lnk = table.lnk[i] + w * (table.lnk[i + 1] - table.lnk[i]);
      expect(Math.abs(jmakFraction(row.start_s, n, lnk) - 0.01)).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(jmakFraction(row.finish_s, n, lnk) - 0.99)).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(jmakTime_s(0.01, n, lnk) / row.start_s - 1)).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(Math.exp((table.lnStart - lnk) / n) / row.start_s - 1)).toBeLessThanOrEqual(1e-12);
    }
  });

  it("scales all times by the calibration factor without changing n", () => {
    const base = jmakTable(curve);
    const slow = jmakTable(curve, 3);
    for (let i = 0; i < 3; i++) {
      // n is scale-free; k·(3t)ⁿ = k₀tⁿ ⇒ ln k = ln k₀ − n ln 3 (round-off, 1e−12).
      expect(Math.abs(slow.n[i] - base.n[i])).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(slow.lnk[i] - (base.lnk[i] - base.n[i] * Math.log(3)))).toBeLessThanOrEqual(1e-12);
    }
  });

  it("interpolates n and ln k linearly between rows and reports −1 outside the table", () => {
    const table = jmakTable(curve);
    expect(Array.from(table.T_K)).toEqual([873.15, 923.15, 973.15]);
    const i = jmakInterval(table, 948.15);
    expect(i).toBe(1);
    expect(jmakWeight(table, i, 948.15)).toBeCloseTo(0.5, 12); // (948.15 − 923.15)/50: round-off only
    expect(jmakInterval(table, 873.15)).toBe(0);
    expect(jmakInterval(table, 973.15)).toBe(1);
    expect(jmakInterval(table, 873.0)).toBe(-1);
    expect(jmakInterval(table, 975)).toBe(-1);
  });

  it("refuses fractions or times that cannot define a curve", () => {
    expect(() => jmakFromTimes(10, 5, 0.01, 0.99)).toThrow(RangeError);
    expect(() => jmakFromTimes(1, 5, 0.5, 0.2)).toThrow(RangeError);
    expect(() => jmakTable({ ...curve, points: [curve.points[0]] })).toThrow(RangeError);
    expect(() => jmakTable({ ...curve, points: [curve.points[0], curve.points[0]] })).toThrow(RangeError);
  });
});

describe("Equivalent-time growth (Hawbolt, Chau & Brimacombe 1983)", () => {
  it("reproduces the isothermal curve when stepped at one temperature", () => {
    // Each step maps Y → t* → Y(t* + Δt) on the same curve: round-off accumulates over 1000
    // steps to ≈ 1e−13; 1e−10 absolute.
    const { n, lnk } = jmakFromTimes(4, 90, 0.01, 0.99);
    let Y = jmakFraction(4, n, lnk);
    for (let step = 1; step <= 1000; step++) {
      Y = jmakGrow(Y, n, lnk, 0.1);
      if (step % 100 === 0) expect(Math.abs(Y - jmakFraction(4 + 0.1 * step, n, lnk))).toBeLessThanOrEqual(1e-10);
    }
  });

  it("with a common n, adds k^(1/n)·t over two holds (the additivity closed form)", () => {
    // Y = 1 − exp(−(k₁^(1/n) t₁ + k₂^(1/n) t₂)ⁿ) follows from additivity when n is the same at both
    // temperatures (Cahn's isokinetic condition, Acta Metall. 4 (1956) 572 — citation from memory);
    // round-off only, 1e−12.
    const n = 2.5;
    const lnk1 = Math.log(1e-4);
    const lnk2 = Math.log(3e-3);
    const t1 = 12;
    const t2 = 5;
    const Y1 = jmakFraction(t1, n, lnk1);
    const Y = jmakGrow(Y1, n, lnk2, t2);
    const expected = 1 - Math.exp(-((Math.exp(lnk1 / n) * t1 + Math.exp(lnk2 / n) * t2) ** n));
    expect(Math.abs(Y - expected)).toBeLessThanOrEqual(1e-12);
  });
});
