/**
 * `recalesce calibrate CASE.json --measured LOG.csv --out DIR [--per-bank] [--regularisation λ]`:
 * fit the line's heat-transfer multiplier (and per-bank multipliers) to measured top-surface
 * temperatures; writes calibrated.json and report.json.
 */
import type { Command } from "commander";
import { loadCase } from "../io/load-case.js";
import { InputError } from "../io/errors.js";
import { calibrateCase, DEFAULT_REGULARISATION_K2 } from "../io/calibrate.js";
import { calibrationTable, writeCalibrationFolder } from "../io/calibrate-report.js";
import { numberOption, workersOption } from "./option-parsers.js";

interface CalibrateOptions {
  measured: string;
  out: string;
  perBank?: boolean;
  regularisation?: number;
  workers?: number;
}

export function registerCalibrateCommand(program: Command): void {
  program
    .command("calibrate")
    .description("fit the line's heat-transfer multiplier (and with --per-bank one per bank) to a pyrometer log; writes calibrated.json and report.json")
    .argument("<case>", "case file (JSON) with a run-out table (cooling.line)")
    .requiredOption("--measured <log>", "CSV of top-surface readings: position_m,T_C (strip) or segment,position_m,T_C (coil)")
    .requiredOption("-o, --out <dir>", "result folder (replaced atomically)")
    .option("--per-bank", "also fit one multiplier per bank, regularised toward 1")
    .option("--regularisation <lambda>", `weight pulling per-bank multipliers toward 1 [K² per (ln multiplier)²] (default ${DEFAULT_REGULARISATION_K2})`, numberOption("a weight ≥ 0 [K²]", (v) => v >= 0))
    .option("-j, --workers <n>", "worker threads (default: all cores)", workersOption)
    .action(async (file: string, opts: CalibrateOptions) => {
      if (opts.regularisation !== undefined && !opts.perBank) throw new InputError("--regularisation", "", "applies only with --per-bank (the line multiplier alone is not regularised)");
      const c = loadCase(file);
      const outcome = await calibrateCase(file, c, opts.measured, { perBank: opts.perBank === true, regularisation_K2: opts.regularisation ?? DEFAULT_REGULARISATION_K2 }, { workers: opts.workers });
      writeCalibrationFolder(outcome, opts.out);
      process.stdout.write(calibrationTable(outcome, opts.out));
    });
}
