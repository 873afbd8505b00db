/**
 * Worker-thread entry of the task pool (see task-pool.ts): runs one task by its kind. Tasks and
 * results are plain data. An InputError becomes data too, since error classes do not survive the
 * thread boundary.
 */
import { InputError } from "./errors.js";
import { designChain, type DesignChainTask } from "./design-chain.js";
import { runSweepPoint, type SweepPointTask } from "./sweep-point.js";
import { runReadings, type ReadingsTask } from "./readings-task.js";

export type Task = DesignChainTask | SweepPointTask | ReadingsTask;

export type TaskOutcome = { value: unknown } | { inputError: { file: string; field: string; expected: string } };

export function runTask(task: Task): unknown {
  switch (task.kind) {
    case "design-chain":
      return designChain(task);
    case "sweep-point":
      return runSweepPoint(task);
    case "readings":
      return runReadings(task);
  }
}

export function runTaskSafely(task: Task): TaskOutcome {
  try {
    return { value: runTask(task) };
  } catch (e) {
    if (e instanceof InputError) return { inputError: { file: e.file, field: e.field, expected: e.expected } };
    throw e;
  }
}

export default runTaskSafely;
