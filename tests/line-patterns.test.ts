import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { validateCase } from "../src/io/load-case.js";
import { resolveCase } from "../src/io/resolve-case.js";
import { simulateResolved } from "../src/io/run-case.js";

/**
 * Per-segment header patterns of a coil (cooling.line.patterns), as `recalesce design` writes them.
 * Consistency checks against the model itself: a pattern must act exactly like editing the zones.
 */
const COIL = "cases/coil-6mm-acceleration.json";
const base = () => JSON.parse(readFileSync(COIL, "utf8")) as { cooling: { line: Record<string, unknown> & { zones: Array<Record<string, unknown>> }; coil: Record<string, unknown> } };

function coiling(data: unknown, segment: number): number {
  const c = validateCase(COIL, data);
  const seg = { coilPosition_m: 15 + 30 * segment, entry_C: 870, segment };
  return (simulateResolved(c, resolveCase(COIL, c, seg), undefined, true).summary as { coiling: { T_C: { mean: number } } }).coiling.T_C.mean;
}

describe("a coil with per-segment header patterns", () => {
  it("runs a segment with its pattern exactly as a line whose zones were edited the same way, and leaves other segments alone", () => {
    // Pattern for segment 3 (index 2): only the first 8 water zones, flows × 1.2.
    const withPattern = base();
    const open = [0, 1, 2, 3, 4, 5, 6, 7];
    withPattern.cooling.line.patterns = [{ from_segment: 3, to_segment: 3, open_zones: open, flow_scale: 1.2 }];
    const edited = base();
    edited.cooling.line.banks = (edited.cooling.line.banks as Array<{ name: string; on: boolean }>).map((b) => ({ ...b, on: b.name === "B1" || b.name === "B2" }));
    edited.cooling.line.zones.forEach((z, i) => {
      for (const f of ["top", "bottom"] as const) {
        const w = (z[f] as { water?: { on?: boolean; flow_m3_h: number } }).water!;
        w.on = open.includes(i);
        if (open.includes(i)) w.flow_m3_h *= 1.2;
      }
    });
    expect(coiling(withPattern, 2)).toBe(coiling(edited, 2));
    // Segment 4 has no pattern: the line as written.
    expect(coiling(withPattern, 3)).toBe(coiling(base(), 3));
  });

  it("refuses patterns without a coil, on a zone without water, beyond the coil, or overlapping", () => {
    const noCoil = base() as { cooling: Record<string, unknown> & { line: Record<string, unknown> } };
    delete noCoil.cooling.coil;
    noCoil.cooling.line.patterns = [{ from_segment: 1, to_segment: 1, open_zones: [0] }];
    expect(() => validateCase("c.json", noCoil)).toThrow(/cooling\.line\.patterns: per-segment patterns need a coil/);
    const badZone = base();
    badZone.cooling.line.patterns = [{ from_segment: 1, to_segment: 2, open_zones: [0, 99] }];
    expect(() => validateCase("c.json", badZone)).toThrow(/patterns\[0\]\.open_zones\[1\]: zone 99 is not a water zone/);
    const beyond = base();
    beyond.cooling.line.patterns = [{ from_segment: 29, to_segment: 31, open_zones: [0] }];
    expect(() => validateCase("c.json", beyond)).toThrow(/to_segment: the coil has 30 segments/);
    const overlap = base();
    overlap.cooling.line.patterns = [
      { from_segment: 1, to_segment: 3, open_zones: [0] },
      { from_segment: 3, to_segment: 4, open_zones: [1] },
    ];
    expect(() => validateCase("c.json", overlap)).toThrow(/segment 3 already has a pattern/);
  });
});
