/**
 * Property tests (fast-check) on generated VALID small cases, run in-process through the io layer
 * exactly as `recalesce run` does, checking what must hold for any input:
 *
 * - no NaN or Infinity anywhere: the solver's final temperatures and fractions are finite; every
 *   number of the summary object is finite; every CSV cell is a finite number, except that the
 *   product columns (grain, strength, hardness) may be empty where the product is not defined.
 *   The formatter prints a non-finite value as an empty cell and rounds NaN to 0 in JSON (format.ts),
 *   so the in-memory checks are the ones that can see a NaN; the CSV checks catch the rest;
 * - phase fractions in [0, 1] and summing to 1 within the 6-decimal printing (five values each
 *   rounded by at most 5e-7, so |Σ − 1| ≤ 2.5e-6, checked at 3e-6);
 * - temperatures within [T_low, T_high]: by the maximum principle, conduction and the faces
 *   can only pull a point towards the initial temperature and the media, so
 *   T_low = min(initial, every active medium and surroundings temperature); heat is added only by
 *   transformations, at most L_max / c_p,min per kilogram, so T_high = max(initial, media) +
 *   L_max / c_p,min. L_max (largest h_γ − h_product over 273–1300 K) and c_p,min (smallest
 *   single-phase c_p there) are computed from src/physics/phase-enthalpy.ts: 157.5 kJ/kg and
 *   433 J/(kg·K) at the time of writing, a bound of ≈ 364 K, looser than the ≈ 260 K suggested by
 *   the 130 kJ/kg of h_γ − h_α at 700 K [physics.md §2] because h_γ − h_α keeps growing towards room
 *   temperature. 0.01 K of slack covers the 0.001 K printing and the 1e-3 K Picard tolerance;
 * - the energy ledger closes to a relative error below 1e-4 at the default Picard tolerance
 *   (the project's acceptance bound; the blessed cases reach 1e-9 … 1.3e-5).
 *
 * Cases are small (≤ 20 cells, ≤ 6 s, steps ≥ 5 ms) and few (40 runs per property, about 1–2 s).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runCase } from "../src/io/run-case.js";
import { phaseEnthalpy_J_kg, phaseSpecificHeat_J_kgK } from "../src/physics/phase-enthalpy.js";
import { AUSTENITE, PHASE_COUNT, PHASES } from "../src/physics/phases.js";

/** Latent self-heating bound L_max / c_p,min [K], from the phase enthalpies over 273–1300 K. */
function latentHeatingBound_K(): number {
  let maxLatent = 0;
  let minCp = Infinity;
  for (let T = 273; T <= 1300; T += 1) {
    for (let p = 0; p < PHASE_COUNT; p++) {
      if (p !== AUSTENITE) maxLatent = Math.max(maxLatent, phaseEnthalpy_J_kg(AUSTENITE, T) - phaseEnthalpy_J_kg(p, T));
      minCp = Math.min(minCp, phaseSpecificHeat_J_kgK(p, T));
    }
  }
  return maxLatent / minCp;
}

const r2 = (v: number) => Math.round(v * 100) / 100;
const between = (min: number, max: number) => fc.double({ min, max, noNaN: true }).map(r2);

interface Face {
  htc_W_m2K?: number;
  medium_C?: number;
  emissivity?: number;
  surroundings_C?: number;
  insulated?: true;
}

const faceArb: fc.Arbitrary<Face> = fc.oneof(
  { weight: 5, arbitrary: fc.record({ htc_W_m2K: between(0, 5000), medium_C: between(10, 100), emissivity: between(0, 1), surroundings_C: between(10, 100) }) },
  { weight: 1, arbitrary: fc.constant<Face>({ insulated: true }) },
);

/** A valid table of user kinetics (start before finish, temperatures increasing). */
const TABLE_KINETICS = {
  model: "table",
  ferrite: { points: [{ T_C: 550, start_s: 1, finish_s: 12 }, { T_C: 650, start_s: 0.5, finish_s: 6 }, { T_C: 780, start_s: 4, finish_s: 60 }] },
  pearlite: { points: [{ T_C: 500, start_s: 2, finish_s: 15 }, { T_C: 700, start_s: 6, finish_s: 60 }] },
  bainite: { points: [{ T_C: 350, start_s: 2, finish_s: 30 }, { T_C: 550, start_s: 3, finish_s: 50 }] },
};

const steelArb = fc.record({
  composition_wt_pct: fc.record({ C: between(0.02, 0.8), Mn: between(0.1, 1.8), Si: between(0, 0.5), Cr: between(0, 1), Mo: between(0, 0.4), Ni: between(0, 1) }),
  austenite_grain_um: between(5, 150),
  transformation: fc.constantFrom("on", "on", "off"),
  kinetics: fc.constantFrom<object>({ model: "li1998" }, { model: "li1998" }, TABLE_KINETICS),
});

const plainArb = fc.record({ conductivity_W_mK: between(15, 60), specific_heat_J_kgK: between(400, 800), density_kg_m3: between(7000, 8000) });

const caseArb = fc
  .record({
    thickness_mm: between(1, 40),
    initial_C: between(700, 1000),
    material: fc.oneof({ weight: 3, arbitrary: steelArb }, { weight: 1, arbitrary: plainArb }),
    stages: fc.array(fc.record({ duration_s: between(0.2, 2), top: faceArb, bottom: faceArb }), { minLength: 1, maxLength: 3 }),
    scheme: fc.constantFrom("explicit", "implicit", "crank-nicolson"),
    cells: fc.integer({ min: 3, max: 20 }),
    time_step_s: fc.constantFrom(0.005, 0.01, 0.02, 0.05, 0.1, 0.2),
    depthPermille: fc.uniqueArray(fc.integer({ min: 0, max: 1000 }), { minLength: 1, maxLength: 3 }),
    interval_s: fc.constantFrom(0.1, 0.25, 0.5, 1),
  })
  .map((g) => {
    // The explicit scheme sub-steps to its stability limit ∝ Δx²; keep its cells coarse and the
    // piece at least 3 mm so a run stays a few thousand sub-steps.
    const explicit = g.scheme === "explicit";
    const thickness_mm = explicit ? Math.max(3, g.thickness_mm) : g.thickness_mm;
    const cells = explicit ? Math.min(g.cells, 10) : g.cells;
    const total = g.stages.reduce((s, st) => s + st.duration_s, 0);
    return {
      title: "generated case",
      product: { thickness_mm, initial_C: g.initial_C },
      material: g.material,
      cooling: { stages: g.stages },
      numerics: { scheme: g.scheme, cells, time_step_s: Math.min(g.time_step_s, total) },
      output: { depths_mm: g.depthPermille.map((f) => Math.round(f * thickness_mm) / 1000), interval_s: g.interval_s },
    };
  });

type GeneratedCase = ReturnType<(typeof caseArb)["generate"]>["value"];

function temperatureRange(c: GeneratedCase, latentBound_K: number): [number, number] {
  const temps = [c.product.initial_C];
  for (const s of c.cooling.stages) {
    for (const f of [s.top, s.bottom]) {
      if ((f.htc_W_m2K ?? 0) > 0) temps.push(f.medium_C!);
      if ((f.emissivity ?? 0) > 0) temps.push(f.surroundings_C!);
    }
  }
  const transforming = "composition_wt_pct" in c.material && (c.material as { transformation: string }).transformation === "on";
  return [Math.min(...temps), Math.max(...temps) + (transforming ? latentBound_K : 0)];
}

function parseCsv(text: string): { columns: string[]; rows: string[][] } {
  const lines = text.trimEnd().split("\n");
  return { columns: lines[0].split(","), rows: lines.slice(1).map((l) => l.split(",")) };
}

function summaryNumbers(v: unknown, path: string, out: Array<[string, number]>): void {
  if (typeof v === "number") out.push([path, v]);
  else if (Array.isArray(v)) v.forEach((x, i) => summaryNumbers(x, `${path}[${i}]`, out));
  else if (v && typeof v === "object") for (const [k, x] of Object.entries(v)) summaryNumbers(x, path ? `${path}.${k}` : k, out);
}

const PRODUCTS: readonly string[] = PHASES;
/** Columns whose empty cell means "not defined here" (no ferrite, no strength formula). */
const PRODUCT_COLUMNS = new Set(["grain_um", "grain_floor_nm", "yield_MPa", "tensile_MPa", "hardness_HV"]);
/** 0.001 K printing plus the 1e-3 K Picard tolerance, with room. */
const SLACK_K = 0.01;
/** Five fractions, each printed to 6 decimals (≤ 5e-7 rounding each), with room. */
const SUM_TOLERANCE = 3e-6;

let scratch: string;
let latentBound_K: number;
let runCount = 0;

/** Runs a generated case through the io layer into a scratch folder; returns what it wrote. */
async function runGenerated(c: GeneratedCase) {
  const n = ++runCount;
  const file = join(scratch, `case-${n}.json`);
  const out = join(scratch, `out-${n}`);
  writeFileSync(file, JSON.stringify(c, null, 2));
  const outcome = await runCase(file, out);
  const summary = JSON.parse(readFileSync(join(out, "summary.json"), "utf8"));
  const history = parseCsv(readFileSync(join(out, "history.csv"), "utf8"));
  const profile = parseCsv(readFileSync(join(out, "profile.csv"), "utf8"));
  rmSync(out, { recursive: true, force: true });
  return { outcome, summary, history, profile };
}

/** One CSV row: finite cells, temperatures within [low, high], fractions in [0, 1] summing to 1 per depth. */
function checkRow(label: string, columns: readonly string[], row: readonly string[], low: number, high: number): void {
  expect(row.length).toBe(columns.length);
  const sums = new Map<string, number>();
  row.forEach((cell, i) => {
    const name = columns[i];
    if (cell === "" && PRODUCT_COLUMNS.has(name)) return;
    const v = cell === "" ? NaN : Number(cell);
    expect(Number.isFinite(v), `${label} ${name} = "${cell}"`).toBe(true);
    if (name === "T_C" || (name.startsWith("T_") && name.endsWith("_C"))) {
      expect(v, `${label} ${name}`).toBeGreaterThanOrEqual(low - SLACK_K);
      expect(v, `${label} ${name}`).toBeLessThanOrEqual(high + SLACK_K);
    }
    const phase = PRODUCTS.find((p) => name === p || name.startsWith(`${p}_`));
    if (phase) {
      expect(v, `${label} ${name}`).toBeGreaterThanOrEqual(0);
      expect(v, `${label} ${name}`).toBeLessThanOrEqual(1);
      const where = name.slice(phase.length);
      sums.set(where, (sums.get(where) ?? 0) + v);
    }
  });
  for (const [where, sum] of sums) expect(Math.abs(sum - 1), `${label} fractions${where} sum to ${sum}`).toBeLessThanOrEqual(SUM_TOLERANCE);
}

beforeAll(() => {
  scratch = mkdtempSync(join(tmpdir(), "recalesce-property-"));
  latentBound_K = latentHeatingBound_K();
});
afterAll(() => {
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

describe("generated valid cases", () => {
  it("the latent self-heating bound is what the doc comment states", () => {
    // Guards the stated numbers: 157.5 kJ/kg / 433 J/(kg·K) ≈ 364 K, to 1 K (the stated precision).
    expect(latentBound_K).toBeGreaterThan(363);
    expect(latentBound_K).toBeLessThan(365);
  });

  it("give finite results, fractions in [0, 1] summing to 1 and temperatures within the physical bounds", async () => {
    await fc.assert(
      fc.asyncProperty(caseArb, async (c) => {
        const { outcome, summary, history, profile } = await runGenerated(c);
        const [low, high] = temperatureRange(c, latentBound_K);
        const solver = outcome.result!.solver; // generated cases are strips: the 1-D result is always there
        for (let i = 0; i < solver.nodes; i++) {
          const T_C = solver.T[i] - 273.15;
          expect(T_C, `solver node ${i}`).toBeGreaterThanOrEqual(low - SLACK_K);
          expect(T_C, `solver node ${i}`).toBeLessThanOrEqual(high + SLACK_K);
          let sum = 0;
          for (const X of solver.fractions) {
            expect(X[i] >= 0 && X[i] <= 1, `solver fraction at node ${i} = ${X[i]}`).toBe(true);
            sum += X[i];
          }
          // Unrounded fractions: the sum is 1 up to the round-off of a few updates per step.
          expect(Math.abs(sum - 1), `solver fractions at node ${i}`).toBeLessThan(1e-9);
        }
        const numbers: Array<[string, number]> = [];
        summaryNumbers(outcome.summary, "", numbers);
        for (const [path, v] of numbers) expect(Number.isFinite(v), `summary ${path} = ${v}`).toBe(true);
        for (const [name, T] of Object.entries(summary.final.T_C as Record<string, number>)) {
          expect(T, `final ${name}`).toBeGreaterThanOrEqual(low - SLACK_K);
          expect(T, `final ${name}`).toBeLessThanOrEqual(high + SLACK_K);
        }
        for (const [label, csv] of [["history", history], ["profile", profile]] as const) {
          for (const row of csv.rows) checkRow(label, csv.columns, row, low, high);
        }
      }),
      { numRuns: 40, seed: 7101, endOnFailure: true },
    );
  });

  it("close the energy ledger to a relative error below 1e-4 at the default Picard tolerance", async () => {
    // 1e-4: the project's acceptance bound (see the file header). History: this once failed for
    // insulated pieces — an insulated 31.95 mm piece that formed 70 % ferrite ended with ΔH =
    // 1.05 J/m² of Picard noise and Q_out = 0, and ledgerError() divided by a 1e-9·|H0| = 0.12 J/m²
    // floor, reporting 1. Fixed by the enthalpy correction of the committed state (commit 968ece3)
    // and the 1e-6·|H0| floor of the scale (commit 3e4fd60); this property guards both.
    await fc.assert(
      fc.asyncProperty(caseArb, async (c) => {
        const { summary } = await runGenerated(c);
        expect(summary.energy.relative_error, `ledger; heat out ${summary.energy.heat_out_top_J_m2} + ${summary.energy.heat_out_bottom_J_m2} J/m²`).toBeLessThan(1e-4);
      }),
      { numRuns: 40, seed: 7102, endOnFailure: true },
    );
  });
});
