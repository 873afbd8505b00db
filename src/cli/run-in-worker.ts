/**
 * Runs a case on a worker thread when the compiled worker exists (the installed CLI), else in this
 * thread (under a TypeScript test runner). While a worker runs, SIGINT/SIGTERM stop it and remove
 * the hidden partial result folder before the process exits, so nothing half-written survives and
 * a previous result in the same folder is left intact.
 */
import { existsSync, rmSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { runCase, type RunOptions } from "../io/run-case.js";
import { loadCase } from "../io/load-case.js";
import { InputError } from "../io/errors.js";
import { WriteError, partialFolderFor } from "../io/result-folder.js";

let active: { worker: Worker; out: string } | null = null;

/** Signal path: stop the running worker and remove its partial folder. */
export async function stopActiveRun(): Promise<void> {
  if (!active) return;
  const { worker, out } = active;
  active = null;
  await worker.terminate();
  rmSync(partialFolderFor(out), { recursive: true, force: true });
}

export async function runCaseIsolated(file: string, out: string, options: RunOptions): Promise<{ summary: Record<string, unknown>; warnings: string[] }> {
  const url = new URL("../io/run-worker.js", import.meta.url);
  const path = url.protocol === "file:" ? fileURLToPath(url) : "";
  if (!path || !existsSync(path)) {
    const o = await runCase(file, out, options);
    return { summary: o.summary, warnings: o.warnings };
  }
  loadCase(file); // bad input fails here, before a thread is started
  const worker = new Worker(path, { workerData: { file, out, workers: options.workers, force: options.force, chart: options.chart } });
  active = { worker, out };
  try {
    return await new Promise((resolve, reject) => {
      worker.on("message", (m: Record<string, unknown>) => {
        if (m.kind === "progress") options.onProgress?.(m.done as number, m.total as number);
        else if (m.kind === "done") resolve({ summary: m.summary as Record<string, unknown>, warnings: m.warnings as string[] });
        else if (m.kind === "input-error") reject(new InputError(m.file as string, m.field as string, m.expected as string));
        else if (m.kind === "write-error") reject(new WriteError(m.path as string, m.reason as string));
        else reject(new Error(String(m.message)));
      });
      worker.on("error", reject);
      worker.on("exit", (code) => {
        if (code !== 0) reject(new Error(`worker stopped with code ${code}`));
      });
    });
  } finally {
    if (active?.worker === worker) active = null;
    void worker.terminate();
  }
}
