/**
 * `recalesce design` (src/io/design*.ts) on the invented demo mill (scripts/demo-mill.ts: 100 m
 * table, 40 headers B1.1–B10.4, 2 m pitch). The checks are consistency checks against the model
 * itself, which is what a design promises: the designed case run on its own gives the predicted
 * temperature, the chosen header count is at least as good as its neighbours (evaluated
 * independently), limits are kept, and what cannot be reached is reported as such.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { loadCase } from "../src/io/load-case.js";
import { resolveCase } from "../src/io/resolve-case.js";
import { simulateResolved } from "../src/io/run-case.js";
import { InputError } from "../src/io/errors.js";
import { designCooling } from "../src/io/design.js";
import { writeDesignFolder } from "../src/io/design-report.js";
import { designPlan, type DesignRequest } from "../src/io/design-plan.js";
import { SegmentEvaluator } from "../src/io/segment-evaluator.js";
import { SAFETY_NOTICE } from "../src/io/safety.js";
import { runCoil } from "../src/io/coil.js";
import { tempDirs } from "./support/temp-dirs.js";

const THIN = "cases/demo-thin-cmn.json";
const SPLIT = "cases/demo-split-dual-phase.json";
const COIL = "cases/coil-6mm-acceleration.json";
const tmp = tempDirs("recalesce-design-").make;

const early = (more: Partial<DesignRequest> = {}): DesignRequest => ({ coiling_C: 600, tolerance_K: 10, strategy: "early", ...more });

describe("a design of the 3 mm demo strip", () => {
  it("with flow trim lands within tolerance, and designed.json run on its own gives the predicted coiling temperature", async () => {
    const c = loadCase(THIN);
    const o = await designCooling(THIN, c, early({ flowRange: [0.5, 1.5] }), { workers: 1 });
    expect(o.reachable).toBe(true);
    const d = o.segments[0];
    // The trim stops within a tenth of the tolerance (design-plan.ts TRIM_FRACTION).
    expect(Math.abs(d.error_K)).toBeLessThanOrEqual(1);
    const out = join(tmp(), "design");
    const summary = writeDesignFolder(o, out);
    expect(summary.caution).toBe(SAFETY_NOTICE);
    const designedFile = join(out, "designed.json");
    const designed = loadCase(designedFile);
    const rerun = simulateResolved(designed, resolveCase(designedFile, designed), undefined, true).summary as { coiling: { T_C: { mean: number } } };
    // Same pattern, same code path: identical to the last written digit.
    expect(rerun.coiling.T_C.mean).toBe(d.evaluation.coiling_C.mean);
    // Early cooling opens a prefix of the table's headers.
    expect(d.pattern.open).toEqual(Array.from({ length: d.pattern.open.length }, (_, i) => i));
    const written = JSON.parse(readFileSync(join(out, "summary.json"), "utf8"));
    expect(written.segments[0].coiling_C.mean).toBe(d.evaluation.coiling_C.mean);
    expect(written.segments[0].phases.ferrite).toBeGreaterThan(0);
    expect(written.segments[0].yield_MPa.mean).toBeGreaterThan(0);
  });

  it("without flow trim takes the whole-header count nearest the target and reports a miss beyond the tolerance", async () => {
    const c = loadCase(THIN);
    const o = await designCooling(THIN, c, early(), { workers: 1 });
    const d = o.segments[0];
    const n = d.counts[0];
    // Independent runs of one header fewer and one more: neither is nearer the target.
    const ev = new SegmentEvaluator(THIN, c, o.plan, { index: 0, position_m: 0, entry_C: 870 });
    const T = (k: number) => ev.evaluate({ open: o.plan.front.slice(0, k), scaled: o.plan.front.slice(0, k), flowScale: 1 }).coiling_C.mean;
    expect(T(n)).toBe(d.evaluation.coiling_C.mean);
    expect(T(n - 1)).toBeGreaterThan(T(n)); // more water ⇒ colder, the monotonicity the search relies on
    expect(T(n + 1)).toBeLessThan(T(n));
    expect(Math.abs(T(n) - 600)).toBeLessThanOrEqual(Math.abs(T(n - 1) - 600));
    expect(Math.abs(T(n) - 600)).toBeLessThanOrEqual(Math.abs(T(n + 1) - 600));
    expect(o.reachable).toBe(Math.abs(d.error_K) <= 10);
    if (!o.reachable) expect(o.messages[0]).toMatch(/nearest reachable/);
  });

  it("with late cooling opens headers from the back of the table", async () => {
    const o = await designCooling(THIN, loadCase(THIN), { coiling_C: 600, tolerance_K: 10, strategy: "late", flowRange: [0.5, 1.5] }, { workers: 1 });
    const open = o.segments[0].pattern.open;
    expect(open.length).toBeGreaterThan(0);
    expect(open).toEqual(Array.from({ length: open.length }, (_, i) => 40 - open.length + i));
    expect(o.reachable).toBe(true);
  });

  it("keeps the mean cooling rate under water within a limit by lowering the flow and opening more headers", async () => {
    const c = loadCase(THIN);
    const free = await designCooling(THIN, c, early({ flowRange: [0.5, 1.5] }), { workers: 1 });
    const limit = 95; // below the free design's rate (≈ 104 K/s), above what 0.5× flow gives
    expect(free.segments[0].evaluation.rate_K_s!).toBeGreaterThan(limit);
    const o = await designCooling(THIN, c, early({ flowRange: [0.5, 1.5], maxCoolingRate_K_s: limit }), { workers: 1 });
    const d = o.segments[0];
    expect(d.evaluation.rate_K_s!).toBeLessThanOrEqual(limit);
    expect(d.pattern.flowScale).toBeLessThan(free.segments[0].pattern.flowScale);
    expect(d.pattern.open.length).toBeGreaterThan(free.segments[0].pattern.open.length);
    expect(o.reachable).toBe(true);
  });

  it("says too much water when even every header off is colder than the target, with the all-off temperature", async () => {
    const o = await designCooling(THIN, loadCase(THIN), early({ coiling_C: 850 }), { workers: 1 });
    expect(o.reachable).toBe(false);
    expect(o.segments[0].pattern.open).toEqual([]);
    expect(o.messages[0]).toMatch(/too much water/);
    expect(o.messages[0]).toContain(`nearest reachable ${o.segments[0].evaluation.coiling_C.mean.toFixed(1)} °C`);
  });

  it("says too little water when the banks left on cannot cool far enough, opening all of them", async () => {
    const keepOff = ["B2", "B3", "B4", "B5", "B6", "B7", "B8", "B9", "B10"];
    const o = await designCooling(THIN, loadCase(THIN), early({ coiling_C: 400, keepOff }), { workers: 1 });
    expect(o.reachable).toBe(false);
    expect(o.segments[0].pattern.open).toEqual([0, 1, 2, 3]); // B1.1–B1.4
    expect(o.messages[0]).toMatch(/too little water/);
  });
});

describe("split cooling of the dual-phase demo strip", () => {
  it("ends the front group inside the band, holds in air at least the hold time and finishes from the back", async () => {
    const request: DesignRequest = { coiling_C: 250, tolerance_K: 15, strategy: "split", intermediate_C: [660, 720], hold_s: 5, flowRange: [0.5, 1.5] };
    const o = await designCooling(SPLIT, loadCase(SPLIT), request, { workers: 1 });
    const d = o.segments[0];
    expect(o.reachable).toBe(true);
    // The request's own band (660–720 °C) and hold (5 s): constraints the design must meet, no tolerance.
    expect(d.intermediate_C!).toBeGreaterThanOrEqual(660);
    expect(d.intermediate_C!).toBeLessThanOrEqual(720);
    expect(d.hold_s!).toBeGreaterThanOrEqual(5);
    const [front, back] = d.counts;
    expect(d.pattern.open).toEqual([...Array.from({ length: front }, (_, i) => i), ...Array.from({ length: back }, (_, i) => 40 - back + i)]);
    // The trim acts on the back group only.
    expect(d.pattern.scaled).toEqual(Array.from({ length: back }, (_, i) => 40 - back + i));
  });
});

describe("a coil design", () => {
  /** The demo coil cut into 4 segments (threading, acceleration, top speed, tail) to keep the test short. */
  function shortCoil(): string {
    const data = JSON.parse(readFileSync(COIL, "utf8"));
    data.cooling.coil.segments = 4;
    const file = join(tmp(), "coil.json");
    writeFileSync(file, JSON.stringify(data));
    return file;
  }

  it("designs every segment within tolerance and writes patterns.csv; designed.json is the body segment's pattern", async () => {
    const file = shortCoil();
    const o = await designCooling(file, loadCase(file), early({ flowRange: [0.5, 1.5] }), { workers: 1 });
    expect(o.reachable).toBe(true);
    // 10 K: the request's tolerance_K (early() default), which "within tolerance" means.
    expect(o.segments).toHaveLength(4);
    for (const d of o.segments) expect(Math.abs(d.error_K)).toBeLessThanOrEqual(10);
    const out = join(tmp(), "coil-design");
    writeDesignFolder(o, out);
    const csv = readFileSync(join(out, "patterns.csv"), "utf8").trim().split("\n");
    expect(csv.length).toBe(1 + 4);
    const designed = loadCase(join(out, "designed.json"));
    const line = (designed.cooling as { line: { zones: Array<{ top?: { water?: { on: boolean } } }> } }).line;
    const on = line.zones.map((z, i) => (z.top?.water?.on ? i : -1)).filter((i) => i >= 0);
    expect(on).toEqual(o.segments[o.body].pattern.open.map((h) => o.plan.headers[h].zone));
  });

  it("writes every segment's pattern into designed.json, so running it reproduces each segment's predicted coiling temperature", async () => {
    const file = shortCoil();
    const o = await designCooling(file, loadCase(file), early({ flowRange: [0.5, 1.5] }), { workers: 1 });
    const out = join(tmp(), "coil-design-run");
    writeDesignFolder(o, out);
    const designedFile = join(out, "designed.json");
    const designed = loadCase(designedFile);
    const runs = await runCoil(designedFile, designed, { workers: 1 });
    // Same patterns, same code path per segment: identical to the written digit (3 decimals).
    expect(runs).toHaveLength(o.segments.length);
    runs.forEach((r, k) => expect(r.coiling_C.mean).toBe(o.segments[k].evaluation.coiling_C.mean));
  });

  it("with no switches allowed gives every segment the same headers and trims each by its flow", async () => {
    const file = shortCoil();
    const o = await designCooling(file, loadCase(file), early({ flowRange: [0.5, 1.5], maxSwitches: 0 }), { workers: 1 });
    expect(o.largestSwitches).toBe(0);
    const first = o.segments[0].pattern.open;
    for (const d of o.segments) expect(d.pattern.open).toEqual(first);
    // Each segment's flow scale is still trimmed on its own, which absorbs the speed change here.
    expect(new Set(o.segments.map((d) => d.pattern.flowScale)).size).toBeGreaterThan(1);
    expect(o.reachable).toBe(true);
  });
});

describe("bad design requests", () => {
  const c = loadCase(THIN);
  const plan = (r: Partial<DesignRequest>) => () => designPlan(THIN, c, { ...early(), ...r }, [870]);
  it("are input errors naming the option", () => {
    expect(plan({ coiling_C: 900 })).toThrow(InputError);
    expect(plan({ coiling_C: 900 })).toThrow(/--coiling-C: 900 °C is not below the entry temperature/);
    expect(plan({ coiling_C: 25 })).toThrow(/--coiling-C: 25 °C is not above the water temperature/);
    expect(plan({ keepOff: ["B3", "B11"] })).toThrow(/--keep-off: unknown bank "B11"/);
    expect(plan({ strategy: "split", hold_s: 5 })).toThrow(/--intermediate-C: split cooling needs/);
    expect(plan({ strategy: "split", coiling_C: 300, intermediate_C: [250, 700], hold_s: 5 })).toThrow(/must lie above the coiling target/);
    expect(plan({ intermediate_C: [650, 700] })).toThrow(/applies only to --strategy split/);
  });
});

describe("the design command", () => {
  const cli = (args: string[]) => spawnSync(process.execPath, ["--import", "tsx", "tests/support/cli-with-design.ts", ...args], { encoding: "utf8" });
  it("exits 3 with the files written when the target is missed, and 2 with one line for a malformed band", () => {
    const out = join(tmp(), "unreachable");
    const missed = cli(["design", THIN, "--coiling-C", "850", "--out", out]);
    expect(missed.status).toBe(3);
    expect(missed.stdout).toContain("TARGET NOT REACHED");
    expect(missed.stdout).toContain(SAFETY_NOTICE);
    expect(JSON.parse(readFileSync(join(out, "summary.json"), "utf8")).reachable).toBe(false);
    const bad = cli(["design", THIN, "--coiling-C", "300", "--strategy", "split", "--intermediate-C", "700-650", "--hold-s", "5", "--out", join(tmp(), "x")]);
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split("\n")).toHaveLength(1);
    expect(bad.stderr).toContain("--intermediate-C");
  });
});
