/**
 * `recalesce design CASE.json --coiling-C T --out DIR …`: choose the open headers (and with
 * --flows a common flow scale) for a target coiling temperature. Exit code 3 when the target cannot
 * be reached within the limits (the files are still written, with the nearest reachable result).
 */
import type { Command } from "commander";
import { loadCase } from "../io/load-case.js";
import { designCooling } from "../io/design.js";
import { designTable, writeDesignFolder } from "../io/design-report.js";
import type { DesignRequest, Strategy } from "../io/design-plan.js";
import { checked, numberOption, rangeOption, wholeOption, workersOption } from "./option-parsers.js";
import { progressPrinter } from "./commands.js";

/** Default flow trim range when --flows is given without one [× the case's flows]. */
export const DEFAULT_FLOW_RANGE: readonly [number, number] = [0.5, 1.5];

interface DesignOptions {
  coilingC: number;
  out: string;
  toleranceK: number;
  strategy: Strategy;
  maxCoolingRateKS?: number;
  intermediateC?: [number, number];
  holdS?: number;
  keepOff?: string[];
  maxSwitches?: number;
  flows?: true | [number, number];
  workers?: number;
}

function strategyOption(text: string): Strategy {
  if (text === "early" || text === "late" || text === "split") return text;
  throw new Error(`expected early, late or split, got "${text}"`);
}

function bankList(text: string): string[] {
  const names = text.split(",").map((s) => s.trim());
  if (names.some((n) => n === "")) throw new Error(`expected bank names separated by commas (e.g. B3,B7), got "${text}"`);
  return names;
}

/** The request the options describe. */
export function designRequest(o: DesignOptions): DesignRequest {
  return {
    coiling_C: o.coilingC,
    tolerance_K: o.toleranceK,
    strategy: o.strategy,
    maxCoolingRate_K_s: o.maxCoolingRateKS,
    intermediate_C: o.intermediateC,
    hold_s: o.holdS,
    keepOff: o.keepOff,
    maxSwitches: o.maxSwitches,
    flowRange: o.flows === undefined ? undefined : o.flows === true ? DEFAULT_FLOW_RANGE : o.flows,
  };
}

export function registerDesignCommand(program: Command): void {
  program
    .command("design")
    .description("choose the open headers (and optionally a flow scale) for a target coiling temperature; writes designed.json, summary.json (and patterns.csv for a coil)")
    .argument("<case>", "case file (JSON) with a run-out table (cooling.line)")
    .requiredOption("--coiling-C <T>", "target through-thickness mean coiling temperature [°C]", numberOption("a temperature [°C]"))
    .requiredOption("-o, --out <dir>", "result folder (replaced atomically)")
    .option("--tolerance-K <K>", "accepted deviation from the target [K]", numberOption("a tolerance > 0 [K]", (v) => v > 0), 10)
    .option("--strategy <name>", "early (headers from the front), late (from the back) or split", checked(strategyOption), "early" as Strategy)
    .option("--max-cooling-rate-K-s <R>", "largest mean cooling rate under water [K/s]", numberOption("a rate > 0 [K/s]", (v) => v > 0))
    .option("--intermediate-C <LO:HI>", "split: band for the mean temperature after the front group [°C]", rangeOption("°C"))
    .option("--hold-s <S>", "split: shortest air hold between front and back group [s]", numberOption("a time > 0 [s]", (v) => v > 0))
    .option("--keep-off <banks>", "banks that must stay off, e.g. B3,B7", checked(bankList))
    .option("--max-switches <N>", "coils: most headers changing between neighbouring segments", wholeOption(0, 10000, "headers"))
    .option("--flows [LO:HI]", "trim with a common flow scale in LO–HI × the case's flows (default 0.5:1.5)", rangeOption("× case flow", (v) => v > 0))
    .option("-j, --workers <n>", "worker threads (default: all cores)", workersOption)
    .action(async (file: string, opts: DesignOptions) => {
      const c = loadCase(file);
      const progress = progressPrinter("segments");
      const outcome = await designCooling(file, c, designRequest(opts), { workers: opts.workers, onProgress: progress.update });
      progress.done();
      writeDesignFolder(outcome, opts.out);
      process.stdout.write(designTable(outcome, opts.out));
      if (!outcome.reachable) {
        process.stderr.write(`recalesce: design: target ${opts.coilingC} °C ± ${opts.toleranceK} K not reached within the limits (see the table); files written to ${opts.out}\n`);
        process.exitCode = 3;
      }
    });
}
