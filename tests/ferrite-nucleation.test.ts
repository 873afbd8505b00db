import { describe, it, expect } from "vitest";
import {
  FerriteNucleation,
  ferriteNucleationRate_m2s,
  carbonDiffusivityAustenite_m2_s,
  TETRAKAIDECAHEDRON_SV_TIMES_D,
  TETRAKAIDECAHEDRON_INTERCEPT_PER_CUBE_ROOT_VOLUME,
  DEFAULT_NUCLEATION_K1,
  DEFAULT_NUCLEATION_K2,
} from "../src/physics/ferrite-nucleation.js";
import { ModelInputError } from "../src/physics/grain-floor.js";
import { REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, mechanisticGrainAtConstantRate, empiricalGrain_um } from "../scripts/calibrate-nucleation.js";

const GAS_CONSTANT_J_molK = 8.314462618;

describe("tetrakaidecahedron stereology behind S_V and L̄", () => {
  // Truncated octahedron of edge a: volume 8√2 a³, surface (6 + 12√3) a², opposite square faces
  // 2√2 a apart (solid geometry). Space-filling, each face shared by two grains.
  const volume = 8 * Math.SQRT2;
  const surface = 6 + 12 * Math.sqrt(3);
  it("gives S_V = 3.35/d_γ with d_γ the distance between square faces", () => {
    const sv_times_d = (surface / (2 * volume)) * 2 * Math.SQRT2;
    // Tolerance 0.002: the constant is quoted to three significant figures (3.348 → 3.35).
    expect(Math.abs(TETRAKAIDECAHEDRON_SV_TIMES_D - sv_times_d)).toBeLessThan(0.002);
  });
  it("gives L̄ = 0.753 V̄^⅓ from the stereological L̄ = 4V/S", () => {
    const ratio = (4 * volume) / surface / Math.cbrt(volume);
    // Tolerance 0.0005: the constant is quoted to three decimals (0.7527 → 0.753).
    expect(Math.abs(TETRAKAIDECAHEDRON_INTERCEPT_PER_CUBE_ROOT_VOLUME - ratio)).toBeLessThan(0.0005);
  });
});

describe("carbon diffusivity in austenite", () => {
  it("agrees with the textbook Arrhenius fit D0 = 2.3e−5 m²/s, Q = 148 kJ/mol within 25 % at 0.1 %C, 800–1100 °C", () => {
    // pub: Callister, Materials Science and Engineering: An Introduction, Table 5.2 (C in γ-Fe;
    // edition and year not recorded here). Tolerance 25 %:
    // the textbook fit has a two-figure D0 and no carbon dependence, while D_C rises ~40 % from
    // 0.1 to 0.4 %C (Ågren 1986, from memory).
    for (const T_K of [1073, 1173, 1273, 1373]) {
      const textbook = 2.3e-5 * Math.exp(-148000 / (GAS_CONSTANT_J_molK * T_K));
      expect(Math.abs(carbonDiffusivityAustenite_m2_s(T_K, 0.1) / textbook - 1)).toBeLessThan(0.25);
    }
  });
  it("rises with carbon content", () => {
    expect(carbonDiffusivityAustenite_m2_s(1173, 0.4)).toBeGreaterThan(carbonDiffusivityAustenite_m2_s(1173, 0.1));
  });
});

describe("FerriteNucleation", () => {
  const setup = { carbon_wt: 0.1, austeniteGrain_um: 25 };

  it("tabulates the nucleation rate to 5e−4 relative accuracy wherever it matters", () => {
    const sv = TETRAKAIDECAHEDRON_SV_TIMES_D / 25e-6;
    for (const carbon_wt of [0.05, 0.1, 0.2]) {
      const model = new FerriteNucleation(1, { carbon_wt, austeniteGrain_um: 25 });
      const direct = (T: number) => sv * ferriteNucleationRate_m2s(T, carbon_wt, DEFAULT_NUCLEATION_K1, DEFAULT_NUCLEATION_K2);
      let peak = 0;
      for (let T = 700; T <= 1180; T += 0.37) peak = Math.max(peak, direct(T));
      expect(peak).toBeGreaterThan(0);
      for (let T = 700.013; T <= 1180; T += 0.0371) {
        const exact = direct(T);
        // Below 1e−6 of the peak the rate cannot change N_V. Above it, linear interpolation on the
        // 0.05 K grid errs by ≈ (h·d ln I/dT)²/8 ≤ 4e−4 where the barrier term is steepest (next to
        // A3) and by < 1e−4 above 1e−3 of the peak; N_V^⅓ halves the effect on L̄.
        if (exact < 1e-6 * peak) continue;
        const bound = exact < 1e-3 * peak ? 5e-4 : 1e-4;
        expect(Math.abs(model.volumeRateAt(T) / exact - 1)).toBeLessThan(bound);
      }
    }
  });

  it("nucleates nothing above the binary A3 or above a given Ae3", () => {
    const model = new FerriteNucleation(1, setup);
    expect(model.volumeRateAt(1160)).toBe(0); // above the dilute Fe–0.1C A3 (≈ 1141 K)
    const withAe3 = new FerriteNucleation(1, { ...setup, ae3_K: 1100 });
    expect(withAe3.volumeRateAt(1110)).toBe(0);
    expect(withAe3.volumeRateAt(1050)).toBeGreaterThan(0);
  });

  it("accumulates N_V = I S_V (1 − Y) Δt per node and stops on fully transformed boundaries", () => {
    const model = new FerriteNucleation(3, setup);
    const T = new Float64Array([1000, 1000, 1000]);
    const Y = new Float64Array([0, 0.75, 1]);
    model.step(T, Y, 0.5);
    model.step(T, Y, 0.5);
    const expectedFresh = model.volumeRateAt(1000) * 1.0;
    // Tolerance 1e−12 relative: two additions of identical terms.
    expect(Math.abs(model.grainDensity_m3[0] / expectedFresh - 1)).toBeLessThan(1e-12);
    expect(Math.abs(model.grainDensity_m3[1] / (0.25 * expectedFresh) - 1)).toBeLessThan(1e-12);
    expect(model.grainDensity_m3[2]).toBe(0);
    model.reset();
    expect(Array.from(model.grainDensity_m3)).toEqual([0, 0, 0]);
  });

  it("turns grain density into L̄ = 0.753 (X_F/N_V)^⅓ and returns null without ferrite", () => {
    const model = new FerriteNucleation(2, setup);
    model.grainDensity_m3[0] = 1e15; // 1 grain per 1000 µm³
    // 0.753 · (0.8/1e15)^⅓ m = 0.753 · 9.2832 µm = 6.990 µm by hand; tolerance 1e−3 µm covers the
    // rounding of the hand value.
    expect(Math.abs((model.meanIntercept_um(0, 0.8) ?? 0) - 6.990266)).toBeLessThan(1e-3);
    expect(model.meanIntercept_um(0, 0)).toBeNull();
    expect(model.meanIntercept_um(1, 0.8)).toBeNull();
  });

  it("scales N_V with K₁ and with the boundary area 1/d_γ", () => {
    const T = new Float64Array([980]);
    const Y = new Float64Array([0.1]);
    const a = new FerriteNucleation(1, { ...setup, K1: 2 * DEFAULT_NUCLEATION_K1 });
    const b = new FerriteNucleation(1, setup);
    const c = new FerriteNucleation(1, { ...setup, austeniteGrain_um: 50 });
    a.step(T, Y, 1);
    b.step(T, Y, 1);
    c.step(T, Y, 1);
    // Exact proportionalities; tolerance 1e−12 relative: round-off only.
    expect(Math.abs(a.grainDensity_m3[0] / b.grainDensity_m3[0] - 2)).toBeLessThan(1e-12);
    expect(Math.abs(c.grainDensity_m3[0] / b.grainDensity_m3[0] - 0.5)).toBeLessThan(1e-12);
  });

  it("refuses a non-positive austenite grain size or K₂ with a typed error", () => {
    expect(() => new FerriteNucleation(1, { ...setup, austeniteGrain_um: 0 })).toThrow(ModelInputError);
    expect(() => new FerriteNucleation(1, { ...setup, K2: -1 })).toThrow(ModelInputError);
  });
});

describe("mechanistic against empirical ferrite grain size (reference steel, constant-rate cooling)", () => {
  // Reference: 0.10C-0.50Mn-0.05Si, d_γ = 25 µm, Li et al. (1998) kinetics, Andrews Ae3 — the
  // calibration of scripts/calibrate-nucleation.ts. Outside reference: the Hodgson–Gibbs relation
  // (ISIJ Int. 32 (1992) 1329, coefficients from memory).
  const mechanistic = (rate: number, dGamma = REFERENCE_AUSTENITE_GRAIN_um) =>
    mechanisticGrainAtConstantRate(REFERENCE_STEEL, dGamma, rate, DEFAULT_NUCLEATION_K1, DEFAULT_NUCLEATION_K2).intercept_um ?? NaN;

  it("matches the empirical size at the 10 K/s anchor", () => {
    // Tolerance 0.1 %: the defaults are the fit rounded to six significant figures (L̄ ∝ K₁^−⅓).
    expect(Math.abs(mechanistic(10) / empiricalGrain_um(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, 10) - 1)).toBeLessThan(1e-3);
  });

  it("stays within −10 % / +30 % of the empirical size from 1 to 50 K/s", () => {
    // Band: the least-squares fit leaves −3 % … +24 % (recorded in ferrite-nucleation.ts); the
    // band adds a margin for changes in the decomposition model it runs on, while still failing if
    // the nucleation physics or its table broke (a lost factor in K₁ or ΔG_v moves it by far more).
    for (const rate of [1, 2, 5, 10, 20, 30, 50]) {
      const ratio = mechanistic(rate) / empiricalGrain_um(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, rate);
      expect(ratio).toBeGreaterThan(0.9);
      expect(ratio).toBeLessThan(1.3);
    }
  });

  it("gives finer ferrite for faster cooling up to 20 K/s and levels off (within 5 %) up to 50 K/s", () => {
    const rates = [1, 2, 5, 10, 20];
    for (let i = 1; i < rates.length; i++) expect(mechanistic(rates[i])).toBeLessThan(mechanistic(rates[i - 1]));
    // Above ≈ 20 K/s the nucleation barrier is saturated and the model's size stops falling (see
    // the header of ferrite-nucleation.ts); it must not coarsen materially. 5 %: the plateau's
    // recorded rise is 3 %.
    expect(mechanistic(50)).toBeLessThan(1.05 * mechanistic(20));
  });

  it("gives coarser ferrite from a coarser prior austenite at 20–50 K/s, as the empirical relation does", () => {
    // Only from ≈ 20 K/s up: below ≈ 15 K/s the Li-coupled route reverses the trend (known
    // limitation, numbers in the header of ferrite-nucleation.ts).
    for (const rate of [20, 30, 50]) {
      const sizes = [15, 25, 50].map((dGamma) => mechanistic(rate, dGamma));
      expect(sizes[1]).toBeGreaterThan(sizes[0]);
      expect(sizes[2]).toBeGreaterThan(sizes[1]);
      expect(empiricalGrain_um(REFERENCE_STEEL, 50, rate)).toBeGreaterThan(empiricalGrain_um(REFERENCE_STEEL, 15, rate));
    }
  });
});
