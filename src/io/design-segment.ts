/**
 * Chooses the header pattern for one strip point.
 *
 * Monotonicity carries the search: with the headers opened in the strategy's order, more open
 * headers ⇒ a colder strip, and a larger flow ⇒ a colder strip. So
 *   1. the number of open headers n is the crossing of T_coil(n) with the target (bisection, or
 *      galloping from the neighbouring segment's n), taking whichever of the two headers around the
 *      crossing lands nearer;
 *   2. with a flow range, one common flow scale s on those headers trims T_coil(n, s) onto the
 *      target (regula falsi on a 0.1 % grid);
 *   3. with a cooling-rate limit, s is capped where the mean rate under water reaches the limit,
 *      n is searched again at that cap and trimmed below it.
 * Split cooling first finds the front group: the fewest front headers whose end leaves the strip
 * mean at or below the band's top (at the case's flows), then waits `hold_s` of air and opens
 * headers from the back for the coiling target; the flow trim acts on that back group only, so
 * the intermediate temperature it was chosen for is not moved by the trim.
 */
import type { CoilSegment } from "./resolve-case.js";
import type { DesignPlan } from "./design-plan.js";
import { FLOW_SCALE_GRID } from "./design-plan.js";
import type { HeaderPattern } from "./header-pattern.js";
import { firstAtOrBelow, solveFalling } from "./monotone-search.js";
import type { Evaluation, SegmentEvaluator } from "./segment-evaluator.js";
import { DECIMALS, round } from "./format.js";

/** The design of one segment (plain data: it crosses thread boundaries). */
export interface SegmentDesign {
  /** Segment index, 0-based */
  readonly segment: number;
  readonly position_m: number;
  readonly entry_C: number;
  /** Open headers per group in the strategy's order: [n] (early, late) or [front, back] (split). */
  readonly counts: number[];
  readonly pattern: HeaderPattern;
  readonly evaluation: Evaluation;
  /** Coiling mean minus target [K] */
  readonly error_K: number;
  /** Split: strip mean where the front group ends [°C] and the air time until the back group [s] */
  readonly intermediate_C: number | null;
  readonly hold_s: number | null;
  /** Whether the coiling mean is within tolerance and every limit is kept. */
  readonly within: boolean;
  /** Why not, in words (empty when within). */
  readonly issues: string[];
  /** Simulations this segment took. */
  readonly evaluations: number;
}

/** Where to start a warm search: the neighbouring segment's answer. */
export interface DesignGuess {
  readonly counts: readonly number[];
  readonly flowScale: number;
}

interface Group {
  /** Fixed headers (split: the front group) and the ordered candidates for the searched group. */
  readonly fixed: readonly number[];
  readonly order: readonly number[];
  /** Notes from choosing the fixed part (split band and hold). */
  readonly issues: string[];
  readonly intermediate_C: number | null;
  readonly exit_m: number | null;
}

function pattern(group: Group, n: number, s: number): HeaderPattern {
  const searched = group.order.slice(0, n);
  const open = [...group.fixed, ...searched].sort((a, b) => a - b);
  return { open, scaled: [...searched].sort((a, b) => a - b), flowScale: searched.length ? s : 1 };
}

/** Split: the front group, the hold and the back headers still available after it. */
function splitGroup(ev: SegmentEvaluator, plan: DesignPlan, guess: number | undefined, fixedFront: number | undefined): Group {
  const [lo, hi] = plan.band_C!;
  const maxFront = plan.front.length;
  const issues: string[] = [];
  let n1: number;
  if (fixedFront !== undefined) n1 = Math.min(fixedFront, maxFront);
  else {
    const c = firstAtOrBelow((n) => ev.exitMean_C(n), maxFront, hi, guess);
    if (c > maxFront) n1 = maxFront;
    else if (c === 0 || ev.exitMean_C(c) >= lo) n1 = c;
    else {
      // The band is narrower than one header's drop: take the nearer side.
      const above = ev.exitMean_C(c - 1) - hi;
      const below = lo - ev.exitMean_C(c);
      n1 = above <= below ? c - 1 : c;
    }
  }
  const T1 = ev.exitMean_C(n1);
  if (T1 > hi + 1e-9 || T1 < lo - 1e-9) {
    const why = fixedFront !== undefined ? `--max-switches holds it at ${n1} header(s)` : n1 === maxFront ? "all front headers open" : "band narrower than one header";
    issues.push(`front group ends at ${T1.toFixed(1)} °C, outside the band ${lo}–${hi} °C (${why})`);
  }
  const exit = ev.exitPosition_m(n1);
  const holdEnd = ev.positionAfter_m(exit, plan.hold_s!);
  if (holdEnd > plan.length_m) issues.push(`the ${plan.hold_s} s hold after ${exit} m runs past the end of the table`);
  const front = plan.front.slice(0, n1);
  const taken = new Set(front);
  const order: number[] = [];
  for (const i of plan.back) {
    if (taken.has(i) || plan.headers[i].start_m < holdEnd - 1e-9) break;
    order.push(i);
  }
  return { fixed: front, order, issues, intermediate_C: T1, exit_m: exit };
}

/**
 * Designs one segment. `guess` (the neighbour's answer) speeds the search; `fixedCounts` skips
 * the search and only trims (used when the switch limit imposes the counts).
 */
export function designSegment(ev: SegmentEvaluator, plan: DesignPlan, segment: CoilSegment, guess?: DesignGuess, fixedCounts?: readonly number[]): SegmentDesign {
  const split = plan.strategy === "split";
  const group: Group = split
    ? splitGroup(ev, plan, guess?.counts[0], fixedCounts?.[0])
    : { fixed: [], order: plan.strategy === "early" ? plan.front : plan.back, issues: [], intermediate_C: null, exit_m: null };
  const N = group.order.length;
  const target = plan.target_C;
  const range = plan.flowRange;
  const sLo = range ? range[0] : 1;
  let sHi = range ? range[1] : 1;
  const s0 = Math.min(sHi, Math.max(sLo, 1));
  const run = (n: number, s: number) => ev.evaluate(pattern(group, n, s));
  const T = (n: number, s: number) => run(n, s).coiling_C.mean;
  const searchedGuess = guess ? guess.counts[split ? 1 : 0] : undefined;

  /** Header count nearest the target at scale s (the cap when `atOrBelow`: trimming only lowers s). */
  const chooseCount = (s: number, atOrBelow: boolean, from?: number): number => {
    const c = firstAtOrBelow((n) => T(n, s), N, target, from);
    if (c > N) return N;
    if (c === 0 || atOrBelow) return c;
    return Math.abs(T(c - 1, s) - target) <= Math.abs(T(c, s) - target) ? c - 1 : c;
  };
  const trim = (n: number, hi: number, from: number): number => {
    if (!range || n === 0) return from;
    const known: Array<[number, number]> = [[from, T(n, from)]];
    const sol = solveFalling((s) => T(n, s), sLo, hi, target, plan.trim_K, FLOW_SCALE_GRID, known, guess?.flowScale);
    return sol.s;
  };

  let n = fixedCounts ? Math.min(fixedCounts[split ? 1 : 0], N) : chooseCount(s0, false, searchedGuess);
  let s = trim(n, sHi, s0);
  if (range && !fixedCounts && Math.abs(T(n, s) - target) > plan.tolerance_K) {
    // A narrow flow range may not bridge the nearer count's gap: try the other side of the crossing.
    const other = T(n, s) > target ? n + 1 : n - 1;
    if (other >= 0 && other <= N) {
      const so = trim(other, sHi, s0);
      if (Math.abs(T(other, so) - target) < Math.abs(T(n, s) - target)) [n, s] = [other, so];
    }
  }
  const issues = [...group.issues];
  const R = plan.maxCoolingRate_K_s;
  const rate = (nn: number, ss: number) => run(nn, ss).rate_K_s ?? 0;
  if (R !== null && rate(n, s) > R && range && n > 0) {
    // Largest scale on the grid with the rate within the limit: rate grows with the flow.
    const steps = Math.round((s - sLo) / FLOW_SCALE_GRID);
    const k = firstAtOrBelow((j) => rate(n, Number((s - j * FLOW_SCALE_GRID).toFixed(12))), steps, R);
    if (k <= steps) {
      sHi = Number((s - k * FLOW_SCALE_GRID).toFixed(12));
      if (!fixedCounts) n = chooseCount(sHi, true, n);
      s = trim(n, sHi, sHi);
    }
  }
  const e = run(n, s);
  const error = e.coiling_C.mean - target;
  if (R !== null && (e.rate_K_s ?? 0) > R) issues.push(`mean cooling rate under water ${(e.rate_K_s ?? 0).toFixed(1)} K/s exceeds the limit ${R} K/s${range ? " even at the lowest flow" : " (allow --flows to lower the flow)"}`);
  if (Math.abs(error) > plan.tolerance_K) {
    const at = (k: number, scale: number) => `${k} header(s) give ${T(k, scale).toFixed(1)} °C${range ? ` at ${scale}× flow` : ""}`;
    let why: string;
    if (error > 0 && n === N) why = `too little water: every available header open${range ? ` at ${s}× flow` : ""}`;
    else if (error < 0 && n === 0) why = "too much water even with every header off";
    else if (fixedCounts) why = `--max-switches holds this segment at ${n} header(s)${split ? " in the back group" : ""}`;
    else if (R !== null && sHi < (range ? range[1] : 1)) why = "the cooling-rate limit caps the flow";
    else why = `whole headers step past the band: ${error > 0 ? at(n + 1, sLo) : at(n - 1, sHi)}${range ? `; the flow range ${range[0]}–${range[1]}× cannot bridge the step` : "; --flows can trim between them"}`;
    issues.push(`coiling mean ${e.coiling_C.mean.toFixed(1)} °C misses the target by ${error > 0 ? "+" : ""}${error.toFixed(1)} K (${why}); nearest reachable ${e.coiling_C.mean.toFixed(1)} °C`);
  }
  const p = pattern(group, n, s);
  let hold: number | null = null;
  if (split) {
    const firstBack = p.scaled.length ? Math.min(...p.scaled.map((i) => plan.headers[i].start_m)) : plan.length_m;
    hold = round(ev.travelTime_s(group.exit_m!, firstBack), DECIMALS.time_s);
  }
  return {
    segment: segment.index,
    position_m: round(segment.position_m, DECIMALS.position_m),
    entry_C: round(ev.entry_C, DECIMALS.T_C),
    counts: split ? [group.fixed.length, n] : [n],
    pattern: p,
    evaluation: e,
    error_K: round(error, DECIMALS.K),
    intermediate_C: group.intermediate_C === null ? null : round(group.intermediate_C, DECIMALS.T_C),
    hold_s: hold,
    within: issues.length === 0,
    issues,
    evaluations: ev.evaluations,
  };
}
