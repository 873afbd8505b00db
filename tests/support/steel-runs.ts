/**
 * Builders for coupled (transforming-steel) solver runs used by the verification tests: a
 * scenario from a steel description and uniform cooling of both faces, and mass averages of the
 * phase fractions. Uses project code only; it holds no reference values.
 */
import { resolveSteel, type SteelMaterialInput, type SteelSetup } from "../../src/model/steel.js";
import { KELVIN, type Scenario } from "../../src/model/scenario.js";
import type { Scheme } from "../../src/numerics/conduction1d.js";
import type { ThroughThicknessSolver } from "../../src/numerics/conduction1d.js";
import { ConvectionRadiation, type FaceLaw } from "../../src/numerics/face-law.js";

/** A face through which no heat passes. */
export const INSULATED: FaceLaw = new ConvectionRadiation(0, 0, 0, 0, 0);

/** Convection to a medium at medium_C [°C] with HTC h [W/(m²·K)], no radiation. */
export function convection(htc_W_m2K: number, medium_C: number): FaceLaw {
  return new ConvectionRadiation(htc_W_m2K, medium_C + KELVIN, 0, 0);
}

export interface SteelRunSpec {
  readonly material: SteelMaterialInput;
  readonly thickness_m: number;
  readonly initial_C: number;
  readonly duration_s: number;
  /** Law on both faces (symmetric cooling). */
  readonly face: FaceLaw;
  readonly scheme?: Scheme;
  readonly cells?: number;
  readonly dt_s?: number;
  readonly tolerance_K?: number;
  /** Output depths [m]; default the centre. */
  readonly depths_m?: readonly number[];
}

/** The scenario of a spec and the steel it resolves to. */
export function steelScenario(spec: SteelRunSpec): { scenario: Scenario; steel: SteelSetup } {
  const steel = resolveSteel(spec.material, spec.initial_C);
  const depths = spec.depths_m ?? [spec.thickness_m / 2];
  const scenario: Scenario = {
    title: "verification run",
    thickness_m: spec.thickness_m,
    initial_K: spec.initial_C + KELVIN,
    material: steel.material,
    stages: [{ duration_s: spec.duration_s, top: spec.face, bottom: spec.face, label: "cooling" }],
    numerics: {
      scheme: spec.scheme ?? "crank-nicolson",
      cells: spec.cells ?? 20,
      dt_s: spec.dt_s ?? 0.01,
      tolerance_K: spec.tolerance_K ?? 1e-6,
      maxIterations: 200,
    },
    output: { depths_m: depths, depthLabels: depths.map((d) => String(d * 1000)), interval_s: spec.duration_s },
  };
  return { scenario, steel };
}

/** Volume (= mass, constant density) average of phase p over the thickness [−]. */
export function meanFraction(solver: ThroughThicknessSolver, phase: number): number {
  let sum = 0;
  for (let i = 0; i < solver.nodes; i++) sum += solver.width[i] * solver.fractions[phase][i];
  return sum / solver.thickness_m;
}
