/**
 * `recalesce design`: choose the open headers (and, optionally, a common flow scale) so that the
 * through-thickness mean coiling temperature of every coil segment (or of the single strip point)
 * lies within the tolerance of the target.
 *
 * A coil is cut into chains of CHAIN_SEGMENTS neighbouring segments; each chain is designed on a
 * worker thread with warm starts from segment to segment. The chains do not depend on the number of
 * workers, so neither does the result. With --max-switches the counts are then limited so that
 * neighbours differ by at most that many headers (switch-limit.ts), and the segments whose counts
 * moved are trimmed again with the counts imposed.
 */
import { availableParallelism } from "node:os";
import type { Case } from "./case-schema.js";
import { coilSegments, type CoilSegment } from "./resolve-case.js";
import { designPlan, type DesignPlan, type DesignRequest } from "./design-plan.js";
import type { SegmentDesign } from "./design-segment.js";
import type { DesignChainTask } from "./design-chain.js";
import { switchesBetween } from "./header-pattern.js";
import { limitSwitches } from "./switch-limit.js";
import { withPool, type PoolOptions } from "./task-pool.js";

/** Segments designed one after the other with warm starts (a fixed number, not the worker count). */
export const CHAIN_SEGMENTS = 8;

export interface DesignOutcome {
  readonly file: string;
  readonly plan: DesignPlan;
  /** Whether the case is a coil (per-segment patterns). */
  readonly coil: boolean;
  readonly segments: SegmentDesign[];
  /** Every segment within tolerance and every limit kept. */
  readonly reachable: boolean;
  /** What could not be met, one line each. */
  readonly messages: string[];
  /** Simulations run in all. */
  readonly evaluations: number;
  /** Largest number of header switches between neighbouring segments. */
  readonly largestSwitches: number;
  /** Index of the body (middle) segment, whose pattern goes into designed.json. */
  readonly body: number;
}

export interface DesignRunOptions extends PoolOptions {
  readonly onProgress?: (done: number, total: number) => void;
}

/** The strip points to design: every coil segment, or the single point of a strip case. */
export function designPoints(file: string, c: Case): CoilSegment[] {
  if ("line" in c.cooling && c.cooling.coil) return coilSegments(file, c.cooling.coil);
  return [{ index: 0, position_m: 0, entry_C: c.product.initial_C }];
}

function chains(segments: readonly CoilSegment[]): CoilSegment[][] {
  const out: CoilSegment[][] = [];
  for (let k = 0; k < segments.length; k += CHAIN_SEGMENTS) out.push(segments.slice(k, k + CHAIN_SEGMENTS));
  return out;
}

export async function designCooling(file: string, c: Case, request: DesignRequest, options: DesignRunOptions = {}): Promise<DesignOutcome> {
  const points = designPoints(file, c);
  const plan = designPlan(file, c, request, points.map((p) => p.entry_C));
  const coil = "line" in c.cooling && c.cooling.coil !== undefined;
  const task = (segments: CoilSegment[], counts?: number[][], flowScales?: number[]): DesignChainTask => ({ kind: "design-chain", file, caseData: c, plan, segments, counts, flowScales });
  const groups = chains(points);
  // No more threads than chains: a single strip point runs in this thread, without pool start-up.
  const workers = Math.min(options.workers ?? availableParallelism(), groups.length);
  return withPool({ workers, workerFile: options.workerFile }, async (pool) => {
    const progress = (chainsDone: number) => options.onProgress?.(Math.min(points.length, chainsDone * CHAIN_SEGMENTS), points.length);
    const designed = (await pool.map<SegmentDesign[]>(groups.map((g) => task(g)), progress)).flat();
    let evaluations = designed.reduce((s, d) => s + d.evaluations, 0);
    if (plan.maxSwitches !== null && designed.length > 1) {
      const upper = designed.map(() => (plan.strategy === "split" ? [plan.front.length, plan.back.length] : [plan.front.length]));
      const limited = limitSwitches(designed.map((d) => d.counts), plan.maxSwitches, upper);
      const moved = designed.filter((d, k) => limited[k].some((n, g) => n !== d.counts[g]));
      const redone = await pool.map<SegmentDesign[]>(moved.map((d) => task([points[d.segment]], [limited[d.segment]], [d.pattern.flowScale])));
      for (const [r] of redone) {
        designed[r.segment] = r;
        evaluations += r.evaluations;
      }
    }
    let largestSwitches = 0;
    for (let k = 1; k < designed.length; k++) largestSwitches = Math.max(largestSwitches, switchesBetween(designed[k - 1].pattern, designed[k].pattern));
    const messages: string[] = [];
    for (const d of designed) {
      const where = coil ? `segment ${d.segment + 1} (${d.position_m} m)` : "strip";
      for (const issue of d.issues) messages.push(`${where}: ${issue}`);
    }
    if (plan.maxSwitches !== null && largestSwitches > plan.maxSwitches) {
      messages.push(`neighbouring segments differ by up to ${largestSwitches} headers, more than --max-switches ${plan.maxSwitches} (the hold of split cooling left fewer back headers)`);
    }
    return {
      file,
      plan,
      coil,
      segments: designed,
      reachable: messages.length === 0,
      messages,
      evaluations,
      largestSwitches,
      body: Math.floor((designed.length - 1) / 2),
    };
  });
}
