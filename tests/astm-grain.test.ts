import { describe, it, expect } from "vitest";
import { astmGrainNumber, meanInterceptFromAstm_um } from "../src/physics/astm-grain.js";

// ASTM E112 table of grain-size relationships, mean lineal intercept ℓ in mm for G — values from
// memory (not checked against the standard). They are printed to 3 significant figures, so the
// tolerance is half a unit in the third figure relative to the value: 0.5/320 ≈ 0.16 % worst
// case; we use 0.25 % of ℓ, still far below the 41 % step between neighbouring G numbers.
const e112Table: [number, number][] = [
  [0, 0.32],
  [2, 0.16],
  [4, 0.08],
  [5, 0.0566],
  [6, 0.04],
  [7, 0.0283],
  [8, 0.02],
  [10, 0.01],
  [12, 0.005],
];

describe("ASTM E112 grain-size number and mean lineal intercept", () => {
  it("reproduces E112's intercept for G = 0, 2, 4, 5, 6, 7, 8, 10, 12 (0.32 mm … 5 µm, from memory)", () => {
    for (const [G, l_mm] of e112Table) {
      const l_um = meanInterceptFromAstm_um(G);
      expect(Math.abs(l_um - 1000 * l_mm) / (1000 * l_mm)).toBeLessThan(0.0025);
    }
  });

  it("gives the E112 grain-size number of the tabulated intercepts within 0.01", () => {
    // 0.25 % in ℓ corresponds to 6.643856·log10(1.0025) = 0.0072 in G.
    for (const [G, l_mm] of e112Table) expect(Math.abs(astmGrainNumber(1000 * l_mm) - G)).toBeLessThan(0.01);
  });

  it("halves the intercept for every two grain-size numbers, as E112's N = 2^(G−1) per in² at 100× implies", () => {
    // Areal grain density ∝ ℓ⁻² and doubles per G number → ℓ ratio √2 per G. Tolerance 1e−7: E112
    // prints the slope as 6.643856, 2.9e−8 short of 2/log10 2 = 6.6438562; that shifts the ratio by 4e−8.
    for (const G of [-1, 3.5, 9, 14]) {
      expect(Math.abs(meanInterceptFromAstm_um(G) / meanInterceptFromAstm_um(G + 2) - 2)).toBeLessThan(1e-7);
    }
  });

  it("round-trips G → ℓ → G and ℓ → G → ℓ to round-off", () => {
    // Relative 1e−12: one log10 and one power, each correct to a few ulp.
    for (let G = -1; G <= 14; G += 0.37) expect(Math.abs(astmGrainNumber(meanInterceptFromAstm_um(G)) - G)).toBeLessThan(1e-12 * 15);
    for (const l of [2.5, 10, 31.4, 100, 450]) expect(Math.abs(meanInterceptFromAstm_um(astmGrainNumber(l)) - l) / l).toBeLessThan(1e-12);
  });

  it("rejects non-positive or non-finite intercepts and non-finite grain numbers", () => {
    expect(() => astmGrainNumber(0)).toThrow(RangeError);
    expect(() => astmGrainNumber(-5)).toThrow(RangeError);
    expect(() => astmGrainNumber(Number.NaN)).toThrow(RangeError);
    expect(() => meanInterceptFromAstm_um(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });
});
