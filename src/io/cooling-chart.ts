/**
 * The cooling-path chart of one run (`recalesce run … --chart` → cooling.svg), drawn by hand as
 * SVG from the run's history.csv text and summary.json object:
 *
 *   upper panel   temperature [°C] against time [s], one line per output depth (or section point)
 *                 and the through-thickness mean; reference lines at Ae3, Ae1, Bs, Ms
 *                 (summary.critical_C); pyrometer readings (summary.pyrometers) placed at the time
 *                 the tracked point passes each pyrometer; the coiling temperature (summary.coiling);
 *                 for line runs a second time axis on top labelled with the position on the table [m].
 *   lower panel   for transforming steels only: transformed fraction 1 − austenite per depth.
 *   foot          the caution (SAFETY_NOTICE), wrapped to the chart width.
 *
 * Output is deterministic: every coordinate is written with COORDINATE_DECIMALS decimals, tick
 * labels with the decimals their step needs, and nothing depends on the clock or on chance.
 * Series longer than MAX_POINTS_PER_SERIES are thinned by keeping the lowest and the highest point
 * of each bucket of consecutive rows (thinIndices), so peaks such as a recalescence bump survive.
 */
import { fixed } from "./format.js";
import { SAFETY_NOTICE } from "./safety.js";

/** File name of the chart inside the result folder. */
export const CHART_FILE = "cooling.svg";
/** Width of the chart [px]. */
export const CHART_WIDTH_px = 900;
/** Most points one polyline may carry after thinning. */
export const MAX_POINTS_PER_SERIES = 2000;
/** Decimals of every pixel coordinate written to the SVG. */
export const COORDINATE_DECIMALS = 2;

export interface CoolingChartInput {
  /** The text of a run's history.csv (header line, then one row per output time). */
  readonly historyCsv: string;
  /** The run's summary.json as an object. */
  readonly summary: Readonly<Record<string, unknown>>;
}

/** A linear map from a domain (data units) to a range (pixels), with its inverse. */
export interface LinearScale {
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  /** Pixel coordinate of a data value. */
  readonly at: (value: number) => number;
  /** Data value at a pixel coordinate. */
  readonly invert: (px: number) => number;
}

export function linearScale(d0: number, d1: number, r0: number, r1: number): LinearScale {
  const k = (r1 - r0) / (d1 - d0);
  return { domain: [d0, d1], range: [r0, r1], at: (v) => r0 + (v - d0) * k, invert: (px) => d0 + (px - r0) / k };
}

/** Tick values with a step of 1, 2 or 5 × 10^k giving about `target` intervals over [lo, hi]. */
export function niceStep(lo: number, hi: number, target: number): number {
  const raw = (hi - lo) / target;
  const power = 10 ** Math.floor(Math.log10(raw));
  const m = raw / power;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * power;
}

/** The multiples of `step` inside [lo, hi] (ends included, to a millionth of a step). */
export function ticksWithin(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  const first = Math.ceil(lo / step - 1e-6);
  const last = Math.floor(hi / step + 1e-6);
  for (let k = first; k <= last; k++) out.push(k * step);
  return out;
}

/** Decimals that a tick label of this step needs (0 for 50, 1 for 0.2). */
function stepDecimals(step: number): number {
  return Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
}

/**
 * Indices of the points to keep so that a series of n points has at most `maxPoints`: the first
 * and the last point, and from each of ⌊(maxPoints − 2)/2⌋ buckets of consecutive interior points
 * the lowest and the highest (in index order). Every bucket's extremes survive, so the thinned
 * line has the same envelope at the bucket scale. Non-finite values are never chosen as extremes.
 */
export function thinIndices(values: ArrayLike<number>, maxPoints: number = MAX_POINTS_PER_SERIES): number[] {
  const n = values.length;
  const all: number[] = [];
  if (n <= maxPoints) {
    for (let i = 0; i < n; i++) all.push(i);
    return all;
  }
  const buckets = Math.max(1, Math.floor((maxPoints - 2) / 2));
  const interior = n - 2;
  all.push(0);
  for (let b = 0; b < buckets; b++) {
    const start = 1 + Math.floor((b * interior) / buckets);
    const end = 1 + Math.floor(((b + 1) * interior) / buckets);
    let lo = -1;
    let hi = -1;
    for (let i = start; i < end; i++) {
      const v = values[i];
      if (!Number.isFinite(v)) continue;
      if (lo < 0 || v < values[lo]) lo = i;
      if (hi < 0 || v > values[hi]) hi = i;
    }
    if (lo < 0) continue;
    if (lo === hi) all.push(lo);
    else all.push(Math.min(lo, hi), Math.max(lo, hi));
  }
  all.push(n - 1);
  return all;
}

/** Escapes text for SVG content and double-quoted attribute values. */
export function escapeXml(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** Rough width of a line of sans-serif text [px] (0.56 em a character, a little generous). */
function textWidth_px(text: string, fontSize_px: number): number {
  return text.length * 0.56 * fontSize_px;
}

/** Splits text at spaces into lines no wider than `width_px` (a longer single word stands alone). */
export function wrapText(text: string, width_px: number, fontSize_px: number): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter((w) => w !== "")) {
    const next = line === "" ? word : `${line} ${word}`;
    if (line !== "" && textWidth_px(next, fontSize_px) > width_px) {
      lines.push(line);
      line = word;
    } else line = next;
  }
  if (line !== "") lines.push(line);
  return lines;
}

/** History columns by name (column-major); an empty cell reads as NaN. */
export interface HistoryTable {
  readonly columns: readonly string[];
  readonly values: ReadonlyMap<string, Float64Array>;
  readonly rows: number;
}

export function parseHistory(text: string): HistoryTable {
  const lines = text.split("\n").filter((l) => l.trim() !== "");
  if (lines.length === 0) throw new Error("history.csv is empty");
  const columns = lines[0].trim().split(",");
  const rows = lines.length - 1;
  const data = columns.map(() => new Float64Array(rows));
  for (let r = 0; r < rows; r++) {
    const cells = lines[r + 1].trim().split(",");
    for (let j = 0; j < columns.length; j++) {
      const cell = cells[j] ?? "";
      data[j][r] = cell === "" ? NaN : Number(cell);
    }
  }
  const values = new Map<string, Float64Array>();
  columns.forEach((c, j) => values.set(c, data[j]));
  for (const required of ["time_s", "T_mean_C"]) if (!values.has(required)) throw new Error(`history.csv has no ${required} column (columns: ${columns.join(",")})`);
  return { columns, values, rows };
}

/** One line of the chart: the history column it comes from and its legend text. */
export interface ChartSeries {
  readonly column: string;
  readonly label: string;
  readonly colour: string;
  readonly dashed: boolean;
}

/** Neutral, mutually distinct line colours for the depths (cycled when there are more). */
const PALETTE = ["#1f4e79", "#a0522d", "#2e7d4f", "#6b4c9a", "#8a7a1e", "#1d7f86", "#8e3b46", "#4a5a6a"];
const MEAN_COLOUR = "#222222";
const GRID_COLOUR = "#e4e4e4";
const AXIS_COLOUR = "#555555";
const REFERENCE_COLOUR = "#8a8a8a";
const FONT = "system-ui, Helvetica, Arial, sans-serif";

/** Legend text for a temperature column T_<key>_C: "0.75 mm deep", "x 150 mm, y 20 mm". */
function pointLabel(key: string): string {
  const depth = /^(-?[\d.]+)mm$/.exec(key);
  if (depth) return `${depth[1]} mm deep`;
  const xy = /^x(-?[\d.]+)_y(-?[\d.]+)mm$/.exec(key);
  if (xy) return `x ${xy[1]} mm, y ${xy[2]} mm`;
  return key;
}

/** Temperature series (points, then the mean) and fraction series (1 − austenite per depth). */
export function chartSeries(history: HistoryTable): { temperature: ChartSeries[]; fraction: ChartSeries[] } {
  const temperature: ChartSeries[] = [];
  const fraction: ChartSeries[] = [];
  for (const c of history.columns) {
    const m = /^T_(.+)_C$/.exec(c);
    if (!m || c === "T_mean_C") continue;
    const colour = PALETTE[temperature.length % PALETTE.length];
    temperature.push({ column: c, label: pointLabel(m[1]), colour, dashed: false });
    const austenite = `austenite_${m[1]}`;
    if (history.values.has(austenite)) fraction.push({ column: austenite, label: pointLabel(m[1]), colour, dashed: false });
  }
  temperature.push({ column: "T_mean_C", label: "mean through thickness", colour: MEAN_COLOUR, dashed: true });
  return { temperature, fraction };
}

/** A finite number, or undefined. */
function numberOf(v: unknown): number | undefined {
  return typeof v === "number" && Number.isFinite(v) ? v : undefined;
}

function recordOf(v: unknown): Record<string, unknown> | undefined {
  return v !== null && typeof v === "object" && !Array.isArray(v) ? (v as Record<string, unknown>) : undefined;
}

const CRITICAL_NAMES = ["Ae3", "Ae1", "Bs", "Ms"] as const;

/** Critical temperatures [°C] present in summary.critical_C, in the order Ae3, Ae1, Bs, Ms. */
export function criticalLines(summary: Readonly<Record<string, unknown>>): { name: string; T_C: number }[] {
  const critical = recordOf(summary.critical_C);
  if (!critical) return [];
  const out: { name: string; T_C: number }[] = [];
  for (const name of CRITICAL_NAMES) {
    const T = numberOf(critical[name]);
    if (T !== undefined) out.push({ name, T_C: T });
  }
  return out;
}

/**
 * Time [s] at which the tracked point reaches `position_m`, by linear interpolation in the
 * (non-decreasing) position column; null outside the recorded positions.
 */
export function timeAtPosition(time_s: ArrayLike<number>, position_m: ArrayLike<number>, at_m: number): number | null {
  const n = position_m.length;
  if (n === 0) return null;
  const tolerance_m = 1e-9 * Math.max(1, Math.abs(at_m));
  if (at_m < position_m[0] - tolerance_m || at_m > position_m[n - 1] + tolerance_m) return null;
  for (let i = 0; i < n; i++) {
    if (position_m[i] >= at_m - tolerance_m) {
      if (i === 0 || position_m[i] === position_m[i - 1]) return time_s[i];
      const f = (at_m - position_m[i - 1]) / (position_m[i] - position_m[i - 1]);
      return time_s[i - 1] + f * (time_s[i] - time_s[i - 1]);
    }
  }
  return time_s[n - 1];
}

/** Where everything sits, in pixels; exported so that a reader (or a test) can map back. */
export interface ChartLayout {
  readonly width_px: number;
  readonly height_px: number;
  readonly plotLeft_px: number;
  readonly plotRight_px: number;
  readonly titleLines: readonly string[];
  readonly legendRows: readonly { readonly series: ChartSeries | null; readonly x_px: number; readonly y_px: number }[];
  /** Position axis above the temperature panel (line runs only) */
  readonly positionAxisY_px: number | null;
  readonly time: LinearScale;
  readonly temperature: LinearScale;
  readonly temperatureStep_K: number;
  readonly fraction: LinearScale | null;
  readonly cautionLines: readonly string[];
  readonly cautionY_px: number;
}

const PAD_px = 16;
const TITLE_FONT_px = 17;
const TITLE_LINE_px = 22;
const LEGEND_FONT_px = 12;
const LEGEND_LINE_px = 18;
const LEGEND_SWATCH_px = 24;
const POSITION_AXIS_px = 44;
const TEMPERATURE_PANEL_px = 340;
const FRACTION_PANEL_px = 170;
const TIME_AXIS_px = 44;
const PANEL_GAP_px = 30;
const CAUTION_FONT_px = 11;
const CAUTION_LINE_px = 15;
const TICK_FONT_px = 11;

/** The text of the pyrometer legend entry (drawn as an open circle). */
const PYROMETER_LEGEND = "pyrometer reading (top surface)";

/** Range [min, max] of the finite values of some arrays and numbers. */
function extent(arrays: readonly ArrayLike<number>[], extra: readonly number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const take = (v: number) => {
    if (!Number.isFinite(v)) return;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  };
  for (const a of arrays) for (let i = 0; i < a.length; i++) take(a[i]);
  for (const v of extra) take(v);
  if (lo > hi) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  return [lo, hi];
}

/** Pyrometer markers of a line run: time [s] and reading [°C] of each pyrometer that was passed. */
function pyrometerMarks(summary: Readonly<Record<string, unknown>>, history: HistoryTable): { position_m: number; time_s: number; T_C: number }[] {
  const list = summary.pyrometers;
  const position = history.values.get("position_m");
  if (!Array.isArray(list) || !position) return [];
  const out: { position_m: number; time_s: number; T_C: number }[] = [];
  for (const p of list) {
    const r = recordOf(p);
    const x = numberOf(r?.position_m);
    const T = numberOf(r?.T_C);
    if (x === undefined || T === undefined) continue;
    const t = timeAtPosition(history.values.get("time_s")!, position, x);
    if (t !== null) out.push({ position_m: x, time_s: t, T_C: T });
  }
  return out;
}

/** Coiling temperatures [°C] of a line run (mean and top surface), when the summary has them. */
function coilingOf(summary: Readonly<Record<string, unknown>>): { mean: number; top: number | undefined } | null {
  const T = recordOf(recordOf(summary.coiling)?.T_C);
  const mean = numberOf(T?.mean);
  return mean === undefined ? null : { mean, top: numberOf(T?.top) };
}

export function coolingChartLayout(input: CoolingChartInput): ChartLayout {
  return layoutFor(input, parseHistory(input.historyCsv));
}

function layoutFor(input: CoolingChartInput, history: HistoryTable): ChartLayout {
  const { summary } = input;
  const series = chartSeries(history);
  const width = CHART_WIDTH_px;
  const plotLeft = 76;
  const plotRight = width - 112;
  const titleLines = wrapText(typeof summary.title === "string" && summary.title.trim() !== "" ? summary.title : "recalesce run", width - 2 * PAD_px, TITLE_FONT_px * 1.05);
  let y = PAD_px + TITLE_LINE_px * titleLines.length;

  // Legend: one flowing row of entries, wrapped at the plot width.
  const entries: (ChartSeries | null)[] = [...series.temperature];
  const marks = pyrometerMarks(summary, history);
  if (marks.length > 0) entries.push(null);
  const legendRows: { series: ChartSeries | null; x_px: number; y_px: number }[] = [];
  let x = plotLeft;
  y += 6 + LEGEND_LINE_px / 2;
  for (const e of entries) {
    const w = LEGEND_SWATCH_px + 6 + textWidth_px(e ? e.label : PYROMETER_LEGEND, LEGEND_FONT_px) + 18;
    if (x > plotLeft && x + w > plotRight) {
      x = plotLeft;
      y += LEGEND_LINE_px;
    }
    legendRows.push({ series: e, x_px: x, y_px: y });
    x += w;
  }
  y += LEGEND_LINE_px / 2 + 8;

  const position = history.values.get("position_m");
  const positionAxisY = position ? y + POSITION_AXIS_px : null;
  if (position) y += POSITION_AXIS_px;
  else y += 10;

  const time = history.values.get("time_s")!;
  const [t0, t1] = extent([time], []);
  const timeScale = linearScale(t0, t1, plotLeft, plotRight);

  const coiling = coilingOf(summary);
  const [lo, hi] = extent(
    series.temperature.map((s) => history.values.get(s.column)!),
    [...criticalLines(summary).map((c) => c.T_C), ...marks.map((m) => m.T_C), ...(coiling ? [coiling.mean] : [])],
  );
  const step = niceStep(lo, hi, 8);
  const T0 = Math.floor(lo / step + 1e-9) * step;
  const T1 = Math.ceil(hi / step - 1e-9) * step;
  const top = y;
  y += TEMPERATURE_PANEL_px;
  const temperature = linearScale(T0, T1 === T0 ? T0 + step : T1, y, top);
  y += TIME_AXIS_px;

  let fraction: LinearScale | null = null;
  if (series.fraction.length > 0) {
    y += PANEL_GAP_px;
    const fractionTop = y;
    y += FRACTION_PANEL_px;
    fraction = linearScale(0, 1, y, fractionTop);
    y += TIME_AXIS_px;
  }

  const cautionLines = wrapText(`Caution: ${SAFETY_NOTICE}`, width - 2 * PAD_px, CAUTION_FONT_px);
  const cautionY = y + 8 + CAUTION_LINE_px;
  const height = cautionY + CAUTION_LINE_px * (cautionLines.length - 1) + PAD_px;
  return {
    width_px: width,
    height_px: height,
    plotLeft_px: plotLeft,
    plotRight_px: plotRight,
    titleLines,
    legendRows,
    positionAxisY_px: positionAxisY,
    time: timeScale,
    temperature,
    temperatureStep_K: step,
    fraction,
    cautionLines,
    cautionY_px: cautionY,
  };
}

/** A position as typed in a case: at most three decimals, trailing zeros dropped (52, 52.5). */
function shortNumber(v: number): string {
  return String(Number(fixed(v, 3)));
}

/** A pixel coordinate as written to the SVG. */
function px(v: number): string {
  return fixed(v, COORDINATE_DECIMALS);
}

/** A polyline of one history column against time, thinned, skipping non-finite values. */
function polyline(history: HistoryTable, s: ChartSeries, panel: "temperature" | "fraction", x: LinearScale, yScale: LinearScale, transform: (v: number) => number): string {
  const time = history.values.get("time_s")!;
  const raw = history.values.get(s.column)!;
  const values = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) values[i] = transform(raw[i]);
  const points: string[] = [];
  for (const i of thinIndices(values)) {
    if (!Number.isFinite(values[i]) || !Number.isFinite(time[i])) continue;
    points.push(`${px(x.at(time[i]))},${px(yScale.at(values[i]))}`);
  }
  const dash = s.dashed ? ' stroke-dasharray="6 3"' : "";
  const width = s.dashed ? "1.6" : "1.2";
  return `<polyline data-panel="${panel}" data-series="${escapeXml(s.column)}" fill="none" stroke="${s.colour}" stroke-width="${width}"${dash} stroke-linejoin="round" points="${points.join(" ")}"/>`;
}

/** Frame, horizontal grid and value ticks of a panel, with the rotated axis title. */
function panelFrame(layout: ChartLayout, y: LinearScale, step: number, title: string): string[] {
  const out: string[] = [];
  const [left, right] = [layout.plotLeft_px, layout.plotRight_px];
  const [bottom, top] = [y.range[0], y.range[1]];
  const decimals = stepDecimals(step);
  for (const v of ticksWithin(y.domain[0], y.domain[1], step)) {
    const yy = px(y.at(v));
    out.push(`<line x1="${px(left)}" y1="${yy}" x2="${px(right)}" y2="${yy}" stroke="${GRID_COLOUR}" stroke-width="1"/>`);
    out.push(`<text x="${px(left - 6)}" y="${yy}" dy="0.35em" text-anchor="end" font-size="${TICK_FONT_px}">${fixed(v, decimals)}</text>`);
  }
  out.push(`<rect x="${px(left)}" y="${px(top)}" width="${px(right - left)}" height="${px(bottom - top)}" fill="none" stroke="${AXIS_COLOUR}" stroke-width="1"/>`);
  const cx = left - 52;
  const cy = (top + bottom) / 2;
  out.push(`<text x="${px(cx)}" y="${px(cy)}" text-anchor="middle" font-size="12" transform="rotate(-90 ${px(cx)} ${px(cy)})">${escapeXml(title)}</text>`);
  return out;
}

/** Time ticks and the axis title below a panel whose bottom edge is at `bottom_px`. */
function timeAxis(layout: ChartLayout, bottom_px: number): string[] {
  const out: string[] = [];
  const t = layout.time;
  const step = niceStep(t.domain[0], t.domain[1], 10);
  const decimals = stepDecimals(step);
  for (const v of ticksWithin(t.domain[0], t.domain[1], step)) {
    const xx = px(t.at(v));
    out.push(`<line x1="${xx}" y1="${px(bottom_px)}" x2="${xx}" y2="${px(bottom_px + 4)}" stroke="${AXIS_COLOUR}" stroke-width="1"/>`);
    out.push(`<text x="${xx}" y="${px(bottom_px + 16)}" text-anchor="middle" font-size="${TICK_FONT_px}">${fixed(v, decimals)}</text>`);
  }
  const mid = (layout.plotLeft_px + layout.plotRight_px) / 2;
  out.push(`<text x="${px(mid)}" y="${px(bottom_px + 34)}" text-anchor="middle" font-size="12">time [s]</text>`);
  return out;
}

/** Position along the table [m] as tick labels on a second axis above the temperature panel. */
function positionAxis(layout: ChartLayout, history: HistoryTable, axisY_px: number): string[] {
  const position = history.values.get("position_m")!;
  const time = history.values.get("time_s")!;
  const [p0, p1] = extent([position], []);
  const step = niceStep(p0, p1, 10);
  const decimals = stepDecimals(step);
  const out: string[] = [];
  for (const v of ticksWithin(p0, p1, step)) {
    const t = timeAtPosition(time, position, v);
    if (t === null) continue;
    const xx = px(layout.time.at(t));
    out.push(`<line x1="${xx}" y1="${px(axisY_px)}" x2="${xx}" y2="${px(axisY_px - 4)}" stroke="${AXIS_COLOUR}" stroke-width="1"/>`);
    out.push(`<text x="${xx}" y="${px(axisY_px - 8)}" text-anchor="middle" font-size="${TICK_FONT_px}">${fixed(v, decimals)}</text>`);
  }
  const mid = (layout.plotLeft_px + layout.plotRight_px) / 2;
  out.push(`<text x="${px(mid)}" y="${px(axisY_px - 26)}" text-anchor="middle" font-size="12">position on the table [m]</text>`);
  return out;
}

/** Reference lines at the critical temperatures, labelled to the right of the plot. */
function criticalMarks(layout: ChartLayout, summary: Readonly<Record<string, unknown>>): string[] {
  const out: string[] = [];
  const y = layout.temperature;
  const lines = criticalLines(summary).map((c) => ({ ...c, y: y.at(c.T_C) }));
  // Labels at least 12 px apart, pushed downwards in order of height.
  const order = [...lines].sort((a, b) => a.y - b.y);
  let previous = -Infinity;
  const labelY = new Map<string, number>();
  for (const c of order) {
    const ly = Math.max(c.y, previous + 12);
    labelY.set(c.name, ly);
    previous = ly;
  }
  for (const c of lines) {
    const yy = px(c.y);
    out.push(`<line data-critical="${c.name}" x1="${px(layout.plotLeft_px)}" y1="${yy}" x2="${px(layout.plotRight_px)}" y2="${yy}" stroke="${REFERENCE_COLOUR}" stroke-width="1" stroke-dasharray="4 3"/>`);
    out.push(`<text x="${px(layout.plotRight_px + 6)}" y="${px(labelY.get(c.name)!)}" dy="0.35em" font-size="${TICK_FONT_px}" fill="#444444">${c.name} ${fixed(c.T_C, 1)} °C</text>`);
  }
  return out;
}

/** Open circles at the pyrometer readings, each labelled with its position and reading. */
function pyrometerMarkers(layout: ChartLayout, summary: Readonly<Record<string, unknown>>, history: HistoryTable): string[] {
  const out: string[] = [];
  const middle = (layout.plotLeft_px + layout.plotRight_px) / 2;
  for (const m of pyrometerMarks(summary, history)) {
    const cx = layout.time.at(m.time_s);
    const cy = layout.temperature.at(m.T_C);
    out.push(`<circle data-pyrometer="${fixed(m.position_m, 3)}" cx="${px(cx)}" cy="${px(cy)}" r="4" fill="#ffffff" stroke="#222222" stroke-width="1.2"/>`);
    const leftSide = cx > middle;
    out.push(`<text x="${px(cx + (leftSide ? -7 : 7))}" y="${px(cy - 9)}" text-anchor="${leftSide ? "end" : "start"}" font-size="${TICK_FONT_px}">${shortNumber(m.position_m)} m: ${fixed(m.T_C, 1)} °C</text>`);
  }
  return out;
}

/** The coiling temperature: a filled dot on the mean line's end, with the values written beside it. */
function coilingMark(layout: ChartLayout, summary: Readonly<Record<string, unknown>>): string[] {
  const c = coilingOf(summary);
  if (!c) return [];
  const cx = layout.time.range[1];
  const cy = layout.temperature.at(c.mean);
  const text = `coiling: mean ${fixed(c.mean, 1)} °C${c.top === undefined ? "" : `, top ${fixed(c.top, 1)} °C`}`;
  return [
    `<circle data-coiling="mean" cx="${px(cx)}" cy="${px(cy)}" r="3.5" fill="${MEAN_COLOUR}"/>`,
    `<text x="${px(cx - 8)}" y="${px(cy + 18)}" text-anchor="end" font-size="${TICK_FONT_px}">${escapeXml(text)}</text>`,
  ];
}

/** The chart as an SVG document (UTF-8 text). */
export function coolingChartSvg(input: CoolingChartInput): string {
  const history = parseHistory(input.historyCsv);
  const layout = layoutFor(input, history);
  const series = chartSeries(history);
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${layout.width_px}" height="${px(layout.height_px)}" viewBox="0 0 ${layout.width_px} ${px(layout.height_px)}" font-family="${escapeXml(FONT)}" fill="#222222">`,
  );
  out.push(`<rect x="0" y="0" width="${layout.width_px}" height="${px(layout.height_px)}" fill="#ffffff"/>`);

  out.push('<g class="title">');
  layout.titleLines.forEach((line, k) => out.push(`<text x="${PAD_px}" y="${px(PAD_px + TITLE_FONT_px + k * TITLE_LINE_px)}" font-size="${TITLE_FONT_px}" font-weight="600">${escapeXml(line)}</text>`));
  out.push("</g>");

  out.push('<g class="legend">');
  for (const e of layout.legendRows) {
    const x0 = e.x_px;
    const yy = px(e.y_px);
    if (e.series) {
      const dash = e.series.dashed ? ' stroke-dasharray="6 3"' : "";
      out.push(`<line x1="${px(x0)}" y1="${yy}" x2="${px(x0 + LEGEND_SWATCH_px)}" y2="${yy}" stroke="${e.series.colour}" stroke-width="${e.series.dashed ? "1.6" : "1.2"}"${dash}/>`);
    } else {
      out.push(`<circle cx="${px(x0 + LEGEND_SWATCH_px / 2)}" cy="${yy}" r="4" fill="#ffffff" stroke="#222222" stroke-width="1.2"/>`);
    }
    out.push(`<text x="${px(x0 + LEGEND_SWATCH_px + 6)}" y="${yy}" dy="0.35em" font-size="${LEGEND_FONT_px}">${escapeXml(e.series ? e.series.label : PYROMETER_LEGEND)}</text>`);
  }
  out.push("</g>");

  out.push('<g class="panel-temperature">');
  if (layout.positionAxisY_px !== null) out.push(...positionAxis(layout, history, layout.positionAxisY_px));
  out.push(...panelFrame(layout, layout.temperature, layout.temperatureStep_K, "temperature [°C]"));
  out.push(...criticalMarks(layout, input.summary));
  for (const s of series.temperature) out.push(polyline(history, s, "temperature", layout.time, layout.temperature, (v) => v));
  out.push(...pyrometerMarkers(layout, input.summary, history));
  out.push(...coilingMark(layout, input.summary));
  out.push(...timeAxis(layout, layout.temperature.range[0]));
  out.push("</g>");

  if (layout.fraction) {
    const f = layout.fraction;
    out.push('<g class="panel-fraction">');
    out.push(...panelFrame(layout, f, 0.2, "transformed fraction [-]"));
    out.push(`<text x="${px(layout.plotLeft_px)}" y="${px(f.range[1] - 7)}" font-size="${TICK_FONT_px}" fill="#444444">transformed = 1 − austenite, per depth (colours as in the legend)</text>`);
    for (const s of series.fraction) out.push(polyline(history, s, "fraction", layout.time, f, (v) => 1 - v));
    out.push(...timeAxis(layout, f.range[0]));
    out.push("</g>");
  }

  out.push('<g class="caution">');
  out.push(`<text x="${PAD_px}" y="${px(layout.cautionY_px)}" font-size="${CAUTION_FONT_px}" fill="#444444">`);
  layout.cautionLines.forEach((line, k) => out.push(`<tspan x="${PAD_px}" dy="${k === 0 ? "0" : String(CAUTION_LINE_px)}">${escapeXml(line)}</tspan>`));
  out.push("</text>");
  out.push("</g>");
  out.push("</svg>");
  return out.join("\n") + "\n";
}

/**
 * Writes CHART_FILE through `folderWriteFile` (the result folder's own writer, so the chart is part
 * of the atomic commit) when `asked`; reads the history only then.
 */
export function writeChartIfAsked(
  asked: boolean | undefined,
  folderWriteFile: (name: string, text: string) => void,
  readHistory: () => string,
  summary: Readonly<Record<string, unknown>>,
): void {
  if (!asked) return;
  folderWriteFile(CHART_FILE, coolingChartSvg({ historyCsv: readHistory(), summary }));
}
