/**
 * Fits K₁ and K₂ of the grain-boundary nucleation model (src/physics/ferrite-nucleation.ts) so that
 * the mechanistic ferrite grain size reproduces the empirical Hodgson–Gibbs relation
 * (src/physics/ferrite-grain.ts) for a reference C–Mn steel cooled at constant rate.
 *
 * Run: npx tsx scripts/calibrate-nucleation.ts
 *
 * Reference: 0.10C-0.50Mn-0.05Si (wt%), prior austenite d_γ = 25 µm (ASTM G from it as a mean
 * lineal intercept, for the Li kinetics), no retained strain. Critical temperatures: Andrews 7-term
 * Ae3, Andrews Ae1 and Ms, Li Bs (critical-temperatures.ts). Kinetics: Li et al. (1998) through
 * AusteniteDecomposition with time scales 1. Each path cools one node from 900 °C at a constant rate
 * in steps of 0.25 K down to 400 °C.
 *
 * Fit: N_V ∝ K₁, so for each K₂ the K₁ that matches the empirical size exactly at 10 K/s follows in
 * closed form; K₂ then minimises Σ ln²(L̄_mech/d_HG) over 1, 2, 5, 10, 20, 50 K/s (golden-section
 * search in log K₂ after a coarse scan). The printed lines are copied into the header of
 * ferrite-nucleation.ts.
 */
import { pathToFileURL } from "node:url";
import { fullComposition, type Composition } from "../src/physics/composition.js";
import { criticalTemperatures } from "../src/physics/critical-temperatures.js";
import { astmGrainNumber } from "../src/physics/astm-grain.js";
import { AusteniteDecomposition } from "../src/physics/austenite-decomposition.js";
import { FERRITE } from "../src/physics/phases.js";
import { FerriteNucleation } from "../src/physics/ferrite-nucleation.js";
import { carbonEquivalentHG, hodgsonGibbsFerriteGrain_um } from "../src/physics/ferrite-grain.js";

/** The reference steel of the calibration [wt%]. */
export const REFERENCE_STEEL: Composition = fullComposition({ C: 0.1, Mn: 0.5, Si: 0.05 });
/** Prior austenite grain size of the calibration [µm]. */
export const REFERENCE_AUSTENITE_GRAIN_um = 25;
/** Cooling rates of the fit [K/s]. */
export const CALIBRATION_RATES_K_s = [1, 2, 5, 10, 20, 50] as const;
/** Rate at which the fit is exact [K/s]. */
export const ANCHOR_RATE_K_s = 10;

const START_K = 900 + 273.15;
const END_K = 400 + 273.15;
const STEP_K = 0.25;

/** Ae3 (Andrews 7-term) of a steel [K], the temperature above which nothing nucleates. */
export function andrewsAe3_K(steel: Composition): number {
  return criticalTemperatures(steel, { ae3: "andrews", bs: "li" }).Ae3_C + 273.15;
}

/**
 * Cools one node of `steel` at a constant rate with the Li kinetics and the nucleation model, and
 * returns the final ferrite fraction and mean linear intercept [µm] (null without ferrite).
 */
export function mechanisticGrainAtConstantRate(steel: Composition, austeniteGrain_um: number, rate_K_s: number, K1: number, K2: number): { ferrite: number; intercept_um: number | null } {
  const crit = criticalTemperatures(steel, { ae3: "andrews", bs: "li" });
  const decomposition = new AusteniteDecomposition(
    { composition: steel, astmGrainNumber: astmGrainNumber(austeniteGrain_um), critical: crit, timeScale: { ferrite: 1, pearlite: 1, bainite: 1 }, kinetics: { kind: "li1998" } },
    1,
  );
  const nucleation = new FerriteNucleation(1, { carbon_wt: steel.C, austeniteGrain_um, K1, K2, ae3_K: crit.Ae3_C + 273.15 });
  const T_old = new Float64Array(1);
  const T_new = new Float64Array(1);
  const T_mid = new Float64Array(1);
  const dt_s = STEP_K / rate_K_s;
  for (let T = START_K; T > END_K; T -= STEP_K) {
    T_old[0] = T;
    T_new[0] = T - STEP_K;
    T_mid[0] = T - 0.5 * STEP_K;
    decomposition.advance(T_old, T_new, dt_s);
    nucleation.step(T_mid, decomposition.normalisedFerrite, dt_s);
    decomposition.accept();
  }
  const ferrite = decomposition.current[FERRITE][0];
  return { ferrite, intercept_um: nucleation.meanIntercept_um(0, ferrite) };
}

/** Empirical (Hodgson–Gibbs) grain size of `steel` at a constant cooling rate [µm]. */
export function empiricalGrain_um(steel: Composition, austeniteGrain_um: number, rate_K_s: number): number {
  return hodgsonGibbsFerriteGrain_um({ carbonEquivalent: carbonEquivalentHG(steel), coolingRate_K_s: rate_K_s, austeniteGrain_um, retainedStrain: 0 }).grain_um;
}

interface Trial {
  K1: number;
  K2: number;
  misfit: number;
  ratios: number[];
}

/** K₁ exact at the anchor rate for a given K₂, and the resulting misfit over all rates. */
function trial(K2: number): Trial {
  const probe = mechanisticGrainAtConstantRate(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, ANCHOR_RATE_K_s, 1, K2);
  if (probe.intercept_um === null) return { K1: NaN, K2, misfit: Infinity, ratios: [] };
  // L̄ ∝ K₁^(−1/3): scale K₁ so the anchor matches exactly.
  const K1 = (probe.intercept_um / empiricalGrain_um(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, ANCHOR_RATE_K_s)) ** 3;
  let misfit = 0;
  const ratios: number[] = [];
  for (const rate of CALIBRATION_RATES_K_s) {
    const mech = mechanisticGrainAtConstantRate(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, rate, K1, K2).intercept_um;
    if (mech === null) return { K1, K2, misfit: Infinity, ratios: [] };
    const ratio = mech / empiricalGrain_um(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, rate);
    ratios.push(ratio);
    misfit += Math.log(ratio) ** 2;
  }
  return { K1, K2, misfit, ratios };
}

function calibrate(): Trial {
  // Coarse scan in log10 K₂, then golden-section refinement around the best point.
  let best = trial(1e-6);
  for (let e = -7; e <= 0; e += 0.25) {
    const t = trial(10 ** e);
    if (t.misfit < best.misfit) best = t;
  }
  let lo = Math.log10(best.K2) - 0.25;
  let hi = Math.log10(best.K2) + 0.25;
  const g = (Math.sqrt(5) - 1) / 2;
  let a = hi - g * (hi - lo);
  let b = lo + g * (hi - lo);
  let ta = trial(10 ** a);
  let tb = trial(10 ** b);
  while (hi - lo > 1e-4) {
    if (ta.misfit < tb.misfit) {
      hi = b;
      b = a;
      tb = ta;
      a = hi - g * (hi - lo);
      ta = trial(10 ** a);
    } else {
      lo = a;
      a = b;
      ta = tb;
      b = lo + g * (hi - lo);
      tb = trial(10 ** b);
    }
  }
  return ta.misfit < tb.misfit ? ta : tb;
}

function main(): void {
  const fit = calibrate();
  console.log(`reference 0.10C-0.50Mn-0.05Si, d_γ ${REFERENCE_AUSTENITE_GRAIN_um} µm, Ae3 ${(andrewsAe3_K(REFERENCE_STEEL) - 273.15).toFixed(1)} °C, Li kinetics`);
  console.log(`K1 = ${fit.K1.toExponential(5)} K^½/m⁴, K2 = ${fit.K2.toExponential(5)} J³/m⁶, rms ln-misfit ${Math.sqrt(fit.misfit / CALIBRATION_RATES_K_s.length).toFixed(4)}`);
  console.log("rate K/s | ferrite | L̄ mechanistic µm | d Hodgson–Gibbs µm | ratio");
  for (const rate of CALIBRATION_RATES_K_s) {
    const mech = mechanisticGrainAtConstantRate(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, rate, fit.K1, fit.K2);
    const emp = empiricalGrain_um(REFERENCE_STEEL, REFERENCE_AUSTENITE_GRAIN_um, rate);
    console.log(`${String(rate).padStart(8)} | ${mech.ferrite.toFixed(3)} | ${(mech.intercept_um ?? NaN).toFixed(2).padStart(16)} | ${emp.toFixed(2).padStart(18)} | ${((mech.intercept_um ?? NaN) / emp).toFixed(3)}`);
  }
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) main();
