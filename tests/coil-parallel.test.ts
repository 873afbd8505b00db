/**
 * A coil run on worker threads gives the same files as a serial run (src/io/coil.ts: each segment
 * is computed by the same code from the same inputs, and results are merged in segment order).
 * Checked end to end through the compiled CLI, where the worker file exists and threads are used.
 */
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { REPO, cliForThisFile, runCli } from "./support/built-cli.js";

const { cli, scratch } = cliForThisFile("coil-parallel");

describe("the demo coil through the compiled CLI", () => {
  it("gives byte-identical result files with one worker and with two", () => {
    // coil.ts switches to worker threads only when the compiled worker sits next to it.
    expect(existsSync(join(cli().dir, "io", "coil-worker.js"))).toBe(true);
    const folders = [1, 2].map((workers) => {
      const out = join(scratch(), `workers-${workers}`);
      const r = runCli(cli(), ["run", "cases/coil-6mm-acceleration.json", "--out", out, "--workers", String(workers), "--quiet"]);
      expect(r.status, r.stderr).toBe(0);
      return out;
    });
    const files = readdirSync(folders[0]).sort();
    expect(files).toEqual(["coil.csv", "history.csv", "profile.csv", "summary.json"]);
    expect(readdirSync(folders[1]).sort()).toEqual(files);
    for (const f of files) {
      const serial = readFileSync(join(folders[0], f));
      const parallel = readFileSync(join(folders[1], f));
      // Byte equality, no tolerance: the claim is that the thread count changes nothing.
      expect(parallel.equals(serial), `${f} differs between --workers 1 and --workers 2`).toBe(true);
    }
    // A header and one row per segment: all 30 segments were merged, not just some.
    expect(readFileSync(join(folders[0], "coil.csv"), "utf8").trimEnd().split("\n")).toHaveLength(31);
  });
});
