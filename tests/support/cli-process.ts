/**
 * Spawning the compiled CLI (from built-cli.ts) beyond a plain run from the repository root:
 * from another working folder, and without waiting, for signal tests and small pools.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { REPO, type BuiltCli, type CliRun } from "./built-cli.js";

export interface CliEnd extends CliRun {
  readonly signal: NodeJS.Signals | null;
}

/** Runs the compiled CLI from `cwd` and waits for it. */
export function runCliIn(cli: BuiltCli, args: readonly string[], cwd: string): CliRun {
  const r = spawnSync(process.execPath, [cli.main, ...args], { cwd, encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** Starts the compiled CLI without waiting; pair with finished(). */
export function startCli(cli: BuiltCli, args: readonly string[], cwd = REPO): ChildProcess {
  return spawn(process.execPath, [cli.main, ...args], { cwd, stdio: ["ignore", "pipe", "pipe"] });
}

/** Collects a started CLI's output until it ends (call right after startCli). */
export function finished(child: ChildProcess): Promise<CliEnd> {
  let stdout = "";
  let stderr = "";
  child.stdout?.setEncoding("utf8").on("data", (s: string) => (stdout += s));
  child.stderr?.setEncoding("utf8").on("data", (s: string) => (stderr += s));
  return new Promise((resolveEnd) => child.on("close", (status, signal) => resolveEnd({ status, signal, stdout, stderr })));
}

/** Runs jobs with at most `width` at a time, results in job order. */
export async function inPool<T, R>(jobs: readonly T[], width: number, run: (job: T) => Promise<R>): Promise<R[]> {
  const results: R[] = new Array(jobs.length);
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < jobs.length) {
      const i = next++;
      results[i] = await run(jobs[i]);
    }
  };
  await Promise.all(Array.from({ length: Math.min(width, jobs.length) }, worker));
  return results;
}
