/**
 * The plain-text table of quantities that moved beyond tolerance, worst first, shared by the
 * terminal report and the JUnit failure text:
 *
 *     case                  quantity             baseline  now      difference  tolerance
 *     strip-12mm-cmn-water  final.T_C.top        703.608   705.1    +1.492      ±0.5 K
 */
import type { Leaf } from "./baseline.js";
import type { QuantityDifference } from "./compare-baseline.js";

export interface CaseDifference {
  readonly caseName: string;
  readonly difference: QuantityDifference;
}

/** A value as the table shows it: numbers as blessed, "absent" for a missing quantity. */
export function showValue(v: Leaf | undefined): string {
  if (v === undefined) return "absent";
  if (typeof v === "string") return JSON.stringify(v);
  return String(v);
}

/** A signed difference with four significant digits. */
export function showDifference(d: number | null): string {
  if (d === null) return "-";
  if (!Number.isFinite(d)) return String(d);
  const s = String(Number(d.toPrecision(4)));
  return d > 0 ? `+${s}` : s;
}

export function formatDifferenceTable(rows: readonly CaseDifference[]): string {
  const header = ["case", "quantity", "baseline", "now", "difference", "tolerance"];
  const cells = rows.map((r) => [r.caseName, r.difference.quantity, showValue(r.difference.baseline), showValue(r.difference.now), showDifference(r.difference.difference), r.difference.tolerance]);
  const widths = header.map((h, c) => Math.max(h.length, ...cells.map((row) => row[c].length)));
  const line = (row: string[]) => row.map((cell, c) => (c === row.length - 1 ? cell : cell.padEnd(widths[c]))).join("  ");
  return [line(header), ...cells.map(line)].join("\n") + "\n";
}
