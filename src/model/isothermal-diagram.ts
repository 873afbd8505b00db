/**
 * Isothermal transformation (TTT) times of the diffusional products of a steel, under the same
 * kinetics, critical temperatures and time scales the cooling solver uses (austenite-
 * decomposition.ts): for each product, the time an isothermal hold at T needs to reach 1 % and
 * 99 % of that product's normalised fraction Y.
 *
 * Li et al. (1998) kinetics (physics.md §5.1):
 *   τ(X, T) = scale · factor · S(X) / [2^(a G) ΔT^m exp(−Q/RT)],   τ(0.99)/τ(0.01) = 18.664
 * with ΔT = Ae3 − T (ferrite), Ae1 − T (pearlite), Bs − T (bainite).
 * Table kinetics (physics.md §5.3): the JMAK curve through the user's start/finish times, n and
 * ln k interpolated linearly in T between rows, t(Y) = [−ln(1 − Y)/k]^(1/n); at a table row and
 * with the table's own fractions this returns the row's times.
 *
 * Where a product forms (the solver's gates): ferrite for Bs < T < Ae3 when the steel has
 * equilibrium ferrite (hypo-eutectoid, Ae3 > Ae1); pearlite for Bs < T < Ae1; bainite below Bs;
 * table products only inside their table's temperature span. Elsewhere: null.
 *
 * What the diagram does not show: ferrite's amount is X_F = X_F,eq(T)·Y_F (lever rule), so its
 * times are those of Y_F; pearlite in the solver waits for the Hultgren criterion (carbon
 * enrichment by ferrite) and stops ferrite, so in a hypo-eutectoid steel its real start is later
 * than its own clock shown here; martensite is athermal (Koistinen–Marburger), not a time.
 */
import { AusteniteDecomposition, type DecompositionSetup } from "../physics/austenite-decomposition.js";
import type { ValidityWarning } from "../physics/composition.js";
import { jmakInterval, jmakTable, jmakTime_s, jmakWeight, type JmakTable } from "../physics/jmak.js";
import { liCompositionFactors, liIsothermalTime_s, type LiProduct } from "../physics/li1998.js";
import { KELVIN } from "./scenario.js";

/** The products with isothermal kinetics, in diagram order. */
export const DIAGRAM_PRODUCTS: readonly LiProduct[] = ["ferrite", "pearlite", "bainite"];

/** Normalised fraction at the diagram's start and finish [−]. */
export const DIAGRAM_START_FRACTION = 0.01;
export const DIAGRAM_FINISH_FRACTION = 0.99;

/** Isothermal times to the start and finish fractions [s]. */
export interface ProductTimes {
  readonly start_s: number;
  readonly finish_s: number;
}

export interface DiagramRow {
  readonly T_C: number;
  /** Per product; null where it cannot form at T_C. */
  readonly times: Readonly<Record<LiProduct, ProductTimes | null>>;
}

export interface IsothermalDiagram {
  readonly rows: DiagramRow[];
  /** The kinetics' validity warnings (e.g. composition outside Li's calibration). */
  readonly warnings: readonly ValidityWarning[];
}

/** Isothermal start/finish times of every product at each temperature [°C]. */
export function isothermalDiagram(setup: DecompositionSetup, temperatures_C: readonly number[]): IsothermalDiagram {
  const model = new AusteniteDecomposition(setup, 1);
  const timesOf = setup.kinetics.kind === "li1998" ? liTimes(setup) : tableTimes(setup);
  const rows = temperatures_C.map((T_C) => {
    const T_K = T_C + KELVIN;
    const forms = productsFormingAt(setup, model, T_K);
    const times = {} as Record<LiProduct, ProductTimes | null>;
    for (const p of DIAGRAM_PRODUCTS) times[p] = forms[p] ? timesOf(p, T_K) : null;
    return { T_C, times };
  });
  return { rows, warnings: model.warnings };
}

/** The solver's temperature gates for each product at T [K]. */
function productsFormingAt(setup: DecompositionSetup, model: AusteniteDecomposition, T_K: number): Record<LiProduct, boolean> {
  const Bs_K = setup.critical.Bs_C + KELVIN;
  return {
    ferrite: T_K > Bs_K && model.equilibriumFerrite(T_K) > 0,
    pearlite: T_K > Bs_K && T_K < setup.critical.Ae1_C + KELVIN,
    bainite: T_K < Bs_K,
  };
}

type TimesOf = (product: LiProduct, T_K: number) => ProductTimes | null;

function liTimes(setup: DecompositionSetup): TimesOf {
  const factors = liCompositionFactors(setup.composition);
  const G = setup.astmGrainNumber;
  const c = setup.critical;
  const top_C: Record<LiProduct, number> = { ferrite: c.Ae3_C, pearlite: c.Ae1_C, bainite: c.Bs_C };
  return (product, T_K) => {
    const factor = factors[product] * setup.timeScale[product];
    const undercooling = top_C[product] + KELVIN - T_K;
    return {
      start_s: liIsothermalTime_s(product, DIAGRAM_START_FRACTION, factor, G, undercooling, T_K),
      finish_s: liIsothermalTime_s(product, DIAGRAM_FINISH_FRACTION, factor, G, undercooling, T_K),
    };
  };
}

function tableTimes(setup: DecompositionSetup): TimesOf {
  const k = setup.kinetics;
  const tables: Record<LiProduct, JmakTable | null> = { ferrite: null, pearlite: null, bainite: null };
  if (k.kind === "table") {
    for (const p of DIAGRAM_PRODUCTS) {
      const curve = k[p];
      tables[p] = curve ? jmakTable(curve, setup.timeScale[p]) : null;
    }
  }
  return (product, T_K) => {
    const table = tables[product];
    if (table === null) return null;
    const i = jmakInterval(table, T_K);
    if (i < 0) return null;
    const w = jmakWeight(table, i, T_K);
    const n = table.n[i] + w * (table.n[i + 1] - table.n[i]);
    const lnk = table.lnk[i] + w * (table.lnk[i + 1] - table.lnk[i]);
    return { start_s: jmakTime_s(DIAGRAM_START_FRACTION, n, lnk), finish_s: jmakTime_s(DIAGRAM_FINISH_FRACTION, n, lnk) };
  };
}
