/** Worker-thread entry for coil segments (see coil.ts). The validated case travels as data. */
import type { Case } from "./case-schema.js";
import type { CoilSegment } from "./resolve-case.js";
import { simulateSegment, type SegmentResult } from "./coil.js";

export default function runSegment(task: { file: string; caseData: Case; segment: CoilSegment }): SegmentResult {
  return simulateSegment(task.file, task.caseData, task.segment);
}
