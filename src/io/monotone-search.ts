/**
 * Searches on functions that only fall as their argument grows (more water ⇒ colder strip).
 *
 * `firstAtOrBelow` finds the crossing of a non-increasing function of a whole number (the number
 * of open headers) with a target: the smallest n in [0, max] with f(n) ≤ target. Without a guess
 * it bisects [−1, max + 1] (about log₂(max + 2) evaluations); with a guess (the neighbouring coil
 * segment's answer) it gallops outward from the guess in steps 1, 2, 4, … until the crossing is
 * bracketed and then bisects, so a guess that is off by d costs about 2·log₂(d + 1) + 1
 * evaluations. For a monotone f both give the same answer.
 *
 * `solveFalling` solves g(s) = target for a non-increasing g of a continuous scale s on a grid of
 * step `grid` (the flow scale, so that designed flows are round numbers) by the Illinois variant of
 * regula falsi (Dowell & Jarratt 1971), which keeps the bracket and converges superlinearly.
 */

/**
 * Smallest n in [0, max] with f(n) ≤ target, or max + 1 when even f(max) > target. f must be
 * non-increasing; it is called only at whole numbers in [0, max].
 */
export function firstAtOrBelow(f: (n: number) => number, max: number, target: number, guess?: number): number {
  // Invariant: f(lo) > target (lo = −1 stands for +∞), f(hi) ≤ target (hi = max + 1 stands for −∞).
  let lo = -1;
  let hi = max + 1;
  if (guess !== undefined && max >= 0) {
    const g = Math.min(max, Math.max(0, Math.round(guess)));
    if (f(g) <= target) {
      hi = g;
      for (let step = 1; ; step *= 2) {
        const probe = Math.max(0, hi - step);
        if (probe === hi) break;
        if (f(probe) <= target) {
          hi = probe;
          if (probe === 0) break;
        } else {
          lo = probe;
          break;
        }
      }
    } else {
      lo = g;
      for (let step = 1; ; step *= 2) {
        const probe = Math.min(max, lo + step);
        if (probe === lo) break;
        if (f(probe) > target) {
          lo = probe;
          if (probe === max) break;
        } else {
          hi = probe;
          break;
        }
      }
    }
  }
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (f(mid) <= target) hi = mid;
    else lo = mid;
  }
  return hi;
}

export interface ScaleSolution {
  /** The scale whose value is closest to the target among those evaluated [-] */
  readonly s: number;
  readonly value: number;
  /** Whether |value − target| ≤ the tolerance asked for. */
  readonly converged: boolean;
}

/** Rounds to the grid, away from floating-point dust (0.1 + 0.2 → 0.3 on a 0.001 grid). */
function onGrid(s: number, grid: number): number {
  return Number((Math.round(s / grid) * grid).toFixed(12));
}

/**
 * Solves g(s) = target for a non-increasing g on [lo, hi], s on a grid of step `grid`. `known`
 * holds points already evaluated (reused, not re-evaluated); `guess` is tried first. Stops when
 * |g − target| ≤ tolerance, when the bracket is one grid step wide, or after `maxEvaluations` new
 * evaluations; returns the best point seen. When the target lies outside g's range on [lo, hi] the
 * answer is the nearer bound (not converged).
 */
export function solveFalling(
  g: (s: number) => number,
  lo: number,
  hi: number,
  target: number,
  tolerance: number,
  grid: number,
  known: ReadonlyArray<readonly [number, number]> = [],
  guess?: number,
  maxEvaluations = 12,
): ScaleSolution {
  const seen = new Map<number, number>();
  for (const [s, v] of known) if (s >= lo - 1e-12 && s <= hi + 1e-12) seen.set(onGrid(s, grid), v);
  let evaluations = 0;
  const at = (s: number): number => {
    const q = onGrid(Math.min(hi, Math.max(lo, s)), grid);
    let v = seen.get(q);
    if (v === undefined) {
      v = g(q);
      evaluations++;
      seen.set(q, v);
    }
    return v;
  };
  const best = (): ScaleSolution => {
    let bs = NaN;
    let bv = NaN;
    for (const [s, v] of seen) {
      if (Number.isNaN(bs) || Math.abs(v - target) < Math.abs(bv - target) || (Math.abs(v - target) === Math.abs(bv - target) && s < bs)) {
        bs = s;
        bv = v;
      }
    }
    return { s: bs, value: bv, converged: Math.abs(bv - target) <= tolerance };
  };
  if (guess !== undefined) at(guess);
  if (seen.size === 0) at(0.5 * (lo + hi));
  if (best().converged) return best();
  // Bracket: a (value above target, needs a larger scale) and b (value at or below target).
  const bracket = (): { a: number | null; b: number | null } => {
    let a: number | null = null;
    let b: number | null = null;
    for (const [s, v] of seen) {
      if (v > target) a = a === null ? s : Math.max(a, s);
      else b = b === null ? s : Math.min(b, s);
    }
    return { a, b };
  };
  let { a, b } = bracket();
  if (a === null) {
    at(lo);
    ({ a, b } = bracket());
    if (a === null) return best();
  }
  if (b === null) {
    at(hi);
    ({ a, b } = bracket());
    if (b === null) return best();
  }
  let aa: number = a!;
  let bb: number = b!;
  let fa = seen.get(aa)! - target;
  let fb = seen.get(bb)! - target;
  let side = 0;
  while (evaluations < maxEvaluations && bb - aa > grid * 1.5 && !best().converged) {
    let s = onGrid(aa + (fa * (bb - aa)) / (fa - fb), grid);
    if (s <= aa) s = onGrid(aa + grid, grid);
    if (s >= bb) s = onGrid(bb - grid, grid);
    const fs = at(s) - target;
    if (fs > 0) {
      aa = s;
      fa = fs;
      if (side === -1) fb /= 2; // Illinois: halve the stale end's weight
      side = -1;
    } else {
      bb = s;
      fb = fs;
      if (side === 1) fa /= 2;
      side = 1;
    }
  }
  return best();
}
