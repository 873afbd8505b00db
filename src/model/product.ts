/**
 * From each node's computed cooling path to its product: ferrite grain size (empirical
 * Hodgson–Gibbs relation, or the mechanistic grain-boundary nucleation route), the thermodynamic
 * grain-size floor at the node's own transformation temperature, strength and hardness.
 *
 * What is recorded along the path, per node (allocation-free after construction):
 * - the time and temperature at which the ferrite fraction crosses each of a ladder of levels
 *   (geometric from 1e-4, then every 0.0025 to 1), so that after the run the points at 1 % and 50 % of the node's FINAL
 *   ferrite can be interpolated;
 * - the cooling rate when the node first cools through 700 °C (the rate Maynier's hardness
 *   equations are written for);
 * - grain-boundary nucleation (FerriteNucleation) integrated at the step's mid temperature.
 *
 * Where the cooling rate for Hodgson–Gibbs is taken: the node's mean cooling rate between 1 % and
 * 50 % of its final ferrite (src/physics/ferrite-grain.ts). When recalescence makes that
 * non-positive, the window 1 %–90 % is tried; failing that the grain size is null, with the reason.
 *
 * Strength: Pickering (1978) for the ferrite–pearlite share with the ferrite intercept; bainite and
 * martensite through Maynier (1978) hardness converted by TS ≈ 3.3·HV (named rule of thumb, see
 * hardness.ts). Tensile strength is fraction-weighted over the transformed products. Yield
 * strength is reported only while bainite + martensite ≤ 10 % (Pickering's yield equation is for
 * ferrite–pearlite and there is no yield model for the hard products here); otherwise null.
 * Free nitrogen = N − N bound as AlN and TiN by stoichiometry (common practice (no source)), with
 * the IUPAC standard atomic weights N 14.007, Al 26.98, Ti 47.87.
 */
import { FERRITE, PEARLITE, BAINITE, MARTENSITE, AUSTENITE, PHASE_COUNT } from "../physics/phases.js";
import { carbonEquivalentHG, hodgsonGibbsFerriteGrain_um, transformationCoolingRate_K_s } from "../physics/ferrite-grain.js";
import { FerriteNucleation } from "../physics/ferrite-nucleation.js";
import { grainFloorAt_nm, DEFAULT_BOUNDARY_ENERGY_J_m2 } from "../physics/grain-floor.js";
import { pickeringStrength } from "../physics/strength.js";
import { maynierBainiteHV, maynierMartensiteHV, mixtureHardnessHV, tensileFromHardnessRule_MPa } from "../physics/hardness.js";
import type { Composition, ValidityWarning } from "../physics/composition.js";
import type { ThroughThicknessSolver } from "../numerics/conduction1d.js";
import { KELVIN } from "./scenario.js";

/**
 * Ferrite crossing levels: geometric from 1e-4 (ratio 1.05) up to 0.0025, then every 0.0025 up
 * to 1. Fine where a node's first ferrite forms, so that 1 % of even a small final amount (down to
 * 1 % ferrite) is located by interpolation between close levels, and fine in absolute terms later,
 * so the 50 % point of a large amount is too.
 */
const LEVEL_STEP = 0.0025;
const LEVEL_VALUES: Float64Array = (() => {
  const v: number[] = [];
  for (let x = 1e-4; x < LEVEL_STEP; x *= 1.05) v.push(x);
  for (let m = 1; m * LEVEL_STEP <= 1 + 1e-12; m++) v.push(m * LEVEL_STEP);
  return Float64Array.from(v);
})();
const LEVELS = LEVEL_VALUES.length;
/** Least final ferrite fraction for which a ferrite grain size is reported. */
const MIN_FERRITE = 0.01;
const T700_K = 700 + KELVIN;

export type GrainModel = "empirical" | "mechanistic";

export interface ProductOptions {
  readonly composition: Composition;
  readonly austeniteGrain_um: number;
  readonly retainedStrain: number;
  readonly ae3_K: number;
  readonly grainModel: GrainModel;
  /** Boundary energy σ for the floor [J/m²] */
  readonly interfaceEnergy_J_m2: number;
}

/** One node's product; null values carry a reason. */
export interface NodeProduct {
  readonly grain_um: number | null;
  readonly grainEmpirical_um: number | null;
  readonly grainMechanistic_um: number | null;
  readonly grainFloor_nm: number | null;
  readonly yield_MPa: number | null;
  readonly tensile_MPa: number | null;
  readonly hardness_HV: number | null;
  /** Ferrite start (1 % of final ferrite) and 50 % points [°C, s]. */
  readonly ferriteStart_C: number | null;
  readonly ferriteHalf_C: number | null;
  readonly coolingRate_K_s: number | null;
  readonly reasons: string[];
}

export class ProductTracker {
  readonly nodes: number;
  private readonly crossT: Float64Array;
  private readonly crossTime: Float64Array;
  private readonly nextLevel: Int32Array;
  private readonly Xprev: Float64Array;
  private readonly Tprev: Float64Array;
  private readonly Tmid: Float64Array;
  private readonly Yprev: Float64Array;
  private readonly rate700: Float64Array;
  private readonly nucleation: FerriteNucleation;
  private tPrev = 0;
  readonly warnings: ValidityWarning[] = [];

  constructor(nodes: number, readonly options: ProductOptions) {
    this.nodes = nodes;
    this.crossT = new Float64Array(nodes * LEVELS);
    this.crossTime = new Float64Array(nodes * LEVELS);
    this.nextLevel = new Int32Array(nodes);
    this.Xprev = new Float64Array(nodes);
    this.Tprev = new Float64Array(nodes);
    this.Tmid = new Float64Array(nodes);
    this.Yprev = new Float64Array(nodes);
    this.rate700 = new Float64Array(nodes).fill(Number.NaN);
    this.nucleation = new FerriteNucleation(nodes, {
      carbon_wt: options.composition.C,
      austeniteGrain_um: options.austeniteGrain_um,
      ae3_K: options.ae3_K,
    });
  }

  /** Call once before the first step with the initial state. */
  start(solver: ThroughThicknessSolver): void {
    this.Tprev.set(solver.T);
    this.Xprev.set(solver.fractions[FERRITE]);
    this.tPrev = solver.time_s;
    this.Yprev.fill(0);
  }

  /** Call after every accepted step. */
  step(solver: ThroughThicknessSolver): void {
    const n = this.nodes;
    const T = solver.T;
    const X = solver.fractions[FERRITE];
    const t = solver.time_s;
    const dt = t - this.tPrev;
    if (!(dt > 0)) return;
    for (let i = 0; i < n; i++) this.Tmid[i] = 0.5 * (T[i] + this.Tprev[i]);
    this.nucleation.step(this.Tmid, this.Yprev, dt);
    const Y = (solver.evolution as { normalisedFerrite?: Float64Array } | undefined)?.normalisedFerrite;
    for (let i = 0; i < n; i++) {
      const x0 = this.Xprev[i];
      const x1 = X[i];
      let k = this.nextLevel[i];
      while (k < LEVELS && x1 >= LEVEL_VALUES[k]) {
        const level = LEVEL_VALUES[k];
        const w = x1 > x0 ? (level - x0) / (x1 - x0) : 1;
        this.crossT[i * LEVELS + k] = this.Tprev[i] + w * (T[i] - this.Tprev[i]);
        this.crossTime[i * LEVELS + k] = this.tPrev + w * dt;
        k++;
      }
      this.nextLevel[i] = k;
      if (Number.isNaN(this.rate700[i]) && this.Tprev[i] > T700_K && T[i] <= T700_K) this.rate700[i] = (this.Tprev[i] - T[i]) / dt;
      this.Xprev[i] = x1;
      this.Tprev[i] = T[i];
      if (Y) this.Yprev[i] = Y[i];
    }
    this.tPrev = t;
  }

  /** Time and temperature [s, K] at which node i's ferrite reached `fraction`, or null. */
  private crossing(i: number, fraction: number): { t: number; T: number } | null {
    const reached = this.nextLevel[i];
    if (reached === 0 || fraction < LEVEL_VALUES[0]) return null;
    // Last level at or below `fraction` (binary search), clamped to the levels reached.
    let lo = 0;
    let hi = LEVELS - 1;
    while (hi > lo) {
      const mid = (lo + hi + 1) >> 1;
      if (LEVEL_VALUES[mid] <= fraction) lo = mid;
      else hi = mid - 1;
    }
    const k = Math.min(lo, reached - 1);
    const o = i * LEVELS + k;
    if (k + 1 >= reached) return { t: this.crossTime[o], T: this.crossT[o] };
    // Linear in the ferrite fraction between the two bracketing levels.
    const f = (fraction - LEVEL_VALUES[k]) / (LEVEL_VALUES[k + 1] - LEVEL_VALUES[k]);
    return { t: this.crossTime[o] + f * (this.crossTime[o + 1] - this.crossTime[o]), T: this.crossT[o] + f * (this.crossT[o + 1] - this.crossT[o]) };
  }

  /** The product of every node, from the final state. */
  finish(solver: ThroughThicknessSolver): NodeProduct[] {
    const out: NodeProduct[] = [];
    const c = this.options.composition;
    const ceq = carbonEquivalentHG(c);
    const freeN = Math.max(0, c.N - (c.Al * 14.007) / 26.98 - (c.Ti * 14.007) / 47.87);
    const fractions = new Float64Array(PHASE_COUNT);
    for (let i = 0; i < this.nodes; i++) {
      const reasons: string[] = [];
      for (let p = 0; p < PHASE_COUNT; p++) fractions[p] = solver.fractions[p][i];
      const xF = fractions[FERRITE];
      let grainEmp: number | null = null;
      let grainMech: number | null = null;
      let floor: number | null = null;
      let startC: number | null = null;
      let halfC: number | null = null;
      let rate: number | null = null;
      if (xF >= MIN_FERRITE) {
        const a = this.crossing(i, 0.01 * xF);
        const b = this.crossing(i, 0.5 * xF);
        const b90 = this.crossing(i, 0.9 * xF);
        if (a && b) {
          startC = a.T - KELVIN;
          halfC = b.T - KELVIN;
          const r1 = b.t > a.t ? transformationCoolingRate_K_s(a.T, a.t, b.T, b.t) : Number.NaN;
          const r2 = b90 && b90.t > a.t ? transformationCoolingRate_K_s(a.T, a.t, b90.T, b90.t) : Number.NaN;
          rate = r1 > 0 ? r1 : r2 > 0 ? r2 : null;
          if (rate === null) reasons.push("recalescence left no net cooling between ferrite start and 50 %/90 %: empirical grain size undefined");
          else {
            const hg = hodgsonGibbsFerriteGrain_um({ carbonEquivalent: ceq, coolingRate_K_s: rate, austeniteGrain_um: this.options.austeniteGrain_um, retainedStrain: this.options.retainedStrain });
            grainEmp = hg.grain_um;
            for (const w of hg.warnings) this.warnOnce(w);
          }
          try {
            floor = grainFloorAt_nm(b.T, c.C, this.options.interfaceEnergy_J_m2);
          } catch {
            reasons.push("no driving force for ferrite at the 50 % temperature: floor undefined");
          }
        }
        grainMech = this.nucleation.meanIntercept_um(i, xF);
      } else reasons.push(xF > 0 ? "less than 1 % ferrite formed: no ferrite grain size" : "no ferrite formed: no ferrite grain size");
      const grain = this.options.grainModel === "empirical" ? grainEmp : grainMech;
      // Hardness and strength.
      const transformed = 1 - fractions[AUSTENITE];
      const r700 = Number.isNaN(this.rate700[i]) ? rate : this.rate700[i];
      let hardness: number | null = null;
      let tensile: number | null = null;
      let yieldS: number | null = null;
      if (transformed < 0.5) reasons.push("less than half transformed: no properties");
      else if (r700 === null || !(r700 > 0)) reasons.push("no cooling rate at 700 °C: no hardness");
      else {
        const h = mixtureHardnessHV(c, r700, fractions);
        hardness = h.hardness_HV;
        for (const w of h.warnings) if (w.quantity !== "retained austenite fraction") this.warnOnce(w); // retained austenite is reported as a phase fraction, not as a model-range problem
        const fp = fractions[FERRITE] + fractions[PEARLITE];
        const hard = fractions[BAINITE] + fractions[MARTENSITE];
        let ts = 0;
        let ok = true;
        if (fp > 0) {
          if (grain === null) ok = false;
          else {
            const pick = pickeringStrength({ composition: c, freeNitrogen_wt: freeN, ferriteIntercept_um: grain, pearliteFraction: fractions[PEARLITE] / fp });
            ts += fp * pick.tensile_MPa;
            if (hard / transformed <= 0.1) yieldS = pick.yield_MPa;
            else reasons.push("bainite + martensite above 10 %: no yield model");
          }
        }
        ts += fractions[BAINITE] * tensileFromHardnessRule_MPa(maynierBainiteHV(c, r700));
        ts += fractions[MARTENSITE] * tensileFromHardnessRule_MPa(maynierMartensiteHV(c, r700));
        if (ok) tensile = ts / (fp + hard);
        else reasons.push("no ferrite grain size: no strength");
      }
      out.push({
        grain_um: grain,
        grainEmpirical_um: grainEmp,
        grainMechanistic_um: grainMech,
        grainFloor_nm: floor,
        yield_MPa: yieldS,
        tensile_MPa: tensile,
        hardness_HV: hardness,
        ferriteStart_C: startC,
        ferriteHalf_C: halfC,
        coolingRate_K_s: rate,
        reasons,
      });
    }
    return out;
  }

  /** One warning per model and quantity, holding the value furthest outside the range. */
  private warnOnce(w: ValidityWarning): void {
    const k = this.warnings.findIndex((x) => x.model === w.model && x.quantity === w.quantity);
    if (k < 0) {
      this.warnings.push(w);
      return;
    }
    const outside = (x: ValidityWarning) => Math.max(x.min - x.value, x.value - x.max);
    if (outside(w) > outside(this.warnings[k])) this.warnings[k] = w;
  }
}

export const DEFAULT_INTERFACE_ENERGY_J_m2 = DEFAULT_BOUNDARY_ENERGY_J_m2;
