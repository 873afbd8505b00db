import { describe, it, expect } from "vitest";
import { ThroughThicknessSolver, type Scheme } from "../src/numerics/conduction1d.js";
import { ConvectionRadiation } from "../src/numerics/face-law.js";
import { erf, semiInfiniteConvection, slabTheta } from "./support/analytic.js";
import {
  ADIABATIC,
  SCHEMES,
  STEEL_CONDUCTIVITY_W_mK as k,
  STEEL_HEAT_CAPACITY_J_m3K as rhoC,
  advance,
  constantTables,
  crossingDepth,
  march,
  maxAbsDifference,
  prescribedFlux,
  profile,
} from "./support/conduction-runs.js";

const steel = constantTables(k, rhoC);
const alpha = k / rhoC;

describe("slab cooled by convection on both faces against Carslaw & Jaeger §3.11 (Incropera eq. 5.39)", () => {
  // Slab of half-thickness L = 10 mm, 40 cells over the full 2L (Δx = 0.5 mm, 20 per half), Ti =
  // 1200 K into T∞ = 300 K, requested step ΔFo = αΔt/L² = 0.0025 (Δt = 0.03 s; the explicit
  // scheme sub-steps inside it). Reference: the 200-term series of tests/support/analytic.ts,
  // itself checked against physics.md §8 in analytic-references.test.ts.
  const L = 0.01;
  const cells = 40;
  const Ti = 1200;
  const Tinf = 300;
  const dFo = 0.0025;
  // Largest |θ*_computed − θ*_series| observed over the cases below (centre and both surfaces):
  // explicit 2.9e-4 (Bi 10 centre), implicit 1.18e-3 (Bi 10 centre; first order in time, it
  // halves with ΔFo), Crank–Nicolson 5.7e-5 (Bi 1 surface at Fo 0.2; the space error, which
  // quarters when Δx halves, see conduction-refinement). Tolerances: about twice those.
  const tolerance: Record<Scheme, number> = { explicit: 6e-4, implicit: 2.5e-3, "crank-nicolson": 1.2e-4 };

  for (const scheme of SCHEMES) {
    it.each([
      [0.1, [0.5, 2.0]],
      [1, [0.2, 1.0]],
      [10, [0.5]],
    ])(`${scheme}: matches the series at the centre and both surfaces for Bi = %s`, (Bi, Fos) => {
      const law = new ConvectionRadiation((Bi * k) / L, Tinf, 0, Tinf);
      const solver = new ThroughThicknessSolver({ thickness_m: 2 * L, cells, scheme, tables: steel, initial_K: Ti });
      let Fo = 0;
      for (const FoTarget of Fos) {
        const steps = Math.round((FoTarget - Fo) / dFo);
        advance(solver, ((FoTarget - Fo) * L * L) / alpha, steps, law, law);
        Fo = FoTarget;
        const theta = (i: number) => (solver.T[i] - Tinf) / (Ti - Tinf);
        const centre = slabTheta(Bi, Fo, 0);
        const surface = slabTheta(Bi, Fo, 1);
        expect(Math.abs(theta(cells / 2) - centre)).toBeLessThanOrEqual(tolerance[scheme]);
        expect(Math.abs(theta(0) - surface)).toBeLessThanOrEqual(tolerance[scheme]);
        expect(Math.abs(theta(cells) - surface)).toBeLessThanOrEqual(tolerance[scheme]);
      }
    });
  }
});

describe("semi-infinite solid after a step in surface temperature (erf solution, Incropera eq. 5.57)", () => {
  // Buried water main [pub: Incropera & DeWitt, worked example; physics.md §8]: soil at 20 °C,
  // surface held at −15 °C for 60 days, α = 0.138e-6 m²/s → 0 °C reached at 0.68 m. Soil values
  // k = 0.52 W/(m·K), ρc = 2050·1840 J/(m³·K) give that α (soil values from memory of the
  // example; only α enters the answer). A 6 m column is semi-infinite here: erfc(6 m/2√(αt)) ≈
  // 1e-6, and the adiabatic far face is observed to move by 4e-5 K. Δx = 2 cm.
  const soil = constantTables(0.52, 2050 * 1840);
  const soilAlpha = 0.52 / (2050 * 1840);
  const Ti = 293.15;
  const Ts = 258.15;
  const duration = 60 * 86400;
  const depth = 6;
  const cells = 300;
  const initial = profile(depth, cells, (x) => (x === 0 ? Ts : Ti));
  const surface = { kind: "fixed", T_K: Ts } as const;
  const exact = (x: number) => Ts + (Ti - Ts) * erf(x / (2 * Math.sqrt(soilAlpha * duration)));

  it("gives α = 0.138e-6 m²/s from the example's soil properties", () => {
    // Published to three digits: half a unit in the last is 0.0005e-6.
    expect(Math.abs(soilAlpha - 0.138e-6)).toBeLessThanOrEqual(0.0005e-6);
  });

  // Largest nodal error after 60 days against erf (K, for a 35 K step), 240 requested steps of
  // 6 h: explicit 1.1e-3, implicit 2.0e-2 (first order in time), Crank–Nicolson 2.5e-4. (With
  // 1-day steps Crank–Nicolson still shows 0.4 K of ringing from the surface jump at day 60, its
  // highest modes being barely damped; with 6 h steps that has died out.) Tolerances: about
  // twice the observed errors.
  const tolerance: Record<Scheme, number> = { explicit: 2.5e-3, implicit: 4e-2, "crank-nicolson": 6e-4 };

  for (const scheme of SCHEMES) {
    it(`${scheme}: follows the erf profile after 60 days`, () => {
      const solver = march({ thickness_m: depth, cells, scheme, tables: soil, initial_K: initial }, duration, 240, surface, ADIABATIC);
      const reference = profile(depth, cells, exact);
      expect(maxAbsDifference(solver.T, reference)).toBeLessThanOrEqual(tolerance[scheme]);
    });
  }

  it("puts the 0 °C isotherm at 0.68 m after 60 days, as published", () => {
    const solver = march(
      { thickness_m: depth, cells, scheme: "crank-nicolson", tables: soil, initial_K: initial },
      duration,
      240,
      surface,
      ADIABATIC,
    );
    const frostDepth = crossingDepth(solver.T, solver.dx_m, 273.15);
    // The published answer is rounded to 0.01 m, so anything in [0.675, 0.685] reads as 0.68.
    expect(Math.abs(frostDepth - 0.68)).toBeLessThanOrEqual(0.005);
    // Against the erf solution with these soil values (x = 0.67661 m): observed 9e-6 m. From the
    // grid: nodal error ≤ 2.5e-4 K over the gradient there, 19.9 K/m (1.3e-5 m), plus linear
    // interpolation of a profile with curvature 9.4 K/m² across 2 cm, T''Δx²/8 = 4.7e-4 K
    // (2.4e-5 m); 1e-4 m covers their sum with a margin of 2.7.
    let lo = 0;
    let hi = 2;
    for (let i = 0; i < 60; i++) {
      const mid = 0.5 * (lo + hi);
      if (exact(mid) < 273.15) lo = mid;
      else hi = mid;
    }
    expect(Math.abs(frostDepth - lo)).toBeLessThanOrEqual(1e-4);
  });
});

describe("semi-infinite solid with surface convection (Incropera eq. 5.60)", () => {
  // Steel at 1200 K, h = 3000 W/(m²K) to 300 K for 20 s: h√(αt)/k = 1.29, penetration √(αt) =
  // 12.9 mm; a 100 mm plate with an adiabatic back is semi-infinite (back face changes < 1e-4 K).
  // 200 cells (Δx = 0.5 mm), 400 requested steps of 0.05 s.
  const Ti = 1200;
  const Tinf = 300;
  const h = 3000;
  const duration = 20;
  const depth = 0.1;
  const cells = 200;
  // Largest nodal error (K, for a 900 K drop) observed: explicit 5.3e-2, implicit 2.3e-1 (time
  // error, first order), Crank–Nicolson 7.8e-3. Tolerances: about twice those.
  const tolerance: Record<Scheme, number> = { explicit: 0.1, implicit: 0.5, "crank-nicolson": 0.02 };

  for (const scheme of SCHEMES) {
    it(`${scheme}: follows the eq. 5.60 profile`, () => {
      const law = new ConvectionRadiation(h, Tinf, 0, Tinf);
      const solver = march({ thickness_m: depth, cells, scheme, tables: steel, initial_K: Ti }, duration, 400, law, ADIABATIC);
      const reference = profile(depth, cells, (x) => Ti + (Tinf - Ti) * semiInfiniteConvection(x, duration, h, k, alpha));
      expect(maxAbsDifference(solver.T, reference)).toBeLessThanOrEqual(tolerance[scheme]);
    });
  }
});

describe("steady conduction reached after a long time (Fourier's law, Incropera §3.1)", () => {
  // 10 mm plate, 20 cells, marched to Fo = αt/L² = 20. The slowest transient decays like
  // exp(−(π/2)²Fo) = e^{−49} (flux/fixed faces) or faster (fixed/fixed), so what is left is the
  // steady state of the discrete equations, which the three-point stencil and the half-volume
  // face balance reproduce exactly for a linear profile. The difference is round-off: observed
  // ≤ 2.2e-11 K (explicit, 18000 sub-steps) on values of ~1000 K; 1e-9 K bounds it.
  const L = 0.01;
  const cells = 20;
  const duration = (20 * L * L) / alpha;
  // Crank–Nicolson damps the stiffest mode by |1 − λΔt/2|/(1 + λΔt/2) per step; 2400 steps of
  // 0.1 s (λΔt ≈ 13) shrink it below 1e-300. Backward Euler damps everything: 240 steps of 1 s.
  const steps: Record<Scheme, number> = { explicit: 240, implicit: 240, "crank-nicolson": 2400 };
  const ROUND_OFF_K = 1e-9;

  for (const scheme of SCHEMES) {
    it(`${scheme}: settles to the straight line between two prescribed face temperatures`, () => {
      const solver = march(
        { thickness_m: L, cells, scheme, tables: steel, initial_K: 1200 },
        duration,
        steps[scheme],
        { kind: "fixed", T_K: 400 },
        { kind: "fixed", T_K: 900 },
      );
      expect(maxAbsDifference(solver.T, profile(L, cells, (x) => 400 + (500 * x) / L))).toBeLessThanOrEqual(ROUND_OFF_K);
    });

    it(`${scheme}: settles to slope q/k under a prescribed face flux against a fixed face`, () => {
      // q = 2e5 W/m² leaves the top; the bottom is held at 900 K: T(x) = 900 − (q/k)(L − x),
      // a 66.7 K drop across the plate.
      const q = 2e5;
      const solver = march(
        { thickness_m: L, cells, scheme, tables: steel, initial_K: 1200 },
        duration,
        steps[scheme],
        prescribedFlux(q),
        { kind: "fixed", T_K: 900 },
      );
      expect(maxAbsDifference(solver.T, profile(L, cells, (x) => 900 - (q / k) * (L - x)))).toBeLessThanOrEqual(ROUND_OFF_K);
    });
  }
});
