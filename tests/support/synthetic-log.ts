/**
 * Synthetic pyrometer logs made by the tool itself: the case run with known multipliers and
 * pyrometers at the wanted positions, plus uniform noise from a seeded generator (mulberry32, a
 * public-domain 32-bit generator by Tommy Ettinger), so tests are repeatable.
 */
import type { Case } from "../../src/io/case-schema.js";
import { runReadings } from "../../src/io/readings-task.js";
import type { CoilSegment } from "../../src/io/resolve-case.js";

/** Uniform numbers in [0, 1) from a 32-bit seed. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface SyntheticLogOptions {
  readonly htcMultiplier?: number;
  /** Bank name → multiplier. */
  readonly banks?: Record<string, number>;
  readonly positions_m: readonly number[];
  /** Noise amplitude: readings get a uniform error in [−noise, +noise] [K] */
  readonly noise_K: number;
  readonly seed: number;
  /** Coil segments to log (their 1-based numbers go into the segment column). */
  readonly segments?: readonly CoilSegment[];
}

/** The log's CSV text. */
export function syntheticLog(file: string, c: Case, o: SyntheticLogOptions): string {
  const kase = structuredClone(c);
  const line = (kase.cooling as Extract<Case["cooling"], { line: unknown }>).line;
  if (o.htcMultiplier !== undefined) line.htc_multiplier = o.htcMultiplier;
  for (const b of line.banks) if (o.banks?.[b.name] !== undefined) b.multiplier = o.banks[b.name];
  line.pyrometers_m = [...o.positions_m];
  const random = mulberry32(o.seed);
  const noise = () => (2 * random() - 1) * o.noise_K;
  const runs = o.segments ?? [null];
  let csv = o.segments ? "segment,position_m,T_C\n" : "position_m,T_C\n";
  for (const seg of runs) {
    const readings = runReadings({ kind: "readings", file, caseData: kase, segment: seg });
    o.positions_m.forEach((x, i) => (csv += `${seg ? `${seg.index + 1},` : ""}${x},${(readings[i] + noise()).toFixed(2)}\n`));
  }
  return csv;
}
