/**
 * ASTM E112 grain-size number G ↔ mean lineal intercept ℓ.
 *
 *   G = −6.643856·log10(ℓ_mm) − 3.288          (ℓ in mm)
 *
 * ASTM E112 (Standard Test Methods for Determining Average Grain Size), the relation behind its
 * table of grain-size relationships for the intercept method — from memory, not checked against
 * the standard's current edition. 6.643856 = 2/log10 2, so ℓ halves for every two G numbers,
 * consistent with E112's definition N_100 = 2^(G−1) grains per in² at 100× (areal density ∝ ℓ⁻²).
 * E112 tabulates G from 00 to 14 (ℓ ≈ 0.45 mm down to 2.5 µm, from memory); the relation itself is
 * a definition and holds for any ℓ > 0. For equiaxed grains only; ℓ is the mean lineal intercept,
 * not an equivalent-circle diameter (those differ by a shape factor).
 */

/** Slope of E112's intercept relation, 2/log10 2 [–]. */
const E112_SLOPE = 6.643856;
/** Offset of E112's intercept relation for ℓ in mm [–]. */
const E112_OFFSET = 3.288;

/**
 * ASTM E112 grain-size number G [–] from the mean lineal intercept ℓ [µm]:
 * G = −6.643856·log10(ℓ/1000) − 3.288. Throws RangeError unless ℓ is finite and positive.
 */
export function astmGrainNumber(meanIntercept_um: number): number {
  if (!(meanIntercept_um > 0 && Number.isFinite(meanIntercept_um))) throw new RangeError(`mean intercept must be a positive length in µm, got ${meanIntercept_um}`);
  return -E112_SLOPE * Math.log10(meanIntercept_um / 1000) - E112_OFFSET;
}

/**
 * Mean lineal intercept ℓ [µm] of ASTM E112 grain-size number G [–], the inverse of
 * {@link astmGrainNumber}: ℓ = 1000·10^(−(G + 3.288)/6.643856). Throws RangeError unless G is finite.
 */
export function meanInterceptFromAstm_um(G: number): number {
  if (!Number.isFinite(G)) throw new RangeError(`ASTM grain-size number must be finite, got ${G}`);
  return 1000 * 10 ** (-(G + E112_OFFSET) / E112_SLOPE);
}
