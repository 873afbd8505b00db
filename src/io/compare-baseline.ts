/**
 * Compares the results of a re-run with a blessed baseline, quantity by quantity, each with the
 * tolerance rule its name selects (tolerance-rules.ts) after the baseline's overrides.
 *
 * - A number that moved beyond its tolerance is a regression.
 * - A blessed quantity that is absent now, or whose text, true/false or null changed (for example
 *   a transformation that used to finish and now does not), is a regression.
 * - A quantity that is new (not in the baseline) is listed, not failed: bless it with --update.
 * - History rows are matched by time; the baseline's decimated rows are all compared.
 */
import { historyQuantities, type Baseline, type BlessedResults, type Leaf } from "./baseline.js";
import { allowedDifference, describeRule, holds, ruleFor } from "./tolerance-rules.js";

export interface QuantityDifference {
  readonly quantity: string;
  /** undefined = absent. */
  readonly baseline: Leaf | undefined;
  readonly now: Leaf | undefined;
  /** now − baseline when both are numbers. */
  readonly difference: number | null;
  readonly tolerance: string;
  /** |difference| / allowed difference (now / ceiling for ceilings); Infinity when not comparable. */
  readonly severity: number;
}

export interface Comparison {
  /** How many blessed quantities were compared. */
  readonly compared: number;
  /** The quantities beyond tolerance, worst first. */
  readonly regressions: QuantityDifference[];
  /** Quantities the run has and the baseline does not (new history columns as `history.COLUMN`). */
  readonly added: string[];
}

function quantitiesOf(r: BlessedResults): Map<string, Leaf> {
  const all = new Map<string, Leaf>(Object.entries(r.results));
  for (const [k, v] of historyQuantities(r.history)) all.set(k, v);
  return all;
}

/** Only the history rows at the baseline's times are compared; other rows of the run are ignored. */
function restrictHistory(now: BlessedResults, times: ReadonlySet<number>): BlessedResults {
  return { results: now.results, history: { columns: now.history.columns, rows: now.history.rows.filter((r) => r[0] !== null && times.has(r[0])) } };
}

export function compareWithBaseline(baseline: Baseline, run: BlessedResults): Comparison {
  const times = new Set(baseline.history.rows.map((r) => r[0] as number));
  const blessed = quantitiesOf(baseline);
  const now = quantitiesOf(restrictHistory(run, times));
  const classes = baseline.tolerances ?? {};
  const perQuantity = baseline.tolerances?.quantities ?? {};
  const regressions: QuantityDifference[] = [];
  for (const [quantity, b] of blessed) {
    const rule = ruleFor(quantity, classes, perQuantity);
    const n = now.has(quantity) ? now.get(quantity) : undefined;
    if (typeof b === "number" && typeof n === "number") {
      if (holds(rule, b, n, quantity)) continue;
      const allowed = rule.kind === "ceiling" ? rule.value : allowedDifference(rule, b, quantity);
      const measure = rule.kind === "ceiling" ? Math.abs(n) : Math.abs(n - b);
      regressions.push({ quantity, baseline: b, now: n, difference: n - b, tolerance: describeRule(rule, b, quantity), severity: Number.isFinite(measure) ? measure / allowed : Infinity });
    } else if (n === undefined || n !== b) {
      regressions.push({ quantity, baseline: b, now: n, difference: null, tolerance: "unchanged", severity: Infinity });
    }
  }
  const added = [
    ...Object.keys(run.results).filter((q) => !(q in baseline.results)),
    ...run.history.columns.filter((c) => !baseline.history.columns.includes(c)).map((c) => `history.${c}`),
  ];
  regressions.sort((x, y) => y.severity - x.severity || (x.quantity < y.quantity ? -1 : 1));
  return { compared: blessed.size, regressions, added };
}
