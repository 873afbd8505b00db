import { describe, it, expect } from "vitest";
import { grainFloor_nm, grainFloorAt_nm, ModelInputError, FERRITE_MOLAR_VOLUME_m3_mol, DEFAULT_BOUNDARY_ENERGY_J_m2 } from "../src/physics/grain-floor.js";
import { ferriteDrivingForce_Jmol } from "../src/physics/sgte-iron.js";

const AVOGADRO_per_mol = 6.02214076e23; // SI 2019, exact

/** Binary (dilute Fe–C) A3 [K]: where the driving force changes sign, by bisection. */
function binaryA3_K(carbon_wt: number): number {
  let lo = 900;
  let hi = 1250;
  while (hi - lo > 1e-6) {
    const mid = 0.5 * (lo + hi);
    if (ferriteDrivingForce_Jmol(mid, carbon_wt) < 0) lo = mid;
    else hi = mid;
  }
  return lo;
}

describe("thermodynamic grain-size floor", () => {
  it("is about 10 nm for |ΔG| ≈ 700 J/mol and σ ≈ 0.5 J/m²", () => {
    const floor = grainFloor_nm(-700, 0.5);
    // By hand: 2 · 0.5 · 7.1e−6 / 700 = 1.01429e−8 m; tolerance 1e−9 nm: round-off only.
    expect(Math.abs(floor - 10.142857142857)).toBeLessThan(1e-9);
    // Common practice (no source): "about 10 nm"; the band ±10 % is the precision of "about".
    expect(floor).toBeGreaterThan(9);
    expect(floor).toBeLessThan(11);
  });

  it("uses a ferrite molar volume consistent with the bcc lattice parameter of iron", () => {
    // a(α-Fe, room temperature) = 2.8665 Å (from memory; handbook value); V_m = N_A a³ / 2.
    const fromLattice = (AVOGADRO_per_mol * (2.8665e-10) ** 3) / 2;
    // Tolerance 0.5 %: 7.1e−6 is quoted to two significant figures (±0.7 % rounding), and a varies
    // by ~0.1 % with carbon and temperature.
    expect(Math.abs(FERRITE_MOLAR_VOLUME_m3_mol / fromLattice - 1)).toBeLessThan(0.005);
  });

  it("scales linearly with σ and with 1/|ΔG|", () => {
    const ref = grainFloor_nm(-400, 0.5);
    // Exact proportionality; tolerance 1e−12 relative: round-off only.
    expect(Math.abs(grainFloor_nm(-400, 0.8) / ref - 1.6)).toBeLessThan(1e-12);
    expect(Math.abs(grainFloor_nm(-800, 0.5) / ref - 0.5)).toBeLessThan(1e-12);
    expect(Math.abs(grainFloor_nm(-400, 0.5, 2 * FERRITE_MOLAR_VOLUME_m3_mol) / ref - 2)).toBeLessThan(1e-12);
  });

  it("lies far below 1 µm at every realistic transformation temperature of 0.05–0.3 %C steel", () => {
    // Common practice (no source): production ferrite stays above about 1 µm, and transformation on
    // continuous cooling needs an undercooling of at least ~30 K below Ae3. Grid: 500–850 °C, only
    // points at least 30 K below the binary A3 of the same driving-force model.
    let worst_nm = 0;
    let points = 0;
    for (const C of [0.05, 0.1, 0.15, 0.2, 0.25, 0.3]) {
      const limit_K = binaryA3_K(C) - 30;
      for (let T_C = 500; T_C <= 850; T_C += 10) {
        const T_K = T_C + 273.15;
        if (T_K > limit_K) continue;
        const floor = grainFloorAt_nm(T_K, C, DEFAULT_BOUNDARY_ENERGY_J_m2);
        worst_nm = Math.max(worst_nm, floor);
        points++;
        // On the run-out table (≤ 750 °C, common practice) the floor is tens of nm.
        if (T_C <= 750) expect(floor).toBeLessThan(50);
      }
    }
    expect(points).toBeGreaterThan(100);
    // At 30 K undercooling |ΔG| ≈ 35–63 J/mol → ≤ 0.21 µm: at least five times below 1 µm.
    expect(worst_nm).toBeLessThan(250);
  });

  it("refuses ΔG ≥ 0 and σ ≤ 0 with a typed error carrying field and expectation", () => {
    const cases: Array<[number, number, string]> = [
      [0, 0.5, "drivingForce_Jmol"],
      [120, 0.5, "drivingForce_Jmol"],
      [-500, 0, "interfaceEnergy_J_m2"],
      [-500, -0.2, "interfaceEnergy_J_m2"],
    ];
    for (const [dG, sigma, field] of cases) {
      let caught: unknown;
      try {
        grainFloor_nm(dG, sigma);
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(ModelInputError);
      const err = caught as ModelInputError;
      expect(err.kind).toBe("input");
      expect(err.field).toBe(field);
      expect(typeof err.expected).toBe("string");
      expect(err.expected.length).toBeGreaterThan(0);
    }
  });

  it("refuses a temperature above the binary A3, where ferrite cannot form", () => {
    expect(() => grainFloorAt_nm(binaryA3_K(0.2) + 5, 0.2)).toThrow(ModelInputError);
  });
});
