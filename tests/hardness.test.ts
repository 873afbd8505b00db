import { describe, it, expect } from "vitest";
import { fullComposition } from "../src/physics/composition.js";
import { PHASE_COUNT, FERRITE, PEARLITE, BAINITE, MARTENSITE, AUSTENITE } from "../src/physics/phases.js";
import {
  maynierMartensiteHV,
  maynierBainiteHV,
  maynierFerritePearliteHV,
  mixtureHardnessHV,
  tensileFromHardnessRule_MPa,
} from "../src/physics/hardness.js";
import { pickeringStrength } from "../src/physics/strength.js";
import { ModelInputError } from "../src/physics/grain-floor.js";

// Maynier, Jungmann & Dollet (1978), published equations (coefficients as stated in hardness.ts;
// physics.md does not list them yet, so these are checks of the code against the formula as
// printed there, not against an independently confirmed copy). Check values computed by hand
// below from that formula, with
// V_r = 10 K/s · 3600 = 36 000 °C/h, log10 V_r = 4.5563025.
const alloy = fullComposition({ C: 0.4, Mn: 0.9, Si: 0.25, Cr: 1.0, Mo: 0.2 });
const LOG_VR = 4.5563025007672873;

function fractions(values: Partial<Record<number, number>>): Float64Array {
  const f = new Float64Array(PHASE_COUNT);
  for (const [i, v] of Object.entries(values)) f[Number(i)] = v ?? 0;
  return f;
}

describe("Maynier hardness equations", () => {
  // Tolerance 1e−9 HV in the three checks: the hand values are written to full precision, so only
  // round-off separates them.
  it("gives martensite 634.93 HV for 0.40C-0.90Mn-0.25Si-1.0Cr-0.2Mo at 10 K/s (hand calculation)", () => {
    // 127 + 949·0.40 + 27·0.25 + 11·0.90 + 16·1.0 + 21·log V_r = 127 + 379.6 + 6.75 + 9.9 + 16 + 21·4.5563025
    const byHand = 127 + 379.6 + 6.75 + 9.9 + 16 + 21 * LOG_VR;
    expect(Math.abs(byHand - 634.932352516113)).toBeLessThan(1e-9);
    expect(Math.abs(maynierMartensiteHV(alloy, 10) - byHand)).toBeLessThan(1e-9);
  });

  it("gives bainite 381.44 HV for the same steel and rate (hand calculation)", () => {
    // base −323 + 185·0.40 + 330·0.25 + 153·0.90 + 144·1.0 + 191·0.2 = −323 + 74 + 82.5 + 137.7 + 144 + 38.2 = 153.4
    // slope 89 + 53·0.40 − 55·0.25 − 22·0.90 − 20·1.0 − 33·0.2 = 89 + 21.2 − 13.75 − 19.8 − 20 − 6.6 = 50.05
    const byHand = 153.4 + 50.05 * LOG_VR;
    expect(Math.abs(maynierBainiteHV(alloy, 10) - byHand)).toBeLessThan(1e-9);
  });

  it("gives ferrite–pearlite 242.62 HV for the same steel and rate (hand calculation)", () => {
    // base 42 + 223·0.40 + 53·0.25 + 30·0.90 + 7·1.0 + 19·0.2 = 42 + 89.2 + 13.25 + 27 + 7 + 3.8 = 182.25
    // slope 10 − 19·0.25 + 8·1.0 = 13.25
    const byHand = 182.25 + 13.25 * LOG_VR;
    expect(Math.abs(maynierFerritePearliteHV(alloy, 10) - byHand)).toBeLessThan(1e-9);
  });

  it("hardens every product monotonically with the cooling rate for this steel", () => {
    const rates = [0.3, 1, 3, 10, 30, 100, 300];
    for (const hv of [maynierMartensiteHV, maynierBainiteHV, maynierFerritePearliteHV]) {
      for (let i = 1; i < rates.length; i++) expect(hv(alloy, rates[i])).toBeGreaterThan(hv(alloy, rates[i - 1]));
    }
  });

  it("orders martensite > bainite > ferrite–pearlite at equal rate", () => {
    for (const rate of [1, 10, 100]) {
      expect(maynierMartensiteHV(alloy, rate)).toBeGreaterThan(maynierBainiteHV(alloy, rate));
      expect(maynierBainiteHV(alloy, rate)).toBeGreaterThan(maynierFerritePearliteHV(alloy, rate));
    }
  });

  it("refuses a non-positive cooling rate (log V_r undefined)", () => {
    expect(() => maynierMartensiteHV(alloy, 0)).toThrow(ModelInputError);
  });
});

describe("mixture hardness", () => {
  it("weights the product hardnesses by their fractions, ferrite and pearlite sharing HV_FP", () => {
    const m = maynierMartensiteHV(alloy, 10);
    const b = maynierBainiteHV(alloy, 10);
    const fp = maynierFerritePearliteHV(alloy, 10);
    const r = mixtureHardnessHV(alloy, 10, fractions({ [FERRITE]: 0.3, [PEARLITE]: 0.1, [BAINITE]: 0.4, [MARTENSITE]: 0.2 }));
    // Tolerance 1e−9 HV: round-off only.
    expect(Math.abs(r.hardness_HV - (0.4 * fp + 0.4 * b + 0.2 * m))).toBeLessThan(1e-9);
    expect(r.warnings).toEqual([]);
    const pure = mixtureHardnessHV(alloy, 10, fractions({ [MARTENSITE]: 1 }));
    expect(Math.abs(pure.hardness_HV - m)).toBeLessThan(1e-9);
  });

  it("renormalises over the transformed products and warns about retained austenite", () => {
    const r = mixtureHardnessHV(alloy, 10, fractions({ [AUSTENITE]: 0.2, [MARTENSITE]: 0.4, [BAINITE]: 0.4 }));
    const expected = 0.5 * maynierMartensiteHV(alloy, 10) + 0.5 * maynierBainiteHV(alloy, 10);
    expect(Math.abs(r.hardness_HV - expected)).toBeLessThan(1e-9);
    expect(r.warnings.map((w) => w.quantity)).toEqual(["retained austenite fraction"]);
  });

  it("warns when the carbon content lies below the Maynier range (from memory: C ≥ 0.1)", () => {
    const lean = fullComposition({ C: 0.04, Mn: 0.25 });
    const r = mixtureHardnessHV(lean, 10, fractions({ [FERRITE]: 0.95, [PEARLITE]: 0.05 }));
    expect(r.warnings.map((w) => w.quantity)).toEqual(["C"]);
  });

  it("refuses fractions of the wrong length or outside [0, 1]", () => {
    expect(() => mixtureHardnessHV(alloy, 10, [0.5, 0.5])).toThrow(ModelInputError);
    expect(() => mixtureHardnessHV(alloy, 10, [0, 1.2, 0, 0, 0])).toThrow(ModelInputError);
    expect(() => mixtureHardnessHV(alloy, 10, [1, 0, 0, 0, 0])).toThrow(ModelInputError);
  });
});

describe("hardness → tensile conversion", () => {
  it("applies TS ≈ 3.3·HV, the kgf/mm² rule TS ≈ HV/3 converted to MPa", () => {
    // HV/3 kgf/mm² · 9.80665 MPa per kgf/mm² = 3.269 MPa per HV; tolerance 1 %: the rule is rounded
    // to two significant figures.
    expect(Math.abs(tensileFromHardnessRule_MPa(200) / (200 * 9.80665 / 3) - 1)).toBeLessThan(0.01);
  });

  it("agrees with Pickering's tensile strength for a ferrite–pearlite C–Mn steel within 15 %", () => {
    // Two independent published regressions: Maynier HV_FP (1978) → TS by the 3.3·HV rule, and
    // Pickering TS (1978) at the physics.md §7 check point (12.77 µm ferrite, 12 % pearlite, 10 K/s).
    // Band ±15 %: ±10 % scatter of hardness–tensile conversions (common practice (no source)) plus
    // the standard errors of the two regressions (a few per cent each).
    const steel = fullComposition({ C: 0.1, Mn: 0.6, Si: 0.2 });
    const fromHardness = tensileFromHardnessRule_MPa(maynierFerritePearliteHV(steel, 10));
    const pickering = pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 12.77, pearliteFraction: 0.12 }).tensile_MPa;
    expect(Math.abs(fromHardness / pickering - 1)).toBeLessThan(0.15);
  });
});
