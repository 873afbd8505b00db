/**
 * `recalesce steel`: what the simulator will use for a case's steel — the critical temperatures
 * (with the formula behind each, or the user's override), the prior-austenite grain, the kinetics
 * and their time scales — and the isothermal transformation diagram those kinetics give
 * (model/isothermal-diagram.ts), as a readable report and as CSV.
 *
 * CSV layout (one header line, then one row per temperature, highest first):
 *   T_C               hold temperature [°C]
 *   ferrite_start_s   isothermal time to 1 % of the product's normalised fraction [s]
 *   ferrite_finish_s  isothermal time to 99 % [s]
 *   pearlite_start_s, pearlite_finish_s, bainite_start_s, bainite_finish_s   likewise
 * An empty field means the product cannot form at that temperature in the model (or, for a hold
 * near absolute zero, that its time overflows a double). Times carry six significant digits. The time scales of the case are already applied.
 *
 * With --cct the report also holds the continuous-cooling table (model/cct-diagram.ts): one point
 * cooled at each constant rate from the entry temperature to 20 °C along a prescribed path (no
 * latent heat feedback). Rates are given as comma-separated K/s (each > 0 and ≤ 100000, at most
 * 100 of them), printed in ascending order, a repeated rate once. Its CSV (--cct-csv), one header
 * line, then one row per rate, slowest first:
 *   rate_K_s            constant cooling rate [K/s], six significant digits
 *   start_C             temperature at which 1 % of the volume has transformed [°C], 3 decimals
 *   start_product       the product forming there (ferrite, pearlite, bainite or martensite)
 *   ferrite_start_C, pearlite_start_C, bainite_start_C, martensite_start_C
 *                       temperature at which that product reached 1 % of the volume [°C]
 *   ferrite_fraction, pearlite_fraction, bainite_fraction, martensite_fraction,
 *   austenite_fraction  fractions at 20 °C [−], 6 decimals; austenite is the retained austenite
 *   hardness_HV         Maynier et al. (1978) hardness of the transformed products, with the rate as
 *                       the cooling rate at 700 °C [HV], 1 decimal
 * An empty field means: no start (below 1 % of the volume down to 20 °C), or no hardness (nothing
 * transformed).
 *
 * Input problems (a case without a steel composition, no carbon, a bad range option) are
 * InputErrors naming the file or option, the field and the expected unit or range.
 */
import type { Case } from "./case-schema.js";
import { InputError } from "./errors.js";
import { DECIMALS, fixed, significant } from "./format.js";
import { SAFETY_NOTICE } from "./safety.js";
import { resolveSteel, type CriticalUsed } from "../model/steel.js";
import { DIAGRAM_PRODUCTS, isothermalDiagram, type DiagramRow } from "../model/isothermal-diagram.js";
import { CCT_PRODUCTS, DEFAULT_CCT_RATES_K_s, cctDiagram, cctEntryTemperature_C, type CctDiagram, type CctRow } from "../model/cct-diagram.js";
import { criticalTemperatures } from "../physics/critical-temperatures.js";
import { describeWarning } from "../physics/composition.js";

/** Default temperature step of the diagram [K]. */
export const DEFAULT_STEP_K = 25;
/** Most rows a diagram may have (a guard against a step typed in the wrong unit). */
export const MAX_DIAGRAM_ROWS = 1000;

/** Range options as typed on the command line (strings) or given by a caller (numbers). */
export interface DiagramRangeOptions {
  readonly fromC?: string | number;
  readonly toC?: string | number;
  readonly stepK?: string | number;
}

/** Fastest cooling rate --cct accepts [K/s] (a guard against a rate typed in the wrong unit). */
export const MAX_CCT_RATE_K_s = 1e5;
/** Most rates --cct accepts. */
export const MAX_CCT_RATES = 100;

export interface SteelReportOptions extends DiagramRangeOptions {
  /**
   * The CCT table's rates: comma-separated K/s as typed after --cct, true for the default list
   * (--cct without a value), or numbers from a caller; absent: no CCT table.
   */
  readonly cct?: string | true | readonly number[];
}

export interface CriticalLine {
  readonly name: "Ae3" | "Ae1" | "Bs" | "Ms";
  readonly T_C: number;
  /** Formula name, or "given in the case" with the formula's value. */
  readonly source: string;
}

export interface SteelReport {
  readonly title: string;
  readonly composition_wt_pct: Readonly<Record<string, number>>;
  readonly austeniteGrain_um: number;
  readonly astmGrainNumber: number;
  readonly critical: readonly CriticalLine[];
  readonly kinetics: "li1998" | "table";
  readonly timeScale: { readonly ferrite: number; readonly pearlite: number; readonly bainite: number };
  readonly transformation: boolean;
  readonly latentHeat: boolean;
  readonly step_K: number;
  readonly rows: readonly DiagramRow[];
  /** The continuous-cooling table, when asked for. */
  readonly cct: CctDiagram | null;
  readonly warnings: readonly string[];
}

/** A number option: finite, in [min, max]; otherwise an InputError naming the option. */
export function numberOption(option: string, raw: string | number, unit: string, min: number, max: number): number {
  const value = typeof raw === "number" ? raw : raw.trim() === "" ? NaN : Number(raw);
  if (!(Number.isFinite(value) && value >= min && value <= max)) {
    throw new InputError(`option ${option}`, "", `expected a number of ${unit} between ${min} and ${max}, got "${raw}"`);
  }
  return value;
}

/**
 * The cooling rates of --cct [K/s], ascending, each once: the default list for true, else every
 * comma-separated value (or given number) must be a number above 0 and at most MAX_CCT_RATE_K_s;
 * otherwise an InputError naming --cct.
 */
export function cctRates(raw: string | true | readonly number[]): number[] {
  if (raw === true) return [...DEFAULT_CCT_RATES_K_s];
  const items: (string | number)[] = typeof raw === "string" ? raw.split(",") : [...raw];
  const expected = `expected comma-separated cooling rates in K/s, each above 0 and at most ${MAX_CCT_RATE_K_s}, at most ${MAX_CCT_RATES} of them (e.g. 0.3,3,30)`;
  if (items.length > MAX_CCT_RATES) throw new InputError("option --cct", "", `${expected}; got ${items.length} rates`);
  const rates: number[] = [];
  for (const item of items) {
    const value = typeof item === "number" ? item : item.trim() === "" ? NaN : Number(item);
    if (!(Number.isFinite(value) && value > 0 && value <= MAX_CCT_RATE_K_s)) throw new InputError("option --cct", "", `${expected}; got "${String(item).trim()}"`);
    if (!rates.includes(value)) rates.push(value);
  }
  return rates.sort((a, b) => a - b);
}

/** The case's steel report over the requested (or default) temperature range. */
export function steelReport(file: string, c: Case, options: SteelReportOptions = {}): SteelReport {
  const m = c.material;
  if (!m.composition_wt_pct) {
    throw new InputError(file, "material.composition_wt_pct", 'missing; the steel command needs the steel\'s composition in wt%, e.g. { "C": 0.45, "Mn": 0.75 }');
  }
  if (m.composition_wt_pct.C === undefined) {
    throw new InputError(file, "material.composition_wt_pct.C", "missing; the carbon content (wt%, 0–2) sets Ae3, Bs, Ms, the lever rule and the kinetics");
  }
  const steel = resolveSteel(m, c.product.initial_C);
  const choice = { ae3: m.formulas?.Ae3 ?? "andrews", bs: m.formulas?.Bs ?? "li" } as const;
  const formula = criticalTemperatures(steel.composition, choice);
  const used = steel.critical;
  const names: Record<CriticalLine["name"], string> = {
    Ae3: choice.ae3 === "andrews" ? "Andrews (1965), 7-term" : "Andrews (1965) with extension terms",
    Ae1: "Andrews (1965)",
    Bs: choice.bs === "li" ? "form used with Li et al. (1998)" : "Steven & Haynes (1956)",
    Ms: "Andrews (1965), linear",
  };
  const critical: CriticalLine[] = (["Ae3", "Ae1", "Bs", "Ms"] as const).map((name) => {
    const T_C = used[`${name}_C`];
    const given = used.overridden.includes(name);
    return { name, T_C, source: given ? `given in the case (${names[name]} gives ${fixed(formula[`${name}_C`], 1)} °C)` : names[name] };
  });

  const step_K = options.stepK === undefined ? DEFAULT_STEP_K : numberOption("--step-K", options.stepK, "K", 1e-3, 1000);
  const temperatures = diagramTemperatures(used, steel.composition.C, options, step_K);
  const diagram = isothermalDiagram(steel.decomposition, temperatures);
  const rates = options.cct === undefined ? null : cctRates(options.cct);
  const cct = rates === null ? null : cctDiagram(steel.decomposition, rates, { entry_C: cctEntryTemperature_C(used, c.product.initial_C) });

  const composition: Record<string, number> = {};
  for (const [e, v] of Object.entries(steel.composition)) if (v !== 0) composition[e] = v;
  const warnings = [...steel.warnings];
  for (const w of [...diagram.warnings, ...(cct?.warnings ?? [])]) {
    const text = describeWarning(w);
    if (!warnings.includes(text)) warnings.push(text);
  }
  if (!steel.transformation) warnings.push('material.transformation is "off": the solver will not use these kinetics for this case');
  return {
    title: c.title,
    composition_wt_pct: composition,
    austeniteGrain_um: steel.austeniteGrain_um,
    astmGrainNumber: steel.astmGrainNumber,
    critical,
    kinetics: steel.decomposition.kinetics.kind,
    timeScale: steel.decomposition.timeScale,
    transformation: steel.transformation,
    latentHeat: steel.latentHeat,
    step_K,
    rows: diagram.rows,
    cct,
    warnings,
  };
}

/**
 * Hold temperatures [°C], from the top down in steps of step_K. Defaults: the top is the first
 * multiple of the step below the highest temperature at which anything forms (Ae3 for a
 * hypo-eutectoid steel, else the higher of Ae1 and Bs); the bottom is the first multiple at or
 * above Ms (below it martensite forms athermally).
 */
function diagramTemperatures(critical: CriticalUsed, carbon_wt: number, options: DiagramRangeOptions, step_K: number): number[] {
  const ferriteForms = critical.Ae3_C > critical.Ae1_C && carbon_wt < 0.77;
  const highest = Math.max(ferriteForms ? critical.Ae3_C : -Infinity, critical.Ae1_C, critical.Bs_C);
  const defaultFrom = (Math.ceil(highest / step_K) - 1) * step_K;
  const from = options.fromC === undefined ? defaultFrom : numberOption("--from-C", options.fromC, "°C", -273, 2000);
  let to: number;
  if (options.toC !== undefined) to = numberOption("--to-C", options.toC, "°C", -273, 2000);
  else {
    to = Math.ceil(critical.Ms_C / step_K) * step_K;
    if (to >= from) to = from - step_K;
  }
  if (!(from > to)) {
    const option = options.fromC !== undefined ? "--from-C" : "--to-C";
    throw new InputError(`option ${option}`, "", `expected --from-C above --to-C (°C); the range is ${fixed(from, 1)} → ${fixed(to, 1)} °C`);
  }
  const count = Math.floor((from - to) / step_K + 1e-9) + 1;
  if (count > MAX_DIAGRAM_ROWS) {
    throw new InputError("option --step-K", "", `gives ${count} rows from ${fixed(from, 1)} to ${fixed(to, 1)} °C; expected at most ${MAX_DIAGRAM_ROWS} (a larger step in K or a narrower range)`);
  }
  return Array.from({ length: count }, (_, k) => from - k * step_K);
}

const DASH = "—";

/** A time for the table: three significant digits, plain notation between 0.01 s and 1e6 s. */
function formatTime_s(t: number): string {
  if (!Number.isFinite(t)) return DASH;
  if (t < 0.01 || t >= 1e6) return t.toExponential(2);
  return String(Number(t.toPrecision(3)));
}

/** A formatted temperature: integers as they are, otherwise one decimal. */
function formatTemperature_C(T: number): string {
  return Number.isInteger(T) ? String(T) : fixed(T, 1);
}

/** text centred in a field of the given width (extra space to the right). */
function centred(text: string, width: number): string {
  const left = Math.max(0, Math.floor((width - text.length) / 2));
  return (" ".repeat(left) + text).padEnd(width);
}

/** The report as text for a terminal. */
export function formatSteelReport(r: SteelReport): string {
  const lines: string[] = [];
  lines.push(r.title);
  lines.push(`  composition [wt%]: ${Object.entries(r.composition_wt_pct).map(([e, v]) => `${e} ${v}`).join(", ")}`);
  lines.push(`  prior austenite: mean intercept ${r.austeniteGrain_um} µm, ASTM E112 grain-size number ${fixed(r.astmGrainNumber, 2)}`);
  lines.push("  critical temperatures used:");
  for (const c of r.critical) lines.push(`    ${c.name.padEnd(4)}${fixed(c.T_C, 1).padStart(8)} °C   ${c.source}`);
  const scale = `time scales ferrite ${r.timeScale.ferrite}, pearlite ${r.timeScale.pearlite}, bainite ${r.timeScale.bainite}`;
  lines.push(`  kinetics: ${r.kinetics === "li1998" ? "Li et al. (1998) with additivity" : "user TTT tables (JMAK fit, Scheil incubation)"}; ${scale}`);
  lines.push(`  transformation ${r.transformation ? "on" : "off"}, latent heat ${r.latentHeat ? "on" : "off"}`);
  lines.push("");
  lines.push("  isothermal transformation times [s]: start = 1 %, finish = 99 % of each product's own amount");
  const width = 10;
  const head1 = "    T [°C]" + DIAGRAM_PRODUCTS.map((p) => centred(p, 2 * width)).join("");
  const head2 = "          " + DIAGRAM_PRODUCTS.map(() => "start".padStart(width) + "finish".padStart(width)).join("");
  lines.push(head1, head2);
  for (const row of r.rows) {
    let line = formatTemperature_C(row.T_C).padStart(10);
    for (const p of DIAGRAM_PRODUCTS) {
      const t = row.times[p];
      line += (t ? formatTime_s(t.start_s) : DASH).padStart(width) + (t ? formatTime_s(t.finish_s) : DASH).padStart(width);
    }
    lines.push(line);
  }
  lines.push(`  ${DASH} the product does not form at that temperature in this model.`);
  lines.push("  Ferrite times are those of its normalised fraction (its amount follows the lever rule). In the");
  lines.push("  solver pearlite also waits until ferrite has enriched the austenite in carbon (Hultgren), so in");
  lines.push("  a hypo-eutectoid steel it starts later than its own clock shown here. Below Ms martensite forms");
  lines.push("  on cooling (Koistinen–Marburger), not with time.");
  if (r.cct) lines.push("", ...formatCct(r.cct));
  if (r.warnings.length > 0) {
    lines.push("  warnings:");
    for (const w of r.warnings) lines.push(`    ${w}`);
  }
  lines.push(`  caution: ${SAFETY_NOTICE}`);
  return lines.join("\n") + "\n";
}

/** A time for the CSV: six significant digits; empty when it overflows (a hold near 0 K). */
function csvTime(t_s: number): string {
  return Number.isFinite(t_s) ? String(significant(t_s)) : "";
}

/** The diagram as CSV (layout in the file comment). */
export function steelReportCsv(r: SteelReport): string {
  const header = ["T_C", ...DIAGRAM_PRODUCTS.flatMap((p) => [`${p}_start_s`, `${p}_finish_s`])];
  let out = header.join(",") + "\n";
  for (const row of r.rows) {
    const cells = [String(significant(row.T_C, 10))];
    for (const p of DIAGRAM_PRODUCTS) {
      const t = row.times[p];
      cells.push(t ? csvTime(t.start_s) : "", t ? csvTime(t.finish_s) : "");
    }
    out += cells.join(",") + "\n";
  }
  return out;
}

/** A fraction for the text table: three decimals. */
function formatFraction(x: number): string {
  return fixed(x, 3);
}

/** A start temperature for the text table: one decimal, or a dash. */
function formatStart(T_C: number | null): string {
  return T_C === null ? DASH : fixed(T_C, 1);
}

/** Column labels of the CCT products (eight characters at most). */
const CCT_LABELS: Readonly<Record<(typeof CCT_PRODUCTS)[number], string>> = { ferrite: "ferrite", pearlite: "pearlite", bainite: "bainite", martensite: "martens." };

/** The CCT table as text lines (under the isothermal one). */
function formatCct(d: CctDiagram): string[] {
  const lines: string[] = [];
  lines.push(`  continuous cooling (CCT) at constant rates from ${formatTemperature_C(d.entry_C)} °C to ${formatTemperature_C(d.end_C)} °C, along a prescribed path as a`);
  lines.push("  dilatometer imposes it (the products' latent heat does not feed back into the temperature):");
  const w = 9;
  const labels = CCT_PRODUCTS.map((p) => CCT_LABELS[p].padStart(w)).join("");
  lines.push("      rate     start" + "".padEnd(12) + centred("each product's start [°C]", 4 * w) + centred(`fractions at ${formatTemperature_C(d.end_C)} °C`, 5 * w) + "hardness");
  lines.push("     [K/s]      [°C]  as        " + labels + labels + "austen.".padStart(w) + "    [HV]");
  for (const row of d.rows) lines.push(formatCctRow(row, w));
  lines.push(`  start = 1 % of the volume transformed; "as" = the product forming at that moment (it may itself`);
  lines.push(`  stay below 1 %); a product's start = 1 % of the volume of it; ${DASH} not reached down to ${formatTemperature_C(d.end_C)} °C.`);
  lines.push("  Hardness: Maynier et al. (1978) of the transformed products (it has no term for retained");
  lines.push("  austenite), with the constant rate as the cooling rate at 700 °C. Entry temperature: the");
  lines.push("  higher of the case's initial temperature and 50 K above the highest of Ae3, Ae1 and Bs.");
  return lines;
}

function formatCctRow(row: CctRow, w: number): string {
  let line = String(significant(row.rate_K_s, 6)).padStart(10) + formatStart(row.start_C).padStart(10) + "  " + (row.startProduct ?? DASH).padEnd(10);
  for (const p of CCT_PRODUCTS) line += formatStart(row.productStart_C[p]).padStart(w);
  const f = row.fractions;
  for (const x of [f.ferrite, f.pearlite, f.bainite, f.martensite, f.austenite]) line += formatFraction(x).padStart(w);
  line += (row.hardness_HV === null ? DASH : fixed(row.hardness_HV, 0)).padStart(8);
  return line;
}

/** The CCT table as CSV (layout in the file comment); an empty string when it was not asked for. */
export function cctCsv(r: SteelReport): string {
  if (r.cct === null) return "";
  const header = ["rate_K_s", "start_C", "start_product", ...CCT_PRODUCTS.map((p) => `${p}_start_C`), ...[...CCT_PRODUCTS, "austenite"].map((p) => `${p}_fraction`), "hardness_HV"];
  const temperature = (T_C: number | null): string => (T_C === null ? "" : fixed(T_C, DECIMALS.T_C));
  let out = header.join(",") + "\n";
  for (const row of r.cct.rows) {
    const f = row.fractions;
    const cells = [
      String(significant(row.rate_K_s)),
      temperature(row.start_C),
      row.startProduct ?? "",
      ...CCT_PRODUCTS.map((p) => temperature(row.productStart_C[p])),
      ...[f.ferrite, f.pearlite, f.bainite, f.martensite, f.austenite].map((x) => fixed(x, DECIMALS.fraction)),
      row.hardness_HV === null ? "" : fixed(row.hardness_HV, DECIMALS.strength),
    ];
    out += cells.join(",") + "\n";
  }
  return out;
}
