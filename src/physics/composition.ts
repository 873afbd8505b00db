/**
 * Steel composition in mass percent (wt%), and the warnings that models raise when an input lies
 * outside the range their authors fitted.
 *
 * Every element the models know is present; missing ones are 0. Units: wt% throughout.
 */

/** Elements accepted in a case file (wt%). */
export const ELEMENTS = ["C", "Mn", "Si", "Ni", "Cr", "Mo", "Cu", "P", "Al", "V", "Ti", "Nb", "N", "W", "As", "Co", "B", "S"] as const;
export type Element = (typeof ELEMENTS)[number];

/** Full composition [wt%]; every element present, zero when absent. */
export type Composition = Readonly<Record<Element, number>>;

/** Fills the missing elements of a partial composition with 0. */
export function fullComposition(partial: Partial<Record<Element, number>>): Composition {
  const out = {} as Record<Element, number>;
  for (const e of ELEMENTS) out[e] = partial[e] ?? 0;
  return out;
}

/**
 * A model input outside the model's published validity range. The run goes on; the CLI prints
 * the warning and the summary lists it. Never clamp silently.
 */
export interface ValidityWarning {
  readonly kind: "validity";
  /** Model name with its source, e.g. "Andrews Ae3 (1965)". */
  readonly model: string;
  /** What lies outside, e.g. "C" or "cooling rate". */
  readonly quantity: string;
  readonly value: number;
  readonly min: number;
  readonly max: number;
  readonly unit: string;
}

/** Pushes a warning for each element outside its [min, max] range. */
export function checkRanges(
  model: string,
  composition: Composition,
  ranges: Partial<Record<Element, readonly [number, number]>>,
  out: ValidityWarning[],
): ValidityWarning[] {
  for (const e of ELEMENTS) {
    const r = ranges[e];
    if (!r) continue;
    const v = composition[e];
    if (v < r[0] || v > r[1]) out.push({ kind: "validity", model, quantity: e, value: v, min: r[0], max: r[1], unit: "wt%" });
  }
  return out;
}

/** One line describing a warning, for terminals and summary files. */
export function describeWarning(w: ValidityWarning): string {
  return `${w.model}: ${w.quantity} = ${w.value} ${w.unit} lies outside the fitted range ${w.min}–${w.max} ${w.unit}; result is an extrapolation`;
}
