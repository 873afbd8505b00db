/**
 * `recalesce steel CASE.json [--csv FILE] [--from-C T --to-C T --step-K K] [--cct [RATES]]
 * [--cct-csv FILE]`: prints the case's steel — critical temperatures as used, grain, kinetics —
 * and its isothermal transformation diagram; with --csv also writes the diagram as CSV
 * (atomically). --cct adds the continuous-cooling table at constant rates (comma-separated K/s;
 * without a value the default list) under the isothermal one, and --cct-csv writes it as CSV
 * (atomically; it implies --cct with the default list when --cct is not given). Bad input exits 2
 * through the InputError the report raises; nothing is written unless the whole report was
 * computed.
 */
import type { Command } from "commander";
import { loadCase } from "../io/load-case.js";
import { cctCsv, formatSteelReport, steelReport, steelReportCsv } from "../io/steel-report.js";
import { writeFileAtomic } from "../io/atomic-file.js";
import { DEFAULT_CCT_RATES_K_s } from "../model/cct-diagram.js";

interface SteelOptions {
  csv?: string;
  fromC?: string;
  toC?: string;
  stepK?: string;
  cct?: string | true;
  cctCsv?: string;
}

export function registerSteelCommand(program: Command): void {
  program
    .command("steel")
    .description("print a case's critical temperatures and its isothermal transformation (TTT) times; --csv writes the diagram; --cct adds a continuous-cooling table")
    .argument("<case>", "case file (JSON) with material.composition_wt_pct")
    .option("--csv <file>", "also write the diagram as CSV (replaced atomically)")
    .option("--from-C <T>", "highest hold temperature [°C] (default: the first step below the highest of Ae3, Ae1, Bs)")
    .option("--to-C <T>", "lowest hold temperature [°C] (default: the first step at or above Ms)")
    .option("--step-K <K>", "temperature step [K] (default 25)")
    .option("--cct [rates]", `also print the continuous-cooling table at these constant cooling rates, comma-separated [K/s] (default ${DEFAULT_CCT_RATES_K_s.join(",")})`)
    .option("--cct-csv <file>", "also write the continuous-cooling table as CSV (replaced atomically; implies --cct)")
    .action((file: string, opts: SteelOptions) => {
      const cct = opts.cct ?? (opts.cctCsv !== undefined ? true : undefined);
      const report = steelReport(file, loadCase(file), { fromC: opts.fromC, toC: opts.toC, stepK: opts.stepK, cct });
      if (opts.csv !== undefined) writeFileAtomic(opts.csv, steelReportCsv(report));
      if (opts.cctCsv !== undefined) writeFileAtomic(opts.cctCsv, cctCsv(report));
      process.stdout.write(formatSteelReport(report));
      if (opts.csv !== undefined) process.stdout.write(`  diagram written to ${opts.csv}\n`);
      if (opts.cctCsv !== undefined) process.stdout.write(`  continuous-cooling table written to ${opts.cctCsv}\n`);
    });
}
