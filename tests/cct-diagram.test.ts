/**
 * The continuous-cooling (CCT) table (model/cct-diagram.ts) and its place in `recalesce steel`
 * (--cct, --cct-csv). Reference values are written out here from their sources, not taken from the
 * project's modules.
 */
import { describe, expect, it } from "vitest";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { cctDiagram, cctEntryTemperature_C, DEFAULT_CCT_RATES_K_s, type CctDiagram } from "../src/model/cct-diagram.js";
import type { DecompositionSetup } from "../src/physics/austenite-decomposition.js";
import { fullComposition, type Composition } from "../src/physics/composition.js";
import { validateCase } from "../src/io/load-case.js";
import { InputError } from "../src/io/errors.js";
import { SAFETY_NOTICE } from "../src/io/safety.js";
import { cctCsv, cctRates, formatSteelReport, steelReport } from "../src/io/steel-report.js";
import { cliForThisFile, runCli } from "./support/built-cli.js";

// The two steels of the brief with their critical temperatures [calc, physics.md §4 table]:
// Ae3 Andrews 7-term, Ae1 Andrews, Bs of the Li model, Ms Andrews linear.
const plain045 = fullComposition({ C: 0.45, Mn: 0.75, Si: 0.25 });
const critical045 = { Ae3_C: 785.0, Ae1_C: 722.2, Bs_C: 584.6, Ms_C: 325.8 };
const crmo040 = fullComposition({ C: 0.4, Mn: 0.9, Si: 0.25, Cr: 1.0, Mo: 0.2 });
const criticalCrMo = { Ae3_C: 799.1, Ae1_C: 737.5, Bs_C: 540.1, Ms_C: 328.8 };

/** Li (1998) kinetics at ASTM grain 8, the setup tests/austenite-decomposition.test.ts uses. */
function liSetup(composition: Composition, critical: DecompositionSetup["critical"]): DecompositionSetup {
  return { composition, astmGrainNumber: 8, critical, timeScale: { ferrite: 1, pearlite: 1, bainite: 1 }, kinetics: { kind: "li1998" } };
}

const ENTRY_C = 850; // above Ae3 of both steels: nothing forms higher up in the model
const plainTable = cctDiagram(liSetup(plain045, critical045), DEFAULT_CCT_RATES_K_s, { entry_C: ENTRY_C });
const crmoTable = cctDiagram(liSetup(crmo040, criticalCrMo), DEFAULT_CCT_RATES_K_s, { entry_C: ENTRY_C });
const BOTH: ReadonlyArray<readonly [string, CctDiagram]> = [
  ["0.45C-0.75Mn-0.25Si", plainTable],
  ["0.40C-0.90Mn-0.25Si-1.0Cr-0.2Mo", crmoTable],
];

describe("constant-rate cooling of a single point (prescribed path)", () => {
  it("the default rates are 0.1 … 300 K/s, one row each in that order", () => {
    expect(DEFAULT_CCT_RATES_K_s).toEqual([0.1, 0.3, 1, 3, 10, 30, 100, 300]);
    for (const [, table] of BOTH) expect(table.rows.map((r) => r.rate_K_s)).toEqual(DEFAULT_CCT_RATES_K_s);
  });

  it("the start temperature falls or stays as the cooling rate rises, for a medium-carbon and a hardenable steel", () => {
    // Continuous-cooling metallurgy: faster cooling leaves less time at each temperature, so the
    // transformation starts lower (common practice (no source)). No tolerance is needed: every rate
    // visits the same temperatures and Li's additivity clock there scales with 1/rate, so a faster
    // rate can never be ahead (the interpolated 1 % crossing of a smaller curve lies lower).
    for (const [name, table] of BOTH) {
      const starts = table.rows.map((r) => r.start_C);
      for (const s of starts) expect(s, name).not.toBeNull();
      for (let i = 1; i < starts.length; i++) expect(starts[i]!, `${name} at ${table.rows[i].rate_K_s} K/s`).toBeLessThanOrEqual(starts[i - 1]!);
      // Not vacuous: from the diffusional range at 0.1 K/s (start above Bs) down to Ms at 300 K/s,
      // where 1 % of Koistinen–Marburger needs Ms − T = ln(1/0.99)/0.011 = 0.91 K (Koistinen &
      // Marburger 1959); 0.5 K more for diffusional traces formed earlier (measured 0.3 and 0.01 K).
      expect(starts[0]!).toBeGreaterThan(table === plainTable ? critical045.Bs_C : criticalCrMo.Bs_C);
      const Ms = table === plainTable ? critical045.Ms_C : criticalCrMo.Ms_C;
      expect(starts[starts.length - 1]!).toBeLessThanOrEqual(Ms);
      expect(starts[starts.length - 1]!).toBeGreaterThanOrEqual(Ms - 0.91 - 0.5);
      expect(table.rows[table.rows.length - 1].startProduct).toBe("martensite");
    }
    // The plain steel starts as ferrite when cooled slowly (hypo-eutectoid, physics.md §5.5).
    expect(plainTable.rows[0].startProduct).toBe("ferrite");
  });

  it("the fractions at every rate lie in [0, 1] and sum to 1", () => {
    // physics.md §5.5: X_γ + X_F + X_P + X_B + X_M = 1, each in [0, 1]. 1e-12: austenite is 1 minus
    // the four products, so the sum differs from 1 by round-off of a few additions only.
    for (const [name, table] of BOTH) {
      for (const row of table.rows) {
        const f = row.fractions;
        const all = [f.ferrite, f.pearlite, f.bainite, f.martensite, f.austenite];
        for (const x of all) {
          expect(x, `${name} at ${row.rate_K_s} K/s`).toBeGreaterThanOrEqual(0);
          expect(x, `${name} at ${row.rate_K_s} K/s`).toBeLessThanOrEqual(1);
        }
        expect(Math.abs(all.reduce((a, b) => a + b, 0) - 1)).toBeLessThanOrEqual(1e-12);
      }
    }
  });

  it("at 0.1 K/s the 0.45 %C steel's ferrite is the lever rule at A1 (about 0.43), the rest pearlite", () => {
    // Lever rule at A1 on the Fe–C diagram (physics.md §5.5): (0.77 − 0.45)/(0.77 − 0.02) = 0.4267.
    // Band [lever − 0.03, lever] as justified in tests/austenite-decomposition.test.ts for this steel,
    // grain and rate: the model cannot exceed the lever rule, and 0.03 is the scatter of point-counted
    // ferrite fractions (from memory). Measured: 0.426667 (the lever rule to round-off).
    const lever = (0.77 - 0.45) / (0.77 - 0.02);
    const slow = plainTable.rows[0];
    expect(slow.rate_K_s).toBe(0.1);
    expect(slow.fractions.ferrite).toBeLessThanOrEqual(lever + 1e-12);
    expect(slow.fractions.ferrite).toBeGreaterThanOrEqual(lever - 0.03);
    // Retained austenite below 1e-6: slow cooling completes the diffusional products above Ms.
    expect(slow.fractions.austenite).toBeLessThan(1e-6);
    expect(Math.abs(slow.fractions.pearlite - (1 - slow.fractions.ferrite))).toBeLessThan(1e-6);
  });

  it("at 300 K/s the hardenable steel is martensite and retained austenite, martensite = 1 − exp(−0.011 (Ms − 20))", () => {
    // Koistinen & Marburger (1959) closed form at 20 °C with Ms = 328.8 °C: 0.966517. The rate form is
    // integrated exactly over each step (a product of exp(−α ΔT) telescopes), so
    // X_M = (1 − X_diffusional) · f_KM and |X_M − f_KM| ≤ X_diffusional. "Martensite and retained
    // austenite" is taken as diffusional products below 1e-3 (below metallographic resolution);
    // measured 1.1e-4, gap to KM 1.0e-4. The table's Ms is rounded to 0.05 K: 0.05 · 0.011 · 0.0335 =
    // 2e-5 more. Tolerance 1e-3 covers both.
    const fast = crmoTable.rows[crmoTable.rows.length - 1];
    expect(fast.rate_K_s).toBe(300);
    const f = fast.fractions;
    expect(f.ferrite + f.pearlite + f.bainite).toBeLessThan(1e-3);
    const km = 1 - Math.exp(-0.011 * (328.8 - 20));
    expect(Math.abs(f.martensite - km)).toBeLessThan(1e-3);
    expect(Math.abs(f.austenite - (1 - km))).toBeLessThan(1e-3);
    expect(fast.productStart_C.martensite).not.toBeNull();
    expect(fast.productStart_C.bainite).toBeNull();
  });

  it("the hardness rises with the cooling rate", () => {
    // Maynier et al. (1978): faster cooling gives harder products (each equation rises with
    // log V_r for these compositions, and faster cooling shifts the mixture to bainite and
    // martensite). Strictly rising at each step of the default list.
    for (const [name, table] of BOTH) {
      for (let i = 1; i < table.rows.length; i++) expect(table.rows[i].hardness_HV!, `${name} at ${table.rows[i].rate_K_s} K/s`).toBeGreaterThan(table.rows[i - 1].hardness_HV!);
    }
  });

  it("uses the constant rate as Maynier's cooling rate at 700 °C: ferrite–pearlite at 0.1 K/s gives HV_FP", () => {
    // Maynier et al. (1978) ferrite–pearlite equation written out, V_r = 0.1 K/s = 360 °C/h:
    // HV = 42 + 223C + 53Si + 30Mn + (10 − 19Si) log10 V_r = 191.52 for 0.45C-0.75Mn-0.25Si. The
    // 0.1 K/s row is ferrite + pearlite only (retained austenite < 1e-6, see above), so the mixture is
    // HV_FP itself; relative 1e-9 allows for that 1e-6 renormalisation only.
    const hv = 42 + 223 * 0.45 + 53 * 0.25 + 30 * 0.75 + (10 - 19 * 0.25) * Math.log10(0.1 * 3600);
    expect(Math.abs(plainTable.rows[0].hardness_HV! / hv - 1)).toBeLessThan(1e-9);
  });

  it("the default 0.1 K step resolves the path: a five times finer step changes nothing visible in the table", () => {
    // Refinement check (house style): the table prints 0.1 °C, three decimals and whole HV. Bounds:
    // two units of the printed temperature, one unit of the third decimal, half an HV. Measured with
    // 0.02 K: starts 0.04 K, product starts 0.08 K, fractions 3.5e-4, hardness 0.16 HV.
    for (const [setup, coarse] of [
      [liSetup(plain045, critical045), plainTable],
      [liSetup(crmo040, criticalCrMo), crmoTable],
    ] as const) {
      expect(coarse.step_K).toBeLessThanOrEqual(0.1);
      const fine = cctDiagram(setup, DEFAULT_CCT_RATES_K_s, { entry_C: ENTRY_C, maxStep_K: 0.02 });
      coarse.rows.forEach((row, i) => {
        const other = fine.rows[i];
        expect(Math.abs(row.start_C! - other.start_C!)).toBeLessThan(0.2);
        for (const p of ["ferrite", "pearlite", "bainite", "martensite"] as const) {
          const a = row.productStart_C[p];
          const b = other.productStart_C[p];
          expect(a === null, `${p} at ${row.rate_K_s} K/s`).toBe(b === null);
          if (a !== null && b !== null) expect(Math.abs(a - b)).toBeLessThan(0.2);
          expect(Math.abs(row.fractions[p] - other.fractions[p])).toBeLessThan(1e-3);
        }
        expect(Math.abs(row.hardness_HV! - other.hardness_HV!)).toBeLessThan(0.5);
      });
    }
  });

  it("each rate starts from fresh austenite: a rate computed alone gives the same row as in the list", () => {
    // The single model is reset between rates; state leaking from the previous rate would show here.
    const alone = cctDiagram(liSetup(crmo040, criticalCrMo), [30], { entry_C: ENTRY_C });
    expect(alone.rows[0]).toEqual(crmoTable.rows[5]);
  });

  it("the entry temperature does not matter once above Ae3, so the default may take the higher of initial and Ae3 + 50 K", () => {
    // Nothing forms above the highest critical temperature (austenite-decomposition.ts gates). The
    // grids from 850 and 1000 °C share their temperatures up to round-off of the step arithmetic,
    // hence 1e-6 K and 1e-9 in fraction.
    const higher = cctDiagram(liSetup(plain045, critical045), DEFAULT_CCT_RATES_K_s, { entry_C: 1000 });
    higher.rows.forEach((row, i) => {
      expect(Math.abs(row.start_C! - plainTable.rows[i].start_C!)).toBeLessThan(1e-6);
      expect(Math.abs(row.fractions.ferrite - plainTable.rows[i].fractions.ferrite)).toBeLessThan(1e-9);
    });
    // The stated choice: max(initial, max(Ae3, Ae1, Bs) + 50 K).
    expect(cctEntryTemperature_C(critical045, 880)).toBe(880);
    expect(cctEntryTemperature_C(critical045, 760)).toBe(835);
  });
});

const FILE = "demo-steel.json";
const CASE = {
  title: "demo steel for the CCT table",
  product: { thickness_mm: 10, initial_C: 880 },
  material: { composition_wt_pct: { C: 0.45, Mn: 0.75, Si: 0.25 }, austenite_grain_um: 25 },
  cooling: { stages: [{ duration_s: 10, top: { htc_W_m2K: 1000, medium_C: 30 }, bottom: { htc_W_m2K: 1000, medium_C: 30 } }] },
  numerics: { scheme: "crank-nicolson", cells: 20, time_step_s: 0.01 },
  output: { depths_mm: [5], interval_s: 1 },
};

/** The InputError f throws (the test fails if it throws nothing or something else). */
function refusal(f: () => unknown): InputError {
  let error: unknown = null;
  try {
    f();
  } catch (e) {
    error = e;
  }
  expect(error).toBeInstanceOf(InputError);
  return error as InputError;
}

describe("the CCT table in the steel report", () => {
  it("a rate list with a non-positive or non-numeric value is an InputError naming --cct and the unit", () => {
    for (const bad of ["1,0", "1,-3", "abc", "1,,3", "", "3e5", "1,Infinity", "1;3"]) {
      const e = refusal(() => cctRates(bad));
      expect(e.file, bad).toBe("option --cct");
      expect(e.expected).toContain("K/s");
      expect(e.message).not.toContain("\n");
    }
    expect(refusal(() => cctRates([2, Number.NaN])).file).toBe("option --cct");
    // And through the report, before anything is computed.
    expect(refusal(() => steelReport(FILE, validateCase(FILE, CASE), { cct: "10,-1" })).file).toBe("option --cct");
  });

  it("rates are read as K/s, printed slowest first, a repeated one once; no value means the default list", () => {
    expect(cctRates("3, 0.3,3,30")).toEqual([0.3, 3, 30]);
    expect(cctRates(true)).toEqual([...DEFAULT_CCT_RATES_K_s]);
  });

  it("prints the table under the isothermal one, before the caution, and writes a CSV matching the rows", () => {
    const r = steelReport(FILE, validateCase(FILE, CASE), { cct: "0.3,30" });
    expect(r.cct!.rows.map((row) => row.rate_K_s)).toEqual([0.3, 30]);
    // Entry: initial 880 °C is above Ae3 + 50 K = 835 °C here (Andrews, physics.md §4 table).
    expect(r.cct!.entry_C).toBe(880);
    const text = formatSteelReport(r);
    const iso = text.indexOf("isothermal transformation times");
    const cct = text.indexOf("continuous cooling (CCT)");
    expect(iso).toBeGreaterThan(0);
    expect(cct).toBeGreaterThan(iso);
    expect(text.indexOf(`caution: ${SAFETY_NOTICE}`)).toBeGreaterThan(cct);
    // The prescribed path is said in the report (no latent heat feedback).
    expect(text).toContain("latent heat does not feed back");

    const lines = cctCsv(r).trimEnd().split("\n");
    expect(lines[0]).toBe(
      "rate_K_s,start_C,start_product,ferrite_start_C,pearlite_start_C,bainite_start_C,martensite_start_C," +
        "ferrite_fraction,pearlite_fraction,bainite_fraction,martensite_fraction,austenite_fraction,hardness_HV",
    );
    expect(lines.length).toBe(3);
    r.cct!.rows.forEach((row, i) => {
      const cells = lines[i + 1].split(",");
      expect(cells.length).toBe(13);
      expect(Number(cells[0])).toBe(row.rate_K_s);
      // 3 decimals for temperatures (±5e-4 K), 6 for fractions (±5e-7), 1 for hardness (±0.05 HV).
      expect(Math.abs(Number(cells[1]) - row.start_C!)).toBeLessThanOrEqual(5e-4);
      expect(cells[2]).toBe(row.startProduct);
      (["ferrite", "pearlite", "bainite", "martensite"] as const).forEach((p, k) => {
        const T = row.productStart_C[p];
        if (T === null) expect(cells[3 + k]).toBe("");
        else expect(Math.abs(Number(cells[3 + k]) - T)).toBeLessThanOrEqual(5e-4);
        expect(Math.abs(Number(cells[7 + k]) - row.fractions[p])).toBeLessThanOrEqual(5e-7 + 1e-15);
      });
      expect(Math.abs(Number(cells[11]) - row.fractions.austenite)).toBeLessThanOrEqual(5e-7 + 1e-15);
      expect(Math.abs(Number(cells[12]) - row.hardness_HV!)).toBeLessThanOrEqual(0.05 + 1e-9);
    });
    // At 0.3 K/s this steel forms no martensite (ferrite + pearlite): an empty field.
    expect(lines[1].split(",")[6]).toBe("");
  });

  it("without --cct the report has no CCT table", () => {
    const r = steelReport(FILE, validateCase(FILE, CASE));
    expect(r.cct).toBeNull();
    expect(formatSteelReport(r)).not.toContain("continuous cooling");
    expect(cctCsv(r)).toBe("");
  });
});

describe("recalesce steel --cct / --cct-csv (compiled command line)", () => {
  const { cli, scratch } = cliForThisFile("cct-cli");

  it("writes the CSV atomically and prints the table; a bad rate exits 2 with one line and writes nothing", () => {
    const casePath = join(scratch(), "steel.json");
    writeFileSync(casePath, JSON.stringify(CASE));
    const csv = join(scratch(), "cct.csv");
    const ok = runCli(cli(), ["steel", casePath, "--cct", "1,10", "--cct-csv", csv]);
    expect(ok.stderr).toBe("");
    expect(ok.status).toBe(0);
    expect(ok.stdout).toContain("continuous cooling (CCT)");
    expect(ok.stdout).toContain(SAFETY_NOTICE);
    const written = readFileSync(csv, "utf8");
    const expected = cctCsv(steelReport(casePath, validateCase(casePath, CASE), { cct: "1,10" }));
    expect(written).toBe(expected);
    // --cct-csv alone implies the default list.
    const csvDefault = join(scratch(), "cct-default.csv");
    expect(runCli(cli(), ["steel", casePath, "--cct-csv", csvDefault]).status).toBe(0);
    expect(readFileSync(csvDefault, "utf8").trimEnd().split("\n").length).toBe(DEFAULT_CCT_RATES_K_s.length + 1);

    const bad = join(scratch(), "bad.csv");
    const refused = runCli(cli(), ["steel", casePath, "--cct", "1,0", "--cct-csv", bad]);
    expect(refused.status).toBe(2);
    expect(refused.stderr.trimEnd().split("\n")).toHaveLength(1);
    expect(refused.stderr).toContain("--cct");
    expect(refused.stderr).toContain("K/s");
    expect(existsSync(bad)).toBe(false);
  });
});
