import { describe, it, expect } from "vitest";
import type { Scheme } from "../src/numerics/conduction1d.js";
import { ConvectionRadiation } from "../src/numerics/face-law.js";
import { buildPropertyTables } from "../src/numerics/property-table.js";
import { slabTheta } from "./support/analytic.js";
import {
  STEEL_CONDUCTIVITY_W_mK as k,
  STEEL_HEAT_CAPACITY_J_m3K as rhoC,
  constantTables,
  march,
  maxAbsDifference,
  observedOrders,
  profile,
} from "./support/conduction-runs.js";

// Observed order of accuracy by systematic refinement [pub: ASME V&V 20-2009, code verification]:
// p = log2(e(h)/e(h/2)) from the max-norm error over all nodes. Problem: slab of half-thickness
// L = 10 mm (full 2L modelled), Ti = 1200 K, both faces convecting to 300 K at Bi = 1.
const L = 0.01;
const Ti = 1200;
const Tinf = 300;
const steel = constantTables(k, rhoC);
const alpha = k / rhoC;
const convection = new ConvectionRadiation(k / L, Tinf, 0, Tinf); // Bi = hL/k = 1

describe("spatial order of the node-based finite volumes", () => {
  it("is 2: Crank–Nicolson at a tiny step against the Carslaw & Jaeger series, 10 → 80 cells", () => {
    // Fo = 0.2 in 4000 steps (ΔFo = 5e-5). The time error there is ~9e-7 K (the CN error of
    // 5.7e-4 K at 160 steps, measured below, scaled by (160/4000)²), against a space error of
    // 2.3e-2 K at 80 cells, so the errors are the spatial ones.
    const Fo = 0.2;
    const duration = (Fo * L * L) / alpha;
    const errors = [10, 20, 40, 80].map((cells) => {
      const solver = march({ thickness_m: 2 * L, cells, scheme: "crank-nicolson", tables: steel, initial_K: Ti }, duration, 4000, convection, convection);
      const exact = profile(2 * L, cells, (x) => Tinf + (Ti - Tinf) * slabTheta(1, Fo, (x - L) / L, 60));
      return maxAbsDifference(solver.T, exact);
    });
    // Observed: errors 1.495, 0.364, 0.0912, 0.0228 K; orders 2.037, 1.998, 2.003. ±0.1 admits
    // the pre-asymptotic 10-cell grid and would still catch a first-order face treatment (p → 1).
    for (const p of observedOrders(errors)) expect(Math.abs(p - 2)).toBeLessThanOrEqual(0.1);
  });
});

describe("temporal order of the θ-scheme", () => {
  // 40 cells, Fo = 0.2 (duration 2.4 s), 40 → 320 steps. Reference: Crank–Nicolson on the same
  // grid with 10240 steps, so the spatial error cancels; its own time error (a third of its 4.2e-7 K
  // difference from a 5120-step run) is 1e-3 of the smallest error below, which moves an
  // observed order by at most 0.0015.
  const cells = 40;
  const duration = (0.2 * L * L) / alpha;
  const spec = (scheme: Scheme) => ({ thickness_m: 2 * L, cells, scheme, tables: steel, initial_K: Ti });
  let reference: Float64Array | undefined; // computed once, on first use
  const stepErrors = (scheme: Scheme) => {
    reference ??= march(spec("crank-nicolson"), duration, 10240, convection, convection).T;
    const T_ref = reference;
    return [40, 80, 160, 320].map((steps) => maxAbsDifference(march(spec(scheme), duration, steps, convection, convection).T, T_ref));
  };

  it("is 2 for Crank–Nicolson", () => {
    // Observed: 9.18e-3, 2.30e-3, 5.74e-4, 1.43e-4 K; orders 2.000, 2.000, 2.001. ±0.05 is the
    // reference's bias with a wide margin. (At 10 steps the undamped highest modes of the
    // sudden-cooling start ring, and the order from 10 → 20 steps reads 5.5: not asymptotic,
    // hence the start at 40.)
    for (const p of observedOrders(stepErrors("crank-nicolson"))) expect(Math.abs(p - 2)).toBeLessThanOrEqual(0.05);
  });

  it("is 1 for backward Euler", () => {
    // Observed: 1.076, 0.539, 0.270, 0.135 K; orders 0.9985, 0.9993, 0.9996. ±0.05 as above.
    for (const p of observedOrders(stepErrors("implicit"))) expect(Math.abs(p - 1)).toBeLessThanOrEqual(0.05);
  });

  it("is 2 for Crank–Nicolson with temperature-dependent conductivity and a radiating face", () => {
    // k(T) = 45 − 0.02 (T − 300 K) W/(m·K) (linear, so the 0.5 K property table holds it exactly;
    // the fall with temperature is steel-like, common practice (no source)); faces h = 3000 W/(m²K)
    // plus ε = 0.8 radiation to 300 K; 2 s of cooling (surface 1200 → 898 K). Tables flagged
    // non-constant with a Picard tolerance of 1e-9 K, so every step is iterated to convergence.
    // Reference: 10240 steps (differs from 5120 steps by 4.6e-7 K: bias ≤ 0.0015 in p).
    const tables = buildPropertyTables([{ heatCapacity: () => rhoC, conductivity: (T_K) => 45 - 0.02 * (T_K - 300) }], false);
    const face = new ConvectionRadiation(3000, Tinf, 0.8, Tinf);
    const spec = { thickness_m: 2 * L, cells, scheme: "crank-nicolson" as const, tables, initial_K: Ti, tolerance_K: 1e-9 };
    const fine = march(spec, 2, 10240, face, face);
    const runs = [40, 80, 160, 320].map((steps) => march(spec, 2, steps, face, face));
    for (const run of [fine, ...runs]) expect(run.stats.unconvergedSteps).toBe(0);
    // Observed: 1.01e-2, 2.53e-3, 6.32e-4, 1.58e-4 K; orders 1.998, 2.000, 2.001. ±0.05 as above.
    const orders = observedOrders(runs.map((run) => maxAbsDifference(run.T, fine.T)));
    for (const p of orders) expect(Math.abs(p - 2)).toBeLessThanOrEqual(0.05);
  });
});
