/**
 * A transforming steel as the solver sees it: per-phase enthalpy, heat capacity and conductivity
 * tables from the SGTE iron description (src/physics/phase-enthalpy.ts), critical temperatures from
 * composition (or the user's), and the austenite-decomposition model that moves the phase
 * fractions every step. The latent heat is carried by the phase enthalpies, h = Σ X_p h_p(T), so it
 * is temperature-dependent and consistent with the heat capacities; no apparent c_p is ever used.
 *
 * Mass per cell is constant (physics.md §1): a density table is evaluated once at the initial
 * temperature.
 */
import { fullComposition, describeWarning, type Composition, type Element } from "../physics/composition.js";
import { criticalTemperatures } from "../physics/critical-temperatures.js";
import { phaseConductivity_W_mK, phaseEnthalpy_J_kg, phaseSpecificHeat_J_kgK, type PhaseThermoOptions } from "../physics/phase-enthalpy.js";
import { astmGrainNumber } from "../physics/astm-grain.js";
import { AusteniteDecomposition, type DecompositionSetup, type UserKineticsCurve } from "../physics/austenite-decomposition.js";
import { AUSTENITE, PHASES } from "../physics/phases.js";
import { buildPropertyTables, evaluateProperty, type TabulatedOrConstant, type PhaseProperties } from "../numerics/property-table.js";
import { KELVIN, type MaterialModel, type Scenario } from "./scenario.js";
import { historyColumns, type SimulationResult } from "./simulate.js";
import { DEFAULT_BOUNDARY_ENERGY_J_m2 } from "../physics/grain-floor.js";

/** Default steel density [kg/m³] (EN 1993-1-2:2005 design value, physics.md §3 [pub]). */
export const STEEL_DENSITY_kg_m3 = 7850;

interface CurveInput {
  start_fraction: number;
  finish_fraction: number;
  points: ReadonlyArray<{ T_C: number; start_s: number; finish_s: number }>;
}

/** The steel part of a validated case (structurally the case schema's material). */
export interface SteelMaterialInput {
  conductivity_W_mK?: TabulatedOrConstant;
  specific_heat_J_kgK?: TabulatedOrConstant;
  density_kg_m3?: TabulatedOrConstant;
  composition_wt_pct?: Partial<Record<Element, number | undefined>>;
  austenite_grain_um?: number;
  retained_strain?: number;
  grain_model?: "empirical" | "mechanistic";
  interface_energy_J_m2?: number;
  transformation?: "on" | "off";
  latent_heat?: "on" | "off";
  critical_C?: { Ae3?: number; Ae1?: number; Bs?: number; Ms?: number };
  formulas?: { Ae3?: "andrews" | "andrews-extended"; Bs?: "steven-haynes" | "li" };
  kinetics?:
    | { model: "li1998"; time_scale?: { ferrite: number; pearlite: number; bainite: number } }
    | { model: "table"; time_scale?: { ferrite: number; pearlite: number; bainite: number }; ferrite?: CurveInput; pearlite?: CurveInput; bainite?: CurveInput };
  stored_energy_fraction?: { bainite?: number; martensite?: number };
}

export interface CriticalUsed {
  readonly Ae3_C: number;
  readonly Ae1_C: number;
  readonly Bs_C: number;
  readonly Ms_C: number;
  /** Which were given by the user rather than computed. */
  readonly overridden: readonly string[];
}

export interface SteelSetup {
  readonly material: MaterialModel;
  readonly composition: Composition;
  readonly austeniteGrain_um: number;
  readonly astmGrainNumber: number;
  readonly retainedStrain: number;
  readonly grainModel: "empirical" | "mechanistic";
  readonly interfaceEnergy_J_m2: number;
  readonly critical: CriticalUsed;
  readonly transformation: boolean;
  readonly latentHeat: boolean;
  readonly decomposition: DecompositionSetup;
  readonly warnings: string[];
  historyColumns(scenario: Scenario): string[];
  extendSummary(summary: Record<string, unknown>, result: SimulationResult): void;
}

/** Default prior austenite grain size when the case gives none [µm] (common practice (no source): recrystallised strip after finishing). */
export const DEFAULT_AUSTENITE_GRAIN_um = 25;

function curve(c: CurveInput | undefined): UserKineticsCurve | undefined {
  return c ? { startFraction: c.start_fraction, finishFraction: c.finish_fraction, points: c.points } : undefined;
}

export function resolveSteel(m: SteelMaterialInput, initial_C: number): SteelSetup {
  const composition = fullComposition(m.composition_wt_pct as Partial<Record<Element, number>>);
  const warnings: string[] = [];
  const crit = criticalTemperatures(composition, { ae3: m.formulas?.Ae3 ?? "andrews", bs: m.formulas?.Bs ?? "li" });
  for (const w of crit.warnings) warnings.push(describeWarning(w));
  const over = m.critical_C ?? {};
  const critical: CriticalUsed = {
    Ae3_C: over.Ae3 ?? crit.Ae3_C,
    Ae1_C: over.Ae1 ?? crit.Ae1_C,
    Bs_C: over.Bs ?? crit.Bs_C,
    Ms_C: over.Ms ?? crit.Ms_C,
    overridden: Object.keys(over),
  };
  const grain = m.austenite_grain_um ?? DEFAULT_AUSTENITE_GRAIN_um;
  const G = astmGrainNumber(grain);
  const thermo: PhaseThermoOptions = {
    bainiteStoredFraction: m.stored_energy_fraction?.bainite,
    martensiteStoredFraction: m.stored_energy_fraction?.martensite,
  };
  const rho = m.density_kg_m3 === undefined ? STEEL_DENSITY_kg_m3 : evaluateProperty(m.density_kg_m3, initial_C);
  const carbon = composition.C;
  const kUser = m.conductivity_W_mK;
  const cpUser = m.specific_heat_J_kgK;
  if (cpUser !== undefined) {
    const peak = typeof cpUser === "number" ? cpUser : Math.max(...cpUser.map((p) => p[1]));
    if (peak > 1000) {
      warnings.push(
        `material.specific_heat_J_kgK reaches ${peak} J/(kg·K): this looks like an apparent heat capacity that already contains transformation heat; with latent heat on it would be counted twice`,
      );
    }
  }
  const transformation = m.transformation !== "off";
  const latentHeat = m.latent_heat !== "off";
  const phaseCount = transformation ? PHASES.length : 1;
  const phases: PhaseProperties[] = [];
  for (let p = 0; p < phaseCount; p++) {
    // Enthalpy per kg: SGTE phase enthalpy, or, with an imposed c_p, the imposed sensible heat of
    // austenite plus this phase's SGTE enthalpy difference to austenite (so latent heat is kept).
    const enthalpy_J_kg = (T: number): number => {
      if (cpUser === undefined) return phaseEnthalpy_J_kg(p, T, thermo);
      return integrateProperty(cpUser, T) + phaseEnthalpy_J_kg(p, T, thermo) - phaseEnthalpy_J_kg(AUSTENITE, T, thermo);
    };
    const cp_J_kgK = (T: number): number => {
      if (cpUser === undefined) return phaseSpecificHeat_J_kgK(p, T, thermo);
      return evaluateProperty(cpUser, T - KELVIN) + phaseSpecificHeat_J_kgK(p, T, thermo) - phaseSpecificHeat_J_kgK(AUSTENITE, T, thermo);
    };
    phases.push({
      enthalpy: (T) => rho * enthalpy_J_kg(T),
      heatCapacity: (T) => rho * cp_J_kgK(T),
      conductivity: (T) => (kUser === undefined ? phaseConductivity_W_mK(p, T, carbon) : evaluateProperty(kUser, T - KELVIN)),
    });
  }
  const tables = buildPropertyTables(phases, false);
  const k = m.kinetics ?? { model: "li1998" as const };
  const ts = k.time_scale ?? { ferrite: 1, pearlite: 1, bainite: 1 };
  const decomposition: DecompositionSetup = {
    composition,
    astmGrainNumber: G,
    critical: { Ae3_C: critical.Ae3_C, Ae1_C: critical.Ae1_C, Bs_C: critical.Bs_C, Ms_C: critical.Ms_C },
    timeScale: ts,
    kinetics: k.model === "li1998" ? { kind: "li1998" } : { kind: "table", ferrite: curve(k.ferrite), pearlite: curve(k.pearlite), bainite: curve(k.bainite) },
  };
  if (transformation) {
    // The kinetics model checks its own validity ranges when built; report them with the rest.
    for (const w of new AusteniteDecomposition(decomposition, 1).warnings) {
      const text = describeWarning(w);
      if (!warnings.includes(text)) warnings.push(text);
    }
  }
  if (transformation && initial_C < critical.Ae3_C) {
    warnings.push(`initial temperature ${initial_C} °C lies below Ae3 ${critical.Ae3_C.toFixed(1)} °C; the piece is assumed fully austenitic at the start`);
  }
  const material: MaterialModel = {
    tables,
    latentHeat,
    createEvolution: transformation ? (nodes) => new AusteniteDecomposition(decomposition, nodes) : undefined,
  };
  return {
    material,
    composition,
    austeniteGrain_um: grain,
    astmGrainNumber: G,
    retainedStrain: m.retained_strain ?? 0,
    grainModel: m.grain_model ?? "empirical",
    interfaceEnergy_J_m2: m.interface_energy_J_m2 ?? DEFAULT_BOUNDARY_ENERGY_J_m2,
    critical,
    transformation,
    latentHeat,
    decomposition,
    warnings,
    historyColumns: (scenario) => historyColumns(scenario, transformation),
    extendSummary(summary, result) {
      extendSteelSummary(this, summary, result);
    },
  };
}

/** ∫ c dT from 0 K for a constant-or-table property given in °C [J/kg]. */
function integrateProperty(p: TabulatedOrConstant, T_K: number): number {
  if (typeof p === "number") return p * T_K;
  // Piecewise linear in °C, constant beyond the ends: integrate exactly segment by segment.
  const x = T_K - KELVIN;
  const lo = -KELVIN;
  let sum = 0;
  let prevT = lo;
  let prevV = evaluateProperty(p, lo);
  for (const [Ti] of p) {
    if (Ti <= lo) continue;
    if (Ti >= x) break;
    const v = evaluateProperty(p, Ti);
    sum += 0.5 * (prevV + v) * (Ti - prevT);
    prevT = Ti;
    prevV = v;
  }
  sum += 0.5 * (prevV + evaluateProperty(p, x)) * (x - prevT);
  return sum;
}

function extendSteelSummary(steel: SteelSetup, summary: Record<string, unknown>, result: SimulationResult): void {
  const comp: Record<string, number> = {};
  for (const [e, v] of Object.entries(steel.composition)) if (v !== 0) comp[e] = v;
  summary.steel = {
    composition_wt_pct: comp,
    austenite_grain_um: steel.austeniteGrain_um,
    austenite_astm_grain_number: Number(steel.astmGrainNumber.toFixed(2)),
    transformation: steel.transformation ? "on" : "off",
    latent_heat: steel.latentHeat ? "on" : "off",
    kinetics: steel.decomposition.kinetics.kind,
    time_scale: steel.decomposition.timeScale,
  };
  summary.critical_C = {
    Ae3: round1(steel.critical.Ae3_C),
    Ae1: round1(steel.critical.Ae1_C),
    Bs: round1(steel.critical.Bs_C),
    Ms: round1(steel.critical.Ms_C),
    given_by_user: steel.critical.overridden,
  };
  void result;
}

function round1(v: number): number {
  return Math.round(v * 10) / 10;
}
