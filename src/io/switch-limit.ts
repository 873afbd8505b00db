/**
 * Limits how many headers change state between neighbouring coil segments.
 *
 * Each segment has its unconstrained header count(s) n*_k. We look for counts n_k with
 * |n_k − n_{k−1}| ≤ N (per group) that make the worst deviation max_k |n_k − n*_k| as small as
 * possible. For a given deviation D the reachable counts of segment k form an interval
 *   R_0 = [n*_0 − D, n*_0 + D] ∩ [0, U_0],  R_k = (R_{k−1} widened by N) ∩ [n*_k − D, n*_k + D] ∩ [0, U_k],
 * so D is feasible iff no R_k is empty; the least feasible D is found by bisection, and the counts
 * are then picked backwards, each as close to n*_k as R_k and the next segment's choice allow
 * (always possible because R_{k+1} lies within R_k widened by N). With two groups (split cooling:
 * front and back) the switch budget is shared: every split b + (N − b) is tried and the one with
 * the smallest worst deviation kept.
 */

interface Interval {
  lo: number;
  hi: number;
}

function reachable(ideal: readonly number[], step: number, upper: readonly number[], D: number): Interval[] | null {
  const out: Interval[] = [];
  for (let k = 0; k < ideal.length; k++) {
    let lo = Math.max(0, ideal[k] - D);
    let hi = Math.min(upper[k], ideal[k] + D);
    if (k > 0) {
      lo = Math.max(lo, out[k - 1].lo - step);
      hi = Math.min(hi, out[k - 1].hi + step);
    }
    if (lo > hi) return null;
    out.push({ lo, hi });
  }
  return out;
}

/** Least worst deviation with steps ≤ `step`, and the counts that achieve it. */
export function limitSteps(ideal: readonly number[], step: number, upper: readonly number[]): { counts: number[]; deviation: number } {
  if (ideal.length === 0) return { counts: [], deviation: 0 };
  let lo = -1; // infeasible (or none tried)
  let hi = Math.max(...upper, ...ideal); // always feasible: every interval is [0, U_k]
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (reachable(ideal, step, upper, mid)) hi = mid;
    else lo = mid;
  }
  const R = reachable(ideal, step, upper, hi)!;
  const counts = new Array<number>(ideal.length);
  for (let k = ideal.length - 1; k >= 0; k--) {
    let a = R[k].lo;
    let b = R[k].hi;
    if (k < ideal.length - 1) {
      a = Math.max(a, counts[k + 1] - step);
      b = Math.min(b, counts[k + 1] + step);
    }
    counts[k] = Math.min(b, Math.max(a, ideal[k]));
  }
  return { counts, deviation: hi };
}

/**
 * Counts per segment (one or two groups each) with at most `maxSwitches` changes between
 * neighbours in total over the groups; `upper[k][g]` bounds group g of segment k.
 */
export function limitSwitches(ideal: ReadonlyArray<readonly number[]>, maxSwitches: number, upper: ReadonlyArray<readonly number[]>): number[][] {
  const groups = ideal[0]?.length ?? 0;
  const column = (rows: ReadonlyArray<readonly number[]>, g: number) => rows.map((r) => r[g]);
  if (groups === 1) return limitSteps(column(ideal, 0), maxSwitches, column(upper, 0)).counts.map((n) => [n]);
  let best: { worst: number; sum: number; counts: number[][] } | null = null;
  for (let b = 0; b <= maxSwitches; b++) {
    const first = limitSteps(column(ideal, 0), b, column(upper, 0));
    const second = limitSteps(column(ideal, 1), maxSwitches - b, column(upper, 1));
    const worst = Math.max(first.deviation, second.deviation);
    const sum = first.deviation + second.deviation;
    if (!best || worst < best.worst || (worst === best.worst && sum < best.sum)) {
      best = { worst, sum, counts: first.counts.map((n, k) => [n, second.counts[k]]) };
    }
  }
  return best!.counts;
}
