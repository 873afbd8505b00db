/**
 * Sweep grids (src/io/sweep-grid.ts) and dotted case paths (src/io/case-path.ts): parsing, the
 * order of points and shards, against lists written out by hand.
 */
import { describe, expect, it } from "vitest";
import { gridSize, parseShard, parseValues, parseVary, pointValues, shardPoints } from "../src/io/sweep-grid.js";
import { parseCasePath, setValueAt, valueAt } from "../src/io/case-path.js";

describe("sweep values", () => {
  it("are a list or an inclusive range on its grid", () => {
    expect(parseValues("4,8,12")).toEqual([4, 8, 12]);
    expect(parseValues("6:12:2")).toEqual([6, 8, 10, 12]);
    expect(parseValues("6:11:2")).toEqual([6, 8, 10]); // 11 is not on the grid
    expect(parseValues("0.1:0.5:0.1")).toEqual([0.1, 0.2, 0.3, 0.4, 0.5]); // no 0.30000000000000004
  });
  it("reject malformed lists and ranges with a message naming the problem", () => {
    expect(() => parseValues("4,x")).toThrow(/"x" is not a number/);
    expect(() => parseValues("6:12")).toThrow(/start:stop:step/);
    expect(() => parseValues("6:12:0")).toThrow(/step must be > 0/);
    expect(() => parseValues("12:6:1")).toThrow(/stop must not be below start/);
    expect(() => parseVary("4,8")).toThrow(/path=values/);
  });
});

describe("the grid", () => {
  const vary = [parseVary("a=1,2"), parseVary("b=10:30:10")];
  it("lists points with the first --vary slowest, like nested loops", () => {
    expect(gridSize(vary)).toBe(6);
    expect([0, 1, 2, 3, 4, 5].map((i) => pointValues(vary, i))).toEqual([
      [1, 10],
      [1, 20],
      [1, 30],
      [2, 10],
      [2, 20],
      [2, 30],
    ]);
  });
  it("cuts into shards by index modulo N, together covering every point once", () => {
    expect(shardPoints(6, parseShard("1/4"))).toEqual([0, 4]);
    expect(shardPoints(6, parseShard("4/4"))).toEqual([3]);
    const all = [1, 2, 3, 4].flatMap((k) => shardPoints(6, { index: k, count: 4 })).sort();
    expect(all).toEqual([0, 1, 2, 3, 4, 5]);
    expect(shardPoints(6, null)).toEqual([0, 1, 2, 3, 4, 5]);
  });
  it("rejects a shard out of range", () => {
    expect(() => parseShard("0/3")).toThrow(/1–3/);
    expect(() => parseShard("4/3")).toThrow(/1–3/);
    expect(() => parseShard("2")).toThrow(/K\/N/);
  });
});

describe("case paths", () => {
  const data = { cooling: { line: { banks: [{ multiplier: 1 }, { multiplier: 2 }] } }, product: { thickness_mm: 3 } };
  it("read and write dotted keys with array indices", () => {
    expect(parseCasePath("cooling.line.banks[1].multiplier")).toEqual(["cooling", "line", "banks", 1, "multiplier"]);
    expect(valueAt(data, parseCasePath("cooling.line.banks[1].multiplier")!)).toBe(2);
    const copy = structuredClone(data);
    setValueAt(copy, parseCasePath("product.thickness_mm")!, 5);
    expect(copy.product.thickness_mm).toBe(5);
  });
  it("tell missing paths and malformed ones apart", () => {
    expect(valueAt(data, parseCasePath("cooling.line.banks[2].multiplier")!)).toBeUndefined();
    expect(valueAt(data, parseCasePath("product.width_mm")!)).toBeUndefined();
    expect(valueAt(data, parseCasePath("product.thickness_mm.x")!)).toBeUndefined();
    expect(parseCasePath("product..thickness")).toBeNull();
    expect(parseCasePath("banks[x]")).toBeNull();
  });
});
