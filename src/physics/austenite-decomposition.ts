/**
 * Per-node austenite decomposition for the cooling solver: ferrite, pearlite, bainite and
 * martensite share the austenite of every node (physics.md §5.5). All nodes advance at once,
 * without allocation; the solver may call advance() several times per step while it iterates the
 * latent-heat coupling, then accept().
 *
 * Products (temperatures of the step's midpoint T_mid for the diffusional ones):
 * - Ferrite, Ae3 > T_mid > Bs: X_F = X_F,eq(T_mid) · Y_F, never decreasing (no reversion), with
 *   the lever rule X_F,eq = (C_γ − C₀)/(C_γ − 0.02) on the Andrews Ae3 line inverted,
 *   C_γ(T) = ((Ae3 + 203√C₀ − T)/203)² [wt%, K differences] clamped at 0.77, and
 *   X_F,eq = (0.77 − C₀)/0.75 below Ae1 (Andrews, JISI 203 (1965) 721; Fe–C diagram). The
 *   supplied Ae3 fixes the line, so X_F,eq(Ae3) = 0 whichever Ae3 formula was used. When
 *   Ae3 ≤ Ae1 (near-eutectoid steels with the Mn-extended Ae3) or C₀ ≥ 0.77, no ferrite forms
 *   (physics.md §4). Ferrite stops growing once pearlite has started (is present; a table's
 *   incubation clock alone does not stop it): the remaining austenite then sits on the
 *   extrapolated Acm line and transforms cooperatively.
 * - Pearlite, T_mid < Ae1 and T_mid > Bs, only once the carbon-enriched remaining austenite
 *   C_γ,rem = (C₀ − 0.02 X_F)/(1 − X_F) reaches the Hultgren-extrapolated Acm line
 *   C_Acm(T) = 0.77 + (T[°C] − 727)/314 (through (727 °C, 0.77 %C) and (1148 °C, 2.11 %C) of the
 *   Fe–Fe₃C diagram; the criterion is common practice, from memory). Once started it keeps going
 *   below Ae1 (colonies exist); it consumes the remaining austenite.
 * - Bainite, T_mid < Bs, on the remaining austenite; ferrite and pearlite stop below Bs.
 * - Martensite, below Ms: dX_M = α X_γ max(0, −dT) (Koistinen & Marburger 1959 rate form),
 *   integrated exactly over the step (see martensite.ts); nothing on heating.
 *
 * Pearlite and bainite are normalised on the austenite left to them: with Y the normalised
 * fraction, ΔX = (Y_new − Y_old)/(1 − Y_old) · X_γ — so X = Y·(austenite at start) while nothing
 * else consumes austenite, and products competing below Ms share it consistently.
 *
 * Kinetics of the normalised fractions Y_F, Y_P, Y_B:
 * - "li1998": additivity θ += Δt/K(T_mid) while the undercooling is positive, Y = S⁻¹(θ)
 *   (Li et al. 1998, see li1998.ts); never an ODE started at Y = 0.
 * - "table": Scheil incubation Σ Δt/t_s(T_mid) = 1 (Scheil 1935), at which instant Y = Y_s,
 *   then equivalent-time JMAK growth (Hawbolt et al. 1983, see jmak.ts); before incubation ends
 *   Y = 0. A product without a table never forms; outside a table's temperature span it pauses.
 *
 * Not modelled: austenite re-forming on reheating above Ae1 (products are kept), proeutectoid
 * cementite. Fractions stay in [0, 1]; austenite = 1 − (ferrite + pearlite + bainite + martensite).
 */
import type { Composition, ValidityWarning } from "./composition.js";
import { AUSTENITE, BAINITE, FERRITE, MARTENSITE, PEARLITE, PHASE_COUNT } from "./phases.js";
import { LI1998_ACTIVATION_TEMPERATURE_K, LI1998_PRODUCT_CONSTANTS, checkLi1998Composition, liCompositionFactors, liIntegralInverse } from "./li1998.js";
import { jmakGrow, jmakInterval, jmakTable, type JmakTable, type UserKineticsCurve } from "./jmak.js";
import { KM_COEFFICIENT_PER_K, kmStepConversion } from "./martensite.js";

export type { UserKineticsCurve } from "./jmak.js";

export interface DecompositionSetup {
  composition: Composition;
  /** ASTM E112 grain-size number of the prior austenite */ astmGrainNumber: number;
  critical: { Ae3_C: number; Ae1_C: number; Bs_C: number; Ms_C: number };
  /** Multiplies all incubation and transformation times of a product (calibration; 1 = model as published). */
  timeScale: { ferrite: number; pearlite: number; bainite: number };
  kinetics: { kind: "li1998" } | { kind: "table"; ferrite?: UserKineticsCurve; pearlite?: UserKineticsCurve; bainite?: UserKineticsCurve };
  /** Koistinen–Marburger coefficient [1/K], default 0.011 */ martensiteCoefficient_perK?: number;
}

/** Carbon of ferrite on the lever rule [wt%] (Fe–C diagram, common practice 0.02). */
const CARBON_FERRITE = 0.02;
/** Eutectoid carbon [wt%] (Fe–Fe₃C diagram). */
const CARBON_EUTECTOID = 0.77;
/** Slope of Andrews' Ae3 in √C [K/√wt%] (Andrews 1965). */
const ANDREWS_SQRT_C_SLOPE = 203;
/** Hultgren-extrapolated Acm line: C = 0.77 + (T − 727 °C)/314 [wt%]. */
const ACM_ANCHOR_K = 727 + 273.15;
const ACM_SLOPE_K_PER_WT = 314;

const DIFFUSIONAL = 3; // ferrite, pearlite, bainite: index 0, 1, 2 in the accumulator arrays
const F = 0;
const P = 1;
const B = 2;

/** Lever-rule ferrite fraction of the composition [−] (physics.md §5.5). */
function leverFerrite(carbonAustenite: number, carbon: number): number {
  const x = (carbonAustenite - carbon) / (carbonAustenite - CARBON_FERRITE);
  return x > 0 ? x : 0;
}

/**
 * One table-kinetics step for one product: Scheil incubation, then equivalent-time growth.
 * Writes [clock, Y] into out; clock < 1 while incubating, = 1 afterwards.
 */
function tableStep(table: JmakTable, T_K: number, clock: number, Y: number, dt_s: number, out: Float64Array): void {
  out[0] = clock;
  out[1] = Y;
  const i = jmakInterval(table, T_K);
  if (i < 0) return;
  const w = (T_K - table.T_K[i]) / (table.T_K[i + 1] - table.T_K[i]);
  const n = table.n[i] + w * (table.n[i + 1] - table.n[i]);
  const lnk = table.lnk[i] + w * (table.lnk[i + 1] - table.lnk[i]);
  if (clock < 1) {
    const startRate = Math.exp((lnk - table.lnStart) / n); // 1/t_s [1/s]
    const next = clock + dt_s * startRate;
    if (next < 1) {
      out[0] = next;
      return;
    }
    // Incubation ends inside the step; the curve starts at Y_s and grows for the rest of it.
    out[0] = 1;
    out[1] = jmakGrow(table.startFraction, n, lnk, (next - 1) / startRate);
    return;
  }
  out[1] = jmakGrow(Y, n, lnk, dt_s);
}

/**
 * Advances one product's clock and normalised fraction Y by dt_s: Li additivity with the rate
 * 1/K(T_mid) [1/s] when liRate ≥ 0, else the product's table (none: no change). Writes [clock, Y].
 */
function advanceProduct(liRate: number, table: JmakTable | null, T_K: number, clock: number, Y: number, dt_s: number, out: Float64Array): void {
  if (liRate >= 0) {
    out[0] = clock + dt_s * liRate;
    out[1] = liIntegralInverse(out[0]);
  } else if (table !== null) {
    tableStep(table, T_K, clock, Y, dt_s, out);
  } else {
    out[0] = clock;
    out[1] = Y;
  }
}

/**
 * Austenite consumed by a product whose normalised fraction rose from before to after, normalised
 * on the austenite left to it: (after − before)/(1 − before) · austenite, at most all of it.
 */
function austeniteTaken(before: number, after: number, austenite: number): number {
  if (!(after > before)) return 0;
  const share = (after - before) / (1 - before);
  return share < 1 ? share * austenite : austenite;
}

export class AusteniteDecomposition {
  /** Committed fractions at the start of the step, phase-major: current[phase][node]. */
  readonly current: Float64Array[];
  /** Fractions at the end of the step computed by the last advance(). */
  readonly trial: Float64Array[];
  /** Committed normalised ferrite fraction Y_F per node [−] (for the grain-size model). */
  readonly normalisedFerrite: Float64Array;
  /** Y_F at the end of the step computed by the last advance() [−]. */
  readonly trialNormalisedFerrite: Float64Array;
  /** Inputs outside the models' validity ranges, found by the constructor. */
  readonly warnings: readonly ValidityWarning[];
  readonly nodes: number;

  // Committed and trial accumulators per diffusional product: clock (Li θ or Scheil sum) and Y.
  private readonly clock: Float64Array[];
  private readonly trialClock: Float64Array[];
  private readonly normalised: Float64Array[];
  private readonly trialNormalised: Float64Array[];
  private readonly scratch = new Float64Array(2);

  private readonly carbon: number;
  private readonly Ae3_K: number;
  private readonly Ae1_K: number;
  private readonly Bs_K: number;
  private readonly Ms_K: number;
  /** Temperature of the Andrews Ae3 line at C = 0 consistent with the supplied Ae3 [K]. */
  private readonly Ae3Carbonfree_K: number;
  private readonly ferriteForms: boolean;
  private readonly ferriteBelowAe1: number;
  private readonly alpha_perK: number;
  private readonly useLi: boolean;
  /** Li: 1/K = rateCoefficient · ΔT^m · exp(−Q/RT) [1/s], with time scale folded in. */
  private readonly rateCoefficient = new Float64Array(DIFFUSIONAL);
  private readonly tables: (JmakTable | null)[];

  constructor(setup: DecompositionSetup, nodes: number) {
    if (!(Number.isInteger(nodes) && nodes > 0)) throw new RangeError(`austenite decomposition: nodes must be a positive integer (${nodes})`);
    this.nodes = nodes;
    const alloc = (count: number): Float64Array[] => Array.from({ length: count }, () => new Float64Array(nodes));
    this.current = alloc(PHASE_COUNT);
    this.trial = alloc(PHASE_COUNT);
    this.clock = alloc(DIFFUSIONAL);
    this.trialClock = alloc(DIFFUSIONAL);
    this.normalised = alloc(DIFFUSIONAL);
    this.trialNormalised = alloc(DIFFUSIONAL);
    this.normalisedFerrite = this.normalised[F];
    this.trialNormalisedFerrite = this.trialNormalised[F];

    const c = setup.composition;
    const warnings: ValidityWarning[] = [];
    this.carbon = c.C;
    this.Ae3_K = setup.critical.Ae3_C + 273.15;
    this.Ae1_K = setup.critical.Ae1_C + 273.15;
    this.Bs_K = setup.critical.Bs_C + 273.15;
    this.Ms_K = setup.critical.Ms_C + 273.15;
    this.Ae3Carbonfree_K = this.Ae3_K + ANDREWS_SQRT_C_SLOPE * Math.sqrt(Math.max(0, c.C));
    this.ferriteForms = this.Ae3_K > this.Ae1_K && c.C < CARBON_EUTECTOID;
    this.ferriteBelowAe1 = leverFerrite(CARBON_EUTECTOID, c.C);
    if (!(c.C < CARBON_EUTECTOID)) {
      warnings.push({ kind: "validity", model: "Lever rule on the Fe–C diagram (hypo-eutectoid)", quantity: "C", value: c.C, min: 0, max: CARBON_EUTECTOID, unit: "wt%" });
    }
    this.alpha_perK = setup.martensiteCoefficient_perK ?? KM_COEFFICIENT_PER_K;

    const scales = [setup.timeScale.ferrite, setup.timeScale.pearlite, setup.timeScale.bainite];
    for (const s of scales) if (!(s > 0 && Number.isFinite(s))) throw new RangeError(`austenite decomposition: time scales must be positive (${s})`);
    const kinetics = setup.kinetics;
    this.useLi = kinetics.kind === "li1998";
    if (kinetics.kind === "li1998") {
      checkLi1998Composition(c, warnings);
      const factors = liCompositionFactors(c);
      const byProduct = [factors.ferrite, factors.pearlite, factors.bainite];
      const names = ["ferrite", "pearlite", "bainite"] as const;
      for (let p = 0; p < DIFFUSIONAL; p++) {
        const grain = 2 ** (LI1998_PRODUCT_CONSTANTS[names[p]].grainExponent * setup.astmGrainNumber);
        this.rateCoefficient[p] = grain / (byProduct[p] * scales[p]);
      }
      this.tables = [null, null, null];
    } else {
      const curves = [kinetics.ferrite, kinetics.pearlite, kinetics.bainite];
      this.tables = curves.map((curve, p) => (curve ? jmakTable(curve, scales[p]) : null));
    }
    this.warnings = warnings;
    this.reset();
  }

  /** Sets every node to 100 % austenite and clears all accumulators. */
  reset(): void {
    for (const arrays of [this.current, this.trial, this.clock, this.trialClock, this.normalised, this.trialNormalised]) {
      for (const a of arrays) a.fill(0);
    }
    this.current[AUSTENITE].fill(1);
    this.trial[AUSTENITE].fill(1);
  }

  /** Lever-rule ferrite fraction X_F,eq at T [K] (see the file comment). */
  equilibriumFerrite(T_K: number): number {
    if (!this.ferriteForms || T_K >= this.Ae3_K) return 0;
    if (T_K <= this.Ae1_K) return this.ferriteBelowAe1;
    const root = (this.Ae3Carbonfree_K - T_K) / ANDREWS_SQRT_C_SLOPE;
    const carbonAustenite = root * root;
    return leverFerrite(carbonAustenite < CARBON_EUTECTOID ? carbonAustenite : CARBON_EUTECTOID, this.carbon);
  }

  /** Hultgren criterion: may pearlite nucleate at T [K] beside ferrite fraction X_F? */
  pearliteMayStart(ferrite: number, T_K: number): boolean {
    if (ferrite >= 1) return false;
    const remainingCarbon = (this.carbon - CARBON_FERRITE * ferrite) / (1 - ferrite);
    return remainingCarbon >= CARBON_EUTECTOID + (T_K - ACM_ANCHOR_K) / ACM_SLOPE_K_PER_WT;
  }

  /**
   * From the committed state, computes the trial state for a step of dt_s [s] during which node i
   * goes from T_old_K[i] to T_new_K[i] [K]. Repeatable: it never changes the committed state.
   */
  advance(T_old_K: Float64Array, T_new_K: Float64Array, dt_s: number): void {
    const [cA, cF, cP, cB, cM] = this.current;
    const tA = this.trial[AUSTENITE];
    const tF = this.trial[FERRITE];
    const tP = this.trial[PEARLITE];
    const tB = this.trial[BAINITE];
    const tM = this.trial[MARTENSITE];
    const clockF = this.clock[F], clockP = this.clock[P], clockB = this.clock[B];
    const yF = this.normalised[F], yP = this.normalised[P], yB = this.normalised[B];
    const tClockF = this.trialClock[F], tClockP = this.trialClock[P], tClockB = this.trialClock[B];
    const tyF = this.trialNormalised[F], tyP = this.trialNormalised[P], tyB = this.trialNormalised[B];
    const { Ae3_K, Ae1_K, Bs_K, Ms_K, ferriteForms, useLi, scratch, alpha_perK } = this;
    const cF0 = this.rateCoefficient[F], cP0 = this.rateCoefficient[P], cB0 = this.rateCoefficient[B];
    const tableF = this.tables[F], tableP = this.tables[P], tableB = this.tables[B];
    const diffusionalTop_K = Math.max(ferriteForms ? Ae3_K : -Infinity, Ae1_K, Bs_K);

    for (let i = 0; i < this.nodes; i++) {
      const T_old = T_old_K[i];
      const T_new = T_new_K[i];
      const T_mid = 0.5 * (T_old + T_new);
      let ferrite = cF[i];
      let pearlite = cP[i];
      let bainite = cB[i];
      let martensite = cM[i];
      let austenite = cA[i];
      let kF = clockF[i], kP = clockP[i], kB = clockB[i];
      let nF = yF[i], nP = yP[i], nB = yB[i];

      if (austenite > 0 && T_mid < diffusionalTop_K) {
        let arrhenius = -1; // exp(−Q/RT_mid) of Li (1998), evaluated once per node when first needed

        // Ferrite: Ae3 > T_mid > Bs, until pearlite exists (Y_P > 0, not merely incubating).
        if (ferriteForms && T_mid < Ae3_K && T_mid > Bs_K && nP === 0) {
          if (nF < 1) {
            if (useLi && arrhenius < 0) arrhenius = Math.exp(-LI1998_ACTIVATION_TEMPERATURE_K / T_mid);
            const u = Ae3_K - T_mid;
            advanceProduct(useLi ? cF0 * u * u * u * arrhenius : -1, tableF, T_mid, kF, nF, dt_s, scratch);
            kF = scratch[0];
            nF = scratch[1];
          }
          const target = this.equilibriumFerrite(T_mid) * nF;
          if (target > ferrite) {
            const gain = target - ferrite < austenite ? target - ferrite : austenite;
            ferrite += gain;
            austenite -= gain;
          }
        }

        // Pearlite: Bs < T_mid < Ae1, once the Hultgren criterion has been met.
        if (T_mid < Ae1_K && T_mid > Bs_K && austenite > 0 && nP < 1 && (kP > 0 || this.pearliteMayStart(ferrite, T_mid))) {
          if (useLi && arrhenius < 0) arrhenius = Math.exp(-LI1998_ACTIVATION_TEMPERATURE_K / T_mid);
          const u = Ae1_K - T_mid;
          advanceProduct(useLi ? cP0 * u * u * u * arrhenius : -1, tableP, T_mid, kP, nP, dt_s, scratch);
          const gain = austeniteTaken(nP, scratch[1], austenite);
          kP = scratch[0];
          nP = scratch[1];
          pearlite += gain;
          austenite -= gain;
        }

        // Bainite: T_mid < Bs, on what is still austenite.
        if (T_mid < Bs_K && austenite > 0 && nB < 1) {
          if (useLi && arrhenius < 0) arrhenius = Math.exp(-LI1998_ACTIVATION_TEMPERATURE_K / T_mid);
          const u = Bs_K - T_mid;
          advanceProduct(useLi ? cB0 * u * u * arrhenius : -1, tableB, T_mid, kB, nB, dt_s, scratch);
          const gain = austeniteTaken(nB, scratch[1], austenite);
          kB = scratch[0];
          nB = scratch[1];
          bainite += gain;
          austenite -= gain;
        }
      }

      // Martensite: cooling below Ms, on what is left.
      if (T_new < Ms_K && austenite > 0) martensite += austenite * kmStepConversion(Ms_K, T_old, T_new, alpha_perK);

      const transformed = ferrite + pearlite + (bainite + martensite);
      tF[i] = ferrite;
      tP[i] = pearlite;
      tB[i] = bainite;
      tM[i] = martensite;
      tA[i] = transformed < 1 ? 1 - transformed : 0;
      tClockF[i] = kF;
      tClockP[i] = kP;
      tClockB[i] = kB;
      tyF[i] = nF;
      tyP[i] = nP;
      tyB[i] = nB;
    }
  }

  /** Makes the trial state (fractions, additivity clocks, normalised fractions) the committed one. */
  accept(): void {
    for (let p = 0; p < PHASE_COUNT; p++) this.current[p].set(this.trial[p]);
    for (let p = 0; p < DIFFUSIONAL; p++) {
      this.clock[p].set(this.trialClock[p]);
      this.normalised[p].set(this.trialNormalised[p]);
    }
  }
}
