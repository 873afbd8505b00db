import { describe, it, expect } from "vitest";
import { ProductTracker } from "../src/model/product.js";
import { fullComposition } from "../src/physics/composition.js";
import { FERRITE, AUSTENITE, PHASE_COUNT } from "../src/physics/phases.js";
import type { ThroughThicknessSolver } from "../src/numerics/conduction1d.js";

/**
 * Where the cooling rate for the Hodgson–Gibbs relation is taken: between 1 % and 50 % of a node's
 * FINAL ferrite (src/model/product.ts). The tracker is driven here by a prescribed path — linear
 * cooling at a known rate while ferrite grows linearly in time — so the rate it reports can be
 * compared with the one prescribed (an exact property of the path, no outside value needed).
 */
function drive(finalFerrite: number, rate_K_s: number): ReturnType<ProductTracker["finish"]>[number] {
  const fractions = Array.from({ length: PHASE_COUNT }, () => new Float64Array(1));
  fractions[AUSTENITE][0] = 1;
  const solver = { T: new Float64Array([1100]), fractions, time_s: 0, evolution: undefined } as unknown as ThroughThicknessSolver;
  const tracker = new ProductTracker(1, {
    composition: fullComposition({ C: 0.1, Mn: 0.5 }),
    austeniteGrain_um: 25,
    retainedStrain: 0,
    ae3_K: 1121,
    grainModel: "empirical",
    interfaceEnergy_J_m2: 0.5,
  });
  tracker.start(solver);
  const dt = 0.01;
  const tStart = 2; // ferrite appears at t = 2 s and grows linearly for 4 s
  for (let n = 1; n <= 800; n++) {
    const t = n * dt;
    solver.time_s = t;
    solver.T[0] = 1100 - rate_K_s * t;
    const x = Math.min(finalFerrite, Math.max(0, ((t - tStart) / 4) * finalFerrite));
    fractions[FERRITE][0] = x;
    fractions[AUSTENITE][0] = 1 - x;
    tracker.step(solver);
  }
  return tracker.finish(solver)[0];
}

describe("the cooling rate through the ferrite transformation", () => {
  it("equals the prescribed rate for a node that ends with 5 % ferrite (1 % of it lies below the first stored level)", () => {
    const p = drive(0.05, 10);
    // Linear path: any two points give exactly 10 K/s; the levels are interpolated linearly, so
    // only round-off remains.
    expect(p.coolingRate_K_s).not.toBeNull();
    expect(p.coolingRate_K_s!).toBeCloseTo(10, 9);
    // 1 % of the final ferrite is reached at t = 2 + 0.04 s: T = 1100 − 10·2.04 K.
    expect(p.ferriteStart_C! + 273.15).toBeCloseTo(1100 - 10 * 2.04, 6);
  });

  it("equals the prescribed rate for a node that ends with 80 % ferrite", () => {
    const p = drive(0.8, 25);
    expect(p.coolingRate_K_s!).toBeCloseTo(25, 9);
    expect(p.ferriteHalf_C! + 273.15).toBeCloseTo(1100 - 25 * 4, 6); // 50 % at t = 2 + 2 s
  });
});
