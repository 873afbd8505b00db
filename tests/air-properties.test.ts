import { describe, it, expect } from "vitest";
import {
  AIR_ALPHA,
  AIR_DERIVATIVE_OFFSET,
  AIR_K,
  AIR_NU,
  AIR_PR,
  AIR_PROPERTY_SLOTS,
  AIR_TABLE_T_MAX_K,
  AIR_TABLE_T_MIN_K,
  airProperties,
  airPropertiesInto,
  checkAirPropertyRange,
} from "../src/physics/air-properties.js";
import type { ValidityWarning } from "../src/physics/composition.js";

// Rows of Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed. (2007), Table A.4
// (air at 1 atm) as printed: T [K], ν·10⁶ [m²/s], k·10³ [W/(m·K)], α·10⁶ [m²/s], Pr.
const PRINTED_ROWS: [number, number, number, number, number][] = [
  [300, 15.89, 26.3, 22.5, 0.707],
  [400, 26.41, 33.8, 38.3, 0.69],
  [800, 84.93, 57.3, 120, 0.709],
  [1000, 121.9, 66.7, 168, 0.726],
  [1300, 185.1, 82, 257, 0.719],
];

describe("air properties at 1 atm (Incropera & DeWitt 2007, Table A.4)", () => {
  it("returns the printed table values at tabulated temperatures", () => {
    for (const [T, nu, k, alpha, Pr] of PRINTED_ROWS) {
      const p = airProperties(T);
      // Exact rows: only the ·10⁻⁶ / ·10⁻³ scaling in floating point separates them, ≤ 1e-15 relative.
      expect(p.nu_m2_s / (nu * 1e-6) - 1).toBeCloseTo(0, 12);
      expect(p.k_W_mK / (k * 1e-3) - 1).toBeCloseTo(0, 12);
      expect(p.alpha_m2_s / (alpha * 1e-6) - 1).toBeCloseTo(0, 12);
      expect(p.Pr - Pr).toBeCloseTo(0, 12);
    }
  });

  it("has a Prandtl number equal to ν/α at every stored row, within the table's rounding", () => {
    // Pr = ν/α by definition. α is printed to 3 significant figures (≤ 0.35 % rounding at the
    // rows stored), ν to ≥ 3 (≤ 0.25 %), Pr to 3 decimals (≤ 0.08 %): together ≤ 0.7 %, so 0.8 %
    // flags a mistyped digit without flagging the book's rounding.
    for (let T = AIR_TABLE_T_MIN_K; T <= AIR_TABLE_T_MAX_K; T += T < 1000 ? 50 : 100) {
      const p = airProperties(T);
      expect(Math.abs(p.nu_m2_s / p.alpha_m2_s / p.Pr - 1)).toBeLessThan(0.008);
    }
  });

  it("interpolates linearly: at 303 K it gives the film properties quoted in Incropera's Example 9.3", () => {
    // Incropera & DeWitt 6th ed. Example 9.3 (heated duct in a crawlspace, film temperature
    // 303 K) quotes ν = 16.2e-6 m²/s, k = 0.0265 W/(m·K), α = 22.9e-6 m²/s, Pr = 0.707
    // (quoted values from memory). They are rounded to the last printed digit, so the tolerance is
    // half a unit of that digit.
    const p = airProperties(303);
    expect(Math.abs(p.nu_m2_s - 16.2e-6)).toBeLessThanOrEqual(0.05e-6);
    expect(Math.abs(p.k_W_mK - 0.0265)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(p.alpha_m2_s - 22.9e-6)).toBeLessThanOrEqual(0.05e-6);
    expect(Math.abs(p.Pr - 0.707)).toBeLessThanOrEqual(0.0005);
  });

  it("returns derivatives that match a central difference inside a table segment", () => {
    const p = new Float64Array(AIR_PROPERTY_SLOTS);
    const lo = new Float64Array(AIR_PROPERTY_SLOTS);
    const hi = new Float64Array(AIR_PROPERTY_SLOTS);
    const dT = 1e-3;
    for (const T of [333.3, 736.2, 1150.7]) {
      airPropertiesInto(T, p);
      airPropertiesInto(T - dT, lo);
      airPropertiesInto(T + dT, hi);
      for (const slot of [AIR_K, AIR_NU, AIR_ALPHA, AIR_PR]) {
        const fd = (hi[slot] - lo[slot]) / (2 * dT);
        // Linear within a segment, so the central difference is exact up to round-off,
        // ε·|value|/dT ≈ 2.2e-13·|value| per K; 1e-11·|value| per K leaves a factor 45 of margin
        // and is still 1e-9 of a typical slope (|value|/100 K).
        expect(Math.abs(fd - p[slot + AIR_DERIVATIVE_OFFSET])).toBeLessThanOrEqual(1e-11 * Math.abs(p[slot]));
      }
    }
  });

  it("is continuous across a table row", () => {
    const below = airPropertiesInto(700 - 1e-9, new Float64Array(AIR_PROPERTY_SLOTS));
    const above = airPropertiesInto(700 + 1e-9, new Float64Array(AIR_PROPERTY_SLOTS));
    // Over 2e-9 K the steepest relative slope here (ν'/ν ≈ 2.4e-3 per K) moves a property by
    // 5e-12; 1e-11 allows that, while a step at the row would be at least a printed digit (~1e-3).
    for (const slot of [AIR_K, AIR_NU, AIR_ALPHA, AIR_PR]) expect(Math.abs(above[slot] / below[slot] - 1)).toBeLessThan(1e-11);
  });

  it("warns outside 250–1500 K and stays silent inside", () => {
    const w: ValidityWarning[] = [];
    checkAirPropertyRange(300, "test", w);
    checkAirPropertyRange(1500, "test", w);
    expect(w).toHaveLength(0);
    checkAirPropertyRange(1600, "test", w);
    checkAirPropertyRange(240, "test", w);
    expect(w.map((x) => x.value)).toEqual([1600, 240]);
    expect(w[0]).toMatchObject({ kind: "validity", quantity: "film temperature", min: 250, max: 1500, unit: "K" });
  });
});
