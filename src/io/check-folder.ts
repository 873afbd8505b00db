/**
 * The regression check of a folder of cases: every `DIR/NAME.json` is re-run and compared with its
 * blessed `DIR/NAME.baseline.json`; with `update`, the baselines are re-blessed instead.
 *
 * Order of work, so that bad input never leaves anything half done:
 *   1. find the cases, read and validate every case and every baseline (InputError → exit 2);
 *   2. run each case into a private folder under the system temporary folder, read its
 *      summary.json and history.csv, delete the folder;
 *   3. compare (or bless); with `update`, write every baseline only after all cases ran, each
 *      atomically (temporary file + rename).
 * A case without a baseline is reported as not blessed and does not fail the check.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { basename, join } from "node:path";
import { writeFileAtomic } from "./atomic-file.js";
import { baselineFileFor, blessBaseline, blessedResultsOf, sha256, stringifyBaseline, validateBaseline, type Baseline, type BlessedResults } from "./baseline.js";
import { compareWithBaseline, type Comparison } from "./compare-baseline.js";
import { InputError } from "./errors.js";
import { loadCase, parseJson, readTextFile } from "./load-case.js";
import { runCase } from "./run-case.js";

export type CaseStatus = "passed" | "regressed" | "not blessed" | "blessed";

export interface CaseOutcome {
  /** The case name: the file name without `.json`. */
  readonly name: string;
  readonly caseFile: string;
  readonly baselineFile: string;
  readonly status: CaseStatus;
  /** Against the previous baseline; null when there was none. */
  readonly comparison: Comparison | null;
  /** The case file differs from the one the baseline was blessed from. */
  readonly caseChanged: boolean;
  /** Per-quantity tolerance overrides dropped on re-blessing because the quantity is gone. */
  readonly droppedOverrides: string[];
}

export interface CheckOutcome {
  readonly folder: string;
  readonly update: boolean;
  readonly cases: CaseOutcome[];
}

export interface CheckOptions {
  /** Case names (with or without `.json`) to restrict the check to. */
  readonly only?: readonly string[];
  /** Re-bless instead of failing on differences. */
  readonly update?: boolean;
}

const BASELINE_SUFFIX = ".baseline.json";

/** The case files of a folder, sorted by name (byte order, so every machine agrees). */
export function findCases(dir: string, only: readonly string[] = []): string[] {
  let st;
  try {
    st = statSync(dir);
  } catch {
    throw new InputError(dir, "", "folder not found; expected a folder of case files (NAME.json)");
  }
  if (!st.isDirectory()) throw new InputError(dir, "", "is a file; expected a folder of case files (NAME.json)");
  const names = readdirSync(dir)
    .filter((f) => f.endsWith(".json") && !f.endsWith(BASELINE_SUFFIX) && !f.startsWith("."))
    .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  for (const wanted of only) {
    const file = wanted.endsWith(".json") ? wanted : `${wanted}.json`;
    if (!names.includes(file)) throw new InputError(dir, "--only", `no case "${file}" in this folder`);
  }
  const chosen = only.length ? names.filter((f) => only.some((w) => f === w || f === `${w}.json`)) : names;
  if (chosen.length === 0) throw new InputError(dir, "", "holds no case files (NAME.json)");
  return chosen.map((f) => join(dir, f));
}

/** Reads and validates a baseline file if there is one. */
export function readBaseline(file: string): Baseline | null {
  try {
    statSync(file);
  } catch {
    return null;
  }
  return validateBaseline(file, parseJson(file, readTextFile(file)));
}

/**
 * Runs a case into a private temporary folder and returns its results (the text of the files the
 * run wrote, so the check sees exactly what users see). The folder is removed afterwards, also
 * when the process exits early.
 */
export async function runCaseForCheck(caseFile: string): Promise<BlessedResults> {
  const scratch = mkdtempSync(join(tmpdir(), "recalesce-check-"));
  const cleanup = (): void => rmSync(scratch, { recursive: true, force: true });
  process.once("exit", cleanup);
  try {
    const out = join(scratch, "result");
    // runCase, not runCaseFile: a coil case runs all its segments and adds summary.coil.
    await runCase(caseFile, out);
    return blessedResultsOf(readFileSync(join(out, "summary.json"), "utf8"), readFileSync(join(out, "history.csv"), "utf8"));
  } finally {
    cleanup();
    process.removeListener("exit", cleanup);
  }
}

export async function checkFolder(dir: string, options: CheckOptions = {}): Promise<CheckOutcome> {
  const update = options.update ?? false;
  const files = findCases(dir, options.only);
  const prepared = files.map((caseFile) => {
    const caseText = readTextFile(caseFile);
    loadCase(caseFile);
    const baselineFile = baselineFileFor(caseFile);
    return { caseFile, caseSha: sha256(caseText), baselineFile, baseline: readBaseline(baselineFile) };
  });

  const cases: CaseOutcome[] = [];
  const writes: Array<{ file: string; text: string }> = [];
  for (const p of prepared) {
    const run = await runCaseForCheck(p.caseFile);
    const comparison = p.baseline ? compareWithBaseline(p.baseline, run) : null;
    const caseChanged = p.baseline !== null && p.baseline.case_sha256 !== p.caseSha;
    let status: CaseStatus = comparison === null ? "not blessed" : comparison.regressions.length ? "regressed" : "passed";
    let droppedOverrides: string[] = [];
    if (update) {
      const blessed = blessBaseline(basename(p.caseFile), p.caseSha, run, p.baseline ?? undefined);
      writes.push({ file: p.baselineFile, text: stringifyBaseline(blessed.baseline) });
      droppedOverrides = blessed.droppedOverrides;
      status = "blessed";
    }
    cases.push({ name: basename(p.caseFile).replace(/\.json$/, ""), caseFile: p.caseFile, baselineFile: p.baselineFile, status, comparison, caseChanged, droppedOverrides });
  }
  for (const w of writes) writeFileAtomic(w.file, w.text);
  return { folder: dir, update, cases };
}
