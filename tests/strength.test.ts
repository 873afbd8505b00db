import { describe, it, expect } from "vitest";
import { fullComposition } from "../src/physics/composition.js";
import { pickeringStrength, PICKERING_HALL_PETCH_MPa_mm05 } from "../src/physics/strength.js";
import { ModelInputError } from "../src/physics/grain-floor.js";

// Pickering (1978), full equations from memory; solid-solution coefficients pub: Pickering &
// Gladman as tabulated in Llewellyn & Hudd, Table 2.1.
const steel = fullComposition({ C: 0.1, Mn: 0.6, Si: 0.2 });

describe("Pickering ferrite–pearlite strength", () => {
  it("reproduces the physics.md check values YS 268.9 and TS 441.6 MPa", () => {
    // physics.md §7 [calc]: 0.10C-0.60Mn-0.20Si, N_f 0.005, d = 12.77 µm, 12 % pearlite.
    const s = pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 12.77, pearliteFraction: 0.12 });
    // Tolerance 0.05 MPa: physics.md quotes one decimal.
    expect(Math.abs(s.yield_MPa - 268.9)).toBeLessThan(0.05);
    expect(Math.abs(s.tensile_MPa - 441.6)).toBeLessThan(0.05);
  });

  it("uses the solid-solution coefficients of Pickering & Gladman for Mn and Si", () => {
    // pub: Llewellyn & Hudd Table 2.1 gives Mn 32 and Si 83 MPa per wt%. Tolerance 1 MPa/wt%: the
    // table rounds to whole MPa (Pickering's 32.3 and 83.2).
    const base = pickeringStrength({ composition: fullComposition({ C: 0.1 }), freeNitrogen_wt: 0, ferriteIntercept_um: 20, pearliteFraction: 0.1 });
    const withMn = pickeringStrength({ composition: fullComposition({ C: 0.1, Mn: 1 }), freeNitrogen_wt: 0, ferriteIntercept_um: 20, pearliteFraction: 0.1 });
    const withSi = pickeringStrength({ composition: fullComposition({ C: 0.1, Si: 1 }), freeNitrogen_wt: 0, ferriteIntercept_um: 20, pearliteFraction: 0.1 });
    expect(Math.abs(withMn.yield_MPa - base.yield_MPa - 32)).toBeLessThan(1);
    expect(Math.abs(withSi.yield_MPa - base.yield_MPa - 83)).toBeLessThan(1);
  });

  it("follows Hall–Petch with k_y = 17.4 MPa·mm^½ = 0.55 MPa·m^½ on the mean linear intercept", () => {
    // physics.md §7: k_y ≈ 0.55 MPa·m^½. 17.4/√1000 = 0.5502; tolerance 0.001: the quoted 0.55 is
    // rounded to two decimals (±0.005) and the conversion is exact.
    expect(Math.abs(PICKERING_HALL_PETCH_MPa_mm05 / Math.sqrt(1000) - 0.55)).toBeLessThan(0.001);
    const coarse = pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 20, pearliteFraction: 0.1 });
    const fine = pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 5, pearliteFraction: 0.1 });
    // ΔYS = 17.4 (5e−3^−½ − 20e−3^−½) = 17.4 (14.1421 − 7.0711) = 123.04 MPa by hand; tolerance 0.01 MPa
    // covers the rounding of the hand value.
    expect(Math.abs(fine.yield_MPa - coarse.yield_MPa - 123.036)).toBeLessThan(0.01);
    expect(fine.tensile_MPa).toBeGreaterThan(coarse.tensile_MPa);
  });

  it("raises tensile strength by 3.85 MPa per percent pearlite and leaves yield unchanged", () => {
    const a = pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 10, pearliteFraction: 0.1 });
    const b = pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 10, pearliteFraction: 0.2 });
    // 10 % more pearlite → 38.5 MPa; tolerance 1e−9 MPa: round-off only.
    expect(Math.abs(b.tensile_MPa - a.tensile_MPa - 38.5)).toBeLessThan(1e-9);
    expect(b.yield_MPa).toBe(a.yield_MPa);
  });

  it("refuses a non-positive grain size and a pearlite fraction outside [0, 1]", () => {
    expect(() => pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 0, pearliteFraction: 0.1 })).toThrow(ModelInputError);
    expect(() => pickeringStrength({ composition: steel, freeNitrogen_wt: 0.005, ferriteIntercept_um: 10, pearliteFraction: 12 })).toThrow(ModelInputError);
    expect(() => pickeringStrength({ composition: steel, freeNitrogen_wt: -0.001, ferriteIntercept_um: 10, pearliteFraction: 0.1 })).toThrow(ModelInputError);
  });
});
