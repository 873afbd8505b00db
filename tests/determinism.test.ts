/**
 * The same case gives byte-identical result files: fixed-precision formatting (io/format.ts), no
 * dates or host names in the files. The case runs in two separate processes of the compiled CLI,
 * from two different working folders, so nothing may depend on process state or the current
 * folder. (Coil runs on 1 and 2 worker threads are compared byte for byte in coil-parallel.test.ts.)
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildCli, removeBuild, REPO, runCli, type BuiltCli } from "./support/built-cli.js";
import { runCliIn } from "./support/cli-process.js";

let cli: BuiltCli;
let scratch: string;

beforeAll(() => {
  cli = buildCli();
  scratch = mkdtempSync(join(tmpdir(), "recalesce-determinism-"));
});
afterAll(() => {
  removeBuild(cli);
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

/** Runs a case twice (different working folders) and returns both result folders. */
function runTwice(caseFile: string, tag: string): [string, string] {
  const a = join(scratch, `${tag}-a`);
  const b = join(scratch, `${tag}-b`);
  const first = runCli(cli, ["run", caseFile, "--out", a, "--quiet"]);
  const second = runCliIn(cli, ["run", caseFile, "--out", b, "--quiet"], scratch);
  expect(first.status, first.stderr).toBe(0);
  expect(second.status, second.stderr).toBe(0);
  return [a, b];
}

function expectIdenticalFolders(a: string, b: string): void {
  const files = readdirSync(a).sort();
  expect(readdirSync(b).sort()).toEqual(files);
  expect(files).toEqual(expect.arrayContaining(["summary.json", "history.csv", "profile.csv"]));
  for (const f of files) {
    const x = readFileSync(join(a, f));
    const y = readFileSync(join(b, f));
    // Byte equality, not a tolerance: the claim is that the files are identical.
    expect(x.equals(y), `${f} differs between two runs of the same case`).toBe(true);
  }
}

describe("determinism", () => {
  it("running a transforming stage case twice gives byte-identical summary, history and profile", () => {
    const [a, b] = runTwice(join(REPO, "cases", "stages-strip-8mm-split-cooling.json"), "split");
    expectIdenticalFolders(a, b);
  });
});
