/**
 * `recalesce sweep CASE.json --vary path=values … --out DIR [--shard K/N] [--workers N]`: run a
 * case over a grid of values of its numeric fields; one row per point in DIR/sweep.csv.
 */
import type { Command } from "commander";
import { loadCase } from "../io/load-case.js";
import { runSweep } from "../io/sweep.js";
import { parseShard, parseVary, type Shard, type VarySpec } from "../io/sweep-grid.js";
import { SAFETY_NOTICE } from "../io/safety.js";
import { checked, workersOption } from "./option-parsers.js";
import { progressPrinter } from "./commands.js";

interface SweepOptions {
  vary: VarySpec[];
  out: string;
  shard?: Shard;
  workers?: number;
}

const collectVary = (text: string, previous: VarySpec[]): VarySpec[] => [...previous, checked(parseVary)(text)];

/** The printed report of a sweep (or merge): where the rows went and the range of the results. */
export function describeSweep(summary: Record<string, unknown>, rows: ReadonlyArray<readonly string[]>, out: string): string {
  const s = summary as { title: string; points: number; shard: Shard | null; vary: Array<{ path: string; values: number[] }>; columns: string[] };
  const lines = [`Sweep: ${s.title}`];
  lines.push(`  ${s.points} points over ${s.vary.map((v) => `${v.path} (${v.values.length})`).join(" × ")}${s.shard ? `; shard ${s.shard.index}/${s.shard.count}: ${rows.length} points` : ""}`);
  const meanColumn = s.columns.findIndex((c) => c.endsWith("_mean_C"));
  const means = rows.map((r) => Number(r[meanColumn - 1 - s.vary.length])).filter(Number.isFinite);
  if (means.length) lines.push(`  ${s.columns[meanColumn]}: ${Math.min(...means).toFixed(1)}–${Math.max(...means).toFixed(1)} °C`);
  lines.push(`  results in ${out}/ (sweep.csv, summary.json)`);
  lines.push(`  caution: ${SAFETY_NOTICE}`);
  return lines.join("\n") + "\n";
}

export function registerSweepCommand(program: Command): void {
  program
    .command("sweep")
    .description("run a case over a grid of values of its numeric fields; one row per point in sweep.csv")
    .argument("<case>", "case file (JSON)")
    .requiredOption("--vary <path=values>", "a numeric case field and its values: list 4,8,12 or range start:stop:step (repeat for a grid)", collectVary, [] as VarySpec[])
    .requiredOption("-o, --out <dir>", "result folder (replaced atomically)")
    .option("--shard <K/N>", "run only points with index ≡ K−1 (mod N); join shards with recalesce merge", checked(parseShard))
    .option("-j, --workers <n>", "worker threads (default: all cores)", workersOption)
    .action(async (file: string, opts: SweepOptions) => {
      const c = loadCase(file);
      const progress = progressPrinter("points");
      const outcome = await runSweep(file, c, { vary: opts.vary, shard: opts.shard ?? null }, opts.out, { workers: opts.workers, onProgress: progress.update });
      progress.done();
      process.stdout.write(describeSweep(outcome.summary, outcome.rows, opts.out));
    });
}
