/**
 * Tolerance rules for comparing a re-run case with its blessed baseline. The rule for a quantity is
 * chosen from its NAME, never from a list of known fields, so quantities added to summary.json or
 * history.csv later are compared without touching this file. The units in the names
 * (`_C`, `_K`, `_s`, `_um`, `_MPa`, …) are the house convention that makes this possible.
 *
 * A quantity path is dotted with array items named by an identity key, e.g.
 * `final.T_C.top`, `depths[depth_mm=3].phases.ferrite`, `history[time_s=12.5].T_3mm_C`.
 * The segments are read from the leaf towards the root and the first segment that a rule
 * recognises decides (so `final.T_C.top` is a temperature because of `T_C`, and
 * `depths[depth_mm=3].phases.ferrite` a fraction because of `ferrite`).
 *
 * Default tolerances and why they have that size:
 *
 * | class       | recognised by                                  | rule                      |
 * |-------------|------------------------------------------------|---------------------------|
 * | ledger      | ends `relative_error`                          | now ≤ 1e-4                |
 * | rate        | ends `_K_s`                                    | 1 % relative              |
 * | temperature | ends `_C` or `_K`, or is `T_C`                 | 0.5 K absolute            |
 * | fraction    | a phase name, `phases`, `fractions`, `_fraction` | 0.005 absolute          |
 * | grain       | contains `grain`, or ends `_um`                | 1 % relative              |
 * | strength    | ends `_MPa` or `_HV`                           | 1 % relative              |
 * | time        | ends `_s`                                      | 0.05 s absolute           |
 * | position    | ends `_mm` or `_m`                             | 1e-6 absolute (own unit)  |
 * | other       | anything else (energies, counts)               | 0.1 % relative            |
 *
 * - 0.5 K: well above the 0.001 K printing resolution and the 1e-3 K Picard tolerance, well below
 *   the ≈ 5–20 K by which a real change of kinetics or boundary law moves a cooling curve.
 * - 0.005 fraction: half a percent of phase, far below what a metallographer can resolve
 *   (common practice (no source): point counting is good to about ±2 %), far above the 1e-6 print.
 * - 1 % grain and strength: the empirical grain-size and strength formulas scatter by ±10 % or more
 *   against their data, so 1 % only catches code changes, not model noise.
 * - 0.05 s: five output steps of 0.01 s; transformation start/finish times are found by
 *   interpolation between steps and move by a fraction of a step when rounding changes.
 * - 1 % rates: a cooling rate over a window of ≈ 50 K moves by 1 % when either end moves by 0.5 K.
 * - 1e-6 positions: depths and line positions echo the input and must not move beyond rounding.
 * - 1e-4 ledger: the project-wide acceptance bound for the default Picard tolerance (also asserted
 *   by the property tests); the ledger closes to round-off (1e-14) without transformation and to
 *   1e-9 … 1.3e-5 in the blessed transforming cases (the martensite quench is the largest).
 * - 0.1 % for energies: ρ·c·L·ΔT with 0.5 K in a ≈ 500 K drop.
 *
 * Relative rules never go below one unit in the last printed digit of the quantity (format.ts),
 * so a baseline value of 0 does not demand an exact 0.
 */
import { decimalsForColumn } from "./format.js";
import { PHASES } from "../physics/phases.js";

export type ToleranceClass = "ledger" | "rate" | "temperature" | "fraction" | "grain" | "strength" | "time" | "position" | "other";

/** How a tolerance value is applied. */
export type ToleranceKind = "absolute" | "relative" | "ceiling";

export interface ToleranceRule {
  readonly class: ToleranceClass;
  readonly kind: ToleranceKind;
  /** Absolute bound in the quantity's unit, relative fraction, or ceiling value. */
  readonly value: number;
  /** Unit shown beside absolute and ceiling values. */
  readonly unit: string;
}

/** Per-class defaults; the keys are the names a baseline file uses to override them. */
export const DEFAULT_TOLERANCES = {
  ledger_max: 1e-4,
  rate_relative: 0.01,
  temperature_K: 0.5,
  fraction: 0.005,
  grain_relative: 0.01,
  strength_relative: 0.01,
  time_s: 0.05,
  position: 1e-6,
  other_relative: 0.001,
} as const;

export type ClassTolerances = { -readonly [K in keyof typeof DEFAULT_TOLERANCES]: number };

/** Which override key, kind and unit belong to each class. */
const CLASS_TABLE: Record<ToleranceClass, { key: keyof ClassTolerances; kind: ToleranceKind; unit: string }> = {
  ledger: { key: "ledger_max", kind: "ceiling", unit: "" },
  rate: { key: "rate_relative", kind: "relative", unit: "" },
  temperature: { key: "temperature_K", kind: "absolute", unit: "K" },
  fraction: { key: "fraction", kind: "absolute", unit: "" },
  grain: { key: "grain_relative", kind: "relative", unit: "" },
  strength: { key: "strength_relative", kind: "relative", unit: "" },
  time: { key: "time_s", kind: "absolute", unit: "s" },
  position: { key: "position", kind: "absolute", unit: "" },
  other: { key: "other_relative", kind: "relative", unit: "" },
};

const PHASE_NAMES: readonly string[] = PHASES;

/** The class a single name segment announces, or null when it says nothing. */
export function classOfSegment(name: string): ToleranceClass | null {
  if (name.endsWith("relative_error")) return "ledger";
  if (name.endsWith("_K_s")) return "rate";
  if (name === "T_C" || name.endsWith("_C") || name.endsWith("_K")) return "temperature";
  if (name === "phases" || name === "fractions" || name.endsWith("_fraction") || PHASE_NAMES.some((p) => name === p || name.startsWith(`${p}_`))) return "fraction";
  if (name.includes("grain") || name.endsWith("_um")) return "grain";
  if (name.endsWith("_MPa") || name.endsWith("_HV")) return "strength";
  if (name.endsWith("_s")) return "time";
  if (name.endsWith("_mm") || name.endsWith("_m")) return "position";
  return null;
}

/** Splits a quantity path into its name segments, dropping array identities (`depths[depth_mm=3]` → `depths`). */
export function pathSegments(path: string): string[] {
  return path.replace(/\[[^\]]*\]/g, "").split(".").filter((s) => s !== "");
}

/** The class of a quantity: the leaf-most segment that announces one decides. */
export function classOfPath(path: string): ToleranceClass {
  const segments = pathSegments(path);
  for (let i = segments.length - 1; i >= 0; i--) {
    const c = classOfSegment(segments[i]);
    if (c) return c;
  }
  return "other";
}

/** The rule for a quantity, after the per-class and per-quantity overrides of a baseline file. */
export function ruleFor(path: string, classes: Partial<ClassTolerances> = {}, quantities: Readonly<Record<string, number>> = {}): ToleranceRule {
  const cls = classOfPath(path);
  const entry = CLASS_TABLE[cls];
  const value = quantities[path] ?? classes[entry.key] ?? DEFAULT_TOLERANCES[entry.key];
  return { class: cls, kind: entry.kind, value, unit: entry.unit };
}

/** The smallest step the result files print for a quantity (one unit in the last place). */
export function printResolution(path: string): number {
  const segments = pathSegments(path);
  return 10 ** -decimalsForColumn(segments[segments.length - 1] ?? "");
}

/** The allowed |now − baseline| for absolute and relative rules (ceiling rules bound `now` itself). */
export function allowedDifference(rule: ToleranceRule, baseline: number, path: string): number {
  if (rule.kind === "relative") return Math.max(rule.value * Math.abs(baseline), printResolution(path));
  return rule.value;
}

/** Whether a numeric quantity holds its rule. */
export function holds(rule: ToleranceRule, baseline: number, now: number, path: string): boolean {
  if (!Number.isFinite(now)) return false;
  if (rule.kind === "ceiling") return Math.abs(now) <= rule.value;
  // The slack covers binary rounding of decimal values (|704.1 − 703.6| is 0.5000000000000227).
  const slack = 4 * Number.EPSILON * Math.max(Math.abs(now), Math.abs(baseline));
  return Math.abs(now - baseline) <= allowedDifference(rule, baseline, path) + slack;
}

/** The rule as people read it: "±0.5 K", "±1 % (±3.1)", "≤ 1e-5". */
export function describeRule(rule: ToleranceRule, baseline: number, path: string): string {
  const unit = rule.unit ? ` ${rule.unit}` : "";
  if (rule.kind === "ceiling") return `≤ ${rule.value}${unit}`;
  if (rule.kind === "relative") return `±${+(rule.value * 100).toPrecision(6)} % (±${+allowedDifference(rule, baseline, path).toPrecision(3)})`;
  return `±${rule.value}${unit}`;
}
