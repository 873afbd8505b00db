/**
 * In-memory strip cases and pipeline runs for the product tests: a case object built here,
 * validated with the loader's own validateCase, resolved and simulated through simulateResolved —
 * the same path `recalesce run` takes, without files. Holds no reference values.
 */
import { validateCase } from "../../src/io/load-case.js";
import { resolveCase } from "../../src/io/resolve-case.js";
import { simulateResolved } from "../../src/io/run-case.js";
import type { NodeProduct } from "../../src/model/product.js";
import type { SimulationResult } from "../../src/model/simulate.js";

/** The name validateCase and resolveCase are given for an in-memory case. */
export const MEMORY_CASE = "in-memory.json";

const AIR = { emissivity: 0.8, surroundings_C: 30 };

export interface StripSpec {
  readonly thickness_mm: number;
  /** Water HTC on both faces during the water stage [W/(m²·K)]. */
  readonly htc_W_m2K: number;
  readonly composition?: Record<string, number>;
  readonly austeniteGrain_um?: number;
  readonly grainModel?: "empirical" | "mechanistic";
  readonly latentHeat?: "on" | "off";
  readonly initial_C?: number;
  /** Air after the last stand, water, air to the coiler [s]. */
  readonly airBefore_s?: number;
  readonly water_s?: number;
  readonly airAfter_s?: number;
  readonly cells?: number;
  readonly penalty?: boolean;
}

/** Default steel of the trend tests: 0.10C-0.6Mn-0.2Si (invented demo grade). */
export const CMN_STEEL = { C: 0.1, Mn: 0.6, Si: 0.2 };

/**
 * Stage cooling of a strip: air (radiation, ε 0.8), water (convection at htc_W_m2K to 30 °C on both
 * faces), air again. Crank–Nicolson, 0.02 s steps, depths top / centre / bottom.
 */
export function stripCaseObject(s: StripSpec): Record<string, unknown> {
  const water = { htc_W_m2K: s.htc_W_m2K, medium_C: 30 };
  const stages = [
    { duration_s: s.airBefore_s ?? 1, label: "air after the last stand", top: AIR, bottom: AIR },
    { duration_s: s.water_s ?? 8, label: "water", top: water, bottom: water },
  ];
  if ((s.airAfter_s ?? 15) > 0) stages.push({ duration_s: s.airAfter_s ?? 15, label: "air to the coiler", top: AIR, bottom: AIR });
  return {
    title: "invented test strip",
    product: { thickness_mm: s.thickness_mm, initial_C: s.initial_C ?? 880 },
    material: {
      composition_wt_pct: s.composition ?? CMN_STEEL,
      austenite_grain_um: s.austeniteGrain_um ?? 25,
      grain_model: s.grainModel ?? "empirical",
      latent_heat: s.latentHeat ?? "on",
    },
    cooling: { stages },
    numerics: { scheme: "crank-nicolson", cells: s.cells ?? 12, time_step_s: 0.02 },
    output: { depths_mm: [0, s.thickness_mm / 2, s.thickness_mm], interval_s: 1, recalescence_penalty: s.penalty ?? false },
  };
}

/** Top / centre / bottom / mean of a through-thickness product field in summary.final. */
export interface ThroughThickness {
  readonly top: number | null;
  readonly centre: number | null;
  readonly bottom: number | null;
  readonly mean: number | null;
}

/** The parts of summary.json the product tests read. */
export interface ProductSummary {
  readonly final: {
    readonly phases: Record<string, number>;
    readonly T_C: ThroughThickness;
    readonly grain_um: ThroughThickness;
    readonly yield_MPa: ThroughThickness;
    readonly tensile_MPa: ThroughThickness;
    readonly grain_floor_nm: ThroughThickness;
  };
  readonly depths: ReadonlyArray<{
    readonly depth_mm: number;
    readonly grain_um: number | null;
    readonly grain_floor_nm: number | null;
    readonly ferrite_start_C: number | null;
    readonly ferrite_half_C: number | null;
    readonly cooling_rate_through_transformation_K_s: number | null;
  }>;
  readonly recalescence_penalty?: ReadonlyArray<{
    readonly depth_mm: number;
    readonly latent_heat_on: { readonly grain_um: number | null; readonly ferrite_half_C: number | null };
    readonly latent_heat_off: { readonly grain_um: number | null; readonly ferrite_half_C: number | null };
    readonly grain_coarsening_um: number | null;
    readonly ferrite_half_raised_K: number | null;
  }>;
  readonly product: { readonly notes: string[] };
}

export interface PipelineRun {
  readonly summary: ProductSummary;
  readonly products: NodeProduct[];
  readonly result: SimulationResult;
}

/** Validates, resolves and simulates a case object (the penalty run only if the case asks for it). */
export function runPipeline(caseObject: Record<string, unknown>): PipelineRun {
  const c = validateCase(MEMORY_CASE, caseObject);
  const out = simulateResolved(c, resolveCase(MEMORY_CASE, c));
  if (!out.products) throw new Error("the case did not produce per-node products (no transforming steel?)");
  return { summary: out.summary as unknown as ProductSummary, products: out.products, result: out.result };
}

/** Index of the node nearest the centre plane. */
export function centreNode(run: PipelineRun): number {
  return Math.round(run.result.solver.thickness_m / 2 / run.result.solver.dx_m);
}
