/**
 * `recalesce steel CASE.json [--csv FILE] [--from-C T --to-C T --step-K K]`: prints the case's
 * steel — critical temperatures as used, grain, kinetics — and its isothermal transformation
 * diagram; with --csv also writes the diagram as CSV (atomically). Bad input exits 2 through the
 * InputError the report raises; nothing is written unless the whole report was computed.
 */
import type { Command } from "commander";
import { loadCase } from "../io/load-case.js";
import { formatSteelReport, steelReport, steelReportCsv } from "../io/steel-report.js";
import { writeFileAtomic } from "../io/atomic-file.js";

interface SteelOptions {
  csv?: string;
  fromC?: string;
  toC?: string;
  stepK?: string;
}

export function registerSteelCommand(program: Command): void {
  program
    .command("steel")
    .description("print a case's critical temperatures and its isothermal transformation (TTT) times; --csv writes the diagram")
    .argument("<case>", "case file (JSON) with material.composition_wt_pct")
    .option("--csv <file>", "also write the diagram as CSV (replaced atomically)")
    .option("--from-C <T>", "highest hold temperature [°C] (default: the first step below the highest of Ae3, Ae1, Bs)")
    .option("--to-C <T>", "lowest hold temperature [°C] (default: the first step at or above Ms)")
    .option("--step-K <K>", "temperature step [K] (default 25)")
    .action((file: string, opts: SteelOptions) => {
      const report = steelReport(file, loadCase(file), { fromC: opts.fromC, toC: opts.toC, stepK: opts.stepK });
      if (opts.csv !== undefined) writeFileAtomic(opts.csv, steelReportCsv(report));
      process.stdout.write(formatSteelReport(report));
      if (opts.csv !== undefined) process.stdout.write(`  diagram written to ${opts.csv}\n`);
    });
}
