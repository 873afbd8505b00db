/**
 * The blessed baseline of a case: `DIR/NAME.baseline.json` beside `DIR/NAME.json`. It holds the key
 * results of summary.json as flat quantity paths, the history at the output depths decimated to at
 * most HISTORY_ROWS rows, and optional per-case tolerance overrides (see tolerance-rules.ts), which
 * re-blessing keeps. Baselines change only through `recalesce check DIR --update`.
 *
 * File layout (format version 1):
 *
 *     { "format": "recalesce-baseline", "version": 1,
 *       "case": "NAME.json", "case_sha256": "…",           the case file it was blessed from
 *       "note": "…",
 *       "tolerances": { "temperature_K": 1, "quantities": { "final.T_C.top": 2 } },   optional
 *       "results": { "end_time_s": 21, "final.T_C.top": 703.608, … },
 *       "history": { "columns": ["time_s", …], "rows": [[0, 880, …], …] } }
 *
 * Quantity paths: objects are dotted, array items are named by an identity key when every item has
 * a distinct one (`depths[depth_mm=3]`, `pyrometers[position_m=30]`), else by index.
 * Summary branches that echo the input or describe the run rather than its result (title, caution,
 * warnings, numerics and steel at the top; notes at any depth) are not blessed; every other number,
 * text, true/false or null is.
 */
import { createHash } from "node:crypto";
import { z } from "zod";
import { InputError, formatPath } from "./errors.js";
import { DEFAULT_TOLERANCES, type ClassTolerances } from "./tolerance-rules.js";

export const BASELINE_FORMAT = "recalesce-baseline";
export const BASELINE_VERSION = 1;
/** At most this many history rows are blessed (first and last always among them). */
export const HISTORY_ROWS = 50;

/** Top-level summary branches that are not results. */
const NOT_RESULTS = new Set(["title", "caution", "warnings", "numerics", "steel"]);
/** Keys that are prose, not results, wherever they appear. */
const PROSE_KEYS = new Set(["notes", "note", "caution", "warnings"]);
/** Keys that name an array item, in order of preference. */
const IDENTITY_KEYS = ["name", "label", "depth_mm", "position_m", "time_s"];

export type Leaf = number | string | boolean | null;

export interface History {
  readonly columns: string[];
  /** Numbers as printed; null where the file had an empty (non-finite) cell. */
  readonly rows: Array<Array<number | null>>;
}

/** Per-case overrides: per class (keys of DEFAULT_TOLERANCES) and per quantity path. */
export type Tolerances = Partial<ClassTolerances> & { quantities?: Record<string, number> };

/** What one run of a case gives to compare or bless. */
export interface BlessedResults {
  readonly results: Record<string, Leaf>;
  readonly history: History;
}

export interface Baseline extends BlessedResults {
  readonly case: string;
  readonly case_sha256: string;
  readonly tolerances?: Tolerances;
}

/** The baseline file that belongs to a case file `DIR/NAME.json`. */
export function baselineFileFor(caseFile: string): string {
  return caseFile.replace(/\.json$/i, "") + ".baseline.json";
}

export function sha256(bytes: string | Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** The identity key whose values name every item of an array distinctly, with those names. */
function identityOf(items: readonly unknown[]): { key: string; names: string[] } | null {
  for (const key of IDENTITY_KEYS) {
    const names = items.map((item) => {
      if (item === null || typeof item !== "object" || Array.isArray(item)) return null;
      const v = (item as Record<string, unknown>)[key];
      return typeof v === "number" || typeof v === "string" ? `${key}=${v}` : null;
    });
    if (names.every((n) => n !== null) && new Set(names).size === names.length) return { key, names: names as string[] };
  }
  return null;
}

function flattenInto(value: unknown, path: string, out: Record<string, Leaf>, skipKey?: string): void {
  if (value === null || typeof value === "number" || typeof value === "string" || typeof value === "boolean") {
    out[path] = value;
    return;
  }
  if (Array.isArray(value)) {
    const identity = identityOf(value);
    value.forEach((item, i) => flattenInto(item, `${path}[${identity ? identity.names[i] : i}]`, out, identity?.key));
    return;
  }
  if (typeof value === "object") {
    for (const [key, v] of Object.entries(value as Record<string, unknown>)) {
      if (key === skipKey || PROSE_KEYS.has(key)) continue;
      flattenInto(v, path ? `${path}.${key}` : key, out);
    }
  }
}

/** The blessable quantities of a parsed summary.json, as flat paths. */
export function flattenSummary(summary: Record<string, unknown>): Record<string, Leaf> {
  const out: Record<string, Leaf> = {};
  for (const [key, v] of Object.entries(summary)) if (!NOT_RESULTS.has(key)) flattenInto(v, key, out);
  return out;
}

/** Parses history.csv text (a header and numeric rows as the io layer writes them). */
export function parseHistoryCsv(text: string): History {
  const lines = text.split("\n").filter((l) => l !== "");
  const columns = (lines[0] ?? "").split(",");
  const rows = lines.slice(1).map((l) => l.split(",").map((cell) => (cell === "" ? null : Number(cell))));
  return { columns, rows };
}

/** At most `count` rows, evenly spread by index, always including the first and the last. */
export function decimateRows<T>(rows: readonly T[], count = HISTORY_ROWS): T[] {
  if (rows.length <= count) return rows.slice();
  const out: T[] = [];
  for (let k = 0; k < count; k++) out.push(rows[Math.round((k * (rows.length - 1)) / (count - 1))]);
  return out;
}

/** History rows as quantity paths `history[time_s=T].COLUMN`. */
export function historyQuantities(history: History): Map<string, Leaf> {
  const out = new Map<string, Leaf>();
  const timeColumn = history.columns[0];
  for (const row of history.rows) {
    const key = `history[${timeColumn}=${row[0]}]`;
    for (let c = 1; c < history.columns.length; c++) out.set(`${key}.${history.columns[c]}`, row[c] ?? null);
  }
  return out;
}

/** The results of one run, ready to compare or bless. */
export function blessedResultsOf(summaryText: string, historyText: string): BlessedResults {
  const history = parseHistoryCsv(historyText);
  return {
    results: flattenSummary(JSON.parse(summaryText) as Record<string, unknown>),
    history: { columns: history.columns, rows: decimateRows(history.rows) },
  };
}

const positive = z.number({ error: "expected a positive number" }).refine((v) => Number.isFinite(v) && v > 0, "expected a positive number");
const toleranceKeys = Object.keys(DEFAULT_TOLERANCES) as Array<keyof typeof DEFAULT_TOLERANCES>;

const tolerancesSchema = z.strictObject({
  ...(Object.fromEntries(toleranceKeys.map((k) => [k, positive.optional()])) as Record<keyof typeof DEFAULT_TOLERANCES, z.ZodOptional<typeof positive>>),
  quantities: z.record(z.string(), positive, { error: "expected an object of quantity path: tolerance" }).optional(),
});

const leafSchema = z.union([z.number(), z.string(), z.boolean(), z.null()], { error: "expected a number, text, true/false or null" });

const baselineSchema = z.strictObject({
  format: z.literal(BASELINE_FORMAT, { error: `expected "${BASELINE_FORMAT}"` }),
  version: z.literal(BASELINE_VERSION, { error: `expected ${BASELINE_VERSION} (this recalesce reads format version ${BASELINE_VERSION}; re-bless with check --update)` }),
  case: z.string({ error: "expected the case file name" }),
  case_sha256: z.string({ error: "expected 64 hex digits" }).regex(/^[0-9a-f]{64}$/, "expected 64 hex digits"),
  note: z.string().optional(),
  tolerances: tolerancesSchema.optional(),
  results: z.record(z.string(), leafSchema, { error: "expected an object of quantity path: value" }),
  history: z
    .strictObject({
      columns: z.array(z.string(), { error: "expected a list of column names" }).min(2, "expected time and at least one more column"),
      rows: z.array(z.array(z.number().nullable(), { error: "expected a row of numbers" }), { error: "expected a list of rows" }),
    })
    .superRefine((h, ctx) => {
      h.rows.forEach((r, i) => {
        if (r.length !== h.columns.length) ctx.addIssue({ code: "custom", path: ["rows", i], message: `expected ${h.columns.length} values, one per column` });
        else if (r[0] === null) ctx.addIssue({ code: "custom", path: ["rows", i, 0], message: "expected a time [s]" });
      });
    }),
});

/** Validates a parsed baseline file; problems become one InputError naming the field. */
export function validateBaseline(file: string, data: unknown): Baseline {
  const parsed = baselineSchema.safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const keys = issue.code === "unrecognized_keys" ? (issue as { keys: string[] }).keys : [];
    const path = formatPath(keys.length ? [...issue.path, keys[0]] : issue.path) || "(top level)";
    const message = keys.length ? `unknown key "${keys[0]}"` : issue.message;
    throw new InputError(file, path, `${message}; fix it, or delete the file and re-bless with check --update`);
  }
  const b = parsed.data;
  const known = new Set([...Object.keys(b.results), ...historyQuantities(b.history).keys()]);
  for (const q of Object.keys(b.tolerances?.quantities ?? {})) {
    if (!known.has(q)) throw new InputError(file, `tolerances.quantities["${q}"]`, "names no blessed quantity; expected a path from \"results\" or history[time_s=T].COLUMN");
  }
  return b;
}

/** A new baseline from a run; the tolerances of the previous baseline are kept (those that still name a quantity). */
export function blessBaseline(caseName: string, caseSha256: string, run: BlessedResults, previous?: Baseline): { baseline: Baseline; droppedOverrides: string[] } {
  const dropped: string[] = [];
  let tolerances: Tolerances | undefined;
  if (previous?.tolerances) {
    tolerances = { ...previous.tolerances };
    if (previous.tolerances.quantities) {
      const known = new Set([...Object.keys(run.results), ...historyQuantities(run.history).keys()]);
      const kept: Record<string, number> = {};
      for (const [q, v] of Object.entries(previous.tolerances.quantities)) {
        if (known.has(q)) kept[q] = v;
        else dropped.push(q);
      }
      tolerances.quantities = kept;
    }
  }
  return {
    baseline: { case: caseName, case_sha256: caseSha256, ...(tolerances ? { tolerances } : {}), results: run.results, history: run.history },
    droppedOverrides: dropped,
  };
}

/** Pretty JSON with arrays of plain values kept on one line (one history row per line). */
function pretty(value: unknown, indent: string): string {
  if (Array.isArray(value)) {
    if (value.every((v) => v === null || typeof v !== "object")) return `[${value.map((v) => JSON.stringify(v)).join(", ")}]`;
    const inner = indent + "  ";
    return value.length ? `[\n${value.map((v) => inner + pretty(v, inner)).join(",\n")}\n${indent}]` : "[]";
  }
  if (value !== null && typeof value === "object") {
    const entries = Object.entries(value).filter(([, v]) => v !== undefined);
    const inner = indent + "  ";
    return entries.length ? `{\n${entries.map(([k, v]) => `${inner}${JSON.stringify(k)}: ${pretty(v, inner)}`).join(",\n")}\n${indent}}` : "{}";
  }
  return JSON.stringify(value);
}

/** The baseline file's text: deterministic (no dates, keys in a fixed order). */
export function stringifyBaseline(b: Baseline): string {
  const document = {
    format: BASELINE_FORMAT,
    version: BASELINE_VERSION,
    case: b.case,
    case_sha256: b.case_sha256,
    note: "Blessed results of the case beside this file. Change them only with `recalesce check DIR --update`; tolerance overrides under \"tolerances\" are kept when re-blessing.",
    ...(b.tolerances ? { tolerances: b.tolerances } : {}),
    results: b.results,
    history: b.history,
  };
  return pretty(document, "") + "\n";
}
