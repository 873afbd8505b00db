/**
 * A cross-section (thickness × width) cooled stage by stage: the 2-D counterpart of simulate.ts,
 * for edge effects in strip and recalescence in thick plate. Stages carry a boundary law for the
 * top, bottom and edge faces; with `symmetric` the mid-width plane is a symmetry plane and only
 * half the width is computed. Output rows at the interval are linear in time between steps, as in
 * 1-D, and stream to a sink.
 */
import { CrossSectionSolver, type AdiSplitting, type CrossSectionScheme } from "../numerics/conduction2d.js";
import type { FaceLaw } from "../numerics/face-law.js";
import type { MaterialModel } from "./scenario.js";
import { KELVIN } from "./scenario.js";
import type { HistorySink, SimulationHooks } from "./simulate.js";

export interface SectionStage {
  readonly duration_s: number;
  readonly top: FaceLaw;
  readonly bottom: FaceLaw;
  readonly edge: FaceLaw;
  readonly label: string;
}

/** An output point: x from mid-width towards the edge, y depth from the top [m]. */
export interface SectionPoint {
  readonly x_m: number;
  readonly y_m: number;
  readonly label: string;
}

export interface SectionScenario {
  readonly title: string;
  readonly thickness_m: number;
  readonly width_m: number;
  readonly symmetric: boolean;
  readonly initial_K: number;
  readonly material: MaterialModel;
  readonly stages: readonly SectionStage[];
  readonly numerics: {
    readonly scheme: CrossSectionScheme;
    readonly splitting: AdiSplitting;
    readonly thicknessCells: number;
    readonly widthCells: number;
    readonly dt_s: number;
    readonly tolerance_K: number;
    readonly maxIterations: number;
  };
  /** Points sampled into the history (mid-width depths first, then extra points). */
  readonly points: readonly SectionPoint[];
  readonly interval_s: number;
}

export interface SectionResult {
  readonly solver: CrossSectionSolver;
  readonly end_s: number;
  /** Largest temperature rise after a running minimum per point [K] and when it peaked [s]. */
  readonly recalescence: Array<{ rise_K: number; time_s: number | null }>;
}

/** Domain x [m] of a point given from mid-width. */
export function domainX(s: { width_m: number; symmetric: boolean }, xFromMid_m: number): number {
  return s.symmetric ? xFromMid_m : s.width_m / 2 + xFromMid_m;
}

function sample(solver: CrossSectionSolver, scenario: SectionScenario, out: Float64Array): void {
  const pts = scenario.points;
  for (let q = 0; q < pts.length; q++) out[q] = solver.temperatureAt_K(domainX(scenario, pts[q].x_m), pts[q].y_m) - KELVIN;
  out[pts.length] = solver.meanTemperature_K() - KELVIN;
}

export function simulateSection(scenario: SectionScenario, sink?: HistorySink, hooks: SimulationHooks = {}): SectionResult {
  const n = scenario.numerics;
  const nodes = (n.widthCells + 1) * (n.thicknessCells + 1);
  const evolution = scenario.material.createEvolution?.(nodes);
  const solver = new CrossSectionSolver({
    thickness_m: scenario.thickness_m,
    width_m: scenario.width_m,
    symmetric: scenario.symmetric,
    thicknessCells: n.thicknessCells,
    widthCells: n.widthCells,
    scheme: n.scheme,
    splitting: n.splitting,
    tables: scenario.material.tables,
    initial_K: scenario.initial_K,
    evolution,
    latentHeat: scenario.material.latentHeat,
    tolerance_K: n.tolerance_K,
    maxIterations: n.maxIterations,
  });
  const width = scenario.points.length + 1;
  let prev = new Float64Array(width);
  let cur = new Float64Array(width);
  const row = new Float64Array(width);
  const runningMin = new Float64Array(scenario.points.length).fill(Infinity);
  const recalescence = scenario.points.map(() => ({ rise_K: 0, time_s: null as number | null }));
  const total = scenario.stages.reduce((a, st) => a + st.duration_s, 0);
  const slack = 1e-9 * Math.max(1, total);
  sample(solver, scenario, cur);
  // The product tracker reads T, fractions, time_s and evolution only, which both solvers share.
  const hookSolver = solver as unknown as Parameters<NonNullable<SimulationHooks["onStep"]>>[0];
  hooks.onStart?.(hookSolver);
  let nextOutput = 0;
  if (sink) {
    sink.row(0, cur);
    nextOutput = scenario.interval_s;
  }
  let t = 0;
  let stageEnd = 0;
  for (let si = 0; si < scenario.stages.length; si++) {
    const stage = scenario.stages[si];
    const faces = { top: stage.top, bottom: stage.bottom, edge: stage.edge, ...(scenario.symmetric ? {} : { otherEdge: stage.edge }) };
    stageEnd += stage.duration_s;
    while (t < stageEnd - slack) {
      const dt = Math.min(n.dt_s, stageEnd - t);
      const swap = prev;
      prev = cur;
      cur = swap;
      solver.step(dt, faces);
      const tNew = stageEnd - t - dt <= slack ? stageEnd : t + dt;
      sample(solver, scenario, cur);
      for (let q = 0; q < scenario.points.length; q++) {
        if (cur[q] < runningMin[q]) runningMin[q] = cur[q];
        const rise = cur[q] - runningMin[q];
        if (rise > recalescence[q].rise_K) recalescence[q] = { rise_K: rise, time_s: tNew };
      }
      if (sink) {
        while (nextOutput <= tNew + slack && nextOutput <= total + slack) {
          const w = Math.min(1, Math.max(0, (nextOutput - t) / (tNew - t)));
          for (let q = 0; q < width; q++) row[q] = prev[q] + w * (cur[q] - prev[q]);
          sink.row(Math.min(nextOutput, total), row);
          nextOutput += scenario.interval_s;
        }
      }
      t = tNew;
      hooks.onStep?.(hookSolver);
    }
    hooks.onStageEnd?.(si, hookSolver);
  }
  if (sink && nextOutput - scenario.interval_s < total - slack) sink.row(total, cur);
  return { solver, end_s: total, recalescence };
}
