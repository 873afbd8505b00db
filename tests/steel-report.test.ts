/**
 * The steel report behind `recalesce steel`: critical temperatures as used and the isothermal
 * diagram, checked against the published formulas written out here (not the project's modules).
 */
import { describe, expect, it } from "vitest";
import { validateCase } from "../src/io/load-case.js";
import { InputError } from "../src/io/errors.js";
import { formatSteelReport, steelReport, steelReportCsv, type DiagramRangeOptions, type SteelReport } from "../src/io/steel-report.js";

const FILE = "demo-steel.json";
/** 0.45C-0.75Mn-0.25Si [wt%], physics.md §4 check steel. */
const C = 0.45;
const MN = 0.75;
const SI = 0.25;
const GRAIN_um = 25;

function caseWith(material: Record<string, unknown>) {
  return validateCase(FILE, {
    title: "demo steel for the report",
    product: { thickness_mm: 10, initial_C: 880 },
    material,
    cooling: { stages: [{ duration_s: 10, top: { htc_W_m2K: 1000, medium_C: 30 }, bottom: { htc_W_m2K: 1000, medium_C: 30 } }] },
    numerics: { scheme: "crank-nicolson", cells: 20, time_step_s: 0.01 },
    output: { depths_mm: [5], interval_s: 1 },
  });
}

function report(material: Record<string, unknown> = {}, range: DiagramRangeOptions = {}): SteelReport {
  return steelReport(FILE, caseWith({ composition_wt_pct: { C, Mn: MN, Si: SI }, austenite_grain_um: GRAIN_um, ...material }), range);
}

// Andrews (1965) Ae3 (7-term) and Ae1, and the Bs used with Li et al. (1998) [°C] (physics.md §4).
const AE3 = 910 - 203 * Math.sqrt(C) + 44.7 * SI;
const AE1 = 723 - 10.7 * MN + 29.1 * SI;
const BS = 637 - 58 * C - 35 * MN;
// ASTM E112 intercept relation G = −6.643856 log10(ℓ/mm) − 3.288 (from memory, as astm-grain.ts).
const G = -6.643856 * Math.log10(GRAIN_um / 1000) - 3.288;
// Li et al. (1998) composition factors and constants (physics.md §5.1).
const FC = Math.exp(1.0 + 6.31 * C + 1.78 * MN + 0.31 * SI);
const PC = Math.exp(-4.25 + 4.12 * C + 4.36 * MN + 0.44 * SI);
const BC = Math.exp(-10.23 + 10.18 * C + 0.85 * MN);
const Q_OVER_R = 27500 / 1.987;
// S(0.01) and S(0.99) [calc, physics.md §5.1], six significant digits.
const S01 = 0.10434;
const S99 = 1.947424;

/** τ(X) = factor·S(X) / [2^(aG) ΔT^m exp(−Q/RT)] of Li et al. (1998) [s]. */
function liTime(S: number, factor: number, a: number, undercooling: number, m: number, T_C: number): number {
  return (factor * S) / (2 ** (a * G) * undercooling ** m * Math.exp(-Q_OVER_R / (T_C + 273.15)));
}

describe("isothermal times under Li et al. (1998) kinetics", () => {
  const r = report({}, { fromC: 775, toC: 350, stepK: 25 });

  it("the 1 % and 99 % times of every product equal Li's τ(0.01) and τ(0.99), 18.664 apart", () => {
    let checked = 0;
    for (const row of r.rows) {
      const T = row.T_C;
      const expected = {
        ferrite: T < AE3 && T > BS ? [FC, 0.41, AE3 - T, 3] : null,
        pearlite: T < AE1 && T > BS ? [PC, 0.32, AE1 - T, 3] : null,
        bainite: T < BS ? [BC, 0.29, BS - T, 2] : null,
      } as const;
      for (const p of ["ferrite", "pearlite", "bainite"] as const) {
        const e = expected[p];
        const got = row.times[p];
        if (e === null) {
          expect(got, `${p} at ${T} °C`).toBeNull();
          continue;
        }
        // Relative 1e-5: S(0.01) and S(0.99) are quoted to six significant digits (±5e-6).
        expect(Math.abs(got!.start_s / liTime(S01, e[0], e[1], e[2], e[3], T) - 1)).toBeLessThan(1e-5);
        expect(Math.abs(got!.finish_s / liTime(S99, e[0], e[1], e[2], e[3], T) - 1)).toBeLessThan(1e-5);
        // physics.md §5.1: τ(99 %)/τ(1 %) = 18.664 at every T, quoted to five digits (±2.7e-5).
        expect(Math.abs(got!.finish_s / got!.start_s - 18.664)).toBeLessThan(5e-4);
        checked++;
      }
    }
    // 775 → 600 °C ferrite (8 rows), 700 → 600 °C pearlite (5), 575 → 350 °C bainite (10).
    expect(checked).toBe(23);
  });

  it("the case's time scales multiply each product's times", () => {
    const scaled = report({ kinetics: { model: "li1998", time_scale: { ferrite: 2, pearlite: 3, bainite: 0.5 } } }, { fromC: 775, toC: 350, stepK: 25 });
    const factor = { ferrite: 2, pearlite: 3, bainite: 0.5 } as const;
    r.rows.forEach((row, i) => {
      for (const p of ["ferrite", "pearlite", "bainite"] as const) {
        const a = row.times[p];
        const b = scaled.rows[i].times[p];
        if (a === null) expect(b).toBeNull();
        // A time scale multiplies the time (physics.md §5.1 calibration factor); round-off only.
        else expect(b!.start_s / (factor[p] * a.start_s) - 1).toBeCloseTo(0, 12);
      }
    });
  });

  it("a eutectoid steel forms no ferrite at any temperature", () => {
    // physics.md §5.5: no proeutectoid ferrite at C ≥ 0.77 wt% (lever rule on the Fe–C diagram).
    const eutectoid = steelReport(FILE, caseWith({ composition_wt_pct: { C: 0.8, Mn: MN, Si: SI } }));
    expect(eutectoid.rows.length).toBeGreaterThan(5);
    for (const row of eutectoid.rows) expect(row.times.ferrite).toBeNull();
    expect(eutectoid.rows.some((row) => row.times.pearlite !== null)).toBe(true);
  });

  it("the default range runs from the first step below Ae3 down to the first step at or above Ms", () => {
    const d = report();
    // Ae3 = 785.0 °C and Ms = 325.8 °C (physics.md §4 table) with the default 25 K step.
    expect(d.rows[0].T_C).toBe(775);
    expect(d.rows[d.rows.length - 1].T_C).toBe(350);
    expect(d.step_K).toBe(25);
  });
});

describe("isothermal times under table kinetics", () => {
  it("at a table row the 1 %/99 % times are that row's start and finish times (times the time scale)", () => {
    // Invented TTT rows. A JMAK curve through a row's two points (physics.md §5.3) returns them.
    const t = report(
      {
        kinetics: {
          model: "table",
          time_scale: { bainite: 2 },
          bainite: { points: [{ T_C: 400, start_s: 8, finish_s: 300 }, { T_C: 500, start_s: 3, finish_s: 120 }] },
        },
      },
      { fromC: 500, toC: 400, stepK: 50 },
    );
    const byT = new Map(t.rows.map((row) => [row.T_C, row.times]));
    // Relative 1e-12: n and ln k are fitted and inverted in closed form; round-off only.
    expect(byT.get(500)!.bainite!.start_s / 6 - 1).toBeCloseTo(0, 12);
    expect(byT.get(500)!.bainite!.finish_s / 240 - 1).toBeCloseTo(0, 12);
    expect(byT.get(400)!.bainite!.start_s / 16 - 1).toBeCloseTo(0, 12);
    expect(byT.get(400)!.bainite!.finish_s / 600 - 1).toBeCloseTo(0, 12);
    // Between rows: log-interpolated JMAK, so the times lie between the rows' times.
    const mid = byT.get(450)!.bainite!;
    expect(mid.start_s).toBeGreaterThan(6);
    expect(mid.start_s).toBeLessThan(16);
    // A product without a table never forms (austenite-decomposition.ts rule).
    for (const times of byT.values()) {
      expect(times.ferrite).toBeNull();
      expect(times.pearlite).toBeNull();
    }
  });
});

describe("critical temperatures in the report", () => {
  it("name the formula used, or say the value was given and what the formula gives", () => {
    const r = report({ critical_C: { Ms: 300 } });
    const line = new Map(r.critical.map((c) => [c.name, c]));
    // Andrews (1965) Ae3 and Ae1, Bs of Li's model (physics.md §4 table: 785.0, 722.2, 584.6,
    // printed to 0.1 °C: half a unit plus 1 %). First the formulas written out in this file against
    // the table, then the report against those formulas (same arithmetic: 9 decimals, round-off).
    for (const [formula, table] of [[AE3, 785.0], [AE1, 722.2], [BS, 584.6]]) expect(Math.abs(formula - table)).toBeLessThanOrEqual(0.05 * 1.01);
    expect(line.get("Ae3")!.T_C).toBeCloseTo(AE3, 9);
    expect(line.get("Ae3")!.source).toContain("Andrews");
    expect(line.get("Ae1")!.T_C).toBeCloseTo(AE1, 9);
    expect(line.get("Bs")!.T_C).toBeCloseTo(BS, 9);
    expect(line.get("Ms")!.T_C).toBe(300);
    // Andrews' Ms = 539 − 423C − 30.4Mn = 325.8 °C (physics.md §4 table).
    expect(line.get("Ms")!.source).toContain("given in the case");
    expect(line.get("Ms")!.source).toContain("325.8");
    const text = formatSteelReport(r);
    for (const name of ["Ae3", "Ae1", "Bs", "Ms"]) expect(text).toContain(name);
    expect(text).toContain("—");
  });
});

describe("the CSV", () => {
  it("has one row per temperature, empty fields where the product cannot form, six significant digits", () => {
    const r = report({}, { fromC: 775, toC: 350, stepK: 25 });
    const lines = steelReportCsv(r).trimEnd().split("\n");
    expect(lines[0]).toBe("T_C,ferrite_start_s,ferrite_finish_s,pearlite_start_s,pearlite_finish_s,bainite_start_s,bainite_finish_s");
    expect(lines.length).toBe(r.rows.length + 1);
    r.rows.forEach((row, i) => {
      const cells = lines[i + 1].split(",");
      expect(Number(cells[0])).toBe(row.T_C);
      (["ferrite", "pearlite", "bainite"] as const).forEach((p, k) => {
        const t = row.times[p];
        if (t === null) expect(cells[1 + 2 * k]).toBe("");
        // Six significant digits: relative rounding ≤ 5e-6.
        else expect(Math.abs(Number(cells[1 + 2 * k]) / t.start_s - 1)).toBeLessThanOrEqual(5e-6);
      });
    });
  });
});

describe("bad input is refused with an InputError naming the field", () => {
  const refusal = (f: () => unknown): InputError => {
    try {
      f();
    } catch (e) {
      if (e instanceof InputError) return e;
      throw e;
    }
    throw new Error("expected an InputError");
  };

  it("a case without a steel composition", () => {
    const c = caseWith({ conductivity_W_mK: 30, specific_heat_J_kgK: 600, density_kg_m3: 7800 });
    const e = refusal(() => steelReport(FILE, c));
    expect(e.file).toBe(FILE);
    expect(e.field).toBe("material.composition_wt_pct");
    expect(e.expected).toContain("wt%");
  });

  it("a composition without carbon", () => {
    const e = refusal(() => steelReport(FILE, caseWith({ composition_wt_pct: { Mn: 0.75, Si: 0.25 } })));
    expect(e.field).toBe("material.composition_wt_pct.C");
    expect(e.expected).toContain("wt%");
  });

  it("range options that are not numbers, not positive, inverted or too fine", () => {
    expect(refusal(() => report({}, { stepK: "abc" })).file).toBe("option --step-K");
    expect(refusal(() => report({}, { stepK: "0" })).expected).toContain("K");
    expect(refusal(() => report({}, { fromC: 500, toC: 600 })).file).toBe("option --from-C");
    expect(refusal(() => report({}, { fromC: "" })).expected).toContain("°C");
    expect(refusal(() => report({}, { stepK: 0.01 })).expected).toContain("at most 1000");
  });
});
