/**
 * Water headers of a line and on/off patterns (src/io/header-pattern.ts), on a small hand-made
 * line whose expected headers, flags and flows are worked out by hand in each test.
 */
import { describe, expect, it } from "vitest";
import { applyPattern, lineHeaders, patternBits, patternRanges, switchesBetween, type LineLike } from "../src/io/header-pattern.js";

/** Zones written out of table order on purpose; zone 1 is air-only (a direct face), not a header. */
function line(): LineLike {
  const water = (flow: number) => ({ water: { header: "curtain", flow_m3_h: flow } });
  return {
    banks: [
      { name: "A", on: true },
      { name: "B", on: false },
    ],
    zones: [
      { start_m: 14, end_m: 16, bank: "B", top: water(50), bottom: { water: { header: "spray", flux_L_m2s: 20 } } },
      { start_m: 5, end_m: 8, top: { emissivity: 0.8, surroundings_C: 30 } },
      { start_m: 10, end_m: 12, bank: "A", top: water(54) },
      { start_m: 12, end_m: 14, bank: "A", bottom: water(40) },
      { start_m: 20, end_m: 22, top: water(60) },
    ],
  };
}

describe("headers of a line", () => {
  it("are the zones with water, in table order, named by bank and place or by zone number", () => {
    const h = lineHeaders(line());
    expect(h.map((x) => [x.zone, x.id])).toEqual([
      [2, "A.1"],
      [3, "A.2"],
      [0, "B.1"],
      [4, "Z5"],
    ]);
  });
});

describe("applying a pattern", () => {
  const headers = lineHeaders(line());
  it("switches header faces, turns on a bank that holds an open header and scales only the scaled headers' flows", () => {
    const out = applyPattern(line(), headers, { open: [0, 2], scaled: [2], flowScale: 1.2 });
    const w = (zone: number, face: "top" | "bottom") => (out.zones[zone][face] as { water: { on: boolean; flow_m3_h?: number; flux_L_m2s?: number } }).water;
    expect(w(2, "top").on).toBe(true);
    expect(w(2, "top").flow_m3_h).toBe(54); // open but not scaled
    expect(w(3, "bottom").on).toBe(false);
    expect(w(0, "top").on).toBe(true);
    expect(w(0, "top").flow_m3_h).toBeCloseTo(60, 12); // 50 × 1.2, to round-off
    expect(w(0, "bottom").flux_L_m2s).toBeCloseTo(24, 12); // 20 × 1.2
    expect(w(4, "top").on).toBe(false);
    expect(out.banks!.map((b) => b.on)).toEqual([true, true]); // B held an open header
  });

  it("leaves the input untouched and forces kept-off banks off", () => {
    const input = line();
    const before = JSON.stringify(input);
    const out = applyPattern(input, headers, { open: [3], scaled: [3], flowScale: 1 }, new Set(["A"]));
    expect(JSON.stringify(input)).toBe(before);
    expect(out.banks!.map((b) => b.on)).toEqual([false, false]);
  });
});

describe("describing and comparing patterns", () => {
  const headers = lineHeaders(line());
  it("counts the headers whose state differs", () => {
    expect(switchesBetween({ open: [0, 1], scaled: [], flowScale: 1 }, { open: [1, 2, 3], scaled: [], flowScale: 1 })).toBe(3);
  });
  it("groups bits by bank and compresses runs of open headers", () => {
    const p = { open: [0, 1, 3], scaled: [], flowScale: 1 };
    expect(patternBits(headers, p)).toBe("11 0 1");
    expect(patternRanges(headers, p)).toBe("A.1–A.2, Z5");
    expect(patternRanges(headers, { open: [], scaled: [], flowScale: 1 })).toBe("none");
  });
});
