/**
 * Cross-section (2-D) conduction benchmark: cell-steps per second of CrossSectionSolver for the
 * explicit scheme and Peaceman–Rachford ADI, on two grids (thickness cells × width cells):
 *
 *   40 × 40   a 40 mm × 80 mm section, symmetric half (1 mm cells);
 *   20 × 200  a 12 mm × 1200 mm strip, symmetric half (0.6 mm × 3 mm cells);
 *
 * each with constant properties and with the EN 1993-1-2 §3.4.1.3 conductivity (constant ρc: the
 * bench measures the solver, not the data). Faces: water-like convection + radiation on top and
 * bottom, air + radiation on the edge; 1150 K start, requested steps of 20 ms (the explicit scheme
 * sub-steps inside them; reported). A cell-step is one cell advanced by one requested step.
 * Figures only, no assertions. Run alone: npx tsx bench/conduction2d.ts
 */
import { resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { CrossSectionSolver, type CrossSectionFaces, type CrossSectionScheme } from "../src/numerics/conduction2d.js";
import { ConvectionRadiation } from "../src/numerics/face-law.js";
import { buildPropertyTables, type PropertyTables } from "../src/numerics/property-table.js";

const HEAT_CAPACITY_J_m3K = 7850 * 600;
const STEP_s = 0.02;

function tables(temperatureDependent: boolean): PropertyTables {
  if (!temperatureDependent) return buildPropertyTables([{ heatCapacity: () => HEAT_CAPACITY_J_m3K, conductivity: () => 30 }], true);
  return buildPropertyTables([{ heatCapacity: () => HEAT_CAPACITY_J_m3K, conductivity: (T) => Math.max(27.3, 54 - 3.33e-2 * (T - 273.15)) }]);
}

const FACES: CrossSectionFaces = {
  top: new ConvectionRadiation(1500, 303.15, 0.8, 303.15),
  bottom: new ConvectionRadiation(800, 303.15, 0.8, 303.15),
  edge: new ConvectionRadiation(30, 303.15, 0.8, 303.15),
};

interface Figures {
  cell_steps_per_s: number;
  steps: number;
  substeps_per_step: number;
  iterations_per_step: number;
}

function measure(scheme: CrossSectionScheme, thicknessCells: number, widthCells: number, thickness_m: number, width_m: number, temperatureDependent: boolean, seconds = 1.0): Figures {
  const make = () =>
    new CrossSectionSolver({ thickness_m, width_m, symmetric: true, thicknessCells, widthCells, scheme, tables: tables(temperatureDependent), initial_K: 1150 });
  let solver = make();
  for (let i = 0; i < 200; i++) solver.step(STEP_s, FACES); // warm-up (JIT)
  solver = make();
  let steps = 0;
  const t0 = process.hrtime.bigint();
  let elapsed = 0;
  while (elapsed < seconds) {
    for (let i = 0; i < 20; i++) solver.step(STEP_s, FACES);
    steps += 20;
    elapsed = Number(process.hrtime.bigint() - t0) / 1e9;
  }
  return {
    cell_steps_per_s: Math.round((steps * thicknessCells * widthCells) / elapsed),
    steps,
    substeps_per_step: Number((solver.stats.substeps / steps).toFixed(3)),
    iterations_per_step: Number((solver.stats.iterations / steps).toFixed(3)),
  };
}

export function benchConduction2d(): Record<string, unknown> {
  const out: Record<string, unknown> = {
    case: "symmetric half sections, convection + radiation faces, 1150 K, 20 ms requested steps; ADI = Peaceman–Rachford",
  };
  for (const scheme of ["explicit", "adi"] as const) {
    for (const kT of [false, true]) {
      const label = `${scheme}_${kT ? "k_of_T" : "constant"}`;
      out[`${label}_40x40`] = measure(scheme, 40, 40, 0.04, 0.08, kT);
      out[`${label}_20x200`] = measure(scheme, 20, 200, 0.012, 1.2, kT);
    }
  }
  return out;
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  process.stdout.write(JSON.stringify({ node: process.version, conduction2d: benchConduction2d() }, null, 2) + "\n");
}
