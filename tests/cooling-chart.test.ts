import { describe, it, expect, beforeAll } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { runCase } from "../src/io/run-case.js";
import { SAFETY_NOTICE } from "../src/io/safety.js";
import {
  CHART_FILE,
  MAX_POINTS_PER_SERIES,
  coolingChartLayout,
  coolingChartSvg,
  escapeXml,
  thinIndices,
  timeAtPosition,
  writeChartIfAsked,
  type CoolingChartInput,
} from "../src/io/cooling-chart.js";
import { tempDirs } from "./support/temp-dirs.js";

/**
 * The cooling-path chart (cooling.svg) drawn from a real run's history.csv and summary.json. The
 * pixel checks map SVG coordinates back through the chart's own scales (coolingChartLayout); one
 * pixel of tolerance covers the two-decimal rounding of coordinates (≤ 0.005 px) with a wide margin
 * while still catching a wrong scale, a dropped extreme or an off-by-one row.
 */

const dirs = tempDirs("recalesce-chart-");

/** Runs a case into a fresh folder and reads its history and summary back. */
async function runToInput(caseFile: string): Promise<CoolingChartInput> {
  const out = join(dirs.make(), "run");
  await runCase(caseFile, out);
  return { historyCsv: readFileSync(join(out, "history.csv"), "utf8"), summary: JSON.parse(readFileSync(join(out, "summary.json"), "utf8")) };
}

/**
 * A small well-formedness check: tags balance, one <svg> root, text and attribute values carry
 * no raw < or > and no & that is not an entity. Returns the element names in document order.
 */
function checkWellFormed(xml: string): string[] {
  let body = xml;
  const declaration = /^<\?xml[^?]*\?>\s*/.exec(body);
  if (declaration) body = body.slice(declaration[0].length);
  const stack: string[] = [];
  const names: string[] = [];
  let roots = 0;
  const entity = /&(?!(amp|lt|gt|quot|apos|#\d+);)/;
  const tag = /<(\/?)([A-Za-z][\w:-]*)((?:\s+[\w:-]+="[^"<>]*")*)\s*(\/?)>/y;
  let i = 0;
  while (i < body.length) {
    const lt = body.indexOf("<", i);
    const text = body.slice(i, lt < 0 ? body.length : lt);
    if (text.includes(">")) throw new Error(`raw > in text near ${JSON.stringify(text.slice(0, 40))}`);
    if (entity.test(text)) throw new Error(`raw & in text near ${JSON.stringify(text.slice(0, 40))}`);
    if (stack.length === 0 && text.trim() !== "") throw new Error(`text outside the root: ${JSON.stringify(text.slice(0, 40))}`);
    if (lt < 0) break;
    tag.lastIndex = lt;
    const m = tag.exec(body);
    if (!m) throw new Error(`malformed tag at ${lt}: ${JSON.stringify(body.slice(lt, lt + 60))}`);
    const [whole, closing, name, attributes, selfClosing] = m;
    if (entity.test(attributes)) throw new Error(`raw & in attributes of <${name}>`);
    if (closing) {
      if (selfClosing || attributes) throw new Error(`bad closing tag ${whole}`);
      const open = stack.pop();
      if (open !== name) throw new Error(`</${name}> closes <${open}>`);
    } else {
      if (stack.length === 0) roots++;
      names.push(name);
      if (!selfClosing) stack.push(name);
    }
    i = lt + whole.length;
  }
  if (stack.length > 0) throw new Error(`unclosed <${stack.join("> <")}>`);
  if (roots !== 1 || names[0] !== "svg") throw new Error(`expected one <svg> root, found ${roots} roots starting with <${names[0]}>`);
  return names;
}

/** Attribute value of an element's start tag. */
function attribute(element: string, name: string): string {
  const m = new RegExp(`\\s${name}="([^"]*)"`).exec(element);
  if (!m) throw new Error(`no ${name} in ${element.slice(0, 80)}`);
  return m[1];
}

/** The <polyline …/> elements of a panel. */
function polylines(svg: string, panel: "temperature" | "fraction"): string[] {
  return svg.match(new RegExp(`<polyline data-panel="${panel}"[^>]*/>`, "g")) ?? [];
}

function points(element: string): { x: number; y: number }[] {
  return attribute(element, "points")
    .split(" ")
    .map((p) => p.split(",").map(Number))
    .map(([x, y]) => ({ x, y }));
}

/** A column of a history.csv text as numbers. */
function column(csv: string, name: string): number[] {
  const lines = csv.trim().split("\n");
  const j = lines[0].split(",").indexOf(name);
  if (j < 0) throw new Error(`no column ${name}`);
  return lines.slice(1).map((l) => Number(l.split(",")[j]));
}

/** Output depths [mm] of a history header, as written in the T_<d>mm_C columns. */
function depthKeys(csv: string): string[] {
  const header = csv.slice(0, csv.indexOf("\n")).split(",");
  return header.flatMap((c) => /^T_(.+)mm_C$/.exec(c)?.[1] ?? []);
}

/** One pixel expressed in degrees for a layout's temperature scale. */
function kelvinPerPixel(input: CoolingChartInput): number {
  const t = coolingChartLayout(input).temperature;
  return Math.abs((t.domain[1] - t.domain[0]) / (t.range[1] - t.range[0]));
}

describe("the cooling chart of a line run of a steel (demo-thin-cmn)", () => {
  let input: CoolingChartInput;
  let svg: string;
  beforeAll(async () => {
    input = await runToInput("cases/demo-thin-cmn.json");
    svg = coolingChartSvg(input);
  });

  it("the check for well-formedness rejects unbalanced or unescaped markup", () => {
    expect(() => checkWellFormed('<svg><g></svg>')).toThrow();
    expect(() => checkWellFormed('<svg><text>a & b</text></svg>')).toThrow();
    expect(() => checkWellFormed('<svg/><svg/>')).toThrow();
    expect(checkWellFormed('<?xml version="1.0"?>\n<svg><g><line x="1"/></g><text>a &amp; b</text></svg>')).toEqual(["svg", "g", "line", "text"]);
  });

  it("is well-formed XML with one <svg> root", () => {
    const names = checkWellFormed(svg);
    expect(names.filter((n) => n === "svg")).toHaveLength(1);
  });

  it("has one polyline per depth and the mean in the temperature panel, one per depth in the fraction panel", () => {
    const depths = depthKeys(input.historyCsv);
    expect(depths).toEqual(["0", "0.75", "1.5"]); // the case's output depths, so the counts below are not vacuous
    const temperature = polylines(svg, "temperature").map((p) => attribute(p, "data-series"));
    expect(temperature).toEqual([...depths.map((d) => `T_${d}mm_C`), "T_mean_C"]);
    const fraction = polylines(svg, "fraction").map((p) => attribute(p, "data-series"));
    expect(fraction).toEqual(depths.map((d) => `austenite_${d}mm`));
    for (const d of depths) expect(svg).toContain(`>${d} mm deep</text>`);
  });

  it("the mean line's highest and lowest points map back to the extremes of T_mean_C within one pixel", () => {
    const mean = polylines(svg, "temperature").find((p) => attribute(p, "data-series") === "T_mean_C")!;
    const ys = points(mean).map((p) => p.y);
    const scale = coolingChartLayout(input).temperature;
    const history = column(input.historyCsv, "T_mean_C");
    const onePixel_K = kelvinPerPixel(input);
    // SVG y grows downwards: the smallest y is the highest temperature.
    expect(Math.abs(scale.invert(Math.min(...ys)) - Math.max(...history))).toBeLessThan(onePixel_K);
    expect(Math.abs(scale.invert(Math.max(...ys)) - Math.min(...history))).toBeLessThan(onePixel_K);
  });

  it("the fraction lines show 1 − austenite: the last point of each maps back to the history's last row", () => {
    const f = coolingChartLayout(input).fraction!;
    const onePixel = 1 / Math.abs(f.range[1] - f.range[0]);
    for (const p of polylines(svg, "fraction")) {
      const austenite = column(input.historyCsv, attribute(p, "data-series"));
      const last = points(p).at(-1)!;
      expect(Math.abs(f.invert(last.y) - (1 - austenite.at(-1)!))).toBeLessThan(onePixel);
    }
  });

  it("carries the caution, escaped, wrapped into lines that together give the whole notice", () => {
    const group = /<g class="caution">([\s\S]*?)<\/g>/.exec(svg)![1];
    const lines = [...group.matchAll(/<tspan[^>]*>([^<]*)<\/tspan>/g)].map((m) => m[1]);
    expect(lines.length).toBeGreaterThan(1); // the notice is longer than one line at 900 px
    expect(lines.join(" ")).toBe(`Caution: ${escapeXml(SAFETY_NOTICE)}`);
  });

  it("labels each critical temperature of the summary and draws its line at that temperature", () => {
    const critical = input.summary.critical_C as Record<string, number>;
    const scale = coolingChartLayout(input).temperature;
    const onePixel_K = kelvinPerPixel(input);
    for (const name of ["Ae3", "Ae1", "Bs", "Ms"]) {
      expect(typeof critical[name]).toBe("number");
      expect(svg).toContain(`>${name} ${critical[name].toFixed(1)} °C</text>`);
      const line = new RegExp(`<line data-critical="${name}"[^>]*/>`).exec(svg)![0];
      expect(Math.abs(scale.invert(Number(attribute(line, "y1"))) - critical[name])).toBeLessThan(onePixel_K);
    }
  });

  it("marks each pyrometer reading where the strip passes it and annotates the coiling temperature", () => {
    const pyrometers = input.summary.pyrometers as { position_m: number; T_C: number }[];
    expect(pyrometers.length).toBe(3);
    const layout = coolingChartLayout(input);
    const time = column(input.historyCsv, "time_s");
    const position = column(input.historyCsv, "position_m");
    const onePixel_K = kelvinPerPixel(input);
    for (const p of pyrometers) {
      const marker = new RegExp(`<circle data-pyrometer="${p.position_m.toFixed(3)}"[^>]*/>`).exec(svg)![0];
      expect(Math.abs(layout.temperature.invert(Number(attribute(marker, "cy"))) - p.T_C)).toBeLessThan(onePixel_K);
      const t = timeAtPosition(time, position, p.position_m)!;
      expect(Math.abs(Number(attribute(marker, "cx")) - layout.time.at(t))).toBeLessThan(1);
    }
    const coiling = (input.summary.coiling as { T_C: { mean: number } }).T_C.mean;
    expect(svg).toContain(`coiling: mean ${coiling.toFixed(1)} °C`);
    expect(svg).toContain("position on the table [m]");
    expect(svg).toContain("time [s]");
    expect(svg).toContain("temperature [°C]");
  });

  it("gives identical bytes for the same input, and for a second run of the same case", async () => {
    expect(coolingChartSvg(input)).toBe(svg);
    const again = await runToInput("cases/demo-thin-cmn.json");
    expect(coolingChartSvg(again)).toBe(svg);
  });

  it("escapes & < > and \" in the title", () => {
    const odd = coolingChartSvg({ historyCsv: input.historyCsv, summary: { ...input.summary, title: 'Strip <A&B> "trial"' } });
    checkWellFormed(odd);
    expect(odd).toContain("Strip &lt;A&amp;B&gt; &quot;trial&quot;");
    expect(odd).not.toContain("<A&B>");
  });
});

describe("the cooling chart of a non-transforming plate (plate-20mm-water-quench)", () => {
  it("has no fraction panel, no critical lines, no position axis, but the temperature lines and the caution", async () => {
    const input = await runToInput("cases/plate-20mm-water-quench.json");
    const svg = coolingChartSvg(input);
    checkWellFormed(svg);
    expect(coolingChartLayout(input).fraction).toBeNull();
    expect(svg).not.toContain("panel-fraction");
    expect(polylines(svg, "fraction")).toHaveLength(0);
    expect(polylines(svg, "temperature").map((p) => attribute(p, "data-series"))).toEqual(["T_0mm_C", "T_5mm_C", "T_10mm_C", "T_mean_C"]);
    expect(svg).not.toContain("data-critical");
    expect(svg).not.toContain("position on the table");
    expect(svg).toContain(escapeXml(SAFETY_NOTICE.slice(0, 40)));
  });
});

describe("thinning long series", () => {
  it("keeps every point of a series no longer than the limit", () => {
    expect(thinIndices([3, 1, 2], 2000)).toEqual([0, 1, 2]);
  });

  it("keeps at most the limit, in order, with the ends and the global extremes", () => {
    const n = 100_001;
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = Math.sin(i / 500);
    v[31_337] = 5; // a one-row spike, as a sharp recalescence peak would be
    v[77_777] = -5;
    const kept = thinIndices(v, 2000);
    expect(kept.length).toBeLessThanOrEqual(2000);
    expect(kept.length).toBeGreaterThan(1900); // most buckets give two points
    for (let k = 1; k < kept.length; k++) expect(kept[k]).toBeGreaterThan(kept[k - 1]);
    expect(kept[0]).toBe(0);
    expect(kept.at(-1)).toBe(n - 1);
    expect(kept).toContain(31_337);
    expect(kept).toContain(77_777);
  });

  it("a long history gives polylines of at most the limit whose mean keeps its extremes within one pixel", () => {
    const rows = 30_001;
    let csv = "time_s,T_0mm_C,T_mean_C\n";
    const mean: number[] = [];
    for (let i = 0; i < rows; i++) {
      const t = i * 0.01;
      // Cooling with a narrow bump (about five rows wide) that thinning must not flatten.
      const m = 900 - 2 * t + 40 * Math.exp(-(((i - 12_345) / 2) ** 2));
      mean.push(Number(m.toFixed(3)));
      csv += `${t.toFixed(4)},${(m - 20).toFixed(3)},${m.toFixed(3)}\n`;
    }
    const input = { historyCsv: csv, summary: { title: "synthetic" } };
    const svg = coolingChartSvg(input);
    checkWellFormed(svg);
    const lines = polylines(svg, "temperature");
    expect(lines).toHaveLength(2);
    for (const l of lines) expect(points(l).length).toBeLessThanOrEqual(MAX_POINTS_PER_SERIES);
    const layout = coolingChartLayout(input);
    const kept = points(lines[1]).map((p) => ({ t: layout.time.invert(p.x), T: layout.temperature.invert(p.y) }));
    const onePixel_K = kelvinPerPixel(input);
    // The bump's top (row 12 345, t = 123.45 s) is not the global maximum (900 °C at t = 0); the
    // kept points within half a second of it must still reach it.
    const bumpTop = Math.max(...mean.slice(12_300, 12_400));
    const nearBump = kept.filter((p) => Math.abs(p.t - 123.45) < 0.5).map((p) => p.T);
    expect(nearBump.length).toBeGreaterThan(0);
    expect(Math.abs(Math.max(...nearBump) - bumpTop)).toBeLessThan(onePixel_K);
    expect(bumpTop - mean[12_300]).toBeGreaterThan(10 * onePixel_K); // the bump is far taller than the tolerance
    const keptTemperatures = kept.map((p) => p.T);
    expect(Math.abs(Math.max(...keptTemperatures) - Math.max(...mean))).toBeLessThan(onePixel_K);
    expect(Math.abs(Math.min(...keptTemperatures) - Math.min(...mean))).toBeLessThan(onePixel_K);
  });
});

describe("writeChartIfAsked", () => {
  const input = { historyCsv: "time_s,T_0mm_C,T_mean_C\n0.0000,900.000,900.000\n1.0000,800.000,850.000\n", summary: { title: "two rows" } };

  it("writes nothing and reads no history when not asked", () => {
    const written: string[] = [];
    let reads = 0;
    writeChartIfAsked(false, (name) => written.push(name), () => (reads++, input.historyCsv), input.summary);
    expect(written).toEqual([]);
    expect(reads).toBe(0);
  });

  it("writes the chart as cooling.svg through the folder's writer when asked", () => {
    const written = new Map<string, string>();
    writeChartIfAsked(true, (name, text) => written.set(name, text), () => input.historyCsv, input.summary);
    expect([...written.keys()]).toEqual([CHART_FILE]);
    expect(CHART_FILE).toBe("cooling.svg");
    expect(written.get(CHART_FILE)).toBe(coolingChartSvg(input));
  });
});
