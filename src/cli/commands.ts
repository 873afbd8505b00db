/**
 * The recalesce subcommands. Each prints a short readable report; files are written by the io layer.
 */
import { InvalidArgumentError, type Command } from "commander";
import { z } from "zod";
import { runCaseIsolated } from "./run-in-worker.js";
import { caseSchema } from "../io/case-schema.js";
import { SAFETY_NOTICE } from "../io/safety.js";
import { registerLimitsCommand } from "./limits-command.js";
import { registerSteelCommand } from "./steel-command.js";
import { registerCheckCommand } from "./check-command.js";
import { registerDesignCommand } from "./design-command.js";
import { registerCalibrateCommand } from "./calibrate-command.js";
import { registerSweepCommand } from "./sweep-command.js";
import { registerMergeCommand } from "./merge-command.js";

export function registerCommands(program: Command): void {
  program
    .command("run")
    .description("simulate one case file and write summary.json, history.csv and profile.csv to a folder")
    .argument("<case>", "case file (JSON)")
    .requiredOption("-o, --out <dir>", "result folder (replaced atomically on success)")
    .option("-q, --quiet", "print nothing on success")
    .option("-j, --workers <n>", "worker threads for coil segments (default: all cores)", parseWorkers)
    .option("--force", "run even when the up-front work estimate exceeds the stated limits")
    .option("--chart", "also write cooling.svg, a chart of the cooling path and the transformation")
    .action(async (file: string, opts: { out: string; quiet?: boolean; workers?: number; force?: boolean; chart?: boolean }) => {
      const progress = progressPrinter("segments");
      const { summary, warnings } = await runCaseIsolated(file, opts.out, { workers: opts.workers, force: opts.force, chart: opts.chart, onProgress: progress.update });
      progress.done();
      for (const w of warnings) process.stderr.write(`warning: ${w}\n`);
      if (!opts.quiet) process.stdout.write(describeRun(summary, opts.out));
    });

  registerSteelCommand(program);
  registerCheckCommand(program);
  registerLimitsCommand(program);
  registerDesignCommand(program);
  registerCalibrateCommand(program);
  registerSweepCommand(program);
  registerMergeCommand(program);

  program
    .command("schema")
    .description("print the JSON Schema of case files (for editor completion)")
    .action(() => {
      const schema = z.toJSONSchema(caseSchema, { io: "input", unrepresentable: "any" });
      process.stdout.write(JSON.stringify(schema, null, 2) + "\n");
    });
}

function parseWorkers(v: string): number {
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1 || n > 64) throw new InvalidArgumentError("expected a whole number of workers, 1–64");
  return n;
}

/**
 * A one-line progress counter on stderr, shown only on a terminal and only once the work has run
 * for more than a second (short runs stay quiet).
 */
export function progressPrinter(what: string): { update: (done: number, total: number) => void; done: () => void } {
  const start = Date.now();
  let shown = false;
  return {
    update(done, total) {
      if (!process.stderr.isTTY || Date.now() - start < 1000) return;
      shown = true;
      const width = 30;
      const filled = Math.round((width * done) / total);
      process.stderr.write(`\r  ${"#".repeat(filled)}${".".repeat(width - filled)} ${done}/${total} ${what}`);
    },
    done() {
      if (shown) process.stderr.write("\n");
    },
  };
}

function describeRun(summary: Record<string, unknown>, out: string): string {
  const s = summary as {
    title: string;
    end_time_s: number;
    final: { T_C: { top: number; centre: number; bottom: number; mean: number }; phases?: Record<string, number> };
    energy: { relative_error: number };
    numerics: { scheme: string; cells?: number; thickness_cells?: number; width_cells?: number; steps: number; sub_steps: number };
    section?: { width_mm: number };
    coiling?: { T_C: { top: number; mean: number } };
    pyrometers?: Array<{ position_m: number; T_C: number }>;
    coil?: { segments: number; head: { coiling_mean_C: number }; body: { coiling_mean_C: number }; tail: { coiling_mean_C: number }; coiling_mean_C: { spread_K: number } };
  };
  const t = s.final.T_C as { top: number; centre: number; bottom: number; mean: number; edge?: number; corner?: number };
  const lines = [
    `${s.title}`,
    `  after ${s.end_time_s.toFixed(2)} s: top ${t.top.toFixed(1)} °C, centre ${t.centre.toFixed(1)} °C, bottom ${t.bottom.toFixed(1)} °C${t.edge === undefined ? "" : `, edge ${t.edge.toFixed(1)} °C, corner ${t.corner!.toFixed(1)} °C`}, mean ${t.mean.toFixed(1)} °C`,
  ];
  if (s.final.phases) {
    lines.push("  phases (mass average): " + Object.entries(s.final.phases).map(([k, v]) => `${k} ${(v * 100).toFixed(1)} %`).join(", "));
  }
  const f = s.final as Record<string, { mean?: number | null } | undefined>;
  if (f.grain_um || f.tensile_MPa) {
    const v = (k: string, unit: string, d: number) => (f[k]?.mean === null || f[k]?.mean === undefined ? `${k.split("_")[0]} —` : `${k.split("_")[0]} ${f[k]!.mean!.toFixed(d)} ${unit}`);
    lines.push(`  product (mean through thickness): ${v("grain_um", "µm", 1)}, ${v("yield_MPa", "MPa", 0)}, ${v("tensile_MPa", "MPa", 0)}, ${v("hardness_HV", "HV", 0)}`);
  }
  const penalty = (summary.recalescence_penalty as Array<{ depth_mm: number; grain_coarsening_um: number | null; ferrite_half_raised_K: number | null }> | undefined) ?? [];
  const worst = penalty.filter((p) => p.grain_coarsening_um !== null).sort((a, b) => (b.grain_coarsening_um ?? 0) - (a.grain_coarsening_um ?? 0))[0];
  if (worst) {
    lines.push(
      `  recalescence penalty: up to +${worst.grain_coarsening_um!.toFixed(2)} µm ferrite at ${worst.depth_mm} mm (50 % ferrite ${worst.ferrite_half_raised_K!.toFixed(1)} K hotter than without latent heat)`,
    );
  }
  if (s.coiling) lines.push(`  coiling temperature: mean ${s.coiling.T_C.mean.toFixed(1)} °C, top surface ${s.coiling.T_C.top.toFixed(1)} °C`);
  if (s.pyrometers?.length) lines.push("  pyrometers (top surface): " + s.pyrometers.map((p) => `${p.position_m} m ${p.T_C.toFixed(1)} °C`).join(", "));
  if (s.coil) {
    lines.push(
      `  coil (${s.coil.segments} segments): head ${s.coil.head.coiling_mean_C.toFixed(1)} °C, body ${s.coil.body.coiling_mean_C.toFixed(1)} °C, tail ${s.coil.tail.coiling_mean_C.toFixed(1)} °C, spread ${s.coil.coiling_mean_C.spread_K.toFixed(1)} K (coil.csv)`,
    );
  }
  const grid = s.numerics.width_cells === undefined ? `${s.numerics.cells} cells` : `${s.numerics.thickness_cells} × ${s.numerics.width_cells} cells (thickness × half-width)`;
  lines.push(`  ${s.numerics.scheme}, ${grid}, ${s.numerics.steps} steps (${s.numerics.sub_steps} sub-steps); energy ledger closes to ${s.energy.relative_error.toExponential(1)}`);
  lines.push(`  results in ${out}/ (summary.json, history.csv, profile.csv)`);
  lines.push(`  caution: ${SAFETY_NOTICE}`);
  return lines.join("\n") + "\n";
}
