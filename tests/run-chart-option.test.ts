import { describe, it, expect } from "vitest";
import { existsSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { runCase } from "../src/io/run-case.js";

/** `run --chart` puts cooling.svg in the same atomic result folder; without it there is none. */
describe("the chart option of run", () => {
  const dir = mkdtempSync(join(tmpdir(), "recalesce-chart-option-"));

  it("writes cooling.svg next to the result files only when asked, for strip and cross-section runs", async () => {
    for (const [name, file] of [
      ["strip", "cases/strip-12mm-cmn-water.json"],
      ["section", "cases/section-40mm-plate-edge.json"],
    ] as const) {
      const withChart = join(dir, `${name}-chart`);
      const without = join(dir, `${name}-plain`);
      await runCase(file, withChart, { chart: true });
      await runCase(file, without, {});
      expect(existsSync(join(withChart, "cooling.svg"))).toBe(true);
      expect(existsSync(join(without, "cooling.svg"))).toBe(false);
      expect(readFileSync(join(withChart, "cooling.svg"), "utf8")).toMatch(/^<\?xml [^>]*\?>\n<svg /);
      // The chart does not change the numbers.
      expect(readFileSync(join(withChart, "summary.json"), "utf8")).toBe(readFileSync(join(without, "summary.json"), "utf8"));
    }
  });
});
