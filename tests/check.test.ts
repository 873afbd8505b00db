/**
 * `recalesce check`: the regression check of a folder of cases against blessed baselines.
 * Runs in-process through the registered commander command (and its runCheckCommand), on copies of
 * two fast repository cases in a temporary folder: a transforming steel strip (explicit scheme)
 * and the constant-property plate.
 */
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Command } from "commander";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { registerCheckCommand, runCheckCommand } from "../src/cli/check-command.js";
import { writeFileAtomic } from "../src/io/atomic-file.js";
import { baselineFileFor, flattenSummary, validateBaseline } from "../src/io/baseline.js";
import { InputError } from "../src/io/errors.js";
import { loadCase, parseJson, readTextFile } from "../src/io/load-case.js";
import { WriteError } from "../src/io/result-folder.js";
import { classOfPath } from "../src/io/tolerance-rules.js";
import { REPO } from "./support/built-cli.js";

const STEEL = "stages-strip-2p5mm-cmn-explicit";
const PLAIN = "plate-20mm-water-quench";

let scratch: string;
let folderCount = 0;

beforeAll(() => {
  scratch = mkdtempSync(join(tmpdir(), "recalesce-check-test-"));
});
afterAll(() => {
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});
afterEach(() => {
  process.exitCode = undefined; // the command sets it for the CLI; the test process must not keep it
});

/** A fresh folder holding copies of the named repository cases. */
function caseFolder(...names: string[]): string {
  const dir = join(scratch, `cases-${++folderCount}`);
  mkdirSync(dir);
  for (const n of names) copyFileSync(join(REPO, "cases", `${n}.json`), join(dir, `${n}.json`));
  return dir;
}

/** Runs `check` through commander as the CLI would; returns the exit code and what it printed. */
async function check(args: string[]): Promise<{ code: number; out: string }> {
  let out = "";
  const program = new Command().exitOverride().configureOutput({ writeOut: (s) => (out += s), writeErr: (s) => (out += s) });
  registerCheckCommand(program);
  const write = process.stdout.write.bind(process.stdout);
  process.stdout.write = ((s: string) => ((out += s), true)) as typeof process.stdout.write;
  try {
    await program.parseAsync(["check", ...args], { from: "user" });
  } finally {
    process.stdout.write = write;
  }
  const code = (process.exitCode as number | undefined) ?? 0;
  process.exitCode = undefined;
  return { code, out };
}

function readBaselineJson(dir: string, name: string): Record<string, any> {
  return JSON.parse(readFileSync(join(dir, `${name}.baseline.json`), "utf8"));
}

function writeBaselineJson(dir: string, name: string, b: unknown): void {
  writeFileSync(join(dir, `${name}.baseline.json`), JSON.stringify(b, null, 2));
}

describe("check", () => {
  it("passes on unchanged cases after blessing, and says how many cases and regressions", async () => {
    const dir = caseFolder(STEEL, PLAIN);
    const bless = await check([dir, "--update"]);
    expect(bless.code).toBe(0);
    expect(readdirSync(dir).filter((f) => f.endsWith(".baseline.json")).sort()).toEqual([`${PLAIN}.baseline.json`, `${STEEL}.baseline.json`]);
    const r = await check([dir]);
    expect(r.code, r.out).toBe(0);
    expect(r.out).toMatch(new RegExp(`passed +${STEEL}`));
    expect(r.out).toMatch(new RegExp(`passed +${PLAIN}`));
    expect(r.out).toContain("check: 2 cases, 0 regressions");
  });

  it("fails with exit 1 and a table naming the quantity when a baseline value is nudged beyond tolerance, and passes when nudged within", async () => {
    const dir = caseFolder(STEEL);
    await check([dir, "--update"]);
    const blessed = readBaselineJson(dir, STEEL);
    const centre = blessed.results["final.T_C.centre"] as number;
    // 0.6 K is beyond the 0.5 K temperature tolerance; 0.4 K is within it. Both are far from the
    // 0.001 K printing step, so rounding cannot decide the outcome.
    writeBaselineJson(dir, STEEL, { ...blessed, results: { ...blessed.results, "final.T_C.centre": centre + 0.6 } });
    const beyond = await check([dir]);
    expect(beyond.code, beyond.out).toBe(1);
    const row = beyond.out.split("\n").find((l) => l.includes("final.T_C.centre"));
    expect(row, beyond.out).toBeDefined();
    expect(row).toContain(STEEL);
    expect(row).toContain("-0.6");
    expect(row).toContain("±0.5 K");
    expect(beyond.out).toContain("check: 1 case, 1 regression in 1 case");

    writeBaselineJson(dir, STEEL, { ...blessed, results: { ...blessed.results, "final.T_C.centre": centre + 0.4 } });
    expect((await check([dir])).code).toBe(0);
  });

  it("compares the blessed history rows too, with the fraction tolerance for phase columns", async () => {
    const dir = caseFolder(STEEL);
    await check([dir, "--update"]);
    const blessed = readBaselineJson(dir, STEEL);
    const column = (blessed.history.columns as string[]).indexOf("ferrite_0mm");
    expect(column).toBeGreaterThan(0);
    const last = blessed.history.rows.length - 1;
    // 0.01 is twice the 0.005 fraction tolerance.
    blessed.history.rows[last][column] += 0.01;
    writeBaselineJson(dir, STEEL, blessed);
    const r = await check([dir]);
    expect(r.code).toBe(1);
    expect(r.out).toContain(`history[time_s=${blessed.history.rows[last][0]}].ferrite_0mm`);
    expect(r.out).toContain("±0.005");
  });

  it("treats a quantity that disappeared or changed from null as a regression", async () => {
    const dir = caseFolder(PLAIN);
    await check([dir, "--update"]);
    const blessed = readBaselineJson(dir, PLAIN);
    writeBaselineJson(dir, PLAIN, { ...blessed, results: { ...blessed.results, "final.no_such_quantity_C": 1, "end_time_s": null } });
    const r = await check([dir]);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/final\.no_such_quantity_C +1 +absent/);
    expect(r.out).toMatch(/end_time_s +null +60/);
  });

  it("honours a per-quantity tolerance override, and --update keeps it", async () => {
    const dir = caseFolder(STEEL);
    await check([dir, "--update"]);
    const blessed = readBaselineJson(dir, STEEL);
    const centre = blessed.results["final.T_C.centre"] as number;
    writeBaselineJson(dir, STEEL, {
      ...blessed,
      tolerances: { temperature_K: 0.5, quantities: { "final.T_C.centre": 1 } },
      results: { ...blessed.results, "final.T_C.centre": centre + 0.6 },
    });
    expect((await check([dir])).code).toBe(0);
    await check([dir, "--update"]);
    const reblessed = readBaselineJson(dir, STEEL);
    expect(reblessed.tolerances).toEqual({ temperature_K: 0.5, quantities: { "final.T_C.centre": 1 } });
    expect(reblessed.results["final.T_C.centre"]).toBe(centre);
  });

  it("--update rewrites the baselines atomically (no temporary files left) and the check then passes", async () => {
    const dir = caseFolder(STEEL, PLAIN);
    await check([dir, "--update"]);
    const fresh = readFileSync(join(dir, `${STEEL}.baseline.json`), "utf8");
    const blessed = readBaselineJson(dir, STEEL);
    writeBaselineJson(dir, STEEL, { ...blessed, results: { ...blessed.results, "final.T_C.top": 0 } });
    expect((await check([dir])).code).toBe(1);
    const update = await check([dir, "--update"]);
    expect(update.code).toBe(0);
    expect(update.out).toContain("final.T_C.top"); // the change being blessed is shown
    expect(readFileSync(join(dir, `${STEEL}.baseline.json`), "utf8")).toBe(fresh);
    expect(readdirSync(dir).filter((f) => f.startsWith("."))).toEqual([]);
    expect((await check([dir])).code).toBe(0);
  });

  it("an atomic write that fails leaves the previous file and no temporary file", () => {
    const dir = join(scratch, "atomic");
    mkdirSync(join(dir, "target"), { recursive: true });
    writeFileSync(join(dir, "target", "inside"), "previous");
    // Renaming a file over a non-empty folder fails (EISDIR/ENOTEMPTY): the write step succeeds
    // and only the rename fails, which is the step that must clean up after itself.
    expect(() => writeFileAtomic(join(dir, "target"), "new")).toThrow(WriteError);
    expect(readdirSync(dir)).toEqual(["target"]);
    expect(readFileSync(join(dir, "target", "inside"), "utf8")).toBe("previous");
  });

  it("lists a case without a baseline as not blessed and does not fail on it", async () => {
    const dir = caseFolder(PLAIN, STEEL);
    await check([dir, "--update", "--only", PLAIN]);
    const r = await check([dir]);
    expect(r.code, r.out).toBe(0);
    expect(r.out).toMatch(new RegExp(`not blessed +${STEEL} .*does not fail`));
    expect(r.out).toContain("check: 2 cases, 0 regressions, 1 not blessed");
  });

  it("--junit writes XML with one testcase per case: a failure naming the worst quantity, a skipped unblessed case", async () => {
    const dir = caseFolder(PLAIN, STEEL);
    copyFileSync(join(REPO, "cases", "stages-strip-5mm-air-only.json"), join(dir, "unblessed.json"));
    await check([dir, "--update", "--only", PLAIN, "--only", STEEL]);
    const blessed = readBaselineJson(dir, STEEL);
    writeBaselineJson(dir, STEEL, { ...blessed, results: { ...blessed.results, "final.T_C.mean": (blessed.results["final.T_C.mean"] as number) + 3 } });
    const junit = join(dir, "report", "junit.xml");
    mkdirSync(join(dir, "report"));
    const r = await check([dir, "--junit", junit]);
    expect(r.code).toBe(1);
    const xml = readFileSync(junit, "utf8");
    expect(xml.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n')).toBe(true);
    expectWellFormed(xml);
    const cases = [...xml.matchAll(/<testcase\b[^>]*\bname="([^"]*)"/g)].map((m) => m[1]);
    expect(cases).toEqual([PLAIN, STEEL, "unblessed"]);
    expect(xml).toMatch(/<testsuite [^>]*tests="3" failures="1" errors="0" skipped="1"/);
    const failure = /<failure message="([^"]*)"/.exec(xml);
    expect(failure?.[1]).toContain("final.T_C.mean");
    expect(xml).toMatch(/<skipped message="not blessed/);
  });

  it("reports a broken baseline file as bad input naming the file and the field", async () => {
    const dir = caseFolder(PLAIN);
    await check([dir, "--update"]);
    const file = join(dir, `${PLAIN}.baseline.json`);
    const blessed = readBaselineJson(dir, PLAIN);
    writeBaselineJson(dir, PLAIN, { ...blessed, version: 2 });
    await expect(check([dir])).rejects.toThrow(InputError);
    await expect(check([dir])).rejects.toThrow(`${file}: version: expected 1`);

    writeBaselineJson(dir, PLAIN, { ...blessed, tolerances: { quantities: { "final.T_C.nowhere": 1 } } });
    await expect(check([dir])).rejects.toThrow('tolerances.quantities["final.T_C.nowhere"]');

    writeFileSync(file, '{ "format": "recalesce-baseline",\n  "version": 1,\n  oops }');
    await expect(check([dir])).rejects.toThrow(/malformed JSON at line 3, column 3/);
  });

  it("reports a broken case as bad input before any baseline is written", async () => {
    const dir = caseFolder(PLAIN);
    writeFileSync(join(dir, "zz-broken.json"), JSON.stringify({ ...JSON.parse(readFileSync(join(dir, `${PLAIN}.json`), "utf8")), numerics: { scheme: "implicit", cells: 2, time_step_s: 0.1 } }));
    await expect(runCheckCommand(dir, { update: true }, () => undefined)).rejects.toThrow(/zz-broken\.json: numerics\.cells/);
    expect(readdirSync(dir).filter((f) => f.endsWith(".baseline.json"))).toEqual([]);
  });

  it("refuses a folder that is missing, holds no cases, or lacks the case named by --only", async () => {
    await expect(check([join(scratch, "nowhere")])).rejects.toThrow(/folder not found/);
    const empty = join(scratch, "empty");
    mkdirSync(empty);
    await expect(check([empty])).rejects.toThrow(/holds no case files/);
    await expect(check([caseFolder(PLAIN), "--only", "nothing-here"])).rejects.toThrow(/--only: no case "nothing-here.json"/);
  });
});

describe("tolerance rules and quantity paths", () => {
  it("choose the tolerance class from the quantity's name, so new fields need no list", () => {
    const expected: Record<string, string> = {
      "final.T_C.top": "temperature",
      "coiling.T_C.mean": "temperature",
      "critical_C.Ae3": "temperature",
      "pyrometers[position_m=30].T_C": "temperature",
      "depths[depth_mm=3].recalescence_K": "temperature",
      "history[time_s=1.5].T_3mm_C": "temperature",
      "depths[depth_mm=3].phases.ferrite": "fraction",
      "history[time_s=1.5].martensite_0mm": "fraction",
      "final.grain_um.centre": "grain",
      "final.yield_MPa.top": "strength",
      "final.hardness_HV.mean": "strength",
      "depths[depth_mm=0].transformation_start.time_s": "time",
      "line.time_under_water_s": "time",
      "line.mean_cooling_rate_under_water_K_s": "rate",
      "energy.relative_error": "ledger",
      "coil.worst_energy_relative_error": "ledger",
      "energy.enthalpy_change_J_m2": "other",
      "line.length_m": "position",
    };
    const got = Object.fromEntries(Object.keys(expected).map((q) => [q, classOfPath(q)]));
    expect(got).toEqual(expected);
  });

  it("flattening names array items by a distinct identity key, else by index, and skips non-results", () => {
    const flat = flattenSummary({
      title: "ignored",
      numerics: { steps: 10 },
      depths: [{ depth_mm: 0, recalescence_K: 1 }, { depth_mm: 3, recalescence_K: 2 }],
      twins: [{ depth_mm: 1, x_C: 5 }, { depth_mm: 1, x_C: 6 }],
      final: { T_C: { top: 700 }, finish: null },
      product: { grain_model: "nucleation", notes: ["prose is not a result"] },
    });
    expect(flat).toEqual({
      "depths[depth_mm=0].recalescence_K": 1,
      "depths[depth_mm=3].recalescence_K": 2,
      "twins[0].depth_mm": 1,
      "twins[0].x_C": 5,
      "twins[1].depth_mm": 1,
      "twins[1].x_C": 6,
      "final.T_C.top": 700,
      "final.finish": null,
      "product.grain_model": "nucleation",
    });
  });
});

describe("the blessed regression suite in cases/", () => {
  it("every case is valid and every baseline beside a case parses and names that case", () => {
    const dir = join(REPO, "cases");
    const files = readdirSync(dir).filter((f) => f.endsWith(".json") && !f.endsWith(".baseline.json"));
    expect(files.length).toBeGreaterThan(0);
    let baselines = 0;
    for (const f of files) {
      loadCase(join(dir, f));
      const b = join(dir, baselineFileFor(f));
      if (!readdirSync(dir).includes(baselineFileFor(f))) continue;
      const baseline = validateBaseline(b, parseJson(b, readTextFile(b)));
      expect(baseline.case).toBe(f);
      baselines++;
    }
    // Not vacuous: the skip above must not have skipped every case.
    expect(baselines).toBeGreaterThan(0);
  });
});

/** Tags open and close in order, attributes quoted, only the five XML entities. */
function expectWellFormed(xml: string): void {
  const body = xml.replace(/^<\?xml[^?]*\?>\n/, "");
  const stack: string[] = [];
  for (const m of body.matchAll(/<(\/?)([A-Za-z][\w-]*)((?:\s+[\w-]+="[^"<]*")*)\s*(\/?)>/g)) {
    if (m[1]) expect(stack.pop()).toBe(m[2]);
    else if (!m[4]) stack.push(m[2]);
  }
  expect(stack).toEqual([]);
  expect(body.replace(/<[^>]*>/g, "")).not.toMatch(/<|&(?!(amp|lt|gt|quot|apos);)/);
}
