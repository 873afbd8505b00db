/**
 * Mistakes in a run-out-table case through the compiled CLI: each makes `recalesce run` exit 2
 * with exactly one line on stderr naming the field (or the CSV row), no stack trace, and no
 * output folder (nor a hidden partial one). One process per mistake, nine in all.
 */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { REPO, cliForThisFile, runCli } from "./support/built-cli.js";

const { cli, scratch } = cliForThisFile("line-bad-input");

type Edit = (c: Record<string, any>) => void;

/** The 60 m example (direct zones, constant speed, pyrometers at 0, 30, 60 m), edited. */
function exampleLine(edit: Edit): Record<string, any> {
  const c = JSON.parse(readFileSync(join(REPO, "cases", "line-example-direct-zones.json"), "utf8"));
  edit(c);
  return c;
}

/** The demo coil (water banks, speed schedule), edited. */
function demoCoil(edit: Edit): Record<string, any> {
  const c = JSON.parse(readFileSync(join(REPO, "cases", "coil-6mm-acceleration.json"), "utf8"));
  edit(c);
  return c;
}

/**
 * Writes the case (and an entry CSV when given) into a folder of its own, runs it, and checks the
 * contract; returns the error line.
 */
function refused(name: string, kase: Record<string, any>, csv?: string): string {
  const here = mkdtempSync(join(scratch(), `${name}-`));
  const inputs = csv === undefined ? ["case.json"] : ["case.json", "entry.csv"];
  writeFileSync(join(here, "case.json"), JSON.stringify(kase, null, 2));
  if (csv !== undefined) writeFileSync(join(here, "entry.csv"), csv);
  const r = runCli(cli(), ["run", join(here, "case.json"), "--out", join(here, "result")]);
  expect(r.status, r.stderr).toBe(2);
  const lines = r.stderr.trimEnd().split("\n");
  expect(lines, r.stderr).toHaveLength(1);
  expect(lines[0]).toMatch(/^recalesce: /);
  expect(lines[0]).not.toMatch(/internal error|\bat .*:\d+:\d+/);
  expect(r.stdout).toBe("");
  // Nothing but the inputs: no result folder and no hidden partial folder next to it.
  expect(readdirSync(here).sort()).toEqual(inputs);
  return lines[0];
}

describe("a run-out-table case with a mistake is refused with one line naming the field", () => {
  it("zones that overlap", () => {
    const line = refused("overlap", exampleLine((c) => (c.cooling.line.zones[1].start_m = 15)));
    expect(line).toContain("cooling.line.zones[1].start_m");
    expect(line).toContain("overlaps");
  });

  it("a zone that lies outside the line", () => {
    const line = refused("outside", exampleLine((c) => (c.cooling.line.zones[2].end_m = 70)));
    expect(line).toContain("cooling.line.zones[2].end_m");
    expect(line).toContain("outside the line");
  });

  it("a pyrometer outside the line", () => {
    const line = refused("pyrometer", exampleLine((c) => (c.cooling.line.pyrometers_m = [0, 61])));
    expect(line).toContain("cooling.line.pyrometers_m[1]");
  });

  it("a negative water flow", () => {
    const line = refused("flow", demoCoil((c) => (c.cooling.line.zones[3].bottom.water.flow_m3_h = -5)));
    expect(line).toContain("cooling.line.zones[3].bottom.water.flow_m3_h");
    expect(line).toContain("m³/h");
  });

  it("a speed of zero, and a negative threading speed", () => {
    expect(refused("speed-zero", exampleLine((c) => (c.cooling.line.speed_m_s = 0)))).toContain("cooling.line.speed_m_s");
    expect(refused("threading-negative", demoCoil((c) => (c.cooling.line.speed.threading_m_s = -1)))).toContain("cooling.line.speed.threading_m_s");
  });

  it("a schedule whose top speed is below the threading speed", () => {
    const line = refused("max-below", demoCoil((c) => (c.cooling.line.speed.max_m_s = 4)));
    expect(line).toContain("cooling.line.speed.max_m_s");
  });

  it("an entry-temperature CSV with a malformed row reports the file and the row", () => {
    const kase = demoCoil((c) => (c.cooling.coil = { length_m: 900, segments: 30, entry_csv: "entry.csv" }));
    // Row 4 of the file (header = row 1) has a word for a temperature.
    const line = refused("csv", kase, "position_m,T_C\n0,870\n300,860\n600,hot\n900,850\n");
    expect(line).toContain("entry.csv");
    expect(line).toContain("row 4");
  });

  it("an entry-temperature CSV with a blank line before the malformed row reports the row as the file counts it", () => {
    // Row 5 of the file (a spreadsheet shows the blank line as row 3, "600,hot" as row 5).
    // Regression guard: readEntryProfile once numbered the parsed records (blank lines skipped)
    // and reported row 4; since commit 968ece3 it numbers rows as the file counts lines.
    const kase = demoCoil((c) => (c.cooling.coil = { length_m: 900, segments: 30, entry_csv: "entry.csv" }));
    const line = refused("csv-blank", kase, "position_m,T_C\n0,870\n\n300,860\n600,hot\n900,850\n");
    expect(line).toContain("row 5");
  });
});
