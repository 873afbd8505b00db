/**
 * A pool of worker threads for independent runs (design chains, sweep points, calibration runs).
 * When the compiled worker file sits next to this module (running from dist/), tasks go to piscina
 * worker threads; otherwise (under a TypeScript test runner) they run in this thread, in order.
 * Every task is computed by the same code from the same data either way, so results never depend
 * on the number of workers. A user error raised inside a worker comes back as the same InputError.
 */
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import type { Piscina } from "piscina";
import { InputError } from "./errors.js";
import { runTaskSafely, type Task, type TaskOutcome } from "./task-worker.js";

/**
 * The compiled worker `name` next to the module at `moduleUrl`, or null when it does not exist
 * (modules run as TypeScript by a test runner have no compiled sibling).
 */
export function compiledSibling(moduleUrl: string, name: string): string | null {
  const url = new URL(`./${name}`, moduleUrl);
  return url.protocol === "file:" && existsSync(fileURLToPath(url)) ? fileURLToPath(url) : null;
}

const LOADER_FLAGS = ["--require", "-r", "--import", "--loader", "--experimental-loader"];

/** Node options without module loaders and preloads (`--import x`, `--loader=x`, …). */
export function withoutLoaders(argv: readonly string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (LOADER_FLAGS.includes(a)) i++;
    else if (!LOADER_FLAGS.some((f) => a.startsWith(`${f}=`))) out.push(a);
  }
  return out;
}

export interface PoolOptions {
  /** Worker threads (1 = this thread). Default: available cores. */
  readonly workers?: number;
  /** Worker module to load instead of the compiled one (benches under tsx pass the .ts file). */
  readonly workerFile?: string;
}

function unwrap(outcome: TaskOutcome): unknown {
  if ("inputError" in outcome) {
    const e = outcome.inputError;
    throw new InputError(e.file, e.field, e.expected);
  }
  return outcome.value;
}

export class TaskPool {
  private constructor(private readonly pool: Piscina | null, readonly threads: number) {}

  static async open(options: PoolOptions = {}): Promise<TaskPool> {
    const workers = Math.max(1, options.workers ?? availableParallelism());
    const file = options.workerFile ?? compiledSibling(import.meta.url, "task-worker.js");
    if (workers === 1 || file === null) return new TaskPool(null, 1);
    const { Piscina } = await import("piscina");
    // A compiled worker needs no module loader: one inherited from a TypeScript runner (tsx) would
    // run its hooks in every worker and slow it down severalfold.
    const execArgv = file.endsWith(".js") ? withoutLoaders(process.execArgv) : process.execArgv;
    return new TaskPool(new Piscina({ filename: file, minThreads: workers, maxThreads: workers, execArgv }), workers);
  }

  /** Runs every task; results in task order. `onDone` is called as each task finishes. */
  async map<R>(tasks: readonly Task[], onDone?: (done: number, total: number) => void): Promise<R[]> {
    const results: R[] = new Array(tasks.length);
    let done = 0;
    if (this.pool === null) {
      tasks.forEach((t, i) => {
        results[i] = unwrap(runTaskSafely(t)) as R;
        onDone?.(++done, tasks.length);
      });
      return results;
    }
    const pool = this.pool;
    await Promise.all(
      tasks.map(async (t, i) => {
        results[i] = unwrap((await pool.run(t)) as TaskOutcome) as R;
        onDone?.(++done, tasks.length);
      }),
    );
    return results;
  }

  async close(): Promise<void> {
    await this.pool?.destroy();
  }
}

/** Opens a pool, runs `body` with it and always closes it. */
export async function withPool<T>(options: PoolOptions, body: (pool: TaskPool) => Promise<T>): Promise<T> {
  const pool = await TaskPool.open(options);
  try {
    return await body(pool);
  } finally {
    await pool.close();
  }
}
