/**
 * The product side of the built command line (dist/cli/main.js; run `npm run build` first):
 * the `limits` floor as JSON, bad input refused with exit 2 and one stderr line, and one
 * end-to-end consistency check of profile.csv against Pickering's yield and tensile equations.
 * Seven short processes in all.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { parse } from "csv-parse/sync";
import { stripCaseObject } from "./support/product-runs.js";

const CLI = resolve("dist/cli/main.js");
let scratch = "";

beforeAll(() => {
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: run \`npm run build\` before these tests`);
  scratch = mkdtempSync(join(tmpdir(), "recalesce-product-cli-"));
});
afterAll(() => {
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

function recalesce(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [CLI, ...args], { encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** Exit 2, nothing on stdout, exactly one stderr line naming `field`, no stack trace. */
function expectRefused(r: ReturnType<typeof recalesce>, field: RegExp): void {
  expect(r.status, r.stderr).toBe(2);
  expect(r.stdout).toBe("");
  const lines = r.stderr.trimEnd().split("\n");
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(/^recalesce: /);
  expect(lines[0]).toMatch(field);
  expect(r.stderr).not.toMatch(/\bat .*:\d+:\d+/); // a stack frame "at fn (file:line:col)"
}

function writeCase(name: string, data: Record<string, unknown>): string {
  const file = join(scratch, name);
  writeFileSync(file, JSON.stringify(data, null, 2));
  return file;
}

describe("recalesce limits --json", () => {
  it("gives a floor of about 10 nm for ΔG = −700 J/mol and σ = 0.5 J/m²", () => {
    const r = recalesce("limits", "--driving-force=-700", "--interface-energy", "0.5", "--json");
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { grain_floor_nm: number; molar_volume_m3_mol: number; interface_energy_J_m2: number };
    // Common practice (no source): about 10 nm at ~700 J/mol, σ ≈ 0.5 J/m², V_m ≈ 7.1e−6 m³/mol.
    // Tolerance 1 nm: "about 10 nm" is a one-figure statement (10.14 nm by the formula).
    expect(Math.abs(out.grain_floor_nm - 10)).toBeLessThan(1);
    // And exactly L_min = 2σV_m/|ΔG| with the V_m the command reports (physics.md §7 [calc]);
    // tolerance 1e−12 relative: a handful of floating-point operations.
    const expected_nm = ((2 * out.interface_energy_J_m2 * out.molar_volume_m3_mol) / 700) * 1e9;
    expect(Math.abs(out.grain_floor_nm / expected_nm - 1)).toBeLessThan(1e-12);
  });
});

describe("bad input through the built CLI", () => {
  it("refuses --interface-energy 0", () => {
    expectRefused(recalesce("limits", "--driving-force=-700", "--interface-energy", "0"), /--interface-energy/);
  });
  it("refuses a positive driving force (wrong sign)", () => {
    expectRefused(recalesce("limits", "--driving-force", "700"), /--driving-force.*negative/);
  });
  it("refuses a zero driving force", () => {
    expectRefused(recalesce("limits", "--driving-force", "0"), /--driving-force.*negative/);
  });
  it("refuses a case whose retained_strain lies outside [0, 1], on either side, and writes no result folder", () => {
    for (const [name, strain] of [["strain-above.json", 1.5], ["strain-below.json", -0.2]] as const) {
      const base = stripCaseObject({ thickness_mm: 6, htc_W_m2K: 800 });
      const file = writeCase(name, { ...base, material: { ...(base.material as object), retained_strain: strain } });
      const out = join(scratch, `out-${name}`);
      expectRefused(recalesce("run", file, "--out", out, "--quiet"), /material\.retained_strain.*\[0, 1\]/);
      expect(existsSync(out)).toBe(false);
    }
  });
});

describe("profile.csv against Pickering (1978), recomputed from a node's own grain size and pearlite", () => {
  /**
   * Pickering (1978) as written in physics.md §7 [mem for the full equations; solid-solution
   * coefficients pub: Pickering & Gladman in Llewellyn & Hudd, Steels: Metallurgy and
   * Applications, Table 2.1]. Mn, Si, N_f in wt%; d ferrite mean linear intercept in mm; pearlite
   * in percent of the ferrite–pearlite.
   */
  const pickeringYield_MPa = (Mn: number, Si: number, Nf: number, d_mm: number) => 53.9 + 32.3 * Mn + 83.2 * Si + 354 * Math.sqrt(Nf) + 17.4 / Math.sqrt(d_mm);
  const pickeringTensile_MPa = (Mn: number, Si: number, pearlite_pct: number, d_mm: number) => 294 + 27.7 * Mn + 83.2 * Si + 3.85 * pearlite_pct + 7.7 / Math.sqrt(d_mm);

  it("the formulas as written here reproduce physics.md's check values", () => {
    // physics.md §7 [calc]: 0.10C-0.60Mn-0.20Si, N_f 0.005, d 12.77 µm, 12 % pearlite → YS 268.9,
    // TS 441.6 MPa. Tolerance 0.05 MPa: the check values are given to 0.1 MPa.
    expect(Math.abs(pickeringYield_MPa(0.6, 0.2, 0.005, 0.01277) - 268.9)).toBeLessThan(0.05);
    expect(Math.abs(pickeringTensile_MPa(0.6, 0.2, 12, 0.01277) - 441.6)).toBeLessThan(0.05);
  });

  it("matches the yield and tensile strength written for the centre node of a run", () => {
    // 0.10C-0.6Mn-0.2Si-0.005N, no Al or Ti: all nitrogen is free (N_f = 0.005 wt%).
    const composition = { C: 0.1, Mn: 0.6, Si: 0.2, N: 0.005 };
    const file = writeCase("pickering.json", stripCaseObject({ thickness_mm: 6, htc_W_m2K: 1500, composition }));
    const out = join(scratch, "pickering-out");
    const r = recalesce("run", file, "--out", out, "--quiet");
    expect(r.status, r.stderr).toBe(0);
    const rows = parse(readFileSync(join(out, "profile.csv"), "utf8"), { columns: true, cast: true }) as Array<Record<string, number>>;
    const centre = rows[Math.floor(rows.length / 2)];
    // 12 cells over 6 mm: node 6 is the centre plane; depth is written as "3.0000", so 1e−9 is exact.
    expect(centre.depth_mm).toBeCloseTo(3, 9);
    // Premise: a ferrite–pearlite node (Pickering's domain), fully transformed; fractions are
    // written to 6 decimals, so 1e−6 means "zero as written".
    expect(centre.pearlite).toBeGreaterThan(0);
    expect(centre.bainite + centre.martensite + centre.austenite).toBeLessThan(1e-6);

    const d_mm = centre.grain_um / 1000;
    const pearlite_pct = (100 * centre.pearlite) / (centre.ferrite + centre.pearlite);
    // Tolerance 0.06 MPa: the CSV writes strength to 0.1 MPa (±0.05) and grain size to 0.001 µm,
    // which moves 17.4 d^−½ by under 0.005 MPa at d ≈ 10 µm; fractions (6 decimals) add < 1e−4.
    expect(Math.abs(centre.yield_MPa - pickeringYield_MPa(0.6, 0.2, 0.005, d_mm))).toBeLessThan(0.06);
    expect(Math.abs(centre.tensile_MPa - pickeringTensile_MPa(0.6, 0.2, pearlite_pct, d_mm))).toBeLessThan(0.06);
  });
});
