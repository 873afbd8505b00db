/**
 * `recalesce merge DIR1 DIR2 … --out DIR`: join the shards of a sweep into one result folder,
 * byte-identical to the sweep run in one piece.
 */
import type { Command } from "commander";
import { mergeSweeps } from "../io/sweep-merge.js";
import { describeSweep } from "./sweep-command.js";

export function registerMergeCommand(program: Command): void {
  program
    .command("merge")
    .description("join sweep shards (folders written by recalesce sweep --shard) into one sweep.csv")
    .argument("<folders...>", "result folders of the shards")
    .requiredOption("-o, --out <dir>", "result folder (replaced atomically)")
    .action((folders: string[], opts: { out: string }) => {
      const m = mergeSweeps(folders, opts.out);
      process.stdout.write(`Merged ${m.folders} folder(s).\n` + describeSweep(m.summary, m.rows, opts.out));
    });
}
