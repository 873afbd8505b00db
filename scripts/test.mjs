#!/usr/bin/env node
// Runs the vitest suite and ends with the plain closing line `N passed, N failed[, N skipped]`
// that CI reads (vitest's own summary is not recognised there). The counts come from vitest's
// JUnit report, so they are the runner's own numbers, not ours. Exits non-zero when anything failed
// or when no test ran at all.
import { spawnSync } from "node:child_process";
import { mkdirSync, readFileSync, existsSync, rmSync } from "node:fs";
import { join } from "node:path";

const reportDir = ".vitest-report";
const report = join(reportDir, "junit.xml");
rmSync(reportDir, { recursive: true, force: true });
mkdirSync(reportDir, { recursive: true });

const extra = process.argv.slice(2);
const run = spawnSync(
  process.execPath,
  ["node_modules/vitest/vitest.mjs", "run", "--reporter=default", "--reporter=junit", `--outputFile.junit=${report}`, ...extra],
  { stdio: "inherit" },
);

let passed = 0;
let failed = 0;
let skipped = 0;
if (existsSync(report)) {
  const xml = readFileSync(report, "utf8");
  for (const m of xml.matchAll(/<testcase\b[^>]*?(\/>|>([\s\S]*?)<\/testcase>)/g)) {
    const body = m[2] ?? "";
    if (/<(failure|error)\b/.test(body)) failed++;
    else if (/<skipped\b/.test(body)) skipped++;
    else passed++;
  }
  // Errors outside any test (a file that fails to import) appear as suite-level failures.
  const suiteErrors = [...xml.matchAll(/<testsuite\b[^>]*\berrors="(\d+)"/g)].reduce((s, m) => s + Number(m[1]), 0);
  if (suiteErrors > 0 && failed === 0) failed = suiteErrors;
}
const status = run.status ?? 1;
if (status !== 0 && failed === 0) failed = 1;
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
process.exit(status !== 0 || failed > 0 || passed === 0 ? 1 : 0);
