/**
 * `recalesce check DIR [--junit FILE] [--update] [--only NAME]...`: the regression check of a folder
 * of cases against their blessed baselines (see io/check-folder.ts for the procedure,
 * io/baseline.ts for the file, io/tolerance-rules.ts for the tolerances).
 *
 * Default tolerances, chosen from each quantity's name and overridable per case in its baseline
 * file under "tolerances": temperatures 0.5 K absolute (`temperature_K`), phase fractions 0.005
 * absolute (`fraction`), grain size and strength 1 % relative (`grain_relative`,
 * `strength_relative`), times 0.05 s absolute (`time_s`), cooling rates 1 % relative
 * (`rate_relative`), energy-ledger error at most 1e-4 (`ledger_max`), positions 1e-6 (`position`),
 * anything else 0.1 % relative (`other_relative`); single quantities under
 * "tolerances": { "quantities": { "PATH": value } }.
 *
 * Exit codes: 0 every blessed case holds (cases without a baseline are listed as not blessed and do
 * not fail), 1 a regression (or a write failure, path named), 2 bad input: a broken case or a
 * broken baseline file, named in one line. `--update` re-blesses (the only way baselines change)
 * and exits 0; `--junit FILE` writes JUnit XML, one testcase per case.
 */
import { SAFETY_NOTICE } from "../io/safety.js";
import type { Command } from "commander";
import { writeFileAtomic } from "../io/atomic-file.js";
import { checkFolder, type CheckOutcome, type CaseOutcome } from "../io/check-folder.js";
import { formatDifferenceTable, type CaseDifference } from "../io/difference-table.js";
import { junitXml } from "../io/junit.js";

export interface CheckCommandOptions {
  readonly junit?: string;
  readonly update?: boolean;
  readonly only?: readonly string[];
}

/** How many new (unblessed) quantity names a case lists before "and N more". */
const NEW_LISTED = 5;

function plural(n: number, word: string): string {
  if (n === 1) return `${n} ${word}`;
  return `${n} ${word.endsWith("y") ? `${word.slice(0, -1)}ies` : `${word}s`}`;
}

function caseLine(c: CaseOutcome, dir: string, nameWidth: number): string {
  const name = c.name.padEnd(nameWidth);
  const changed = c.caseChanged ? "; the case file changed since it was blessed" : "";
  switch (c.status) {
    case "not blessed":
      return `  not blessed  ${name}  no ${c.name}.baseline.json (does not fail); bless with: recalesce check ${dir} --update --only ${c.name}`;
    case "passed":
      return `  passed       ${name}  ${plural(c.comparison!.compared, "quantity")} within tolerance${changed}`;
    case "regressed":
      return `  REGRESSED    ${name}  ${c.comparison!.regressions.length} of ${plural(c.comparison!.compared, "quantity")} beyond tolerance${changed}`;
    case "blessed": {
      const moved = c.comparison ? `, ${c.comparison.regressions.length} moved beyond tolerance since the last blessing` : ", first blessing";
      const dropped = c.droppedOverrides.length ? `; dropped tolerance overrides of vanished quantities: ${c.droppedOverrides.join(", ")}` : "";
      return `  blessed      ${name}  wrote ${c.baselineFile}${moved}${dropped}`;
    }
  }
}

/** The terminal report of a check. */
export function describeCheck(outcome: CheckOutcome): string {
  const width = Math.max(...outcome.cases.map((c) => c.name.length));
  const lines = [`check ${outcome.folder}: ${plural(outcome.cases.length, "case")}${outcome.update ? " (re-blessing)" : ""}`];
  for (const c of outcome.cases) lines.push(caseLine(c, outcome.folder, width));
  const moved: CaseDifference[] = outcome.cases.flatMap((c) => (c.comparison?.regressions ?? []).map((difference) => ({ caseName: c.name, difference })));
  moved.sort((a, b) => b.difference.severity - a.difference.severity);
  if (moved.length) {
    lines.push("", outcome.update ? "changes being blessed:" : "quantities beyond tolerance (worst first):", formatDifferenceTable(moved).trimEnd());
  }
  const added = outcome.cases.filter((c) => c.comparison && c.comparison.added.length && !outcome.update);
  if (added.length) {
    lines.push("", "new quantities without a blessed value (not compared; bless with --update):");
    for (const c of added) {
      const list = c.comparison!.added;
      const more = list.length > NEW_LISTED ? ` and ${list.length - NEW_LISTED} more` : "";
      lines.push(`  ${c.name}: ${list.slice(0, NEW_LISTED).join(", ")}${more}`);
    }
  }
  const notBlessed = outcome.cases.filter((c) => c.status === "not blessed").length;
  const regressedCases = outcome.cases.filter((c) => c.status === "regressed").length;
  if (outcome.update) {
    lines.push("", `check --update: ${plural(outcome.cases.length, "case")} blessed`);
  } else {
    const where = moved.length ? ` in ${plural(regressedCases, "case")}` : "";
    const unblessed = notBlessed ? `, ${notBlessed} not blessed` : "";
    lines.push("", `check: ${plural(outcome.cases.length, "case")}, ${plural(moved.length, "regression")}${where}${unblessed}`);
    lines.push(`caution: ${SAFETY_NOTICE}`);
  }
  return lines.join("\n") + "\n";
}

/** Runs the check, prints the report, writes JUnit if asked; returns the exit code (0 or 1). */
export async function runCheckCommand(dir: string, options: CheckCommandOptions, write: (text: string) => void = (t) => process.stdout.write(t)): Promise<number> {
  const outcome = await checkFolder(dir, { only: options.only, update: options.update });
  write(describeCheck(outcome));
  if (options.junit) writeFileAtomic(options.junit, junitXml(outcome));
  return !outcome.update && outcome.cases.some((c) => c.status === "regressed") ? 1 : 0;
}

export function registerCheckCommand(program: Command): void {
  program
    .command("check")
    .description("re-run every case of a folder and compare it with its blessed baseline (NAME.baseline.json)")
    .argument("<dir>", "folder of case files NAME.json with baselines NAME.baseline.json")
    .option("--junit <file>", "also write a JUnit XML report, one testcase per case")
    .option("--update", "re-bless: write the baselines from this run (keeps their tolerance overrides)")
    .option("--only <name>", "check only this case (repeatable)", (v: string, acc: string[]) => [...acc, v], [] as string[])
    .action(async (dir: string, opts: { junit?: string; update?: boolean; only: string[] }) => {
      const code = await runCheckCommand(dir, opts);
      if (code !== 0) process.exitCode = code;
    });
}
