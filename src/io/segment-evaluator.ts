/**
 * Runs one strip point (a coil segment, or the single point of a strip case) under any header
 * pattern. The case is resolved once (steel set-up, speed profile); each pattern only rebuilds the
 * line's stages, so an evaluation costs one simulation. Results are cached per pattern.
 *
 * The pattern goes through `applyPattern` on the validated case's line and then through the same
 * `lineSpec`/`trackPoint` as `recalesce run`, so the designed case file, run on its own, reproduces
 * the predicted temperatures exactly.
 */
import type { Case } from "./case-schema.js";
import { lineSpec, resolveCase, type CoilSegment, type ResolvedCase } from "./resolve-case.js";
import { simulateResolved } from "./run-case.js";
import { applyPattern, type HeaderPattern } from "./header-pattern.js";
import type { DesignPlan } from "./design-plan.js";
import { trackPoint } from "../model/line.js";
import { simulate } from "../model/simulate.js";
import { KELVIN } from "../model/scenario.js";

type LineInput = Parameters<typeof lineSpec>[0];
type Through = { top: number; centre: number; bottom: number; mean: number };

/** What a design needs to know about one run (plain data). */
export interface Evaluation {
  /** Coiling temperatures [°C] */
  readonly coiling_C: Through;
  /** Mean cooling rate under water [K/s]; null when the point never meets water */
  readonly rate_K_s: number | null;
  /** Time under water [s] */
  readonly water_s: number;
  /** Mass-averaged phase fractions, when the steel transforms. */
  readonly phases: Record<string, number> | null;
  /** Product fields (grain size, strengths, hardness: top/centre/bottom/mean) when reported. */
  readonly product: Record<string, Record<string, number | null>> | null;
}

const PRODUCT_FIELDS = ["grain_um", "yield_MPa", "tensile_MPa", "hardness_HV"] as const;

/** The design-relevant part of a run summary. */
export function evaluationOf(summary: Record<string, unknown>): Evaluation {
  const s = summary as {
    final: Record<string, unknown> & { T_C: Through; phases?: Record<string, number> };
    coiling?: { T_C: Through };
    line?: { time_under_water_s: number; mean_cooling_rate_under_water_K_s: number | null };
  };
  const product: Record<string, Record<string, number | null>> = {};
  for (const f of PRODUCT_FIELDS) if (s.final[f] && typeof s.final[f] === "object") product[f] = s.final[f] as Record<string, number | null>;
  return {
    coiling_C: s.coiling?.T_C ?? s.final.T_C,
    rate_K_s: s.line?.mean_cooling_rate_under_water_K_s ?? null,
    water_s: s.line?.time_under_water_s ?? 0,
    phases: s.final.phases ?? null,
    product: Object.keys(product).length ? product : null,
  };
}

function patternKey(p: HeaderPattern): string {
  return `${p.open.join(",")}|${p.scaled.join(",")}|${p.flowScale}`;
}

export class SegmentEvaluator {
  private readonly base: ResolvedCase;
  private readonly line: LineInput;
  private readonly keepOff: ReadonlySet<string>;
  private readonly cache = new Map<string, Evaluation>();
  private readonly exitCache = new Map<number, number>();
  /** Simulations run so far. */
  evaluations = 0;

  constructor(
    readonly file: string,
    readonly c: Case,
    readonly plan: DesignPlan,
    readonly segment: CoilSegment,
  ) {
    if (!("line" in c.cooling)) throw new Error("SegmentEvaluator needs a line case");
    this.line = c.cooling.line;
    this.keepOff = new Set(plan.keepOff);
    this.base = resolveCase(file, c, c.cooling.coil ? { coilPosition_m: segment.position_m, entry_C: segment.entry_C } : {});
  }

  /** The resolved case (stages and line) under a pattern. */
  private resolvedFor(p: HeaderPattern): { c: Case; resolved: ResolvedCase } {
    const line = applyPattern(this.line, this.plan.headers, p, this.keepOff);
    const spec = lineSpec(line);
    const baseLine = this.base.line!;
    const point = trackPoint(spec, baseLine.profile, baseLine.coilPosition_m);
    const resolved: ResolvedCase = {
      ...this.base,
      scenario: { ...this.base.scenario, stages: point.stages },
      line: { ...baseLine, spec, point },
    };
    const cooling = { ...(this.c.cooling as { line: LineInput }), line };
    return { c: { ...this.c, cooling } as Case, resolved };
  }

  evaluate(p: HeaderPattern): Evaluation {
    const key = patternKey(p);
    const hit = this.cache.get(key);
    if (hit) return hit;
    const { c, resolved } = this.resolvedFor(p);
    const { summary } = simulateResolved(c, resolved, undefined, true);
    this.evaluations++;
    const e = evaluationOf(summary);
    this.cache.set(key, e);
    return e;
  }

  /** Entry temperature of this point [°C] */
  get entry_C(): number {
    return this.base.scenario.initial_K - KELVIN;
  }

  /**
   * Mean temperature [°C] where the first `n` headers of the front order (at the case's flows) end:
   * the run is stopped at the end of the last of them. n = 0 gives the entry temperature.
   */
  exitMean_C(n: number): number {
    if (n === 0) return this.entry_C;
    const hit = this.exitCache.get(n);
    if (hit !== undefined) return hit;
    const open = this.plan.front.slice(0, n).sort((a, b) => a - b);
    const x = this.exitPosition_m(n);
    const { resolved } = this.resolvedFor({ open, scaled: [], flowScale: 1 });
    const stages = resolved.scenario.stages.filter((s) => s.position_m !== undefined && s.position_m[1] <= x + 1e-9);
    const result = simulate({ ...resolved.scenario, stages });
    this.evaluations++;
    const T = result.solver.meanTemperature_K() - KELVIN;
    this.exitCache.set(n, T);
    return T;
  }

  /** Where the first `n` front headers end [m] (0 for none). */
  exitPosition_m(n: number): number {
    let x = 0;
    for (const i of this.plan.front.slice(0, n)) x = Math.max(x, this.plan.headers[i].end_m);
    return x;
  }

  /** Time this point takes from table position a to b [s] */
  travelTime_s(a_m: number, b_m: number): number {
    const { profile, coilPosition_m } = this.base.line!;
    return profile.timeAt(coilPosition_m + b_m) - profile.timeAt(coilPosition_m + a_m);
  }

  /** Table position this point reaches `t_s` seconds after passing x [m]. */
  positionAfter_m(x_m: number, t_s: number): number {
    const { profile, coilPosition_m } = this.base.line!;
    return profile.travelled(profile.timeAt(coilPosition_m + x_m) + t_s) - coilPosition_m;
  }
}
