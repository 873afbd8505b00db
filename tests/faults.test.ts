/**
 * Faults: interrupted runs and unwritable result folders (the contract in cli/main.ts and
 * io/result-folder.ts). The compiled CLI is spawned; a deliberately slow case (the 20 mm plate
 * with 800 cells and 1 ms steps: 60 000 steps, about 2 s of work, 4.8e7 cell-steps, well inside the
 * run guard) is signalled once its hidden partial folder exists plus about 300 ms, so the signal
 * lands in the middle of the simulation.
 */
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { setTimeout as sleep } from "node:timers/promises";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildCli, removeBuild, REPO, runCli as runBuilt, type BuiltCli } from "./support/built-cli.js";
import { finished, startCli as startBuilt } from "./support/cli-process.js";

let cli: BuiltCli;
let scratch: string;
let slowCase: string;
const quickCase = join(REPO, "cases", "plate-20mm-water-quench.json");

const runCli = (args: readonly string[]) => runBuilt(cli, args);
const startCli = (args: readonly string[]) => startBuilt(cli, args);

beforeAll(() => {
  cli = buildCli();
  scratch = mkdtempSync(join(tmpdir(), "recalesce-faults-"));
  const c = JSON.parse(readFileSync(quickCase, "utf8"));
  c.numerics.cells = 800;
  c.numerics.time_step_s = 0.001;
  slowCase = join(scratch, "slow.json");
  writeFileSync(slowCase, JSON.stringify(c));
});
afterAll(() => {
  removeBuild(cli);
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

/** Every file of a folder with its bytes, for byte-for-byte comparison. */
function snapshot(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const f of readdirSync(dir).sort()) out[f] = readFileSync(join(dir, f)).toString("base64");
  return out;
}

/** Hidden work folders a run may leave beside its target (partial or old results). */
function hiddenLeftovers(parent: string): string[] {
  return readdirSync(parent).filter((f) => f.startsWith(".") && /\.(partial|old)-\d+$/.test(f));
}

/** Polls until a path exists (the run has begun writing); gives up after ~30 s of polling. */
async function waitForPartial(parent: string, target: string, pid: number): Promise<void> {
  const partial = join(parent, `.${target}.partial-${pid}`);
  for (let i = 0; i < 1500 && !existsSync(partial); i++) await sleep(20);
}

describe.each(["SIGTERM", "SIGINT"] as const)("a run interrupted by %s", (signal) => {
  it("leaves no result folder, no hidden partial folder, and a previous result byte-identical", async () => {
    const parent = join(scratch, signal);
    mkdirSync(parent);
    const previous = join(parent, "kept");
    const prior = runCli(["run", quickCase, "--out", previous, "--quiet"]);
    expect(prior.status, prior.stderr).toBe(0);
    const before = snapshot(previous);

    // Two runs at once: one into a fresh folder, one over the previous result.
    const fresh = startCli(["run", slowCase, "--out", join(parent, "fresh"), "--quiet"]);
    const over = startCli(["run", slowCase, "--out", previous, "--quiet"]);
    const results = [finished(fresh), finished(over)];
    await waitForPartial(parent, "fresh", fresh.pid!);
    await waitForPartial(parent, "kept", over.pid!);
    await sleep(300);
    fresh.kill(signal);
    over.kill(signal);
    const [a, b] = await Promise.all(results);

    for (const r of [a, b]) {
      // 128 + signal number, as shells report it (SIGINT 2 → 130, SIGTERM 15 → 143).
      expect(r.status, r.stderr).toBe(signal === "SIGINT" ? 130 : 143);
      expect(r.stderr.trimEnd().split("\n")).toHaveLength(1);
      expect(r.stderr).toContain(signal);
    }
    expect(existsSync(join(parent, "fresh")), "an interrupted run must not leave a result folder").toBe(false);
    expect(hiddenLeftovers(parent)).toEqual([]);
    expect(snapshot(previous)).toEqual(before);
  });
});

describe("a run that cannot finish writing", () => {
  it("exits 1 with the path named in one line and writes nothing", () => {
    // Tests may run as root, where chmod 0o555 does not stop writes; probe, and fall back to a
    // path under a regular file, which fails with ENOTDIR for everyone.
    const readOnly = join(scratch, "read-only");
    mkdirSync(readOnly);
    chmodSync(readOnly, 0o555);
    let chmodProtects = false;
    try {
      writeFileSync(join(readOnly, "probe"), "x");
    } catch {
      chmodProtects = true;
    }
    let target: string;
    if (chmodProtects) {
      target = join(readOnly, "out");
    } else {
      const file = join(scratch, "a-regular-file");
      writeFileSync(file, "not a folder\n");
      target = join(file, "out");
    }
    const r = runCli(["run", quickCase, "--out", target, "--quiet"]);
    chmodSync(readOnly, 0o755);
    expect(r.status, r.stderr).toBe(1);
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain(target);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(existsSync(target)).toBe(false);
  });

  it("a previous result survives a later run into the same folder that fails on bad input", () => {
    const parent = join(scratch, "survive");
    mkdirSync(parent);
    const kept = join(parent, "kept");
    const ok = runCli(["run", quickCase, "--out", kept, "--quiet"]);
    expect(ok.status, ok.stderr).toBe(0);
    const before = snapshot(kept);
    const broken = join(scratch, "broken-case.json");
    writeFileSync(broken, readFileSync(quickCase, "utf8").replace('"cells": 80', '"cells": 2'));
    const r = runCli(["run", broken, "--out", kept, "--quiet"]);
    expect(r.status).toBe(2);
    expect(snapshot(kept)).toEqual(before);
    expect(hiddenLeftovers(parent)).toEqual([]);
  });
});
