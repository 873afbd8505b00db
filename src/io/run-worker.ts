/**
 * Worker-thread entry for `recalesce run`. Running the simulation off the main thread keeps the main
 * thread free to receive SIGINT/SIGTERM while a long case computes, so an interrupted run can stop
 * the worker and remove the partial result folder (see src/cli/run-in-worker.ts).
 */
import { parentPort, workerData } from "node:worker_threads";
import { runCase } from "./run-case.js";
import { InputError } from "./errors.js";
import { WriteError } from "./result-folder.js";

const data = workerData as { file: string; out: string; workers?: number; force?: boolean; chart?: boolean };
runCase(data.file, data.out, {
  workers: data.workers,
  force: data.force,
  chart: data.chart,
  onProgress: (done, total) => parentPort!.postMessage({ kind: "progress", done, total }),
}).then(
  (o) => parentPort!.postMessage({ kind: "done", summary: o.summary, warnings: o.warnings }),
  (e: unknown) => {
    if (e instanceof InputError) parentPort!.postMessage({ kind: "input-error", file: e.file, field: e.field, expected: e.expected });
    else if (e instanceof WriteError) parentPort!.postMessage({ kind: "write-error", path: e.path, reason: e.reason });
    else parentPort!.postMessage({ kind: "error", message: e instanceof Error ? e.message : String(e), stack: e instanceof Error ? e.stack : undefined });
  },
);
