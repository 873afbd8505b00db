/**
 * The switch limit between neighbouring coil segments (src/io/switch-limit.ts), against optima
 * worked out by hand.
 */
import { describe, expect, it } from "vitest";
import { limitSteps, limitSwitches } from "../src/io/switch-limit.js";

describe("limiting the change of header count between neighbours", () => {
  it("keeps counts that already respect the limit", () => {
    expect(limitSteps([3, 4, 5, 5, 4], 1, [10, 10, 10, 10, 10])).toEqual({ counts: [3, 4, 5, 5, 4], deviation: 0 });
  });
  it("spreads a jump so that the worst deviation is as small as possible", () => {
    // 0 → 6 in one step with steps ≤ 2: the best worst deviation is 2 (e.g. 2, 4 | 6 → 2, 4, 6, 6).
    const r = limitSteps([0, 0, 6, 6], 2, [10, 10, 10, 10]);
    expect(r.deviation).toBe(2);
    r.counts.forEach((n, k) => k > 0 && expect(Math.abs(n - r.counts[k - 1])).toBeLessThanOrEqual(2));
    r.counts.forEach((n, k) => expect(Math.abs(n - [0, 0, 6, 6][k])).toBeLessThanOrEqual(2));
  });
  it("with no switches allowed gives one count for the whole coil, in the middle of the spread", () => {
    const r = limitSteps([2, 5, 8], 0, [10, 10, 10]);
    expect(r).toEqual({ counts: [5, 5, 5], deviation: 3 });
  });
  it("shares the budget between the front and back groups of split cooling", () => {
    // Front wants 3 → 3 (no change), back wants 0 → 4: the whole budget of 4 goes to the back.
    expect(limitSwitches([[3, 0], [3, 4]], 4, [[10, 10], [10, 10]])).toEqual([[3, 0], [3, 4]]);
    // Budget 2 for a change of 2 + 2: each group deviates by 1 at worst.
    const r = limitSwitches([[1, 0], [3, 2]], 2, [[10, 10], [10, 10]]);
    expect(Math.abs(r[1][0] - r[0][0]) + Math.abs(r[1][1] - r[0][1])).toBeLessThanOrEqual(2);
    expect(Math.max(...r.flatMap((row, k) => row.map((n, g) => Math.abs(n - [[1, 0], [3, 2]][k][g]))))).toBe(1);
  });
});
