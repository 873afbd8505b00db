import { describe, it, expect } from "vitest";
import { ThroughThicknessSolver } from "../src/numerics/conduction1d.js";
import { ConvectionRadiation, STEFAN_BOLTZMANN } from "../src/numerics/face-law.js";
import {
  ADIABATIC,
  STEEL_CONDUCTIVITY_W_mK as k,
  STEEL_HEAT_CAPACITY_J_m3K as rhoC,
  constantTables,
  march,
  maxAbsDifference,
} from "./support/conduction-runs.js";

// Slab of half-thickness L = 10 mm (full 2L, 40 cells, Δx = 0.5 mm), 1200 K, cooled on both
// faces to 300 K. Explicit (forward Euler) stability by the Incropera Table 5.2 method
// [pub: Incropera & DeWitt Table 5.2; physics.md §8]: every old-temperature coefficient ≥ 0, i.e.
// Fo = αΔt/Δx² ≤ ½ at an interior node and Fo(1 + Bi_Δ) ≤ ½ at a convective surface node,
// Bi_Δ = hΔx/k (the surface node owning Δx/2).
const L = 0.01;
const cells = 40;
const dx = (2 * L) / cells;
const Ti = 1200;
const Tinf = 300;
const steel = constantTables(k, rhoC);
const alpha = k / rhoC;
const newSolver = () => new ThroughThicknessSolver({ thickness_m: 2 * L, cells, scheme: "explicit", tables: steel, initial_K: Ti });
const tableLimit = (h: number) => (dx * dx) / (2 * alpha * (1 + (h * dx) / k));

// Formula and code compute the same quotient in a different order: round-off only, observed
// 2.2e-16 relative; 1e-12 bounds it.
const ROUND_OFF = 1e-12;

describe("explicit stability limit", () => {
  it("is Fo ≤ ½ with adiabatic faces (interior node, Incropera Table 5.2)", () => {
    expect(Math.abs(newSolver().explicitLimit_s(ADIABATIC, ADIABATIC) / tableLimit(0) - 1)).toBeLessThanOrEqual(ROUND_OFF);
  });

  it.each([300, 3000, 30000])("is Fo(1 + Bi_Δ) ≤ ½ at a convective face with h = %s W/(m²K), radiation off", (h) => {
    // Bi_Δ = 0.005, 0.05, 0.5: the face node is always the tightest.
    const law = new ConvectionRadiation(h, Tinf, 0, Tinf);
    expect(Math.abs(newSolver().explicitLimit_s(law, law) / tableLimit(h) - 1)).toBeLessThanOrEqual(ROUND_OFF);
  });

  it("drops when radiation is added, at least as far as the radiation coefficient of physics.md §8", () => {
    // physics.md §8: add h_rad = εσ(T² + T∞²)(T + T∞) to h (at 1200 K, ε = 0.8: 104 W/(m²K)). The
    // solver uses the tangent dq/dT = h + 4εσT³ (314 W/(m²K)), which is larger for T > T∞ and so
    // stricter; the limit must lie at or below the physics.md value and equal Table 5.2 with the
    // tangent (its documented rule). Round-off tolerances as above.
    const h = 3000;
    const epsilon = 0.8;
    const convective = new ConvectionRadiation(h, Tinf, 0, Tinf);
    const radiating = new ConvectionRadiation(h, Tinf, epsilon, Tinf);
    const solver = newSolver();
    const withRadiation = solver.explicitLimit_s(radiating, radiating);
    const secant = epsilon * STEFAN_BOLTZMANN * (Ti * Ti + Tinf * Tinf) * (Ti + Tinf);
    const tangent = 4 * epsilon * STEFAN_BOLTZMANN * Ti ** 3;
    expect(withRadiation).toBeLessThan(solver.explicitLimit_s(convective, convective));
    expect(withRadiation).toBeLessThanOrEqual(tableLimit(h + secant) * (1 + ROUND_OFF));
    expect(Math.abs(withRadiation / tableLimit(h + tangent) - 1)).toBeLessThanOrEqual(ROUND_OFF);
  });
});

describe("explicit scheme asked for 20 times its stable step", () => {
  // Fo = 0.5 of cooling in requested steps of 20 × the limit; the solver must split each into
  // ⌈20/0.9⌉ = 23 equal sub-steps (explicitSafety 0.9 by default, per its doc comment).
  const cases = [
    ["Bi = 1, convection", new ConvectionRadiation(k / L, Tinf, 0, Tinf)],
    ["Bi = 10, convection", new ConvectionRadiation((10 * k) / L, Tinf, 0, Tinf)],
    ["Bi = 10, convection and radiation to the medium temperature", new ConvectionRadiation((10 * k) / L, Tinf, 0.8, Tinf)],
  ] as const;
  const plan = (law: ConvectionRadiation) => {
    const dt = 20 * newSolver().explicitLimit_s(law, law);
    return { dt, steps: Math.round((0.5 * L * L) / alpha / dt) };
  };

  it.each(cases)("keeps every temperature between the medium and the initial temperature (%s)", (_, law) => {
    // Maximum principle of the discrete scheme: with all old-temperature coefficients ≥ 0 each new
    // value is a convex combination of old values and T∞, so no node may leave [T∞, Ti]. Exact
    // up to round-off of ~1e-13 K on 1200 K; 1e-9 K allows for it.
    const { dt, steps } = plan(law);
    const solver = newSolver();
    for (let s = 0; s < steps; s++) {
      const substeps = solver.step(dt, law, law);
      if (law.emissivity === 0) expect(substeps).toBe(23);
      else expect(substeps).toBeGreaterThan(1); // the radiative limit grows as the face cools
      for (const T of solver.T) {
        expect(T).toBeGreaterThanOrEqual(Tinf - 1e-9);
        expect(T).toBeLessThanOrEqual(Ti + 1e-9);
      }
    }
    // The slab did cool (it is no trivially bounded state): the centre is below 1200 K − 40 K.
    expect(solver.T[cells / 2]).toBeLessThan(Ti - 40);
  });

  it.each(cases)("agrees with backward Euler at the sub-step size (%s)", (_, law) => {
    // Forward and backward Euler at the same step have first-order time errors of equal size and
    // opposite sign, so they differ by about twice either. Observed largest nodal difference:
    // 0.19 K at Bi = 1, 0.61 K at Bi = 10 (with or without radiation); tolerance: twice those.
    // (Against the series, the explicit centre is off by 0.30 K at Bi = 10: consistent.)
    const { dt, steps } = plan(law);
    const explicit = newSolver();
    for (let s = 0; s < steps; s++) explicit.step(dt, law, law);
    const implicit = march({ thickness_m: 2 * L, cells, scheme: "implicit", tables: steel, initial_K: Ti }, steps * dt, steps * 23, law, law);
    const tolerance = law.htc_W_m2K === k / L ? 0.4 : 1.2;
    expect(maxAbsDifference(explicit.T, implicit.T)).toBeLessThanOrEqual(tolerance);
  });

  it("reports more sub-steps than requested steps in its statistics", () => {
    // 21 requested steps of 23 sub-steps each at Bi = 1: stats.steps should count the 21 calls
    // and stats.substeps the 483 sub-steps, as the run summary prints "N steps (M sub-steps)".
    // Regression guard: `singleStep` once incremented stats.steps once per sub-step (steps =
    // substeps = 483); fixed in commit 71bef94, which counts requested steps in step().
    const law = cases[0][1];
    const { dt, steps } = plan(law);
    const solver = newSolver();
    for (let s = 0; s < steps; s++) solver.step(dt, law, law);
    expect(solver.stats.substeps).toBe(23 * steps);
    expect(solver.stats.substeps).toBeGreaterThan(solver.stats.steps);
    expect(solver.stats.steps).toBe(steps);
  });
});
