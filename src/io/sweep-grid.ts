/**
 * The parameter grid of a sweep: `--vary path=values` options, their cartesian product in a fixed
 * order (the first --vary varies slowest, the last fastest, like nested loops in the order given),
 * and shards of it (`--shard K/N` takes the points whose 0-based index ≡ K − 1 mod N).
 *
 * Values are a list (`4,8,12`) or a range `start:stop:step` that includes stop when it lands on the
 * grid; range values are rounded to 12 significant digits so that 0.1:0.5:0.1 gives 0.5, not
 * 0.5000000000000001.
 */

export interface VarySpec {
  /** Dotted case path as given (`cooling.line.banks[2].multiplier`). */
  readonly path: string;
  readonly values: readonly number[];
}

/** Largest number of points a sweep may have (a guard against a mistyped step). */
export const MAX_POINTS = 1_000_000;

function number(text: string, what: string): number {
  const t = text.trim();
  const v = t === "" ? NaN : Number(t);
  if (!Number.isFinite(v)) throw new Error(`${what} "${text}" is not a number`);
  return v;
}

/** Parses `4,8,12` or `6:12:2`; throws an Error with a one-line message. */
export function parseValues(text: string): number[] {
  if (text.includes(":")) {
    const parts = text.split(":");
    if (parts.length !== 3) throw new Error(`range "${text}" must be start:stop:step`);
    const [a, b, step] = parts.map((p, i) => number(p, ["start", "stop", "step"][i]));
    if (!(step > 0)) throw new Error(`range "${text}": step must be > 0`);
    if (b < a) throw new Error(`range "${text}": stop must not be below start`);
    const count = Math.floor((b - a) / step + 1e-9) + 1;
    if (count > MAX_POINTS) throw new Error(`range "${text}" has ${count} values, more than ${MAX_POINTS}`);
    return Array.from({ length: count }, (_, i) => Number((a + i * step).toPrecision(12)));
  }
  const values = text.split(",").map((p) => number(p, "value"));
  if (new Set(values).size !== values.length) throw new Error(`list "${text}" repeats a value`);
  return values;
}

/** Parses one `path=values` option. */
export function parseVary(text: string): VarySpec {
  const eq = text.indexOf("=");
  if (eq <= 0) throw new Error(`expected path=values (e.g. product.thickness_mm=4,8,12 or product.thickness_mm=6:12:2), got "${text}"`);
  return { path: text.slice(0, eq).trim(), values: parseValues(text.slice(eq + 1)) };
}

/** Number of points of the grid. */
export function gridSize(vary: readonly VarySpec[]): number {
  return vary.reduce((n, v) => n * v.values.length, 1);
}

/** The varied values of point `index` (0-based), one per --vary, in the order given. */
export function pointValues(vary: readonly VarySpec[], index: number): number[] {
  const out = new Array<number>(vary.length);
  let rest = index;
  for (let d = vary.length - 1; d >= 0; d--) {
    const n = vary[d].values.length;
    out[d] = vary[d].values[rest % n];
    rest = Math.floor(rest / n);
  }
  return out;
}

export interface Shard {
  /** 1-based shard number K and the number of shards N. */
  readonly index: number;
  readonly count: number;
}

/** Parses `K/N` (1 ≤ K ≤ N); throws an Error with a one-line message. */
export function parseShard(text: string): Shard {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (!m) throw new Error(`expected K/N with whole numbers (e.g. 2/4), got "${text}"`);
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (count < 1) throw new Error(`shard count N must be at least 1, got ${count}`);
  if (index < 1 || index > count) throw new Error(`shard K must lie in 1–${count}, got ${index}`);
  return { index, count };
}

/** The 0-based point indices a shard runs (all points without a shard). */
export function shardPoints(total: number, shard: Shard | null): number[] {
  const out: number[] = [];
  for (let i = shard ? shard.index - 1 : 0; i < total; i += shard ? shard.count : 1) out.push(i);
  return out;
}
