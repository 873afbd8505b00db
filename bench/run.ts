/**
 * Speed figures, printed as JSON (no assertions; the targets are checked by reading the figures).
 *
 *   conduction: cell-steps per second for each scheme at 40 and 200 cells, temperature-dependent
 *               conductivity (EN 1993-1-2 curve), convection + radiation faces.
 *               Target: implicit, 40 cells ≥ 20 million cell-steps/s on one core.
 *   heap:       heap growth over a long run (must not grow with the number of steps).
 *
 * Later sections (coupled transformation, whole coil, sweep scaling) are added by their issues.
 * Run: npm run bench
 */
import { ThroughThicknessSolver, type Scheme } from "../src/numerics/conduction1d.js";
import { buildPropertyTables } from "../src/numerics/property-table.js";
import { ConvectionRadiation } from "../src/numerics/face-law.js";
import { benchCoupled } from "./coupled.js";

function conductionTables() {
  // EN 1993-1-2 §3.4.1.3 conductivity, constant ρc (the bench measures the solver, not the data).
  return buildPropertyTables([
    { heatCapacity: () => 7850 * 600, conductivity: (T) => Math.max(27.3, 54 - 3.33e-2 * (T - 273.15)) },
  ]);
}

function cellStepsPerSecond(scheme: Scheme, cells: number, seconds = 1.4): { cell_steps_per_s: number; range_cell_steps_per_s: number[]; steps: number; iterations_per_step: number; substeps_per_step: number } {
  const tables = conductionTables();
  const law = new ConvectionRadiation(800, 303.15, 0.8, 303.15);
  const dt = 0.005;
  // 12 mm strip.
  const make = () => new ThroughThicknessSolver({ thickness_m: 0.012, cells, scheme, tables, initial_K: 1153.15 });
  let s = make();
  for (let i = 0; i < 2000; i++) s.step(dt, law, law); // warm-up (JIT)
  // Median over 7 windows of seconds/7: one window is at the mercy of the shared machine.
  const rates: number[] = [];
  let steps = 0;
  let elapsed = 0;
  for (let w = 0; w < 7; w++) {
    s = make();
    let n = 0;
    const t0 = process.hrtime.bigint();
    let e = 0;
    while (e < seconds / 7) {
      for (let i = 0; i < 500; i++) s.step(dt, law, law);
      n += 500;
      e = Number(process.hrtime.bigint() - t0) / 1e9;
    }
    rates.push((n * cells) / e);
    steps += n;
    elapsed += e;
  }
  rates.sort((a, b) => a - b);
  return {
    cell_steps_per_s: Math.round(rates[3]),
    range_cell_steps_per_s: [Math.round(rates[0]), Math.round(rates[6])],
    steps,
    iterations_per_step: Number((s.stats.iterations / s.stats.steps).toFixed(3)),
    substeps_per_step: Number((s.stats.substeps / s.stats.steps).toFixed(3)),
  };
}

function heapGrowth(): { heap_before_MB: number; heap_after_MB: number; steps: number } {
  const tables = conductionTables();
  const law = new ConvectionRadiation(800, 303.15, 0.8, 303.15);
  const s = new ThroughThicknessSolver({ thickness_m: 0.012, cells: 40, scheme: "implicit", tables, initial_K: 1153.15 });
  for (let i = 0; i < 10000; i++) s.step(0.005, law, law);
  global.gc?.();
  const before = process.memoryUsage().heapUsed;
  for (let i = 0; i < 1_000_000; i++) s.step(0.005, law, law);
  global.gc?.();
  const after = process.memoryUsage().heapUsed;
  return { heap_before_MB: Number((before / 1e6).toFixed(2)), heap_after_MB: Number((after / 1e6).toFixed(2)), steps: 1_000_000 };
}

const only = process.argv[2];
const out: Record<string, unknown> = { node: process.version, date: new Date().toISOString().slice(0, 10) };
if (!only || only === "conduction") {
  const conduction: Record<string, unknown> = {};
  for (const scheme of ["explicit", "implicit", "crank-nicolson"] as const) {
    for (const cells of [40, 200]) conduction[`${scheme}_${cells}`] = cellStepsPerSecond(scheme, cells);
  }
  out.conduction = conduction;
  out.conduction_target = { implicit_40_min_cell_steps_per_s: 20e6 };
  out.heap = heapGrowth();
}
if (!only || only === "coupled") out.coupled = benchCoupled();
if (!only || only === "design") out.design = await (await import("./design.js")).benchDesign();
if (!only || only === "sweep") out.sweep = await (await import("./sweep.js")).benchSweep();
if (!only || only === "conduction2d") out.conduction2d = (await import("./conduction2d.js")).benchConduction2d();
if (!only || only === "coil") out.coil = (await import("./coil.js")).benchCoil();
process.stdout.write(JSON.stringify(out, null, 2) + "\n");
