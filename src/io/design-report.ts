/**
 * Writes a design's result folder (atomically) and renders its terminal table.
 *
 *   designed.json  the input case with the chosen pattern (for a coil: every segment's, as
 *                  cooling.line.patterns, with the zones' own flags at the body segment's), runnable
 *                  by `recalesce run`;
 *   summary.json   target, tolerance, limits, headers, and per segment the pattern, predicted
 *                  coiling temperatures, error, phases and product fields, plus the caution;
 *   patterns.csv   (coils) one row per segment: the open zones and flow scale, until the case format
 *                  can hold per-segment patterns.
 */
import { applyPattern, patternBits, patternRanges, switchesBetween, zonePatternRuns, type LineLike } from "./header-pattern.js";
import type { DesignOutcome } from "./design.js";
import type { SegmentDesign } from "./design-segment.js";
import { writeJsonFolder } from "./write-folder.js";
import { DECIMALS, fixed } from "./format.js";
import { SAFETY_NOTICE } from "./safety.js";
import { rawLine, readRawCase, relocateCase } from "./relocate-case.js";

const zonesOf = (o: DesignOutcome, idx: readonly number[]) => idx.map((i) => o.plan.headers[i].zone);

function segmentRecord(o: DesignOutcome, d: SegmentDesign): Record<string, unknown> {
  const e = d.evaluation;
  return {
    segment: d.segment + 1,
    position_m: d.position_m,
    entry_C: d.entry_C,
    open_headers: d.pattern.open.length,
    headers_on: patternRanges(o.plan.headers, d.pattern),
    zones_on: zonesOf(o, d.pattern.open),
    flow_scale: d.pattern.flowScale,
    scaled_zones: zonesOf(o, d.pattern.scaled),
    coiling_C: e.coiling_C,
    error_K: d.error_K,
    within_tolerance: d.within,
    cooling_rate_under_water_K_s: e.rate_K_s,
    time_under_water_s: e.water_s,
    ...(d.intermediate_C !== null ? { intermediate_C: d.intermediate_C, hold_s: d.hold_s } : {}),
    ...(e.phases ? { phases: e.phases } : {}),
    ...(e.product ?? {}),
    issues: d.issues,
  };
}

export function designSummary(o: DesignOutcome, title: string): Record<string, unknown> {
  const p = o.plan;
  return {
    title,
    caution: SAFETY_NOTICE,
    case: o.file,
    target: { coiling_mean_C: p.target_C, tolerance_K: p.tolerance_K },
    strategy: p.strategy,
    limits: {
      max_cooling_rate_K_s: p.maxCoolingRate_K_s,
      keep_off: p.keepOff,
      max_switches: p.maxSwitches,
      flow_scale: p.flowRange ? { min: p.flowRange[0], max: p.flowRange[1] } : null,
      intermediate_C: p.band_C ? { min: p.band_C[0], max: p.band_C[1] } : null,
      hold_s: p.hold_s,
    },
    reachable: o.reachable,
    messages: o.messages,
    headers: p.headers.map((h) => ({ id: h.id, zone: h.zone, bank: h.bank, start_m: h.start_m, end_m: h.end_m })),
    ...(o.coil ? { coil: { segments: o.segments.length, body_segment: o.body + 1, largest_switches_between_neighbours: o.largestSwitches } } : {}),
    segments: o.segments.map((d) => segmentRecord(o, d)),
    evaluations: o.evaluations,
  };
}

/** patterns.csv: one row per segment (zone lists space-separated, 0-based as in cooling.line.zones). */
export function patternsCsv(o: DesignOutcome): string {
  const cols = ["segment", "position_m", "entry_C", "open_headers", "zones_on", "flow_scale", "scaled_zones", "coiling_mean_C", "error_K", "within_tolerance", "switches_from_previous"];
  let out = cols.join(",") + "\n";
  o.segments.forEach((d, k) => {
    const switches = k > 0 ? switchesBetween(o.segments[k - 1].pattern, d.pattern) : 0;
    out +=
      [
        String(d.segment + 1),
        fixed(d.position_m, DECIMALS.position_m),
        fixed(d.entry_C, DECIMALS.T_C),
        String(d.pattern.open.length),
        zonesOf(o, d.pattern.open).join(" "),
        String(d.pattern.flowScale),
        zonesOf(o, d.pattern.scaled).join(" "),
        fixed(d.evaluation.coiling_C.mean, DECIMALS.T_C),
        fixed(d.error_K, DECIMALS.K),
        d.within ? "yes" : "no",
        String(switches),
      ].join(",") + "\n";
  });
  return out;
}

/** The input case with the body segment's pattern, its paths rewritten for `outDir`. */
export function designedCase(o: DesignOutcome, outDir: string): Record<string, unknown> {
  const raw = readRawCase(o.file);
  relocateCase(raw, o.file, outDir);
  const body = o.segments[o.body];
  const cooling = raw.cooling as Record<string, unknown>;
  // A coil carries every segment's pattern (runs of equal patterns), whose flow scales apply to the
  // flows written in the zones: so the zones keep the case's flows, with the body segment's on/off
  // flags (what a run without the coil would use).
  const basePattern = o.coil ? { ...body.pattern, flowScale: 1 } : body.pattern;
  const line = applyPattern(rawLine<LineLike>(raw), o.plan.headers, basePattern, new Set(o.plan.keepOff)) as LineLike & { patterns?: unknown };
  if (o.coil) line.patterns = zonePatternRuns(o.plan.headers, o.segments.map((d) => d.pattern));
  cooling.line = line;
  const what = `${o.plan.strategy} cooling to ${o.plan.target_C} °C${o.coil ? `, per-segment patterns in cooling.line.patterns (also patterns.csv)` : ""}`;
  raw.title = `${String(raw.title)} (designed: ${what})`;
  return raw;
}

/** Writes DIR/designed.json, DIR/summary.json and (coils) DIR/patterns.csv atomically. */
export function writeDesignFolder(o: DesignOutcome, outDir: string): Record<string, unknown> {
  const designed = designedCase(o, outDir);
  const summary = designSummary(o, String(designed.title));
  writeJsonFolder(outDir, { "designed.json": designed, "summary.json": summary }, o.coil ? { "patterns.csv": patternsCsv(o) } : {});
  return summary;
}

const pad = (s: string, n: number) => (s.length >= n ? s : " ".repeat(n - s.length) + s);

/** The readable table printed on the terminal. */
export function designTable(o: DesignOutcome, outDir: string): string {
  const p = o.plan;
  const banks = [...new Set(p.headers.map((h) => h.bank ?? h.id))];
  const lines: string[] = [];
  const flows = p.flowRange ? `, flow trim ${p.flowRange[0]}–${p.flowRange[1]}×` : "";
  lines.push(`Design: coiling mean ${p.target_C} °C ± ${p.tolerance_K} K, ${p.strategy} cooling, ${p.front.length} of ${p.headers.length} headers available${flows}`);
  if (p.band_C) lines.push(`  split: front group to ${p.band_C[0]}–${p.band_C[1]} °C, then at least ${p.hold_s} s of air, then headers from the back`);
  const bitsWidth = Math.max(16, patternBits(p.headers, o.segments[0].pattern).length);
  const phase = o.segments[0].evaluation.phases ? "ferrite %" : "";
  const yieldCol = o.segments[0].evaluation.product?.yield_MPa ? "yield MPa" : "";
  const head = [pad("seg", 4), pad("pos m", 7), pad("entry °C", 9), `  ${`headers ${banks[0]}…${banks[banks.length - 1]}`.padEnd(bitsWidth)}`, pad("flow×", 6), pad("coil °C", 8), pad("error K", 8), pad("rate K/s", 9)];
  if (p.band_C) head.push(pad("mid °C", 7), pad("hold s", 7));
  if (phase) head.push(pad(phase, 10));
  if (yieldCol) head.push(pad(yieldCol, 10));
  lines.push(head.join(""));
  for (const d of o.segments) {
    const e = d.evaluation;
    const row = [
      pad(String(d.segment + 1), 4),
      pad(d.position_m.toFixed(1), 7),
      pad(d.entry_C.toFixed(1), 9),
      `  ${patternBits(p.headers, d.pattern).padEnd(bitsWidth)}`,
      pad(d.pattern.flowScale.toFixed(3), 6),
      pad(e.coiling_C.mean.toFixed(1), 8),
      pad(`${d.error_K > 0 ? "+" : ""}${d.error_K.toFixed(1)}${d.within ? "" : "!"}`, 8),
      pad(e.rate_K_s === null ? "-" : e.rate_K_s.toFixed(1), 9),
    ];
    if (p.band_C) row.push(pad(d.intermediate_C === null ? "-" : d.intermediate_C.toFixed(1), 7), pad(d.hold_s === null ? "-" : d.hold_s.toFixed(1), 7));
    if (phase) row.push(pad(((e.phases?.ferrite ?? 0) * 100).toFixed(1), 10));
    if (yieldCol) {
      const y = e.product?.yield_MPa?.mean;
      row.push(pad(y === null || y === undefined ? "-" : y.toFixed(0), 10));
    }
    lines.push(row.join(""));
  }
  const body = o.segments[o.body];
  lines.push(`  open (${o.coil ? `body segment ${o.body + 1}` : "strip"}): ${patternRanges(p.headers, body.pattern)}${body.pattern.flowScale !== 1 ? ` at ${body.pattern.flowScale}× flow` : ""}`);
  if (o.coil) lines.push(`  largest change between neighbouring segments: ${o.largestSwitches} header(s)${p.maxSwitches !== null ? ` (limit ${p.maxSwitches})` : ""}`);
  if (o.reachable) lines.push(`  every ${o.coil ? "segment" : "point"} within ±${p.tolerance_K} K (${o.evaluations} runs)`);
  else {
    lines.push(`  TARGET NOT REACHED (${o.messages.length} problem(s), marked !):`);
    for (const m of o.messages) lines.push(`    ${m}`);
  }
  lines.push(`  results in ${outDir}/ (designed.json, summary.json${o.coil ? ", patterns.csv" : ""})`);
  lines.push(`  caution: ${SAFETY_NOTICE}`);
  return lines.join("\n") + "\n";
}
