/**
 * Writes a calibration's result folder (atomically) and renders its terminal table:
 *   calibrated.json  the input case with the fitted multipliers (its own pyrometers kept);
 *   report.json      fitted values with 1σ, residuals before and after per reading, RMS, caution.
 */
import { basename } from "node:path";
import type { CalibrationOutcome } from "./calibrate.js";
import { writeJsonFolder } from "./write-folder.js";
import { DECIMALS, round, significant } from "./format.js";
import { SAFETY_NOTICE } from "./safety.js";
import { rawLine, readRawCase, relocateCase } from "./relocate-case.js";

export function calibrationReport(o: CalibrationOutcome, title: string): Record<string, unknown> {
  const coil = o.readings.some((r) => r.segment !== null);
  return {
    title,
    caution: SAFETY_NOTICE,
    case: o.file,
    log: o.logFile,
    reading: "top-surface temperature (the model's pyrometer is the top surface node)",
    parameters: o.parameters.map((p) => ({ name: p.name, path: p.path, initial: p.initial, fitted: p.fitted, sigma_1: p.sigma, regularised_toward_1: p.regularised })),
    fit: {
      method: "Levenberg–Marquardt on ln(multiplier), forward-difference Jacobian",
      regularisation_K2: o.request.perBank ? o.request.regularisation_K2 : null,
      iterations: o.fit.iterations,
      runs: o.fit.evaluations,
      degrees_of_freedom: significant(o.fit.degreesOfFreedom, 4),
      residual_sigma_K: round(o.fit.residualSigma, DECIMALS.K),
    },
    rms_before_K: round(o.rmsBefore_K, DECIMALS.K),
    rms_after_K: round(o.rmsAfter_K, DECIMALS.K),
    readings: o.readings.map((r, i) => ({
      row: r.row,
      ...(coil ? { segment: r.segment } : {}),
      position_m: r.position_m,
      measured_C: r.T_C,
      before_C: round(o.before_C[i], DECIMALS.T_C),
      residual_before_K: round(o.before_C[i] - r.T_C, DECIMALS.K),
      after_C: round(o.after_C[i], DECIMALS.T_C),
      residual_after_K: round(o.after_C[i] - r.T_C, DECIMALS.K),
    })),
  };
}

/** The input case with the fitted multipliers, its paths rewritten for `outDir`. */
export function calibratedCase(o: CalibrationOutcome, outDir: string): Record<string, unknown> {
  const raw = readRawCase(o.file);
  relocateCase(raw, o.file, outDir);
  const line = rawLine<{ htc_multiplier?: number; banks?: Array<{ multiplier?: number }> }>(raw);
  for (const p of o.parameters) {
    const bank = /^cooling\.line\.banks\[(\d+)\]\.multiplier$/.exec(p.path);
    if (bank) line.banks![Number(bank[1])].multiplier = p.fitted;
    else line.htc_multiplier = p.fitted;
  }
  raw.title = `${String(raw.title)} (calibrated to ${basename(o.logFile)})`;
  return raw;
}

export function writeCalibrationFolder(o: CalibrationOutcome, outDir: string): Record<string, unknown> {
  const calibrated = calibratedCase(o, outDir);
  const report = calibrationReport(o, String(calibrated.title));
  writeJsonFolder(outDir, { "calibrated.json": calibrated, "report.json": report });
  return report;
}

const pad = (s: string, n: number) => (s.length >= n ? s : " ".repeat(n - s.length) + s);
const signed = (v: number) => `${v > 0 ? "+" : ""}${v.toFixed(1)}`;

export function calibrationTable(o: CalibrationOutcome, outDir: string): string {
  const coil = o.readings.some((r) => r.segment !== null);
  const lines: string[] = [];
  lines.push(`Calibration of ${o.file} to ${o.logFile} (${o.readings.length} top-surface readings${o.request.perBank ? `, per bank, λ = ${o.request.regularisation_K2} K²` : ""})`);
  lines.push(`${"  parameter".padEnd(22)}${pad("initial", 9)}${pad("fitted", 9)}${pad("± 1σ", 9)}`);
  for (const p of o.parameters) lines.push(`${`  ${p.name}`.padEnd(22)}${pad(p.initial.toFixed(3), 9)}${pad(p.fitted.toFixed(4), 9)}${pad(p.sigma.toPrecision(2), 9)}`);
  lines.push(`${pad("row", 6)}${coil ? pad("seg", 5) : ""}${pad("pos m", 8)}${pad("meas °C", 9)}${pad("before", 9)}${pad("resid K", 9)}${pad("after", 9)}${pad("resid K", 9)}`);
  o.readings.forEach((r, i) => {
    lines.push(
      `${pad(String(r.row), 6)}${coil ? pad(String(r.segment), 5) : ""}${pad(r.position_m.toFixed(1), 8)}${pad(r.T_C.toFixed(1), 9)}${pad(o.before_C[i].toFixed(1), 9)}${pad(signed(o.before_C[i] - r.T_C), 9)}${pad(o.after_C[i].toFixed(1), 9)}${pad(signed(o.after_C[i] - r.T_C), 9)}`,
    );
  });
  lines.push(`  RMS residual: before ${o.rmsBefore_K.toFixed(2)} K, after ${o.rmsAfter_K.toFixed(2)} K (${o.fit.iterations} iterations, ${o.fit.evaluations} runs)`);
  lines.push(`  results in ${outDir}/ (calibrated.json, report.json)`);
  lines.push(`  caution: ${SAFETY_NOTICE}`);
  return lines.join("\n") + "\n";
}
