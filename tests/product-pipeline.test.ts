/**
 * From cooling path to product, through the whole pipeline: in-memory case → validateCase →
 * resolveCase → simulateResolved (conduction + kinetics + latent heat + ProductTracker) → summary.
 * The per-module tests check the published formulas; these check that the pipeline hands each
 * node's own path to them and that the results move the way physical metallurgy says they must.
 *
 * Sources of the expectations:
 * - faster cooling through the transformation lowers the transformation temperature and refines
 *   ferrite; a finer ferrite raises yield strength (Hall–Petch): R.W.K. Honeycombe & H.K.D.H.
 *   Bhadeshia, Steels: Microstructure and Properties, ch. on ferrite grain refinement and
 *   strength (from memory); the same rule for run-out tables in physics.md §9 is common
 *   practice (no source);
 * - recalescence (released latent heat) holds the transformation at a higher temperature and so
 *   coarsens ferrite, most at the centre of thick sections: common practice (no source);
 * - coarser prior austenite (fewer boundary nucleation sites per volume) gives coarser ferrite:
 *   Honeycombe & Bhadeshia (from memory); in the empirical relation through its
 *   22[1 − exp(−0.015 d_γ)] term (Hodgson & Gibbs 1992, from memory, physics.md §7);
 * - the thermodynamic floor 2σV_m/|ΔG| is some 10–100 nm while production ferrite stays above
 *   about 1 µm: common practice (no source).
 */
import { describe, it, expect } from "vitest";
import { CMN_STEEL, centreNode, runPipeline, stripCaseObject, type PipelineRun } from "./support/product-runs.js";

/**
 * Every run in this file passes through here, so the floor is checked in every pipeline run:
 * wherever a node has a ferrite grain size it also has a floor (ferrite formed, so the driving
 * force at its 50 % temperature was negative), the floor lies more than 100× below the grain
 * size, and the grain size is above 1 µm (common practice (no source): a floor of ~10 nm against
 * production ferrite above ~1 µm, two orders apart). The floor grows as the 50 % temperature nears
 * A3 (≈ 100 nm at 820 °C for 0.1 %C, grain-floor.ts); the smallest ratio measured in this file's
 * runs is about 185 (d_γ 15 µm, HTC 800). A nm/µm slip (×1000) in either quantity fails it.
 */
function expectFloorFarBelowGrain(run: PipelineRun): void {
  for (const p of run.products) {
    if (p.grain_um === null) continue;
    expect(p.grainFloor_nm, p.reasons.join("; ")).not.toBeNull();
    const ratio = p.grain_um / (p.grainFloor_nm! * 1e-3);
    expect(ratio).toBeGreaterThan(100);
    expect(p.grain_um).toBeGreaterThan(1);
  }
}

function run(caseObject: Record<string, unknown>): PipelineRun {
  const r = runPipeline(caseObject);
  expectFloorFarBelowGrain(r);
  return r;
}

/** Andrews (1965) Ae3 [°C], 7-term form (physics.md §4 [pub: Andrews, JISI 203 (1965) 721]). */
function andrewsAe3_C(c: { C: number; Si?: number; Ni?: number; V?: number; Mo?: number; W?: number }): number {
  return 910 - 203 * Math.sqrt(c.C) - 15.2 * (c.Ni ?? 0) + 44.7 * (c.Si ?? 0) + 104 * (c.V ?? 0) + 31.5 * (c.Mo ?? 0) + 13.1 * (c.W ?? 0);
}

describe("metallurgical trends through the whole pipeline (6 mm 0.10C-0.6Mn-0.2Si strip, stage cooling)", () => {
  it("a higher water HTC cools faster through the transformation, transforms lower, and gives finer ferrite and higher yield", () => {
    // Source: Honeycombe & Bhadeshia (from memory); physics.md §9 common practice (no source).
    const slow = run(stripCaseObject({ thickness_mm: 6, htc_W_m2K: 300 }));
    const fast = run(stripCaseObject({ thickness_mm: 6, htc_W_m2K: 1500 }));
    const centre = (r: PipelineRun) => r.summary.depths[1];
    // Premise: the faster case really cools faster through its transformation, at the centre.
    expect(centre(fast).cooling_rate_through_transformation_K_s!).toBeGreaterThan(centre(slow).cooling_rate_through_transformation_K_s!);
    expect(centre(fast).ferrite_half_C!).toBeLessThan(centre(slow).ferrite_half_C!);
    // Strict orderings: measured gaps (12.595 → 9.888 µm, 245.0 → 264.9 MPa) are thousands of times the output
    // rounding (0.001 µm, 0.1 MPa), so no tolerance is needed for the comparison to be meaningful.
    expect(fast.summary.final.grain_um.mean!).toBeLessThan(slow.summary.final.grain_um.mean!);
    expect(fast.summary.final.yield_MPa.mean!).toBeGreaterThan(slow.summary.final.yield_MPa.mean!);
  });

  it("latent heat coarsens the ferrite at the centre of a 20 mm plate, and the recalescence penalty reports it", () => {
    // Source: common practice (no source) — released heat holds the transformation higher.
    const spec = { thickness_mm: 20, htc_W_m2K: 2000, water_s: 20, airAfter_s: 20, cells: 16 } as const;
    const on = run(stripCaseObject({ ...spec, penalty: true }));
    const off = run(stripCaseObject({ ...spec, latentHeat: "off" }));
    // Premise: transformed through (measured 0 austenite; bound 1 %, a remainder that small could
    // not reverse a 2.5 µm grain difference).
    expect(on.summary.final.phases.austenite).toBeLessThan(0.01);
    expect(on.summary.final.grain_um.centre!).toBeGreaterThan(off.summary.final.grain_um.centre!);

    const penalty = on.summary.recalescence_penalty!.find((p) => p.depth_mm === 10)!;
    expect(penalty.grain_coarsening_um!).toBeGreaterThan(0);
    expect(penalty.ferrite_half_raised_K!).toBeGreaterThan(0);
    // The penalty's latent-heat-off column is the same calculation as a case with latent_heat
    // "off": equal to the summary's 3-decimal rounding (tolerance 0.0015 µm, 1.5 rounding steps).
    expect(Math.abs(penalty.latent_heat_off.grain_um! - off.summary.final.grain_um.centre!)).toBeLessThan(0.0015);
    expect(Math.abs(penalty.latent_heat_on.grain_um! - on.summary.final.grain_um.centre!)).toBeLessThan(0.0015);
  });

  it("a larger prior austenite grain gives coarser ferrite with the empirical model", () => {
    // Source: Honeycombe & Bhadeshia (from memory); Hodgson & Gibbs 1992 d_γ term (from memory).
    const fine = run(stripCaseObject({ thickness_mm: 6, htc_W_m2K: 800, austeniteGrain_um: 15 }));
    const coarse = run(stripCaseObject({ thickness_mm: 6, htc_W_m2K: 800, austeniteGrain_um: 60 }));
    // Strict: measured gap ≈ 8 µm against 0.001 µm rounding.
    expect(coarse.summary.final.grain_um.mean!).toBeGreaterThan(fine.summary.final.grain_um.mean!);
    expect(coarse.summary.final.grain_um.centre!).toBeGreaterThan(fine.summary.final.grain_um.centre!);
    expect(coarse.summary.final.yield_MPa.mean!).toBeLessThan(fine.summary.final.yield_MPa.mean!);
  });
});

describe("the thermodynamic grain-size floor in pipeline runs", () => {
  it("lies far below the computed grain size at every node, for both grain models and slow and fast cooling", () => {
    // Source: common practice (no source): floor ~10–100 nm, production ferrite above ~1 µm.
    for (const grainModel of ["empirical", "mechanistic"] as const) {
      for (const htc_W_m2K of [150, 3000]) {
        const r = run(stripCaseObject({ thickness_mm: 6, htc_W_m2K, grainModel }));
        expect(r.products.filter((p) => p.grain_um !== null).length).toBe(r.products.length);
        // The summary reports each node's own floor: top/centre/bottom equal the node values to
        // the summary's 2-decimal rounding (tolerance 0.006 nm, about one rounding step).
        const f = r.summary.final.grain_floor_nm;
        const nodes = [0, centreNode(r), r.products.length - 1];
        [f.top, f.centre, f.bottom].forEach((v, k) => expect(Math.abs(v! - r.products[nodes[k]].grainFloor_nm!)).toBeLessThan(0.006));
      }
    }
  });
});

describe("the mechanistic route against the empirical route (reference 0.10C-0.50Mn-0.05Si, d_γ 25 µm, 6 mm)", () => {
  // The reference steel of the nucleation calibration (src/physics/ferrite-nucleation.ts).
  const REFERENCE = { C: 0.1, Mn: 0.5, Si: 0.05 };
  const sweep = (latentHeat: "on" | "off", htcs: readonly number[]) => {
    const ratios: number[] = [];
    const rates: number[] = [];
    for (const htc_W_m2K of htcs) {
      const spec = { thickness_mm: 6, htc_W_m2K, composition: REFERENCE, latentHeat, water_s: 40, airAfter_s: 0, cells: 10 } as const;
      const emp = run(stripCaseObject({ ...spec, grainModel: "empirical" }));
      const mech = run(stripCaseObject({ ...spec, grainModel: "mechanistic" }));
      // Selection by material.grain_model: the mechanistic case reports its mechanistic size.
      expect(mech.products.every((p) => p.grain_um === p.grainMechanistic_um)).toBe(true);
      emp.products.forEach((p, i) => {
        ratios.push(mech.products[i].grain_um! / p.grain_um!);
        rates.push(p.coolingRate_K_s!);
      });
    }
    return { ratios, rates };
  };

  it("agrees within 0.9–1.3 per node with latent heat off, over ≈ 2–40 K/s through the transformation", () => {
    // Without recalescence every node cools at a nearly constant rate through its transformation,
    // the setting of the calibration; band 0.9–1.3 is the one the physics module's own test uses
    // (its recorded constant-rate spread is 0.97–1.23). Measured here: 0.955–1.194.
    const { ratios, rates } = sweep("off", [40, 100, 400, 800]);
    // The sweep must span the range the test name claims (bounds = that range's ends, loosened
    // by under a factor 1.5 for "≈"); measured 2.23–41.8 K/s.
    expect(Math.min(...rates)).toBeLessThan(3);
    expect(Math.max(...rates)).toBeGreaterThan(35);
    expect(Math.min(...ratios)).toBeGreaterThan(0.9);
    expect(Math.max(...ratios)).toBeLessThan(1.3);
  });

  it("agrees within 0.75–1.35 per node with latent heat on, over ≈ 1–55 K/s through the transformation", () => {
    // With recalescence the empirical Ṫ (mean rate from 1 % to 50 % of the final ferrite) takes in
    // the plateau, so the empirical size is coarser at slow cooling than the nucleation count
    // implies: measured 0.823–1.266 (rates 0.91–54.7 K/s). The band adds 0.07 below and 0.08
    // above for changes in the decomposition model the routes run on; it still fails if either
    // route is off by a third.
    const { ratios, rates } = sweep("on", [60, 200, 800, 1500]);
    // Span claimed in the test name (bounds = its ends, loosened for "≈").
    expect(Math.min(...rates)).toBeLessThan(1.5);
    expect(Math.max(...rates)).toBeGreaterThan(40);
    expect(Math.min(...ratios)).toBeGreaterThan(0.75);
    expect(Math.max(...ratios)).toBeLessThan(1.35);
  });
});

describe("a node that never transformed", () => {
  it("reports grain size null (not zero) with the reason in summary.product.notes", () => {
    // 30 mm from 950 °C, 5 s of air: stays above Ae3 everywhere, so no ferrite can form.
    const r = run({ ...stripCaseObject({ thickness_mm: 30, htc_W_m2K: 0, initial_C: 950 }), cooling: { stages: [{ duration_s: 5, top: { emissivity: 0.8, surroundings_C: 30 }, bottom: { emissivity: 0.8, surroundings_C: 30 } }] } });
    const T = r.summary.final.T_C;
    const ae3 = andrewsAe3_C(CMN_STEEL);
    // Premise: the coldest point (the faces) is still above Ae3 and nothing transformed.
    expect(Math.min(T.top!, T.bottom!)).toBeGreaterThan(ae3);
    expect(r.summary.final.phases.austenite).toBe(1);

    for (const d of r.summary.depths) {
      expect(d.grain_um).toBeNull();
      expect(d.grain_floor_nm).toBeNull();
      expect(d.ferrite_half_C).toBeNull();
    }
    for (const field of ["grain_um", "yield_MPa", "tensile_MPa", "grain_floor_nm"] as const) {
      expect(r.summary.final[field]).toEqual({ top: null, centre: null, bottom: null, mean: null });
    }
    expect(r.products.every((p) => p.grain_um === null && p.reasons.some((s) => /no ferrite formed/.test(s)))).toBe(true);
    expect(r.summary.product.notes.some((s) => /no ferrite formed/.test(s))).toBe(true);
  });
});
