import { describe, it, expect, beforeAll } from "vitest";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { runCase } from "../src/io/run-case.js";
import { validateCase } from "../src/io/load-case.js";

/**
 * Cross-section cases through `recalesce run` (product.section "cross-section"). The 2-D solver
 * itself is verified against the product solution of Incropera & DeWitt §5.8 in
 * conduction2d.test.ts; these tests check the case-to-files pipeline around it.
 */

const dir = mkdtempSync(join(tmpdir(), "recalesce-section-"));

function write(name: string, data: unknown): string {
  const f = join(dir, `${name}.json`);
  writeFileSync(f, JSON.stringify(data));
  return f;
}

const water = { htc_W_m2K: 800, medium_C: 30, emissivity: 0 };
const insulated = { insulated: true };

function plainCase(section: boolean, edge: unknown, symmetric = true) {
  return {
    title: "plain section",
    product: { thickness_mm: 20, initial_C: 900, width_mm: 200, ...(section ? { section: "cross-section" } : {}) },
    material: { conductivity_W_mK: 30, specific_heat_J_kgK: 600, density_kg_m3: 7800 },
    cooling: { stages: [{ duration_s: 30, top: water, bottom: water, ...(section ? { edge } : {}) }] },
    numerics: section ? { scheme: "adi", cells: 20, width_cells: symmetric ? 10 : 20, symmetric, time_step_s: 0.05 } : { scheme: "crank-nicolson", cells: 20, time_step_s: 0.05 },
    output: { depths_mm: [0, 10], interval_s: 5 },
  };
}

interface Summary {
  final: { T_C: Record<string, number>; phases?: Record<string, number>; grain_um?: Record<string, number | null> };
  energy: { relative_error: number; heat_out_J_m?: Record<string, number> };
}

async function run(name: string, data: unknown): Promise<Summary> {
  validateCase(name, data);
  const out = join(dir, name);
  await runCase(write(name, data), out);
  return JSON.parse(readFileSync(join(out, "summary.json"), "utf8")) as Summary;
}

describe("a cross-section case", () => {
  let strip: Summary;
  let wide: Summary;
  beforeAll(async () => {
    strip = await run("strip", plainCase(false, undefined));
    wide = await run("wide-insulated", plainCase(true, insulated));
  });

  it("with insulated edges reproduces the 1-D strip at mid-width (Peaceman–Rachford reduces to Crank–Nicolson in 1-D)", () => {
    // With insulated edges nothing varies across the width, and PR ADI's y-sweeps are CN steps
    // split in two halves; conduction2d.test.ts measures 9e-12 K between them on the same grid.
    // The files round to 1e-3 °C, so 2e-3 K covers the rounding of both sides.
    for (const k of ["top", "centre", "bottom", "mean"]) expect(Math.abs(wide.final.T_C[k] - strip.final.T_C[k])).toBeLessThan(2e-3);
  });

  it("cools fastest at the corner and closes its energy ledger", async () => {
    const s = await run("cooled-edge", plainCase(true, water));
    // Maximum principle with the corner losing heat through two faces (common practice (no source)).
    expect(s.final.T_C.corner).toBeLessThan(s.final.T_C.edge);
    expect(s.final.T_C.edge).toBeLessThan(s.final.T_C.centre);
    expect(s.final.T_C.corner).toBeLessThan(s.final.T_C.top);
    // Constant properties: the ledger closes to round-off (conduction2d.test.ts measures ≤ 2e-15).
    expect(s.energy.relative_error).toBeLessThan(1e-9);
    expect(s.energy.heat_out_J_m!.edge).toBeGreaterThan(0);
    // The section's extremes equal the extremes of the whole field written to profile.csv (read
    // back independently), and bound the named places.
    const rows = readFileSync(join(dir, "cooled-edge", "profile.csv"), "utf8").trim().split("\n").slice(1);
    const temps = rows.map((r) => Number(r.split(",")[2]));
    expect(s.final.T_C.max).toBe(Math.max(...temps));
    expect(s.final.T_C.min).toBe(Math.min(...temps));
    expect(s.final.T_C.min).toBeLessThanOrEqual(s.final.T_C.corner);
    expect(s.final.T_C.max).toBeGreaterThanOrEqual(s.final.T_C.centre);
  });

  it("gives the same field with a symmetry plane as with the full width", async () => {
    const half = await run("half", plainCase(true, water, true));
    const full = await run("full", plainCase(true, water, false));
    // Same node positions (full width has twice the cells); the mirror test in
    // conduction2d.test.ts measures 9e-13 K, the files round to 1e-3 °C.
    for (const k of ["top", "centre", "bottom", "edge", "corner", "mean"]) expect(Math.abs(half.final.T_C[k] - full.final.T_C[k])).toBeLessThan(2e-3);
  });

  it("transforms a steel with fractions that sum to 1, grain sizes at the five places, and a closed ledger", async () => {
    const data = JSON.parse(readFileSync("cases/section-40mm-plate-edge.json", "utf8")) as Record<string, unknown>;
    const s = await run("steel", data);
    const p = s.final.phases!;
    const sum = p.ferrite + p.pearlite + p.bainite + p.martensite + p.austenite;
    expect(Math.abs(sum - 1)).toBeLessThan(5e-6); // six-decimal rounding of five values
    // Latent heat on: the Picard iteration and the enthalpy correction keep the ledger well below
    // the 1e-6 the 1-D coupled tests demand.
    expect(s.energy.relative_error).toBeLessThan(1e-6);
    expect(s.final.grain_um!.corner).not.toBeNull();
    // The corner cools fastest, so its ferrite is finer than the centre's (faster cooling → finer
    // ferrite: Hodgson–Gibbs relation, physics.md §7, from memory).
    expect(s.final.grain_um!.corner!).toBeLessThan(s.final.grain_um!.centre!);
  });

  it("refuses an ADI scheme on a strip and a cross-section without an edge condition", () => {
    const strip = plainCase(false, undefined) as { numerics: Record<string, unknown> };
    strip.numerics.scheme = "adi";
    expect(() => validateCase("c.json", strip)).toThrow(/numerics\.scheme/);
    const noEdge = plainCase(true, undefined);
    expect(() => validateCase("c.json", noEdge)).toThrow(/cooling\.stages\[0\]\.edge/);
  });
});
