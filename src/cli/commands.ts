/**
 * The recalesce subcommands. Each prints a short readable report; files are written by the io layer.
 */
import type { Command } from "commander";
import { z } from "zod";
import { runCaseFile } from "../io/run-case.js";
import { caseSchema } from "../io/case-schema.js";
import { SAFETY_NOTICE } from "../io/safety.js";

export function registerCommands(program: Command): void {
  program
    .command("run")
    .description("simulate one case file and write summary.json, history.csv and profile.csv to a folder")
    .argument("<case>", "case file (JSON)")
    .requiredOption("-o, --out <dir>", "result folder (replaced atomically on success)")
    .option("-q, --quiet", "print nothing on success")
    .action((file: string, opts: { out: string; quiet?: boolean }) => {
      const { summary, warnings } = runCaseFile(file, opts.out);
      for (const w of warnings) process.stderr.write(`warning: ${w}\n`);
      if (!opts.quiet) process.stdout.write(describeRun(summary, opts.out));
    });

  program
    .command("schema")
    .description("print the JSON Schema of case files (for editor completion)")
    .action(() => {
      const schema = z.toJSONSchema(caseSchema, { io: "input", unrepresentable: "any" });
      process.stdout.write(JSON.stringify(schema, null, 2) + "\n");
    });
}

function describeRun(summary: Record<string, unknown>, out: string): string {
  const s = summary as {
    title: string;
    end_time_s: number;
    final: { T_C: { top: number; centre: number; bottom: number; mean: number }; phases?: Record<string, number> };
    energy: { relative_error: number };
    numerics: { scheme: string; cells: number; steps: number; sub_steps: number };
    coiling?: { T_C: { mean: number } };
  };
  const t = s.final.T_C;
  const lines = [
    `${s.title}`,
    `  after ${s.end_time_s} s: top ${t.top.toFixed(1)} °C, centre ${t.centre.toFixed(1)} °C, bottom ${t.bottom.toFixed(1)} °C, mean ${t.mean.toFixed(1)} °C`,
  ];
  if (s.final.phases) {
    lines.push("  phases (mass average): " + Object.entries(s.final.phases).map(([k, v]) => `${k} ${(v * 100).toFixed(1)} %`).join(", "));
  }
  lines.push(`  ${s.numerics.scheme}, ${s.numerics.cells} cells, ${s.numerics.steps} steps (${s.numerics.sub_steps} sub-steps); energy ledger closes to ${s.energy.relative_error.toExponential(1)}`);
  lines.push(`  results in ${out}/ (summary.json, history.csv, profile.csv)`);
  lines.push(`  caution: ${SAFETY_NOTICE}`);
  return lines.join("\n") + "\n";
}
