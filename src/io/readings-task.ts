/**
 * One run for a calibration: the case (with trial multipliers and the log's positions as its
 * pyrometers) at one strip point, returning the top-surface temperature at every pyrometer [°C].
 * Runs on worker threads; plain data in and out.
 */
import type { Case } from "./case-schema.js";
import { resolveCase, type CoilSegment } from "./resolve-case.js";
import { simulateResolved } from "./run-case.js";

export interface ReadingsTask {
  readonly kind: "readings";
  readonly file: string;
  readonly caseData: Case;
  /** The coil segment, or null for the strip point of a non-coil case. */
  readonly segment: CoilSegment | null;
}

export function runReadings(task: ReadingsTask): number[] {
  const options = task.segment ? { coilPosition_m: task.segment.position_m, entry_C: task.segment.entry_C, segment: task.segment.index } : {};
  const resolved = resolveCase(task.file, task.caseData, options);
  return simulateResolved(task.caseData, resolved, undefined, true).readings.pyrometers_C;
}
