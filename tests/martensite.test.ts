import { describe, it, expect } from "vitest";
import { KM_COEFFICIENT_PER_K, kmFraction, kmStepConversion, kmTemperatureForFraction } from "../src/physics/martensite.js";

describe("Koistinen–Marburger martensite (Acta Metall. 7, 1959)", () => {
  const Ms_K = 325.8 + 273.15;

  it("reaches 50 % at Ms − 63.0 K and 90 % at Ms − 209.3 K with α = 0.011/K", () => {
    // [calc, physics.md §5.4], printed to 0.1 K: half a unit = 0.05 K.
    expect(KM_COEFFICIENT_PER_K).toBe(0.011);
    expect(Math.abs(Ms_K - kmTemperatureForFraction(Ms_K, 0.5) - 63.0)).toBeLessThanOrEqual(0.05);
    expect(Math.abs(Ms_K - kmTemperatureForFraction(Ms_K, 0.9) - 209.3)).toBeLessThanOrEqual(0.05);
    // The closed form at those temperatures: slope df/dT = α(1 − f) ≤ 0.0055/K times 0.05 K.
    expect(Math.abs(kmFraction(Ms_K, Ms_K - 63.0) - 0.5)).toBeLessThanOrEqual(0.0055 * 0.05);
    expect(Math.abs(kmFraction(Ms_K, Ms_K - 209.3) - 0.9)).toBeLessThanOrEqual(0.0011 * 0.05);
  });

  it("the stepped rate form on the remaining austenite equals the closed form on monotonic cooling", () => {
    // Per-step factors exp(−αΔT_i) multiply to exp(−αΣΔT_i): round-off only over 400 steps, 1e−13.
    let austenite = 1;
    let martensite = 0;
    let T = Ms_K + 20;
    for (let step = 0; step < 400; step++) {
      const T_new = T - 0.7;
      const dM = austenite * kmStepConversion(Ms_K, T, T_new);
      martensite += dM;
      austenite -= dM;
      T = T_new;
    }
    expect(Math.abs(martensite - kmFraction(Ms_K, T))).toBeLessThanOrEqual(1e-13);
    expect(martensite).toBeGreaterThan(0.9);
  });

  it("forms nothing on heating, above Ms, or for the part of a step above Ms", () => {
    expect(kmStepConversion(Ms_K, Ms_K - 50, Ms_K - 40)).toBe(0);
    expect(kmStepConversion(Ms_K, Ms_K + 30, Ms_K + 10)).toBe(0);
    expect(kmFraction(Ms_K, Ms_K + 5)).toBe(0);
    // Crossing Ms: only the 10 K below Ms count (exact expression, round-off only).
    expect(Math.abs(kmStepConversion(Ms_K, Ms_K + 15, Ms_K - 10) - (1 - Math.exp(-0.11)))).toBeLessThanOrEqual(1e-15);
  });
});
