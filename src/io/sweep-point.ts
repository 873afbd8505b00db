/**
 * One point of a sweep: run the (already varied and validated) case as a single strip point — for
 * a coil case its body (middle) segment, as `recalesce run` reports it — and format its sweep.csv
 * cells. Runs on worker threads; the cells are text so that every thread formats them the same way.
 */
import type { Case } from "./case-schema.js";
import { coilSegments, resolveCase } from "./resolve-case.js";
import { guardWork, simulateResolved } from "./run-case.js";
import { DECIMALS, decimalsForColumn, fixed } from "./format.js";
import { InputError } from "./errors.js";

export interface SweepPointTask {
  readonly kind: "sweep-point";
  readonly file: string;
  readonly caseData: Case;
  /** The point's assignments (`product.thickness_mm=4, …`), to name it in messages. */
  readonly label: string;
}

const PHASE_COLUMNS = ["ferrite", "pearlite", "bainite", "martensite", "austenite"] as const;
const PRODUCT_COLUMNS = ["grain_um", "yield_MPa", "tensile_MPa"] as const;

function transforms(c: Case): boolean {
  return c.material.composition_wt_pct !== undefined && c.material.transformation !== "off";
}

/** Result columns of sweep.csv for a case (after the point index and the varied values). */
export function sweepResultColumns(c: Case): string[] {
  const where = "line" in c.cooling ? "coiling" : "final";
  const cols = [`${where}_mean_C`, `${where}_top_C`];
  if (transforms(c)) cols.push(...PHASE_COLUMNS, ...PRODUCT_COLUMNS);
  cols.push("recalescence_max_K");
  return cols;
}

type Summary = {
  final: Record<string, unknown> & { T_C: { top: number; mean: number }; phases?: Record<string, number> };
  coiling?: { T_C: { top: number; mean: number } };
  depths: Array<{ recalescence_K: number }>;
};

/** Formats the result cells of one run summary in the order of sweepResultColumns. */
export function sweepCells(c: Case, summary: Record<string, unknown>): string[] {
  const s = summary as Summary;
  const T = s.coiling?.T_C ?? s.final.T_C;
  const cells = [fixed(T.mean, DECIMALS.T_C), fixed(T.top, DECIMALS.T_C)];
  if (transforms(c)) {
    for (const p of PHASE_COLUMNS) cells.push(s.final.phases ? fixed(s.final.phases[p], DECIMALS.fraction) : "");
    for (const f of PRODUCT_COLUMNS) {
      const v = (s.final[f] as { mean?: number | null } | undefined)?.mean;
      cells.push(v === null || v === undefined ? "" : fixed(v, decimalsForColumn(f)));
    }
  }
  cells.push(fixed(Math.max(0, ...s.depths.map((d) => d.recalescence_K)), DECIMALS.K));
  return cells;
}

export function runSweepPoint(task: SweepPointTask): string[] {
  const c = task.caseData;
  let options = {};
  if ("line" in c.cooling && c.cooling.coil) {
    const segments = coilSegments(task.file, c.cooling.coil);
    const body = segments[Math.floor((segments.length - 1) / 2)];
    options = { coilPosition_m: body.position_m, entry_C: body.entry_C, segment: body.index };
  }
  try {
    const resolved = resolveCase(task.file, c, options);
    guardWork(task.file, c, resolved, 1, false);
    const { summary } = simulateResolved(c, resolved, undefined, true);
    return sweepCells(c, summary);
  } catch (e) {
    if (e instanceof InputError) throw new InputError(e.file, `--vary ${task.label}`, `${e.field}: ${e.expected}`);
    throw e;
  }
}
