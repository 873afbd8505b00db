import { describe, it, expect } from "vitest";
import { fullComposition } from "../src/physics/composition.js";
import { carbonEquivalentHG, hodgsonGibbsFerriteGrain_um, transformationCoolingRate_K_s, HG_COOLING_RATE_RANGE_K_s } from "../src/physics/ferrite-grain.js";
import { ModelInputError } from "../src/physics/grain-floor.js";

// Source of the relation: Hodgson & Gibbs, ISIJ Int. 32 (1992) 1329 — coefficients from memory
// (physics.md §7 tags them [mem]); the check values below are [calc] from that formula.

describe("Hodgson–Gibbs ferrite grain size", () => {
  it("reproduces the physics.md check value 12.77 µm for Ceq 0.20, 10 K/s, d_γ 30 µm", () => {
    // physics.md §7 [calc]: Ceq 0.20, Ṫ = 10 K/s, d_γ = 30 µm → 12.77 µm.
    // By hand: (−0.4 + 1.274) + (24.2 − 11.8)/√10 + 22(1 − e^−0.45) = 0.874 + 3.92125 + 7.97235 = 12.7674.
    const r = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.2, coolingRate_K_s: 10, austeniteGrain_um: 30, retainedStrain: 0 });
    // Tolerance 0.005 µm: physics.md quotes the value to two decimals.
    expect(Math.abs(r.grain_um - 12.77)).toBeLessThan(0.005);
    expect(r.warnings).toEqual([]);
  });

  it("uses the high-carbon branch from Ceq 0.35 upwards", () => {
    // By hand from the Ceq ≥ 0.35 branch: (22.6 − 57·0.40) + 3.0/√4 + 22(1 − e^0) = −0.2 + 1.5 + 0 = 1.3 µm.
    const r = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.4, coolingRate_K_s: 4, austeniteGrain_um: 0, retainedStrain: 0 });
    // Tolerance 1e−12 µm: a handful of double-precision operations on O(10) numbers.
    expect(Math.abs(r.grain_um - 1.3)).toBeLessThan(1e-12);
  });

  it("refines the grain by the factor 1 − 0.45√ε_r for retained strain", () => {
    const base = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.2, coolingRate_K_s: 10, austeniteGrain_um: 30, retainedStrain: 0 }).grain_um;
    const strained = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.2, coolingRate_K_s: 10, austeniteGrain_um: 30, retainedStrain: 0.25 }).grain_um;
    // 1 − 0.45·√0.25 = 0.775 exactly; tolerance 1e−12 relative: round-off only.
    expect(Math.abs(strained / base - 0.775)).toBeLessThan(1e-12);
  });

  it("gives finer ferrite for faster cooling and coarser ferrite for a coarser austenite", () => {
    let previous = Infinity;
    for (const rate of [0.5, 1, 3, 10, 30, 100]) {
      const d = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.18, coolingRate_K_s: rate, austeniteGrain_um: 25, retainedStrain: 0 }).grain_um;
      expect(d).toBeLessThan(previous);
      previous = d;
    }
    const fine = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.18, coolingRate_K_s: 10, austeniteGrain_um: 15, retainedStrain: 0 }).grain_um;
    const coarse = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.18, coolingRate_K_s: 10, austeniteGrain_um: 60, retainedStrain: 0 }).grain_um;
    expect(coarse).toBeGreaterThan(fine);
  });

  it("warns, without refusing, when the cooling rate or Ceq lies outside the assumed fitted range", () => {
    const fast = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.2, coolingRate_K_s: 300, austeniteGrain_um: 30, retainedStrain: 0 });
    expect(fast.grain_um).toBeGreaterThan(0);
    expect(fast.warnings).toHaveLength(1);
    expect(fast.warnings[0]).toMatchObject({ kind: "validity", quantity: "cooling rate", value: 300, min: HG_COOLING_RATE_RANGE_K_s[0], max: HG_COOLING_RATE_RANGE_K_s[1], unit: "K/s" });
    const lean = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.03, coolingRate_K_s: 10, austeniteGrain_um: 30, retainedStrain: 0 });
    expect(lean.warnings.map((w) => w.quantity)).toEqual(["Ceq = C + Mn/6"]);
  });

  it("refuses a retained strain outside [0, 1] with a typed error naming the field", () => {
    for (const bad of [-0.1, 1.5, Number.NaN]) {
      let caught: unknown;
      try {
        hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.2, coolingRate_K_s: 10, austeniteGrain_um: 30, retainedStrain: bad });
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(ModelInputError);
      expect(caught).toMatchObject({ kind: "input", field: "retainedStrain", expected: "in [0, 1]" });
    }
  });

  it("refuses a non-positive cooling rate, for which Ṫ^−½ is undefined", () => {
    expect(() => hodgsonGibbsFerriteGrain_um({ carbonEquivalent: 0.2, coolingRate_K_s: 0, austeniteGrain_um: 30, retainedStrain: 0 })).toThrow(ModelInputError);
  });
});

describe("carbon equivalent and transformation cooling rate", () => {
  it("computes Ceq = C + Mn/6", () => {
    // 0.10 + 0.60/6 = 0.20; tolerance 1e−15: round-off only.
    expect(Math.abs(carbonEquivalentHG(fullComposition({ C: 0.1, Mn: 0.6, Si: 0.2 })) - 0.2)).toBeLessThan(1e-15);
  });

  it("returns the constant rate for a linear cooling path, whichever window is taken", () => {
    // Analytic: T(t) = 1150 − 12 t [K] cools at exactly 12 K/s.
    const T = (t: number) => 1150 - 12 * t;
    // Tolerance 1e−12 K/s: round-off in a difference of O(1000) numbers.
    expect(Math.abs(transformationCoolingRate_K_s(T(3), 3, T(7.5), 7.5) - 12)).toBeLessThan(1e-12);
    expect(Math.abs(transformationCoolingRate_K_s(T(0.2), 0.2, T(20), 20) - 12)).toBeLessThan(1e-12);
  });

  it("is negative when recalescence heats the node across the window, and refuses a reversed window", () => {
    expect(transformationCoolingRate_K_s(1000, 1, 1004, 2)).toBeLessThan(0);
    expect(() => transformationCoolingRate_K_s(1000, 2, 990, 2)).toThrow(ModelInputError);
  });
});
