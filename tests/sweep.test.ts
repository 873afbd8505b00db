/**
 * `recalesce sweep` and `merge` (src/io/sweep*.ts): rows against plain runs of the same case,
 * shards merged back byte for byte, worker threads against the in-thread run, and the one-line
 * errors for paths and values the case cannot take.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { describe, expect, it } from "vitest";
import { loadCase } from "../src/io/load-case.js";
import { resolveCase } from "../src/io/resolve-case.js";
import { simulateResolved } from "../src/io/run-case.js";
import { InputError } from "../src/io/errors.js";
import { runSweep, type SweepRequest } from "../src/io/sweep.js";
import { mergeSweeps } from "../src/io/sweep-merge.js";
import { parseVary } from "../src/io/sweep-grid.js";
import { fixed } from "../src/io/format.js";
import { SAFETY_NOTICE } from "../src/io/safety.js";
import { tempDirs } from "./support/temp-dirs.js";

const THIN = "cases/demo-thin-cmn.json";
const temp = tempDirs("recalesce-sweep-");
const tmp = temp.make;

/** 2 × 2 points; point 3 (thickness 3 mm, bank B2 at 1) is the demo case itself. */
const grid = (shard: SweepRequest["shard"] = null): SweepRequest => ({ vary: [parseVary("product.thickness_mm=2.5,3"), parseVary("cooling.line.banks[1].multiplier=0.8:1:0.2")], shard });
const bytes = (dir: string, name: string) => readFileSync(join(dir, name), "utf8");

describe("a sweep", () => {
  const c = loadCase(THIN);
  it("writes one row per grid point in order, and the row of the unvaried point equals a plain run", async () => {
    const out = join(tmp(), "whole");
    const o = await runSweep(THIN, c, grid(), out, { workers: 1 });
    const lines = bytes(out, "sweep.csv").trim().split("\n");
    expect(lines[0]).toBe("point,product.thickness_mm,cooling.line.banks[1].multiplier,coiling_mean_C,coiling_top_C,ferrite,pearlite,bainite,martensite,austenite,grain_um,yield_MPa,tensile_MPa,recalescence_max_K");
    expect(lines.slice(1).map((l) => l.split(",").slice(0, 3).join(","))).toEqual(["0,2.5,0.8", "1,2.5,1", "2,3,0.8", "3,3,1"]);
    const plain = simulateResolved(c, resolveCase(THIN, c), undefined, true).summary as { coiling: { T_C: { mean: number; top: number } }; depths: Array<{ recalescence_K: number }> };
    const row = lines[4].split(",");
    expect(row[3]).toBe(fixed(plain.coiling.T_C.mean, 3));
    expect(row[4]).toBe(fixed(plain.coiling.T_C.top, 3));
    expect(row[13]).toBe(fixed(Math.max(...plain.depths.map((d) => d.recalescence_K)), 3));
    // More water in bank B2 ⇒ colder coiling at the same thickness.
    expect(Number(lines[2].split(",")[3])).toBeLessThan(Number(lines[1].split(",")[3]));
    expect(o.summary.caution).toBe(SAFETY_NOTICE);
  });

  it("cut into shards and merged is byte-identical to the whole sweep", async () => {
    const root = tmp();
    await runSweep(THIN, c, grid(), join(root, "whole"), { workers: 1 });
    const shards = [1, 2, 3].map((k) => join(root, `shard${k}`));
    for (const [k, dir] of shards.entries()) await runSweep(THIN, c, grid({ index: k + 1, count: 3 }), dir, { workers: 1 });
    expect(bytes(shards[0], "sweep.csv").trim().split("\n").map((l) => l.split(",")[0])).toEqual(["point", "0", "3"]);
    mergeSweeps([shards[2], shards[0], shards[1]], join(root, "merged"));
    expect(bytes(join(root, "merged"), "sweep.csv")).toBe(bytes(join(root, "whole"), "sweep.csv"));
    expect(bytes(join(root, "merged"), "summary.json")).toBe(bytes(join(root, "whole"), "summary.json"));
    expect(() => mergeSweeps([shards[0], shards[1]], join(root, "m2"))).toThrow(/shard\(s\) 3\/3 not given/);
    expect(() => mergeSweeps([shards[0], shards[0], shards[1], shards[2]], join(root, "m3"))).toThrow(/point 0 is also in/);
    expect(existsSync(join(root, "m2"))).toBe(false);
  });

  it("on compiled worker threads writes the same bytes as in this thread", async () => {
    const root = tmp();
    const build = mkdtempSync(join(resolve("out"), "test-dist-sweep-"));
    temp.track(build);
    execFileSync("npm", ["run", "build", "--", "--outDir", build], { stdio: "pipe" });
    const compiled = (await import(pathToFileURL(join(build, "io", "sweep.js")).href)) as typeof import("../src/io/sweep.js");
    const loader = (await import(pathToFileURL(join(build, "io", "load-case.js")).href)) as typeof import("../src/io/load-case.js");
    await compiled.runSweep(THIN, loader.loadCase(THIN), grid(), join(root, "threads"), { workers: 2 });
    await runSweep(THIN, c, grid(), join(root, "inline"), { workers: 1 });
    expect(bytes(join(root, "threads"), "sweep.csv")).toBe(bytes(join(root, "inline"), "sweep.csv"));
  });
});

describe("a bad sweep request", () => {
  const c = loadCase(THIN);
  const sweep = (spec: string) => runSweep(THIN, c, { vary: [parseVary(spec)], shard: null }, join(tmp(), "never"), { workers: 1 });
  it("names the path or value and writes nothing", async () => {
    await expect(sweep("product.thick=2,3")).rejects.toThrow(/product\.thick: does not exist in the case/);
    await expect(sweep("cooling.line.banks=2,3")).rejects.toThrow(/cooling\.line\.banks: is not a number in the case \(found a list\)/);
    await expect(sweep("cooling.line.banks[12].multiplier=1")).rejects.toThrow(InputError);
    await expect(sweep("product.thickness_mm=1,3")).rejects.toThrow(/--vary product\.thickness_mm=1: makes the case invalid: output\.depths_mm\[2\]/);
    await expect(sweep("numerics.time_step_s=100")).rejects.toThrow(/--vary numerics\.time_step_s=100: numerics\.time_step_s/);
    for (const d of temp.all()) expect(existsSync(join(d, "never"))).toBe(false);
  });
});
