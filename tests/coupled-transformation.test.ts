/**
 * The transforming-steel simulator as a whole: resolveSteel's material (SGTE phase enthalpies, Li
 * kinetics, Koistinen–Marburger martensite) stepped by the conduction solver through simulate().
 * Each check names what it is compared with.
 */
import { describe, expect, it } from "vitest";
import { simulate } from "../src/model/simulate.js";
import type { Scheme, ThroughThicknessSolver } from "../src/numerics/conduction1d.js";
import { ConvectionRadiation } from "../src/numerics/face-law.js";
import { phaseEnthalpy_J_kg, phaseSpecificHeat_J_kgK } from "../src/physics/phase-enthalpy.js";
import { AUSTENITE, BAINITE, FERRITE, MARTENSITE, PEARLITE, PHASE_COUNT } from "../src/physics/phases.js";
import { INSULATED, convection, meanFraction, steelScenario } from "./support/steel-runs.js";

const K = 273.15;
/** Default density of resolveSteel [kg/m³] (EN 1993-1-2 design value), to turn J/m² into J/kg. */
const RHO = 7850;

// Compositions [wt%] of physics.md §4's check table.
const PLAIN_045 = { C: 0.45, Mn: 0.75, Si: 0.25 };
const EUTECTOID_080 = { C: 0.8, Mn: 0.75, Si: 0.25 };
const CRMO_040 = { C: 0.4, Mn: 0.9, Si: 0.25, Cr: 1.0, Mo: 0.2 };
/** Andrews (1965) Ms of the 0.40C-0.90Mn-0.25Si-1.0Cr-0.2Mo steel [°C] (physics.md §4 table, [calc]). */
const MS_CRMO_C = 539 - 423 * 0.4 - 30.4 * 0.9 - 12.1 * 1.0 - 7.5 * 0.2;

/** Latent heat of the fractions X at T: Σ_p X_p (h_γ − h_p)(T) [J/kg] from the SGTE phase enthalpies. */
function releasedHeat_J_kg(X: readonly number[], T_K: number): number {
  let q = 0;
  for (let p = 0; p < PHASE_COUNT; p++) if (p !== AUSTENITE) q += X[p] * (phaseEnthalpy_J_kg(AUSTENITE, T_K) - phaseEnthalpy_J_kg(p, T_K));
  return q;
}

function fractionsAt(solver: ThroughThicknessSolver, node: number): number[] {
  return Array.from({ length: PHASE_COUNT }, (_, p) => solver.fractions[p][node]);
}

describe("an insulated piece of undercooled austenite (adiabatic calorimetry)", () => {
  // Uniform start and both faces insulated: every node is the same closed system, so the run is a
  // numerical adiabatic calorimeter. 650 °C lies below Ae1 ≈ 722 °C of both steels (Andrews 1965).
  const T0_K = 650 + K;
  const adiabatic = (composition: Record<string, number>, latent: "on" | "off") =>
    simulate(
      steelScenario({
        material: { composition_wt_pct: composition, latent_heat: latent },
        thickness_m: 0.01,
        initial_C: 650,
        duration_s: 200,
        face: INSULATED,
        cells: 4,
        dt_s: 0.1,
        tolerance_K: 1e-6,
      }).scenario,
    ).solver;

  for (const [name, composition] of [
    ["0.45 %C", PLAIN_045],
    ["0.80 %C", EUTECTOID_080],
  ] as const) {
    it(`${name}: transforms, heats itself, and keeps its enthalpy to 1e-6 of the heat released`, () => {
      const s = adiabatic(composition, "on");
      const X = fractionsAt(s, 2);
      const T1_K = s.T[2];
      const released_J_kg = releasedHeat_J_kg(X, T1_K);
      // Not vacuous: at least a third of the austenite has transformed and released heat.
      expect(1 - X[AUSTENITE]).toBeGreaterThan(0.3);
      expect(T1_K - T0_K).toBeGreaterThan(30);
      // First law for a closed insulated system (physics.md §1 ledger with zero face heat). Scale:
      // the heat released per unit area, ρ·q·L; 1e-6 is issue 3's closure target (measured ≈ 1e-9).
      const dH = s.enthalpy_J_m2() - s.initialEnthalpy_J_m2;
      expect(Math.abs(dH) / (RHO * released_J_kg * s.thickness_m)).toBeLessThan(1e-6);
    });

    it(`${name}: the temperature rise is the released heat over the austenite's mean c_p`, () => {
      // Why this comparison: the first law says h_γ(T0) = Σ X_p h_p(T1). Adding and subtracting
      // h_γ(T1) gives h_γ(T1) − h_γ(T0) = Σ X_p (h_γ − h_p)(T1), i.e.
      //   ΔT = q(T1) / c̄_γ,   q(T1) = Σ X_p (h_γ − h_p)(T1),  c̄_γ = [h_γ(T1) − h_γ(T0)]/ΔT,
      // an identity: the heat released at the FINAL temperature heats untransformed austenite from
      // T0 to T1. Equivalently ΔT = q(T0) / c̄_mix with the mean c_p of the FINAL mixture over
      // [T0, T1]. Pairing q(T1) with the mixture c_p (or q(T0) with c_γ) is wrong by ≈ Δc_p·ΔT/c_p,
      // here about 0.07 K. Reference: SGTE phase enthalpies (Dinsdale 1991) evaluated directly;
      // the solver uses its own 0.5 K tables of them.
      const s = adiabatic(composition, "on");
      const X = fractionsAt(s, 2);
      const T1_K = s.T[2];
      const rise_K = T1_K - T0_K;
      const meanAusteniteCp = (phaseEnthalpy_J_kg(AUSTENITE, T1_K) - phaseEnthalpy_J_kg(AUSTENITE, T0_K)) / rise_K;
      let mixtureDh = 0;
      for (let p = 0; p < PHASE_COUNT; p++) mixtureDh += X[p] * (phaseEnthalpy_J_kg(p, T1_K) - phaseEnthalpy_J_kg(p, T0_K));
      const meanMixtureCp = mixtureDh / rise_K;
      // Tolerance 3e-4 K: the solver interpolates E linearly in 0.5 K tables, error ≤ max|dc_p/dT|
      // (0.5 K)²/8 ≈ 2.0 J/(kg·K²) × 0.031 K² ≈ 0.064 J/kg, i.e. ≈ 1.1e-4 K over c_p ≈ 580 J/(kg·K),
      // once at T0 and once at T1; the Picard tolerance (1e-6 K) is negligible. Measured ≤ 3.5e-5 K.
      expect(Math.abs(releasedHeat_J_kg(X, T1_K) / meanAusteniteCp - rise_K)).toBeLessThan(3e-4);
      expect(Math.abs(releasedHeat_J_kg(X, T0_K) / meanMixtureCp - rise_K)).toBeLessThan(3e-4);
      // The point-c_p shortcut: c_γ at the midpoint instead of the mean. fcc c_p is nearly linear
      // in T (SGTE), so the midpoint rule errs by c_γ''ΔT²/24 — measured 1.4e-4 K; allow 1e-3 K.
      const midCp = phaseSpecificHeat_J_kgK(AUSTENITE, 0.5 * (T0_K + T1_K));
      expect(Math.abs(releasedHeat_J_kg(X, T1_K) / midCp - rise_K)).toBeLessThan(1e-3);
    });

    it(`${name}: with latent heat off the same transformation leaves the temperature where it was`, () => {
      const s = adiabatic(composition, "off");
      expect(1 - s.fractions[AUSTENITE][2]).toBeGreaterThan(0.9);
      // No heat source and no face heat: T may move only by round-off (ulp of 923 K ≈ 1e-13 K).
      for (let i = 0; i < s.nodes; i++) expect(Math.abs(s.T[i] - T0_K)).toBeLessThan(1e-9);
    });
  }
});

describe("phase fractions and the energy ledger during cooling", () => {
  // A water quench of a hardenable steel (martensite) and a slow air cool of a 0.45 %C steel
  // (ferrite + pearlite), each under all three schemes.
  const cases = [
    {
      name: "water quench of 4 mm 0.40C-Cr-Mo (martensite)",
      spec: { material: { composition_wt_pct: CRMO_040 }, thickness_m: 0.004, initial_C: 850, duration_s: 10, face: convection(20000, 20), cells: 20, dt_s: 0.01 },
      product: MARTENSITE,
    },
    {
      name: "air cooling of 10 mm 0.45 %C (ferrite + pearlite)",
      spec: {
        material: { composition_wt_pct: PLAIN_045 },
        thickness_m: 0.01,
        initial_C: 850,
        duration_s: 300,
        face: new ConvectionRadiation(30, 20 + K, 0.8, 20 + K),
        cells: 10,
        dt_s: 0.1,
      },
      product: PEARLITE,
    },
  ];
  const schemes: Scheme[] = ["explicit", "implicit", "crank-nicolson"];

  for (const c of cases) {
    for (const scheme of schemes) {
      it(`${c.name}, ${scheme}: every fraction lies in [0, 1] and they sum to 1 at every node after every step; every step converges and the ledger closes to 1e-6`, () => {
        const { scenario } = steelScenario({ ...c.spec, scheme, tolerance_K: 1e-6 });
        let worstSum = 0;
        let outside = 0;
        let steps = 0;
        const result = simulate(scenario, undefined, (s) => {
          steps++;
          for (let i = 0; i < s.nodes; i++) {
            let sum = 0;
            for (let p = 0; p < PHASE_COUNT; p++) {
              const x = s.fractions[p][i];
              if (!(x >= 0 && x <= 1)) outside++;
              sum += x;
            }
            worstSum = Math.max(worstSum, Math.abs(sum - 1));
          }
        });
        const s = result.solver;
        expect(steps).toBe(Math.round(c.spec.duration_s / c.spec.dt_s));
        // Bounds hold exactly (the model clamps austenite at 0); no tolerance.
        expect(outside).toBe(0);
        // Austenite is 1 − Σ products, so the sum is 1 up to the round-off of adding five doubles
        // (≈ 5e-16); 1e-12 is far above that and far below anything physical.
        expect(worstSum).toBeLessThan(1e-12);
        // The run really transforms into the intended product (mass average, not vacuous).
        expect(meanFraction(s, c.product)).toBeGreaterThan(0.5);
        // Energy ledger (physics.md §1): ΔH = −∫(q_top + q_bottom)dt, relative to the heat removed.
        // With the Picard tolerance at 1e-6 K the enthalpy form closes far below 1e-6 (measured
        // 5e-11 … 2e-8); 1e-6 is issue 3's target.
        expect(s.ledgerError()).toBeLessThan(1e-6);
        expect(s.heatOutTop_J_m2).toBeGreaterThan(0);
        // Li kinetics move the fractions continuously with T, so every step has a fixed point
        // and the Picard iteration must find it (at most 10 iterations measured).
        expect(s.stats.unconvergedSteps).toBe(0);
      });
    }
  }
});

describe("latent heat in a thick section", () => {
  // 25 mm of 0.45 %C steel under water (h = 1000 W/(m²·K) both faces): the centre transforms to
  // mostly pearlite at ≈ 615–670 °C. The same run with latent_heat "off" transforms alike but
  // releases nothing (physics.md §1: the latent heat is h_γ − h_p, switched off by giving every
  // phase the austenite enthalpy).
  const DT = 0.05;
  const run = (latent: "on" | "off") => {
    const { scenario } = steelScenario({
      material: { composition_wt_pct: PLAIN_045, latent_heat: latent },
      thickness_m: 0.025,
      initial_C: 850,
      duration_s: 60,
      face: convection(1000, 30),
      cells: 30,
      dt_s: DT,
      depths_m: [0.0125],
    });
    const centre: number[] = [];
    let firstStepWithProduct = -1;
    const result = simulate(scenario, undefined, (s) => {
      centre.push(s.T[15] - K);
      if (firstStepWithProduct < 0 && s.fractions[AUSTENITE].some((x) => x < 1)) firstStepWithProduct = centre.length - 1;
    });
    return { result, centre, firstStepWithProduct };
  };
  const on = run("on");
  const off = run("off");

  it("recalescence appears at the centre with latent heat on and not at all with it off", () => {
    const withHeat = on.result.depthRecords[0];
    const without = off.result.depthRecords[0];
    // A clear rise: measured 9.9 K; 2 K is far above round-off and step-interpolation noise.
    expect(withHeat.recalescence_K).toBeGreaterThan(2);
    expect(withHeat.start).not.toBeNull();
    // The rise peaks after the centre started transforming.
    expect(withHeat.recalescenceTime_s!).toBeGreaterThan(withHeat.start!.time_s);
    // Without a heat source the centre of a symmetrically cooled slab only cools (maximum
    // principle of the heat equation); allow round-off only.
    expect(without.recalescence_K).toBeLessThan(1e-9);
  });

  it("the centre runs hotter while it transforms, and identically before anything transformed", () => {
    // Until the first product appears anywhere (at the faces after 0.75 s, measured) both runs
    // solve the same problem in pure austenite.
    expect(on.firstStepWithProduct).toBeGreaterThan(10);
    for (let k = 0; k < on.firstStepWithProduct; k++) expect(Math.abs(on.centre[k] - off.centre[k])).toBeLessThan(1e-9);
    // From the centre's 1 % to its 99 % point (latent heat on) it is hotter than without latent
    // heat at every step; measured gap 25.6 K at the start growing to 199 K at the finish (the run
    // without latent heat has nothing to slow its cooling).
    const { start, finish } = on.result.depthRecords[0];
    const first = Math.ceil(start!.time_s / DT);
    const last = Math.floor(finish!.time_s / DT) - 1;
    expect(last - first).toBeGreaterThan(100);
    let smallestGap = Infinity;
    for (let k = first; k <= last; k++) smallestGap = Math.min(smallestGap, on.centre[k] - off.centre[k]);
    // 1 K: well above round-off, well below the measured smallest gap.
    expect(smallestGap).toBeGreaterThan(1);
  });
});

describe("continuous cooling through the solver", () => {
  it("the transformation start temperature falls as the heat-transfer coefficient rises", () => {
    // Common practice (no source): faster cooling undercools the austenite further before it
    // transforms — the reason a CCT diagram's start line falls with cooling rate. 3 mm strip of
    // 0.45 %C steel, h = 100 → 3000 W/(m²·K).
    const starts = [100, 300, 1000, 3000].map((h) => {
      const { scenario } = steelScenario({
        material: { composition_wt_pct: PLAIN_045 },
        thickness_m: 0.003,
        initial_C: 850,
        duration_s: 200,
        face: convection(h, 30),
        cells: 10,
        dt_s: 0.02,
      });
      return simulate(scenario).depthRecords[0].start!.T_C;
    });
    // Measured 653.7, 622.8, 607.0, 325.9 °C. Each step must fall by more than 5 K: the start is
    // interpolated within one step (≤ 0.02 s × cooling rate, ≤ 3 K at the fastest case here).
    for (let i = 1; i < starts.length; i++) expect(starts[i]).toBeLessThan(starts[i - 1] - 5);
  });

  it("a thin hardenable section under a very high HTC becomes martensite as Koistinen–Marburger says", () => {
    // 2 mm of 0.40C-0.9Mn-0.25Si-1Cr-0.2Mo quenched with h = 30 kW/(m²·K) into 20 °C water.
    const { scenario, steel } = steelScenario({
      material: { composition_wt_pct: CRMO_040 },
      thickness_m: 0.002,
      initial_C: 850,
      duration_s: 20,
      face: convection(30000, 20),
      cells: 10,
      dt_s: 0.002,
    });
    // The steel uses Andrews' Ms (physics.md §4 table: 328.8 °C, printed to 0.1 °C: half a unit
    // plus 1 %), and the formula written out above reproduces that table value.
    expect(Math.abs(MS_CRMO_C - 328.8)).toBeLessThanOrEqual(0.05 * 1.01);
    expect(steel.critical.Ms_C).toBeCloseTo(MS_CRMO_C, 9); // same formula: round-off only
    const result = simulate(scenario);
    const s = result.solver;
    const martensite = meanFraction(s, MARTENSITE);
    const diffusional = meanFraction(s, FERRITE) + meanFraction(s, PEARLITE) + meanFraction(s, BAINITE);
    // Everything that transformed became martensite: the quench beats the ferrite, pearlite and
    // bainite noses. 0.99 is issue 3's "> 0.99 martensite" applied to the transformed part.
    expect(martensite / (martensite + diffusional)).toBeGreaterThan(0.99);
    // Koistinen & Marburger (1959): f = 1 − exp(−0.011 (Ms − T)). At 20 °C this leaves ≈ 3.4 %
    // retained austenite, so a mass average above 0.99 is impossible at room temperature; the
    // amount must equal the closed form at the final temperature. Tolerance 5e-5 (toBeCloseTo with
    // 4 decimals): the piece ends within 1e-3 K of 20 °C (≈ 1e-5 in f) and the rate form
    // integrated exactly per step agrees with the closed form on a monotone path (Hömberg 1996).
    const finalT_C = s.T[5] - K;
    expect(Math.abs(finalT_C - 20)).toBeLessThan(1e-3);
    expect(martensite).toBeCloseTo(1 - Math.exp(-0.011 * (MS_CRMO_C - 20)), 4);
    expect(martensite).toBeGreaterThan(0.96);
    // Start of transformation (1 % transformed) at Ms + ln(0.99)/0.011 = Ms − 0.914 K (KM closed
    // form). Tolerance 1 K: the crossing is interpolated within one step of 2 ms at a centre
    // cooling rate below 500 K/s there.
    const start = result.depthRecords[0].start!;
    expect(Math.abs(start.T_C - (MS_CRMO_C + Math.log(0.99) / 0.011))).toBeLessThan(1);
  });
});
