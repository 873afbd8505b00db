/**
 * Yield and tensile strength of ferrite–pearlite steel from composition, free nitrogen, ferrite
 * grain size and pearlite fraction: Pickering (1978).
 *
 *   YS = 53.9 + 32.3 Mn + 83.2 Si + 354 N_f^½ + 17.4 d^−½                    [MPa]
 *   TS = 294 + 27.7 Mn + 83.2 Si + 3.85 (% pearlite) + 7.7 d^−½                [MPa]
 *
 * Mn, Si, N_f (free, i.e. uncombined, nitrogen) in wt%; d = ferrite mean linear intercept in mm
 * (Hall–Petch: k_y = 17.4 MPa·mm^½ = 0.55 MPa·m^½).
 * Source: F.B. Pickering, Physical Metallurgy and the Design of Steels, Applied Science (1978)
 * [full equations from memory]; the solid-solution coefficients agree with Pickering & Gladman as
 * tabulated in Llewellyn & Hudd, Steels: Metallurgy and Applications, Table 2.1 (Mn 32, Si 83 MPa
 * per wt%) [pub]. Validity: air-cooled or accelerated-cooled ferrite–pearlite C–Mn steels; the
 * published composition and grain-size range is not confirmed here, so no range warning is raised.
 */
import type { Composition } from "./composition.js";
import { ModelInputError } from "./grain-floor.js";

const MODEL = "Pickering ferrite–pearlite strength (1978)";

/** Hall–Petch coefficient of the Pickering yield equation [MPa·mm^½] (= 0.55 MPa·m^½). */
export const PICKERING_HALL_PETCH_MPa_mm05 = 17.4;

export interface PickeringInput {
  readonly composition: Composition;
  /** Free (uncombined) nitrogen [wt%], ≥ 0. */
  readonly freeNitrogen_wt: number;
  /** Ferrite mean linear intercept [µm], > 0. */
  readonly ferriteIntercept_um: number;
  /** Pearlite volume fraction [–], in [0, 1]. */
  readonly pearliteFraction: number;
}

export interface Strength {
  /** Lower yield strength [MPa]. */
  readonly yield_MPa: number;
  /** Tensile strength [MPa]. */
  readonly tensile_MPa: number;
}

/**
 * Yield and tensile strength [MPa] by Pickering (1978), formulas in the file header.
 * @throws ModelInputError for a non-positive grain size, negative free nitrogen, or a pearlite
 *   fraction outside [0, 1].
 */
export function pickeringStrength(input: PickeringInput): Strength {
  const { composition: c, freeNitrogen_wt: nFree, ferriteIntercept_um: d_um, pearliteFraction: fP } = input;
  if (!(d_um > 0) || !Number.isFinite(d_um)) throw new ModelInputError(MODEL, "ferriteIntercept_um", "> 0 µm", d_um);
  if (!(nFree >= 0)) throw new ModelInputError(MODEL, "freeNitrogen_wt", ">= 0 wt%", nFree);
  if (!(fP >= 0 && fP <= 1)) throw new ModelInputError(MODEL, "pearliteFraction", "in [0, 1]", fP);
  const inverseRootD = 1 / Math.sqrt(d_um * 1e-3); // d in mm
  const yield_MPa = 53.9 + 32.3 * c.Mn + 83.2 * c.Si + 354 * Math.sqrt(nFree) + PICKERING_HALL_PETCH_MPa_mm05 * inverseRootD;
  const tensile_MPa = 294 + 27.7 * c.Mn + 83.2 * c.Si + 3.85 * (100 * fP) + 7.7 * inverseRootD;
  return { yield_MPa, tensile_MPa };
}
