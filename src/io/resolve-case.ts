/**
 * Converts a validated case (units in key names) into an SI Scenario the model runs. All unit
 * conversions happen here, once.
 */
import type { Case, FaceInput } from "./case-schema.js";
import { ConvectionRadiation, type FaceLaw } from "../numerics/face-law.js";
import { buildPropertyTables, evaluateProperty } from "../numerics/property-table.js";
import { KELVIN, type MaterialModel, type Scenario, type Stage } from "../model/scenario.js";
import { InputError } from "./errors.js";
import { resolveSteel, type SteelSetup } from "../model/steel.js";

/** Face input → boundary law. */
export function faceLaw(f: FaceInput): FaceLaw {
  if (f.surface_C !== undefined) return { kind: "fixed", T_K: f.surface_C + KELVIN };
  if (f.insulated) return new ConvectionRadiation(0, 0, 0, 0, 0);
  if (f.flux_W_m2 !== undefined) return new ConvectionRadiation(0, 0, 0, 0, f.flux_W_m2);
  const h = f.htc_W_m2K ?? 0;
  const medium = (f.medium_C ?? f.surroundings_C ?? 0) + KELVIN;
  const surroundings = (f.surroundings_C ?? f.medium_C ?? 0) + KELVIN;
  return new ConvectionRadiation(h, medium, f.emissivity ?? 0, surroundings);
}

/** Formats a depth as written in the case (shortest round-trip form, e.g. 2.5). */
export function depthLabel(d_mm: number): string {
  return String(d_mm);
}

export interface ResolvedCase {
  readonly scenario: Scenario;
  /** Steel description when the case has a composition. */
  readonly steel?: SteelSetup;
}

export function resolveCase(file: string, c: Case): ResolvedCase {
  let material: MaterialModel;
  let steel: SteelSetup | undefined;
  if (c.material.composition_wt_pct) {
    steel = resolveSteel(c.material, c.product.initial_C);
    material = steel.material;
  } else {
    const m = c.material;
    const k = m.conductivity_W_mK!;
    const cp = m.specific_heat_J_kgK!;
    const rho = m.density_kg_m3!;
    const constant = typeof k === "number" && typeof cp === "number" && typeof rho === "number";
    const tables = buildPropertyTables(
      [
        {
          heatCapacity: (T) => evaluateProperty(rho, T - KELVIN) * evaluateProperty(cp, T - KELVIN),
          conductivity: (T) => evaluateProperty(k, T - KELVIN),
        },
      ],
      constant,
    );
    material = { tables, latentHeat: true };
  }
  const stages: Stage[] = c.cooling.stages.map((s, i) => ({
    duration_s: s.duration_s,
    top: faceLaw(s.top),
    bottom: faceLaw(s.bottom),
    label: s.label ?? `stage ${i + 1}`,
  }));
  if (c.numerics.time_step_s > stages.reduce((s, st) => s + st.duration_s, 0)) {
    throw new InputError(file, "numerics.time_step_s", "is longer than the whole cooling; expected a step shorter than the total duration (s)");
  }
  const scenario: Scenario = {
    title: c.title,
    thickness_m: c.product.thickness_mm / 1000,
    initial_K: c.product.initial_C + KELVIN,
    material,
    stages,
    numerics: {
      scheme: c.numerics.scheme,
      cells: c.numerics.cells,
      dt_s: c.numerics.time_step_s,
      tolerance_K: c.numerics.picard_tolerance_K ?? 1e-3,
      maxIterations: c.numerics.max_iterations ?? 60,
    },
    output: {
      depths_m: c.output.depths_mm.map((d) => d / 1000),
      depthLabels: c.output.depths_mm.map(depthLabel),
      interval_s: c.output.interval_s,
    },
  };
  return { scenario, steel };
}
