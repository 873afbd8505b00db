/**
 * What a cooling design is asked to do, checked against the case: the target and its tolerance,
 * the strategy (which headers open first), and the limits. Everything here is plain data so that it
 * can travel to worker threads. A request the case cannot mean (a target above the entry
 * temperature, an unknown bank, a band that does not lie between target and entry) is an
 * InputError naming the option.
 */
import type { Case } from "./case-schema.js";
import { InputError } from "./errors.js";
import { lineHeaders, type Header } from "./header-pattern.js";

export type Strategy = "early" | "late" | "split";

/** The request, as given on the command line (units in the names). */
export interface DesignRequest {
  /** Target through-thickness mean coiling temperature [°C] */
  readonly coiling_C: number;
  /** Accepted deviation from the target [K] */
  readonly tolerance_K: number;
  readonly strategy: Strategy;
  /** Largest mean cooling rate under water [K/s] */
  readonly maxCoolingRate_K_s?: number;
  /** Split cooling: band for the mean temperature where the front group ends [°C] */
  readonly intermediate_C?: readonly [number, number];
  /** Split cooling: shortest air hold between the front and the back group [s] */
  readonly hold_s?: number;
  /** Banks that must stay off. */
  readonly keepOff?: readonly string[];
  /** Coils: most headers changing state between neighbouring segments. */
  readonly maxSwitches?: number;
  /** Flow trim: the common flow scale stays in [min, max] × the case's flows; absent = no trim. */
  readonly flowRange?: readonly [number, number];
}

/** The request resolved against the case's line. */
export interface DesignPlan {
  readonly target_C: number;
  readonly tolerance_K: number;
  /** The flow trim stops when the coiling temperature is this close to the target [K] */
  readonly trim_K: number;
  readonly strategy: Strategy;
  readonly maxCoolingRate_K_s: number | null;
  readonly band_C: readonly [number, number] | null;
  readonly hold_s: number | null;
  readonly keepOff: readonly string[];
  readonly maxSwitches: number | null;
  readonly flowRange: readonly [number, number] | null;
  readonly headers: readonly Header[];
  /** Headers allowed to open, front of the table first (indices into headers). */
  readonly front: readonly number[];
  /** The same, back of the table first. */
  readonly back: readonly number[];
  /** Table length [m] */
  readonly length_m: number;
}

/** Grid of the flow scale: flows are designed in steps of 0.1 % of the case's flow [-]. */
export const FLOW_SCALE_GRID = 0.001;

/**
 * The trim aims at a tenth of the tolerance: close enough that the segment's result is not at the
 * edge of the band, loose enough that the trim ends after a few runs.
 */
const TRIM_FRACTION = 0.1;

/** Checks the request against the case and its entry temperatures, and builds the plan. */
export function designPlan(file: string, c: Case, request: DesignRequest, entries_C: readonly number[]): DesignPlan {
  if (!("line" in c.cooling)) throw new InputError(file, "cooling", "design needs a run-out table (cooling.line); this case gives stages");
  const line = c.cooling.line;
  const headers = lineHeaders(line);
  if (headers.length === 0) throw new InputError(file, "cooling.line.zones", "no zone has water on a face; a design chooses among water headers");
  const entry = Math.min(...entries_C);
  const T = request.coiling_C;
  const range = `expected ${line.water_C} °C (water, cooling.line.water_C) < T < ${entry} °C (entry${entries_C.length > 1 ? ", coolest segment" : ""})`;
  if (!(T < entry)) throw new InputError(file, "--coiling-C", `${T} °C is not below the entry temperature; ${range}`);
  if (!(T > line.water_C)) throw new InputError(file, "--coiling-C", `${T} °C is not above the water temperature; ${range}`);
  const banks = new Set(line.banks.map((b) => b.name));
  for (const b of request.keepOff ?? []) {
    if (!banks.has(b)) throw new InputError(file, "--keep-off", `unknown bank "${b}"; the case's banks (cooling.line.banks) are ${[...banks].join(", ") || "none"}`);
  }
  if (request.strategy === "split") {
    if (!request.intermediate_C) throw new InputError(file, "--intermediate-C", "split cooling needs the intermediate band LO:HI [°C]");
    if (request.hold_s === undefined) throw new InputError(file, "--hold-s", "split cooling needs the air hold [s]");
    const [lo, hi] = request.intermediate_C;
    if (!(lo > T)) throw new InputError(file, "--intermediate-C", `band ${lo}:${hi} °C must lie above the coiling target ${T} °C`);
    if (!(hi < entry)) throw new InputError(file, "--intermediate-C", `band ${lo}:${hi} °C must lie below the entry temperature ${entry} °C`);
  } else {
    if (request.intermediate_C) throw new InputError(file, "--intermediate-C", "applies only to --strategy split");
    if (request.hold_s !== undefined) throw new InputError(file, "--hold-s", "applies only to --strategy split");
  }
  const keepOff = new Set(request.keepOff ?? []);
  const allowed = headers.map((_, i) => i).filter((i) => headers[i].bank === null || !keepOff.has(headers[i].bank!));
  return {
    target_C: T,
    tolerance_K: request.tolerance_K,
    trim_K: TRIM_FRACTION * request.tolerance_K,
    strategy: request.strategy,
    maxCoolingRate_K_s: request.maxCoolingRate_K_s ?? null,
    band_C: request.intermediate_C ? [request.intermediate_C[0], request.intermediate_C[1]] : null,
    hold_s: request.hold_s ?? null,
    keepOff: [...keepOff],
    maxSwitches: request.maxSwitches ?? null,
    flowRange: request.flowRange ? [request.flowRange[0], request.flowRange[1]] : null,
    headers,
    front: allowed,
    back: [...allowed].reverse(),
    length_m: line.length_m,
  };
}
