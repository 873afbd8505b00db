/**
 * Thermodynamic floor of the ferrite grain size: the finest grain structure a transformation can
 * pay for with its chemical driving force.
 *
 * A grain structure of mean linear intercept L̄ carries boundary area S_V = 2/L̄ per unit volume
 * (stereology, S_V = 2 P_L; Smith & Guttman 1953, from memory), hence stores σ S_V = 2σ/L̄ [J/m³].
 * A transformation releasing at most
 * |ΔG_m|/V_m [J/m³] can therefore not make grains finer than
 *
 *   L̄_min = 2 σ V_m / |ΔG_m|    [m]
 *
 * (physics.md §7 [calc]). σ = high-angle boundary energy [J/m²] (≈ 0.5–0.8 for ferrite, from
 * memory — a parameter), V_m = molar volume of ferrite [m³/mol], 7.1e−6 from the bcc lattice
 * parameter a ≈ 2.866 Å (V_m = N_A a³/2). Validity: wherever ΔG_m < 0; the floor diverges at the
 * equilibrium temperature and is only a lower bound — real grains are 2–3 orders coarser.
 */
import { ferriteDrivingForce_Jmol } from "./sgte-iron.js";

/** Molar volume of ferrite [m³/mol], from a ≈ 2.866 Å (physics.md §2). */
export const FERRITE_MOLAR_VOLUME_m3_mol = 7.1e-6;
/** Default high-angle grain-boundary energy of ferrite [J/m²] (0.5–0.8, from memory). */
export const DEFAULT_BOUNDARY_ENERGY_J_m2 = 0.5;

/**
 * An input a model cannot evaluate (not merely outside its fitted range — that is a
 * ValidityWarning). Thrown as a value carrying the field, the expectation and the offending value;
 * the CLI renders it as one line and exits with status 2.
 */
export class ModelInputError extends Error {
  readonly kind = "input" as const;
  constructor(
    /** Model that refused the input, e.g. "grain-size floor". */
    readonly model: string,
    /** Input field name, with its unit suffix, e.g. "drivingForce_Jmol". */
    readonly field: string,
    /** What was expected, e.g. "< 0 J/mol". */
    readonly expected: string,
    /** The value received. */
    readonly value: number,
  ) {
    super(`${model}: ${field} = ${value} is invalid; expected ${expected}`);
    this.name = "ModelInputError";
  }
}

/**
 * Thermodynamic floor of the ferrite mean linear intercept, L̄_min = 2σV_m/|ΔG_m|, in nm.
 *
 * @param drivingForce_Jmol ΔG_m of austenite → ferrite [J/mol]; must be < 0 (ferrite can form).
 * @param interfaceEnergy_J_m2 boundary energy σ [J/m²]; must be > 0.
 * @param molarVolume_m3_mol V_m [m³/mol]; default 7.1e−6 (ferrite); must be > 0.
 * @throws ModelInputError when ΔG_m ≥ 0, σ ≤ 0 or V_m ≤ 0 (or any is not finite).
 */
export function grainFloor_nm(drivingForce_Jmol: number, interfaceEnergy_J_m2: number, molarVolume_m3_mol: number = FERRITE_MOLAR_VOLUME_m3_mol): number {
  if (!(drivingForce_Jmol < 0) || !Number.isFinite(drivingForce_Jmol)) {
    throw new ModelInputError("grain-size floor", "drivingForce_Jmol", "< 0 J/mol (ferrite thermodynamically possible)", drivingForce_Jmol);
  }
  if (!(interfaceEnergy_J_m2 > 0) || !Number.isFinite(interfaceEnergy_J_m2)) {
    throw new ModelInputError("grain-size floor", "interfaceEnergy_J_m2", "> 0 J/m²", interfaceEnergy_J_m2);
  }
  if (!(molarVolume_m3_mol > 0) || !Number.isFinite(molarVolume_m3_mol)) {
    throw new ModelInputError("grain-size floor", "molarVolume_m3_mol", "> 0 m³/mol", molarVolume_m3_mol);
  }
  const floor_m = (2 * interfaceEnergy_J_m2 * molarVolume_m3_mol) / -drivingForce_Jmol;
  return floor_m * 1e9;
}

/**
 * The floor for a steel of carbon content carbon_wt [wt%] transforming at T_K [K], with ΔG_m from
 * the dilute Fe–C driving force of sgte-iron.ts (SGTE, Dinsdale 1991). Substitutional alloying is
 * ignored there, so |ΔG| is an upper bound and this floor a lower bound for Mn steels.
 * Validity: 298.15–1811 K, carbon ≤ about 0.8 wt%.
 *
 * @throws ModelInputError when ferrite cannot form at T_K (ΔG_m ≥ 0, i.e. above the binary A3).
 */
export function grainFloorAt_nm(T_K: number, carbon_wt: number, interfaceEnergy_J_m2: number = DEFAULT_BOUNDARY_ENERGY_J_m2, molarVolume_m3_mol: number = FERRITE_MOLAR_VOLUME_m3_mol): number {
  return grainFloor_nm(ferriteDrivingForce_Jmol(T_K, carbon_wt), interfaceEnergy_J_m2, molarVolume_m3_mol);
}
