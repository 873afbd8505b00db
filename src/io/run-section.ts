/**
 * `recalesce run` for a cross-section case (product.section "cross-section"): resolves the case to
 * a SectionScenario, simulates it with the 2-D solver and writes summary.json, history.csv and
 * profile.csv (the whole final field) atomically.
 */
import type { Case } from "./case-schema.js";
import { faceLaw, resolveMaterial } from "./resolve-case.js";
import { KELVIN } from "../model/scenario.js";
import { simulateSection, domainX, type SectionScenario, type SectionResult } from "../model/section.js";
import { ProductTracker, type NodeProduct } from "../model/product.js";
import { ResultFolder } from "./result-folder.js";
import { readFileSync } from "node:fs";
import { writeChartIfAsked } from "./cooling-chart.js";
import { DECIMALS, decimalsForColumn, fixed, round, significant } from "./format.js";
import { SAFETY_NOTICE } from "./safety.js";
import { PHASES } from "../physics/phases.js";
import ops from "ndarray-ops";
import { describeWarning } from "../physics/composition.js";
import type { SteelSetup } from "../model/steel.js";

const ORDER = ["ferrite", "pearlite", "bainite", "martensite", "austenite"] as const;

export interface ResolvedSection {
  readonly scenario: SectionScenario;
  readonly steel?: SteelSetup;
}

export function resolveSection(c: Case): ResolvedSection {
  if (!("stages" in c.cooling)) throw new Error("cross-sections run with cooling.stages");
  const { material, steel } = resolveMaterial(c);
  const points = [
    ...c.output.depths_mm.map((d) => ({ x_m: 0, y_m: d / 1000, label: `T_${d}mm_C` })),
    ...(c.output.points_mm ?? []).map((p) => ({ x_m: p.x_mm / 1000, y_m: p.y_mm / 1000, label: `T_x${p.x_mm}_y${p.y_mm}mm_C` })),
  ];
  return {
    steel,
    scenario: {
      title: c.title,
      thickness_m: c.product.thickness_mm / 1000,
      width_m: c.product.width_mm! / 1000,
      symmetric: c.numerics.symmetric ?? true,
      initial_K: c.product.initial_C + KELVIN,
      material,
      stages: c.cooling.stages.map((s, i) => ({ duration_s: s.duration_s, top: faceLaw(s.top), bottom: faceLaw(s.bottom), edge: faceLaw(s.edge!), label: s.label ?? `stage ${i + 1}` })),
      numerics: {
        scheme: c.numerics.scheme === "explicit" ? "explicit" : "adi",
        splitting: c.numerics.scheme === "adi-douglas" ? "douglas-rachford" : "peaceman-rachford",
        thicknessCells: c.numerics.cells,
        widthCells: c.numerics.width_cells!,
        dt_s: c.numerics.time_step_s,
        tolerance_K: c.numerics.picard_tolerance_K ?? 1e-3,
        maxIterations: c.numerics.max_iterations ?? 60,
      },
      points,
      interval_s: c.output.interval_s,
    },
  };
}

/** Work estimate of a cross-section run (cells × steps), for the resource guard. */
export function sectionCellSteps(s: SectionScenario): number {
  const total = s.stages.reduce((a, st) => a + st.duration_s, 0);
  return s.numerics.thicknessCells * s.numerics.widthCells * Math.ceil(total / s.numerics.dt_s);
}

/** Node of the field nearest to (x from mid-width, y) [m]. */
function nodeNear(r: SectionResult, s: SectionScenario, x_m: number, y_m: number): number {
  const solver = r.solver;
  const i = solver.columnAt(domainX(s, x_m));
  const j = Math.min(solver.thicknessCells, Math.max(0, Math.round(y_m / solver.dy_m)));
  return solver.index(i, j);
}

/** The five places a mill engineer looks at in a cross-section, as (x from mid-width, y) [m]. */
function places(s: SectionScenario): Record<string, [number, number]> {
  return { top: [0, 0], centre: [0, s.thickness_m / 2], bottom: [0, s.thickness_m], edge: [s.width_m / 2, s.thickness_m / 2], corner: [s.width_m / 2, 0] };
}

export function runSectionCase(file: string, c: Case, outDir: string, chart = false): { summary: Record<string, unknown>; warnings: string[] } {
  const resolved = resolveSection(c);
  const s = resolved.scenario;
  const steel = resolved.steel;
  const transforming = steel?.transformation ?? false;
  const tracker = transforming
    ? new ProductTracker((s.numerics.widthCells + 1) * (s.numerics.thicknessCells + 1), {
        composition: steel!.composition,
        austeniteGrain_um: steel!.austeniteGrain_um,
        retainedStrain: steel!.retainedStrain,
        ae3_K: steel!.critical.Ae3_C + KELVIN,
        grainModel: steel!.grainModel,
        interfaceEnergy_J_m2: steel!.interfaceEnergy_J_m2,
      })
    : null;
  const folder = new ResultFolder(outDir);
  try {
    const history = folder.stream("history.csv");
    const cols = [...s.points.map((p) => p.label), "T_mean_C"];
    const decimals = cols.map(decimalsForColumn);
    history.write(["time_s", ...cols].join(",") + "\n");
    const sink = {
      row(time_s: number, values: Float64Array) {
        let line = fixed(time_s, DECIMALS.time_s);
        for (let q = 0; q < values.length; q++) line += "," + fixed(values[q], decimals[q]);
        history.write(line + "\n");
      },
    };
    const result = simulateSection(s, sink, tracker ? { onStart: tracker.start.bind(tracker), onStep: tracker.step.bind(tracker) } : {});
    history.close();
    const products = tracker ? tracker.finish(result.solver as never) : null;
    const warnings = steel ? steel.warnings.slice() : [];
    if (tracker) for (const w of tracker.warnings) warnings.push(describeWarning(w));
    const summary = sectionSummary(c, s, result, products, warnings);
    if (steel) steel.extendSummary(summary, result as never);
    folder.writeFile("summary.json", JSON.stringify(summary, null, 2) + "\n");
    folder.writeFile("profile.csv", sectionProfile(s, result, products));
    writeChartIfAsked(chart, (n, t) => folder.writeFile(n, t), () => readFileSync(folder.path("history.csv"), "utf8"), summary);
    folder.commit();
    void file;
    return { summary, warnings };
  } catch (e) {
    folder.abort();
    throw e;
  }
}

function sectionSummary(c: Case, s: SectionScenario, r: SectionResult, products: NodeProduct[] | null, warnings: string[]): Record<string, unknown> {
  const solver = r.solver;
  const where = places(s);
  const T: Record<string, number> = {};
  for (const [name, [x, y]] of Object.entries(where)) T[name] = round(solver.temperatureAt_K(domainX(s, x), y) - KELVIN, DECIMALS.T_C);
  T.mean = round(solver.meanTemperature_K() - KELVIN, DECIMALS.T_C);
  // Hottest and coldest node of the section (ndarray-ops over the field view; not a hot loop).
  T.max = round(ops.sup(solver.field) - KELVIN, DECIMALS.T_C);
  T.min = round(ops.inf(solver.field) - KELVIN, DECIMALS.T_C);
  const final: Record<string, unknown> = { T_C: T };
  if (solver.fractions.length > 1) {
    const phases: Record<string, number> = {};
    let v = 0;
    for (let p = 0; p < solver.nodes; p++) v += solver.volume[p];
    for (const name of ORDER) {
      const X = solver.fractions[PHASES.indexOf(name)];
      let sum = 0;
      for (let p = 0; p < solver.nodes; p++) sum += solver.volume[p] * X[p];
      phases[name] = round(sum / v, DECIMALS.fraction);
    }
    final.phases = phases;
  }
  if (products) {
    for (const field of ["grain_um", "yield_MPa", "tensile_MPa", "hardness_HV"] as const) {
      const out: Record<string, number | null> = {};
      const d = field === "grain_um" ? DECIMALS.grain_um : DECIMALS.strength;
      for (const [name, [x, y]] of Object.entries(where)) {
        const v = products[nodeNear(r, s, x, y)][field];
        out[name] = v === null ? null : round(v, d);
      }
      let sum = 0;
      let w = 0;
      products.forEach((p, k) => {
        if (p[field] === null) return;
        sum += solver.volume[k] * (p[field] as number);
        w += solver.volume[k];
      });
      out.mean = w > 0 ? round(sum / w, d) : null;
      final[field] = out;
    }
    const notes = new Set<string>();
    for (const p of products) for (const n of p.reasons) notes.add(n);
    final.product_notes = [...notes].sort();
  }
  const h = solver.heatOut_J_m;
  return {
    title: c.title,
    caution: SAFETY_NOTICE,
    end_time_s: round(r.end_s, DECIMALS.time_s),
    section: { thickness_mm: c.product.thickness_mm, width_mm: c.product.width_mm, symmetric: s.symmetric },
    final,
    energy: {
      relative_error: significant(solver.ledgerError(), 3),
      enthalpy_change_J_m: significant(solver.enthalpy_J_m() - solver.initialEnthalpy_J_m),
      heat_out_J_m: { top: significant(h.top), bottom: significant(h.bottom), edge: significant(h.edge), other_edge: significant(h.otherEdge) },
    },
    numerics: {
      scheme: c.numerics.scheme,
      thickness_cells: s.numerics.thicknessCells,
      width_cells: s.numerics.widthCells,
      time_step_s: s.numerics.dt_s,
      steps: solver.stats.steps,
      sub_steps: solver.stats.substeps,
      picard_iterations: solver.stats.iterations,
      halved_steps: solver.stats.halvings,
      unconverged_steps: solver.stats.unconvergedSteps,
      picard_tolerance_K: s.numerics.tolerance_K,
    },
    points: s.points.map((p, q) => ({
      x_mm: round(p.x_m * 1000, 4),
      y_mm: round(p.y_m * 1000, 4),
      recalescence_K: round(r.recalescence[q].rise_K, DECIMALS.K),
      recalescence_time_s: r.recalescence[q].time_s === null ? null : round(r.recalescence[q].time_s as number, DECIMALS.time_s),
    })),
    warnings,
  };
}

/** The whole final field: one row per node, x from mid-width, y depth from the top. */
function sectionProfile(s: SectionScenario, r: SectionResult, products: NodeProduct[] | null): string {
  const solver = r.solver;
  const transforming = solver.fractions.length > 1;
  const cols = ["x_mm", "depth_mm", "T_C", ...(transforming ? ORDER : []), ...(products ? ["grain_um", "yield_MPa", "tensile_MPa", "hardness_HV"] : [])];
  let out = cols.join(",") + "\n";
  const opt = (v: number | null, d: number) => (v === null ? "" : fixed(v, d));
  for (let i = 0; i <= solver.widthCells; i++) {
    const x = (s.symmetric ? i * solver.dx_m : i * solver.dx_m - s.width_m / 2) * 1000;
    for (let j = 0; j <= solver.thicknessCells; j++) {
      const k = solver.index(i, j);
      const parts = [fixed(x, 4), fixed(j * solver.dy_m * 1000, 4), fixed(solver.T[k] - KELVIN, DECIMALS.T_C)];
      if (transforming) for (const p of ORDER) parts.push(fixed(solver.fractions[PHASES.indexOf(p)][k], DECIMALS.fraction));
      if (products) {
        const q = products[k];
        parts.push(opt(q.grain_um, DECIMALS.grain_um), opt(q.yield_MPa, DECIMALS.strength), opt(q.tensile_MPa, DECIMALS.strength), opt(q.hardness_HV, DECIMALS.strength));
      }
      out += parts.join(",") + "\n";
    }
  }
  return out;
}
