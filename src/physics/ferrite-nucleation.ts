/**
 * Mechanistic ferrite grain size: grain-boundary nucleation integrated along each node's cooling
 * path, giving the ferrite grain density N_V and from it the mean linear intercept.
 *
 * Classical nucleation on austenite grain boundaries (Suehiro et al., Trans. ISIJ 27 (1987) 439;
 * Umemoto et al., ISIJ Int. 32 (1992) 306 — both from memory):
 *
 *   I(T)  = K₁ T^−½ D_C(T) exp[−K₂ / (k_B T ΔG_v²)]         [nuclei/(m² s)]
 *   N_V  += I(T_mid) · S_V · (1 − Y_old) · Δt               [1/m³]   (explicit in Y, midpoint in T)
 *   S_V   = 3.35 / d_γ                                       [1/m]
 *   L̄     = 0.753 (X_F / N_V)^⅓                             [m]
 *
 * - ΔG_v = ΔG_m / V_m [J/m³], ΔG_m from the dilute Fe–C driving force of sgte-iron.ts (SGTE,
 *   Dinsdale 1991) at the bulk carbon content (the carbon enrichment of the remaining austenite is
 *   neglected; the (1 − Y) factor carries the end of nucleation), or a user override ΔG(T).
 *   No nucleation where ΔG_m ≥ 0 or above the steel's Ae3 when one is given.
 * - D_C: carbon diffusivity in austenite, Ågren, Scripta Metall. 20 (1986) 1507 [from memory]:
 *     D_C = 4.53e−7 (1 + y(1 − y) 8339.9/T) exp[−(1/T − 2.221e−4)(17767 − 26436 y)]  [m²/s],
 *     y = x_C/(1 − x_C) (carbon site fraction); validity ≈ 1000–1400 K, y ≤ 0.1 (from memory),
 *     extrapolated below 1000 K here.
 * - S_V = 3.35/d_γ: boundary area per volume of tetrakaidecahedral grains whose opposite square
 *   faces are d_γ apart [calc: S_V = (6 + 12√3)/(16√2 a) with d_γ = 2√2 a]. Reading d_γ as a mean
 *   lineal intercept instead (S_V = 2/d_γ) would only rescale K₁, which is fitted. L̄ = 0.753 V̄^⅓ is
 *   the mean linear intercept of tetrakaidecahedra of volume V̄ = X_F/N_V [calc: L̄ = 4V/S].
 * - Y = normalised ferrite fraction (0 → 1): nucleation only on untransformed boundary area.
 *
 * Calibration of K₁ [K^½/m⁴] and K₂ [J³/m⁶]: fitted with scripts/calibrate-nucleation.ts so that the
 * mechanistic route reproduces the empirical Hodgson–Gibbs relation (ferrite-grain.ts) for the
 * reference steel 0.10C-0.50Mn-0.05Si, d_γ = 25 µm, cooled at constant rate with the Li et al.
 * (1998) kinetics (AusteniteDecomposition, Andrews Ae3), exactly at 10 K/s and in the least-squares
 * sense over 1–50 K/s, with nucleation cut off above the Andrews Ae3 (pass the same `ae3_K` when
 * using the defaults, or the calibration does not apply). Output of the script (recorded here):
 *
 *   reference 0.10C-0.50Mn-0.05Si, d_γ 25 µm, Ae3 848.0 °C, Li kinetics
 *   K1 = 1.47842e+23 K^½/m⁴, K2 = 1.18626e-5 J³/m⁶, rms ln-misfit 0.0985
 *   rate K/s | ferrite | L̄ mechanistic µm | d Hodgson–Gibbs µm | ratio
 *          1 | 0.893 |            22.99 |              21.03 | 1.093
 *          2 | 0.893 |            17.13 |              17.11 | 1.001
 *          5 | 0.893 |            13.22 |              13.63 | 0.970
 *         10 | 0.893 |            11.88 |              11.88 | 1.000
 *         20 | 0.893 |            11.42 |              10.64 | 1.074
 *         50 | 0.875 |            11.77 |               9.54 | 1.234
 *
 * The fitted form cannot follow the empirical Ṫ^−½ law everywhere: with the fast Li ferrite
 * kinetics of this lean steel the barrier term is nearly saturated above ≈ 20 K/s, so the
 * mechanistic size levels off (11.4 → 11.8 µm from 20 to 50 K/s) while the empirical one keeps
 * falling. Agreement band over 1–50 K/s: −3 % to +24 %.
 *
 * Known limitation — prior austenite grain size: the Li kinetics slow down for coarser austenite
 * (2^(0.41G)), the transformation moves a few kelvin lower, and near Ae3 the barrier term is so
 * sensitive that the extra nucleation per boundary area outweighs the loss of boundary area. The
 * mechanistic size therefore grows with d_γ only from ≈ 20 K/s upwards; below ≈ 15 K/s it is
 * reversed (at 1 K/s, d_γ 15/25/50 µm → 28.3/23.3/18.9 µm, against Hodgson–Gibbs 18.6/21.0/25.8).
 * No single K₂ gives both trends: at 1 K/s the d_γ trend needs K₂ ≤ 5e−6 J³/m⁶, the cooling-rate
 * trend K₂ ≥ 1e−5 (scanned 1e−7 to 1e−2, also with 10× and 30× slower Li ferrite kinetics).
 * Prefer the empirical relation for slowly cooled material.
 *
 * Validity: C–Mn ferrite–pearlite steels near the reference composition; ferrite nucleation only
 * (Widmanstätten, bainite and pearlite grains are not counted).
 */
import { carbonMoleFraction, ferriteDrivingForce_Jmol } from "./sgte-iron.js";
import { FERRITE_MOLAR_VOLUME_m3_mol, ModelInputError } from "./grain-floor.js";

/** Boltzmann constant [J/K] (SI 2019, exact). */
export const BOLTZMANN_J_K = 1.380649e-23;
/** Boundary area per volume of tetrakaidecahedral grains times d_γ [–] [calc]. */
export const TETRAKAIDECAHEDRON_SV_TIMES_D = 3.35;
/** Mean linear intercept over the cube root of grain volume for tetrakaidecahedra [–] [calc]. */
export const TETRAKAIDECAHEDRON_INTERCEPT_PER_CUBE_ROOT_VOLUME = 0.753;

/** Default K₁ [K^½/m⁴] from scripts/calibrate-nucleation.ts (see the file header). */
export const DEFAULT_NUCLEATION_K1 = 1.47842e23;
/** Default K₂ [J³/m⁶] from scripts/calibrate-nucleation.ts (see the file header). */
export const DEFAULT_NUCLEATION_K2 = 1.18626e-5;

// Temperature table of the rate: 300–1300 K in 0.05 K steps. Below 300 K carbon does not move on
// the time scale of cooling (D_C < 1e−30 m²/s); above 1300 K austenite is stable for any carbon
// content (pure-iron A3 = 1184.8 K), so the rate is taken as 0 outside the table.
const TABLE_MIN_K = 300;
const TABLE_MAX_K = 1300;
const TABLE_STEP_K = 0.05;
const TABLE_INTERVALS = Math.round((TABLE_MAX_K - TABLE_MIN_K) / TABLE_STEP_K);

/**
 * Carbon diffusivity in austenite [m²/s] (Ågren 1986, from memory; formula in the file header).
 * @param T_K temperature [K]; @param carbon_wt carbon [wt%].
 */
export function carbonDiffusivityAustenite_m2_s(T_K: number, carbon_wt: number): number {
  const x = carbonMoleFraction(carbon_wt);
  const y = x / (1 - x);
  return 4.53e-7 * (1 + (y * (1 - y) * 8339.9) / T_K) * Math.exp(-(1 / T_K - 2.221e-4) * (17767 - 26436 * y));
}

export interface FerriteNucleationSetup {
  /** Bulk carbon content [wt%]. */
  readonly carbon_wt: number;
  /** Prior austenite grain size d_γ [µm] (distance between square faces of the tetrakaidecahedron). */
  readonly austeniteGrain_um: number;
  /** Pre-factor K₁ [K^½/m⁴]; default {@link DEFAULT_NUCLEATION_K1}. */
  readonly K1?: number;
  /** Barrier constant K₂ [J³/m⁶]; default {@link DEFAULT_NUCLEATION_K2}. */
  readonly K2?: number;
  /** Ae3 of the steel [K]: no nucleation above it (the binary ΔG ignores substitutional alloying). */
  readonly ae3_K?: number;
  /** Override of ΔG_m(T) [J/mol] (negative where ferrite can form); default the dilute Fe–C value. */
  readonly drivingForce_Jmol?: (T_K: number) => number;
}

/**
 * Grain-boundary nucleation rate I(T) [nuclei/(m² s)] (formula in the file header), evaluated
 * directly; 0 where ΔG_m ≥ 0. For hot loops use {@link FerriteNucleation}, which tabulates it.
 */
export function ferriteNucleationRate_m2s(T_K: number, carbon_wt: number, K1: number, K2: number, drivingForce_Jmol: (T_K: number) => number = (T) => ferriteDrivingForce_Jmol(T, carbon_wt)): number {
  const dG = drivingForce_Jmol(T_K);
  if (!(dG < 0)) return 0;
  const dGv = dG / FERRITE_MOLAR_VOLUME_m3_mol;
  return (K1 / Math.sqrt(T_K)) * carbonDiffusivityAustenite_m2_s(T_K, carbon_wt) * Math.exp(-K2 / (BOLTZMANN_J_K * T_K * dGv * dGv));
}

/**
 * Ferrite grain density per node, integrated step by step along the cooling path, and the mean
 * linear intercept it implies. The constructor tabulates I(T)·S_V [1/(m³ s)] on a 0.05 K grid
 * (linear interpolation; relative error < 5e−4 wherever the rate exceeds 1e−6 of its peak and
 * < 1e−4 above 1e−3 of it, so < 2e−4 in L̄ ∝ N_V^−⅓); step() is allocation-free.
 */
export class FerriteNucleation {
  /** Ferrite grain (nucleus) density per node [1/m³]. */
  readonly grainDensity_m3: Float64Array;
  /** I(T)·S_V on the temperature grid [1/(m³ s)]. */
  private readonly volumeRate: Float64Array;

  constructor(
    readonly nodes: number,
    setup: FerriteNucleationSetup,
  ) {
    if (!(Number.isInteger(nodes) && nodes > 0)) throw new ModelInputError("ferrite nucleation", "nodes", "a positive integer", nodes);
    if (!(setup.austeniteGrain_um > 0)) throw new ModelInputError("ferrite nucleation", "austeniteGrain_um", "> 0 µm", setup.austeniteGrain_um);
    if (!(setup.carbon_wt >= 0 && setup.carbon_wt < 2)) throw new ModelInputError("ferrite nucleation", "carbon_wt", "in [0, 2) wt%", setup.carbon_wt);
    const K1 = setup.K1 ?? DEFAULT_NUCLEATION_K1;
    const K2 = setup.K2 ?? DEFAULT_NUCLEATION_K2;
    if (!(K1 > 0)) throw new ModelInputError("ferrite nucleation", "K1", "> 0 K^½/m⁴", K1);
    if (!(K2 > 0)) throw new ModelInputError("ferrite nucleation", "K2", "> 0 J³/m⁶", K2);
    this.grainDensity_m3 = new Float64Array(nodes);
    const boundaryArea_m2_m3 = TETRAKAIDECAHEDRON_SV_TIMES_D / (setup.austeniteGrain_um * 1e-6);
    const ae3_K = setup.ae3_K ?? Infinity;
    const carbon = setup.carbon_wt;
    const dG = setup.drivingForce_Jmol ?? ((T: number) => ferriteDrivingForce_Jmol(T, carbon));
    this.volumeRate = new Float64Array(TABLE_INTERVALS + 1);
    for (let i = 0; i <= TABLE_INTERVALS; i++) {
      const T = TABLE_MIN_K + i * TABLE_STEP_K;
      this.volumeRate[i] = T > ae3_K ? 0 : boundaryArea_m2_m3 * ferriteNucleationRate_m2s(T, carbon, K1, K2, dG);
    }
  }

  /** Clears the grain densities (a new strip). */
  reset(): void {
    this.grainDensity_m3.fill(0);
  }

  /** I(T)·S_V [1/(m³ s)] by linear interpolation in the table; 0 outside 300–1300 K. */
  volumeRateAt(T_K: number): number {
    const q = (T_K - TABLE_MIN_K) / TABLE_STEP_K;
    if (!(q >= 0) || q > TABLE_INTERVALS) return 0;
    let i = Math.floor(q);
    if (i === TABLE_INTERVALS) i--;
    const t = q - i;
    return this.volumeRate[i] + t * (this.volumeRate[i + 1] - this.volumeRate[i]);
  }

  /**
   * Advances N_V by one step: N_V[n] += I(T_mid[n]) S_V (1 − Y_old[n]) Δt (explicit in Y, first order;
   * T at the step midpoint). Y outside [0, 1] is treated as its nearest bound (round-off guard).
   * @param T_mid_K step-midpoint temperature per node [K]
   * @param normalisedFerriteOld Y at the start of the step per node [–]
   * @param dt_s step [s]
   */
  step(T_mid_K: Float64Array, normalisedFerriteOld: Float64Array, dt_s: number): void {
    const density = this.grainDensity_m3;
    for (let n = 0; n < this.nodes; n++) {
      const Y = normalisedFerriteOld[n];
      const untransformed = Y >= 1 ? 0 : Y <= 0 ? 1 : 1 - Y;
      if (untransformed === 0) continue;
      density[n] += this.volumeRateAt(T_mid_K[n]) * untransformed * dt_s;
    }
  }

  /**
   * Ferrite mean linear intercept L̄ = 0.753 (X_F/N_V)^⅓ of a node [µm], or null when no ferrite
   * formed there (X_F ≤ 0 or N_V ≤ 0).
   * @param ferriteFraction actual ferrite volume fraction X_F of the node [–]
   */
  meanIntercept_um(node: number, ferriteFraction: number): number | null {
    const density = this.grainDensity_m3[node];
    if (!(ferriteFraction > 0) || !(density > 0)) return null;
    return TETRAKAIDECAHEDRON_INTERCEPT_PER_CUBE_ROOT_VOLUME * Math.cbrt(ferriteFraction / density) * 1e6;
  }
}
