/**
 * JUnit XML for the regression check: one testsuite, one testcase per case. A regressed case
 * carries a <failure> whose message names the worst difference and whose text is the table of the
 * worst ones; a case without a baseline is <skipped>. No times or host names, so the same check
 * gives the same file.
 */
import { SAFETY_NOTICE } from "./safety.js";
import type { CheckOutcome } from "./check-folder.js";
import { formatDifferenceTable, showDifference, showValue } from "./difference-table.js";

/** How many differences a failure's text lists. */
export const JUNIT_WORST = 10;

export function escapeXml(s: string): string {
  return s.replace(/[&<>"']/g, (ch) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&apos;" })[ch] as string);
}

export function junitXml(outcome: CheckOutcome, suiteName = "recalesce check"): string {
  const failures = outcome.cases.filter((c) => c.status === "regressed").length;
  const skipped = outcome.cases.filter((c) => c.status === "not blessed").length;
  const counts = `tests="${outcome.cases.length}" failures="${failures}" errors="0" skipped="${skipped}"`;
  const lines = ['<?xml version="1.0" encoding="UTF-8"?>', `<testsuites name="${escapeXml(suiteName)}" ${counts}>`, `  <testsuite name="${escapeXml(suiteName)}" ${counts}>`];
  for (const c of outcome.cases) {
    const open = `    <testcase classname="${escapeXml(suiteName)}" name="${escapeXml(c.name)}"`;
    if (c.status === "regressed" && c.comparison) {
      const worst = c.comparison.regressions[0];
      const message = `${c.comparison.regressions.length} of ${c.comparison.compared} quantities beyond tolerance; worst: ${worst.quantity} ${showValue(worst.baseline)} -> ${showValue(worst.now)} (${showDifference(worst.difference)}, tolerance ${worst.tolerance})`;
      const table = formatDifferenceTable(c.comparison.regressions.slice(0, JUNIT_WORST).map((d) => ({ caseName: c.name, difference: d })));
      lines.push(`${open}>`, `      <failure message="${escapeXml(message)}" type="regression">${escapeXml(table)}</failure>`, "    </testcase>");
    } else if (c.status === "not blessed") {
      lines.push(`${open}>`, `      <skipped message="${escapeXml(`not blessed: no ${c.name}.baseline.json`)}"/>`, "    </testcase>");
    } else {
      lines.push(`${open}/>`);
    }
  }
  lines.push(`    <system-out>${escapeXml(`caution: ${SAFETY_NOTICE}`)}</system-out>`, "  </testsuite>", "</testsuites>");
  return lines.join("\n") + "\n";
}
