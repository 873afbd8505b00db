/**
 * Designs a run of neighbouring coil segments one after the other, each search starting from the
 * previous segment's answer (the speed and entry temperature change slowly along a coil, so the
 * answer moves by a header or two). The unit of work handed to a worker thread.
 */
import type { Case } from "./case-schema.js";
import type { CoilSegment } from "./resolve-case.js";
import type { DesignPlan } from "./design-plan.js";
import { SegmentEvaluator } from "./segment-evaluator.js";
import { designSegment, type DesignGuess, type SegmentDesign } from "./design-segment.js";

export interface DesignChainTask {
  readonly kind: "design-chain";
  readonly file: string;
  readonly caseData: Case;
  readonly plan: DesignPlan;
  readonly segments: readonly CoilSegment[];
  /** Imposed counts per segment (switch limit); absent = search. */
  readonly counts?: ReadonlyArray<readonly number[]>;
  /** Start of the flow trim per segment (the earlier answer), when counts are imposed. */
  readonly flowScales?: readonly number[];
}

export function designChain(task: DesignChainTask): SegmentDesign[] {
  const out: SegmentDesign[] = [];
  let guess: DesignGuess | undefined;
  task.segments.forEach((seg, k) => {
    const ev = new SegmentEvaluator(task.file, task.caseData, task.plan, seg);
    const imposed = task.counts?.[k];
    const start = imposed ? { counts: imposed, flowScale: task.flowScales?.[k] ?? 1 } : guess;
    const d = designSegment(ev, task.plan, seg, start, imposed);
    out.push(d);
    guess = { counts: d.counts, flowScale: d.pattern.flowScale };
  });
  return out;
}
