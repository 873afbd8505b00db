/**
 * Water headers of a run-out-table line and on/off patterns over them.
 *
 * A header is a zone of `cooling.line.zones` with water on either face (top curtain or laminar
 * jets, bottom sprays). Headers are listed in table order (by start position) and named by their
 * bank and their place in it (`B3.2` = second header of bank B3), or `Z<n>` (1-based zone number
 * in the case) when the zone has no bank. A pattern says which headers are open and by how much the
 * case's flow is scaled on some of them; it is applied to a line object as written in a case file,
 * so the same function produces the design's evaluations and the designed case file.
 */

/** One water header: a zone with water on a face. */
export interface Header {
  /** Index of the zone in `cooling.line.zones`, as written in the case [-] */
  readonly zone: number;
  /** Readable name: bank and ordinal (`B3.2`) or zone number (`Z7`). */
  readonly id: string;
  readonly bank: string | null;
  /** Zone start and end along the table [m] */
  readonly start_m: number;
  readonly end_m: number;
}

/** Which headers are open, and the flow scale on a subset of them. */
export interface HeaderPattern {
  /** Open headers, as indices into the header list (table order), ascending. */
  readonly open: readonly number[];
  /** Open headers whose flow is multiplied by `flowScale` (the others run at the case's flow). */
  readonly scaled: readonly number[];
  /** Flow multiplier on the scaled headers [-] */
  readonly flowScale: number;
}

/** The parts of a line (as in a case file, raw or validated) that a pattern touches. */
interface WaterLike {
  on?: boolean;
  flow_m3_h?: number;
  flux_L_m2s?: number;
}
interface FaceLike {
  water?: WaterLike;
}
export interface LineLike {
  banks?: Array<{ name: string; on?: boolean }>;
  zones: Array<{ start_m: number; end_m: number; bank?: string; top?: unknown; bottom?: unknown }>;
}

function waterOf(face: unknown): WaterLike | null {
  if (face && typeof face === "object" && "water" in face) {
    const w = (face as FaceLike).water;
    return w && typeof w === "object" ? w : null;
  }
  return null;
}

/** The headers of a line in table order. */
export function lineHeaders(line: LineLike): Header[] {
  const order = line.zones
    .map((z, zone) => ({ z, zone }))
    .filter(({ z }) => waterOf(z.top) !== null || waterOf(z.bottom) !== null)
    .sort((a, b) => a.z.start_m - b.z.start_m || a.zone - b.zone);
  const perBank = new Map<string, number>();
  return order.map(({ z, zone }) => {
    const bank = z.bank ?? null;
    let id = `Z${zone + 1}`;
    if (bank !== null) {
      const k = (perBank.get(bank) ?? 0) + 1;
      perBank.set(bank, k);
      id = `${bank}.${k}`;
    }
    return { zone, id, bank, start_m: z.start_m, end_m: z.end_m };
  });
}

/**
 * A copy of `line` with the pattern applied: every header's water faces on or off as the pattern
 * says, flows (flow_m3_h or flux_L_m2s) of the scaled headers multiplied by the scale, banks in
 * `keepOff` switched off, and every other bank that holds an open header switched on (a bank that
 * is off overrides its zones). Banks without open headers keep their flag.
 */
export function applyPattern<L extends LineLike>(line: L, headers: readonly Header[], pattern: HeaderPattern, keepOff: ReadonlySet<string> = new Set()): L {
  const out = structuredClone(line);
  const open = new Set(pattern.open);
  const scaled = new Set(pattern.scaled);
  const banksWithOpen = new Set<string>();
  headers.forEach((h, i) => {
    const zone = out.zones[h.zone];
    const isOpen = open.has(i);
    if (isOpen && h.bank !== null) banksWithOpen.add(h.bank);
    for (const face of [zone.top, zone.bottom]) {
      const w = waterOf(face);
      if (!w) continue;
      w.on = isOpen;
      if (isOpen && scaled.has(i) && pattern.flowScale !== 1) {
        if (w.flow_m3_h !== undefined) w.flow_m3_h *= pattern.flowScale;
        if (w.flux_L_m2s !== undefined) w.flux_L_m2s *= pattern.flowScale;
      }
    }
  });
  for (const b of out.banks ?? []) {
    if (keepOff.has(b.name)) b.on = false;
    else if (banksWithOpen.has(b.name)) b.on = true;
  }
  return out;
}

/** Number of headers whose open/closed state differs between two patterns. */
export function switchesBetween(a: HeaderPattern, b: HeaderPattern): number {
  const sa = new Set(a.open);
  const sb = new Set(b.open);
  let n = 0;
  for (const i of sa) if (!sb.has(i)) n++;
  for (const i of sb) if (!sa.has(i)) n++;
  return n;
}

/**
 * The pattern as one character per header ("1" open, "0" closed), grouped by bank with a space
 * between banks: "1111 1100 0000".
 */
export function patternBits(headers: readonly Header[], pattern: HeaderPattern): string {
  const open = new Set(pattern.open);
  let s = "";
  headers.forEach((h, i) => {
    if (i > 0 && (h.bank === null || h.bank !== headers[i - 1].bank)) s += " ";
    s += open.has(i) ? "1" : "0";
  });
  return s;
}

/** Open headers as runs of consecutive headers: "B1.1–B3.4, B9.1–B10.4" ("none" when all closed). */
export function patternRanges(headers: readonly Header[], pattern: HeaderPattern): string {
  const idx = [...pattern.open].sort((a, b) => a - b);
  if (idx.length === 0) return "none";
  const runs: string[] = [];
  let start = idx[0];
  for (let k = 1; k <= idx.length; k++) {
    if (k < idx.length && idx[k] === idx[k - 1] + 1) continue;
    const end = idx[k - 1];
    runs.push(start === end ? headers[start].id : `${headers[start].id}–${headers[end].id}`);
    if (k < idx.length) start = idx[k];
  }
  return runs.join(", ");
}

/** A per-segment pattern as written in a case (`cooling.line.patterns[]`), by zone index. */
export interface ZonePattern {
  readonly open_zones: readonly number[];
  readonly flow_scale: number;
  readonly scaled_zones?: readonly number[];
}

/** `line` with a zone-indexed pattern applied (see applyPattern; zones are 0-based indices). */
export function applyZonePattern<L extends LineLike>(line: L, pattern: ZonePattern): L {
  const headers = lineHeaders(line);
  const byZone = new Map(headers.map((h, i) => [h.zone, i]));
  const toHeaders = (zones: readonly number[]) => zones.map((z) => byZone.get(z)).filter((i): i is number => i !== undefined).sort((a, b) => a - b);
  const open = toHeaders(pattern.open_zones);
  return applyPattern(line, headers, { open, scaled: pattern.scaled_zones ? toHeaders(pattern.scaled_zones) : open, flowScale: pattern.flow_scale });
}

/**
 * Runs of consecutive segments with the same pattern, as `cooling.line.patterns` entries
 * (segments 1-based, zones 0-based): what a designed coil case carries.
 */
export function zonePatternRuns(headers: readonly Header[], perSegment: readonly HeaderPattern[]): Array<{ from_segment: number; to_segment: number; open_zones: number[]; flow_scale: number; scaled_zones: number[] }> {
  const key = (p: HeaderPattern) => JSON.stringify([p.open, p.scaled, p.flowScale]);
  const runs: Array<{ from_segment: number; to_segment: number; open_zones: number[]; flow_scale: number; scaled_zones: number[] }> = [];
  perSegment.forEach((p, k) => {
    const last = runs[runs.length - 1];
    if (last && k > 0 && key(perSegment[k - 1]) === key(p)) {
      last.to_segment = k + 1;
      return;
    }
    runs.push({ from_segment: k + 1, to_segment: k + 1, open_zones: p.open.map((i) => headers[i].zone), flow_scale: p.flowScale, scaled_zones: p.scaled.map((i) => headers[i].zone) });
  });
  return runs;
}
