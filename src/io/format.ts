/**
 * Fixed-precision number formatting for result files, so that the same case gives byte-identical
 * files. Precision (decimal places): time 4, temperature 3 (°C), position 3 (m), fractions 6,
 * grain size 3 (µm), strength and hardness 1, everything else 6 significant digits.
 */
export const DECIMALS = {
  time_s: 4,
  T_C: 3,
  position_m: 3,
  fraction: 6,
  grain_um: 3,
  strength: 1,
  K: 3,
} as const;

/** Fixed decimals; never "-0.000". */
export function fixed(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return String(v); // NaN or Infinity stays visible, never blank

  const s = v.toFixed(decimals);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/** Rounds to fixed decimals and returns a number (for JSON). */
export function round(v: number, decimals: number): number {
  if (!Number.isFinite(v)) return v; // JSON writes null: visible, never a silent 0
  const r = Number(fixed(v, decimals));
  return Object.is(r, -0) ? 0 : r;
}

/** Six significant digits, as a number (for JSON). */
export function significant(v: number, digits = 6): number {
  if (v === 0 || !Number.isFinite(v)) return v;
  return Number(v.toPrecision(digits));
}

/** Column-aware formatter: picks the precision from the column name. */
export function decimalsForColumn(name: string): number {
  if (name === "time_s") return DECIMALS.time_s;
  if (name.startsWith("T_") || name.endsWith("_C")) return DECIMALS.T_C;
  if (name.startsWith("position") || name.endsWith("_m")) return DECIMALS.position_m;
  if (name.includes("grain") || name.endsWith("_um")) return DECIMALS.grain_um;
  if (name.endsWith("_MPa") || name.endsWith("_HV")) return DECIMALS.strength;
  if (name.endsWith("_K") || name.endsWith("_K_s")) return DECIMALS.K;
  return DECIMALS.fraction;
}
