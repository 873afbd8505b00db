import { describe, it, expect } from "vitest";
import {
  DEFAULT_WATER_CURVE,
  WATER_REGIONS,
  WaterBoilingFace,
  bolleMoureauHtc_W_m2K,
  resolveWaterCurve,
  shimadaMitsutsukaHtc_W_m2K,
  waterFluxDensity_L_m2s,
} from "../src/physics/water-cooling.js";
import type { WaterRegion } from "../src/physics/water-cooling.js";
import type { ValidityWarning } from "../src/physics/composition.js";

const C_TO_K = 273.15;
const WATER_30C = 30 + C_TO_K;

function faceAt(region: WaterRegion, W?: number, water_K = WATER_30C, multiplier = 1): WaterBoilingFace {
  const curve = resolveWaterCurve(region);
  return new WaterBoilingFace({ curve, waterFlux_L_m2s: W ?? curve.referenceWaterFlux_L_m2s, water_K, multiplier });
}

function flux(face: WaterBoilingFace, T_K: number): number {
  const out = new Float64Array(2);
  face.evaluate(T_K, out);
  return out[0];
}

describe("boiling curve shape", () => {
  it("is continuous from 20 to 1000 °C: no step above 1 kW/m² between temperatures 0.01 K apart", () => {
    // Bound: 0.01 K × 100 kW/(m²·K), above the steepest slope of any default curve (≈ 55 kW/(m²·K)
    // in the impingement nucleate segment, asserted below) and far below the smallest anchor flux
    // (q at the onset of boiling, ≥ 240 kW/m²) — so a missing blend between two regimes would show.
    const a = new Float64Array(2);
    const b = new Float64Array(2);
    const step = 0.01;
    for (const region of WATER_REGIONS) {
      const face = faceAt(region);
      let worstJump = 0;
      let steepest = 0;
      for (let T = 20 + C_TO_K; T < 1000 + C_TO_K; T += step) {
        face.evaluate(T, a);
        face.evaluate(T + step, b);
        worstJump = Math.max(worstJump, Math.abs(b[0] - a[0]));
        steepest = Math.max(steepest, Math.abs(a[1]));
      }
      expect(worstJump).toBeLessThan(1000);
      expect(steepest).toBeLessThan(100e3);
    }
  });

  it("returns dq/dT_s equal to a central finite difference in every regime", () => {
    const out = new Float64Array(2);
    const lo = new Float64Array(2);
    const hi = new Float64Array(2);
    const d = 1e-3;
    for (const region of WATER_REGIONS) {
      const face = faceAt(region, undefined, 25 + C_TO_K, 1.3);
      // Points in all four regimes, none within 0.01 K of an anchor (where the cubic pieces meet).
      for (const T_C of [22.2, 61.7, 104.3, 133.3, 188.8, 251.1, 333.3, 499.9, 650.5, 777.7, 950.1]) {
        const T = T_C + C_TO_K;
        face.evaluate(T, out);
        face.evaluate(T - d, lo);
        face.evaluate(T + d, hi);
        const fd = (hi[0] - lo[0]) / (2 * d);
        // The pieces are linear or cubic: central-difference truncation d²|q'''|/6 < 1e-5 W/(m²·K);
        // round-off ε|q|/d ≤ 2.2e-16·1e7/1e-3 ≈ 2e-6. 1e-6 relative + 1e-3 absolute covers both.
        expect(Math.abs(fd - out[1])).toBeLessThanOrEqual(1e-6 * Math.abs(out[1]) + 1e-3);
      }
    }
  });

  it("has its maximum at the critical-heat-flux point, equal to the scaled q_CHF", () => {
    for (const region of WATER_REGIONS) {
      const c = DEFAULT_WATER_CURVE[region];
      const W = 1.7 * c.referenceWaterFlux_L_m2s;
      const face = faceAt(region, W, WATER_30C, 0.8);
      let best = -Infinity;
      let where = 0;
      for (let T = 20 + C_TO_K; T <= 1000 + C_TO_K; T += 0.01) {
        const q = flux(face, T);
        if (q > best) {
          best = q;
          where = T;
        }
      }
      // The scan's 0.01 K grid decides where the maximum is found.
      expect(Math.abs(where - c.criticalHeatFlux_K)).toBeLessThanOrEqual(0.01);
      // Expected from the scaling law of the model: M (W/W_ref)^m q_CHF at the reference water
      // temperature; the slope is zero at T_C, so 0.01 K off costs < 1e-6 relative.
      const expected = 0.8 * Math.pow(1.7, c.waterFluxExponent) * c.criticalHeatFlux_W_m2;
      expect(Math.abs(best / expected - 1)).toBeLessThan(1e-6);
    }
  });

  it("is single-phase convection below the onset of boiling and film boiling above the rewetting temperature", () => {
    for (const region of WATER_REGIONS) {
      const c = DEFAULT_WATER_CURVE[region];
      const face = faceAt(region);
      // Definition of the two outer regimes at reference conditions (scale 1): exact to round-off.
      expect(flux(face, 60 + C_TO_K) / (c.singlePhaseHtc_W_m2K * 30) - 1).toBeCloseTo(0, 12);
      expect(flux(face, 980 + C_TO_K) / (c.filmBoilingHtc_W_m2K * 950) - 1).toBeCloseTo(0, 12);
    }
  });
});

describe("dependence on water flux density and water temperature", () => {
  const temperatures_C = [60, 105, 150, 250, 400, 600, 800, 950];

  it("raises the flux with water flux density at every surface temperature", () => {
    for (const region of WATER_REGIONS) {
      const W = DEFAULT_WATER_CURVE[region].referenceWaterFlux_L_m2s;
      const low = faceAt(region, 0.5 * W);
      const high = faceAt(region, 2 * W);
      for (const T_C of temperatures_C) expect(flux(high, T_C + C_TO_K)).toBeGreaterThan(flux(low, T_C + C_TO_K));
    }
  });

  it("lowers the flux with warmer water at every surface temperature", () => {
    for (const region of WATER_REGIONS) {
      const cold = faceAt(region, undefined, 20 + C_TO_K);
      const warm = faceAt(region, undefined, 40 + C_TO_K);
      for (const T_C of temperatures_C) expect(flux(warm, T_C + C_TO_K)).toBeLessThan(flux(cold, T_C + C_TO_K));
    }
  });

  it("scales the whole curve by the calibration multiplier", () => {
    const one = faceAt("wetted");
    const more = faceAt("wetted", undefined, WATER_30C, 1.35);
    // q is linear in M by construction of the model; equality to round-off.
    for (const T_C of temperatures_C) expect(flux(more, T_C + C_TO_K) / flux(one, T_C + C_TO_K)).toBeCloseTo(1.35, 12);
  });
});

describe("defaults against published correlations and typical magnitudes", () => {
  it("reproduces Shimada & Mitsutsuka's spray h = 1.57 W^0.55 (1 − 0.0075 θ_w) kW/(m²·K) in film boiling", () => {
    // Shimada & Mitsutsuka, Tetsu-to-Hagané 52 (1966) (formula from memory, physics.md §6). At the
    // anchor (W = 5 L/(m²·s), 30 °C) and off it, the default spray curve (M = 1) above its
    // rewetting temperature must give exactly this h: agreement to round-off.
    const cases: [number, number, number][] = [
      [5, 30, 800],
      [2.5, 20, 900],
      [12, 38, 700],
    ];
    for (const [W, waterC, surfaceC] of cases) {
      const published = 1.57e3 * Math.pow(W, 0.55) * (1 - 0.0075 * waterC);
      const face = faceAt("spray", W, waterC + C_TO_K);
      expect(flux(face, surfaceC + C_TO_K) / (surfaceC - waterC) / published - 1).toBeCloseTo(0, 12);
      expect(shimadaMitsutsukaHtc_W_m2K(W, waterC + C_TO_K) / published - 1).toBeCloseTo(0, 12);
    }
    // Printed anchor value of the default: 1.57 · 5^0.55 · 0.775 = 2.9487 kW/(m²·K) (hand calculation).
    expect(Math.abs(DEFAULT_WATER_CURVE.spray.filmBoilingHtc_W_m2K - 2948.7)).toBeLessThan(0.05);
  });

  it("can be switched to Bolle & Moureau's spray law by overrides and then reproduces it", () => {
    // Bolle & Moureau (1976), h = 0.423 W^0.556 kW/(m²·K), 1 < W < 7, 627–927 °C (from memory).
    const curve = resolveWaterCurve("spray", {
      filmBoilingHtc_W_m2K: bolleMoureauHtc_W_m2K(5),
      waterFluxExponent: 0.556,
      waterTemperatureCoefficient_per_K: 0,
      criticalHeatFlux_W_m2: 2e6,
    });
    const face = new WaterBoilingFace({ curve, waterFlux_L_m2s: 3, water_K: WATER_30C });
    // Round-off only: the override makes the film branch the Bolle–Moureau formula at any W.
    expect(flux(face, 800 + C_TO_K) / 770 / (423 * Math.pow(3, 0.556)) - 1).toBeCloseTo(0, 12);
    const w: ValidityWarning[] = [];
    bolleMoureauHtc_W_m2K(9, w);
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ quantity: "water flux density", value: 9, min: 1, max: 7 });
  });

  it("puts film-boiling h inside physics.md's typical ranges (from memory): 5–30, 0.5–3, 0.5–5 kW/(m²·K)", () => {
    const ranges: Record<WaterRegion, [number, number]> = { impingement: [5e3, 30e3], wetted: [0.5e3, 3e3], spray: [0.5e3, 5e3] };
    for (const region of WATER_REGIONS) {
      const h = flux(faceAt(region), 800 + C_TO_K) / (800 - 30);
      expect(h).toBeGreaterThanOrEqual(ranges[region][0]);
      expect(h).toBeLessThanOrEqual(ranges[region][1]);
    }
  });

  it("keeps every default critical heat flux above the pool CHF of saturated water (Zuber, ≈ 1.1 MW/m²)", () => {
    // Zuber's pool CHF (N. Zuber, 1959 — citation from memory; physics.md §6 [calc from mem formula])
    // q = 0.131 ρ_v h_fg [σ g (ρ_l − ρ_v)/ρ_v²]^¼ with saturated water at 1 atm
    // (Incropera & DeWitt Table A.6, values from memory: ρ_l = 957.9, ρ_v = 0.5955 kg/m³,
    // h_fg = 2.257e6 J/kg, σ = 58.9e-3 N/m) gives 1.11 MW/m², the low end of physics.md's
    // 1.1–1.3 MW/m². Subcooled, flowing or impinging water exceeds it (from memory), so each
    // default must lie above it at the reference point.
    const zuber = 0.131 * 0.5955 * 2.257e6 * Math.pow((58.9e-3 * 9.80665 * (957.9 - 0.5955)) / (0.5955 * 0.5955), 0.25);
    expect(zuber).toBeGreaterThan(1.1e6);
    expect(zuber).toBeLessThan(1.3e6);
    for (const region of WATER_REGIONS) expect(DEFAULT_WATER_CURVE[region].criticalHeatFlux_W_m2).toBeGreaterThan(zuber);
  });
});

describe("parameters, header flow and warnings", () => {
  it("converts a header's flow over its wetted area into water flux density in L/(m²·s)", () => {
    // physics.md §9: curtains of 0.3–0.9 m³/min per metre of width. 0.6 m³/min/m on a 1.5 m strip
    // is 54 m³/h; over a 1.5 m zone: 54 000 L / 3600 s / 2.25 m² = 6.667 L/(m²·s) (by hand).
    // Unit conversion only: round-off, 12 decimals.
    expect(waterFluxDensity_L_m2s(54, 1.5, 1.5)).toBeCloseTo(54000 / 3600 / 2.25, 12);
    expect(waterFluxDensity_L_m2s(3.6, 1, 1)).toBeCloseTo(1, 12); // 3.6 m³/h on 1 m² is 1 L/s per m²
  });

  it("resolves overrides field by field and keeps the other defaults", () => {
    const curve = resolveWaterCurve("wetted", { rewetting_K: 800, filmBoilingHtc_W_m2K: undefined });
    expect(curve.rewetting_K).toBe(800);
    expect(curve.filmBoilingHtc_W_m2K).toBe(DEFAULT_WATER_CURVE.wetted.filmBoilingHtc_W_m2K);
    expect(curve.criticalHeatFlux_W_m2).toBe(DEFAULT_WATER_CURVE.wetted.criticalHeatFlux_W_m2);
    expect(Object.isFrozen(curve)).toBe(true);
  });

  it("rejects curves whose anchors are out of order or would put the maximum elsewhere than at the CHF", () => {
    expect(() => resolveWaterCurve("wetted", { rewetting_K: 450 })).toThrow(RangeError); // T_rewet below T_CHF
    expect(() => resolveWaterCurve("spray", { criticalHeatFlux_W_m2: 1e6 })).toThrow(RangeError); // below the rewetting flux 1.68 MW/m²
    expect(() => resolveWaterCurve("impingement", { singlePhaseHtc_W_m2K: 60e3 })).toThrow(RangeError); // nucleate overshoot
    expect(() => new WaterBoilingFace({ curve: resolveWaterCurve("spray"), waterFlux_L_m2s: 5, water_K: 385 })).toThrow(RangeError); // boiling water
  });

  it("warns when the water flux density or temperature lies outside the curve's intended range", () => {
    const quiet = faceAt("spray", 5, WATER_30C).validity([]);
    expect(quiet).toHaveLength(0);
    const w = faceAt("spray", 40, 55 + C_TO_K).validity([]);
    expect(w.map((x) => x.quantity)).toEqual(["water flux density", "water temperature"]);
    expect(w[0]).toMatchObject({ kind: "validity", value: 40, max: 20, unit: "L/(m²·s)" });
  });
});
