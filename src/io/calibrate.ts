/**
 * `recalesce calibrate`: fit the line's heat-transfer multiplier (and with --per-bank one
 * multiplier per bank) to a measured pyrometer log.
 *
 * The model's pyrometer reads the top-surface node, as a plant pyrometer sees the top surface; the
 * case's pyrometers are replaced by the log's positions for the fit. Parameters are the natural
 * logarithms of the multipliers (so they stay positive, and a factor of 1.1 up or down weighs the
 * same). Least squares on predicted − measured temperature [K] by Levenberg–Marquardt with a
 * forward-difference Jacobian (levenberg-marquardt.ts); per-bank logs are pulled toward 0
 * (multiplier 1) with weight λ [K²], so banks the readings cannot tell apart stay at 1 and share
 * the line multiplier. λ = 1000 K² makes a bank 10 % off (Δln ≈ 0.1) cost as much as a 3.2 K
 * residual: smaller than pyrometer scatter, so data that do separate the banks win over the prior.
 */
import { availableParallelism } from "node:os";
import type { Case } from "./case-schema.js";
import { InputError } from "./errors.js";
import { coilSegments, type CoilSegment } from "./resolve-case.js";
import { readMeasuredLog, type MeasuredReading } from "./measured-log.js";
import { fitLeastSquares, type FitResult } from "./levenberg-marquardt.js";
import { withPool, type PoolOptions } from "./task-pool.js";
import type { ReadingsTask } from "./readings-task.js";

/** Default regularisation toward multiplier 1 for per-bank fits [K²]. */
export const DEFAULT_REGULARISATION_K2 = 1000;

/** Multipliers are written with 4 decimals (a 1e-4 change moves a reading by well under 0.1 K). */
const MULTIPLIER_DECIMALS = 4;

export interface CalibrateRequest {
  readonly perBank: boolean;
  /** Tikhonov weight λ on the per-bank log-multipliers [K²] */
  readonly regularisation_K2: number;
}

export interface FittedParameter {
  /** `htc_multiplier` or `bank B3` */
  readonly name: string;
  /** Case path of the value. */
  readonly path: string;
  readonly initial: number;
  readonly fitted: number;
  /** 1σ of the fitted multiplier (delta method on the log) [-] */
  readonly sigma: number;
  readonly regularised: boolean;
}

export interface CalibrationOutcome {
  readonly file: string;
  readonly logFile: string;
  readonly request: CalibrateRequest;
  readonly readings: readonly MeasuredReading[];
  /** Predicted top-surface temperature at each reading before and after the fit [°C] */
  readonly before_C: number[];
  readonly after_C: number[];
  readonly parameters: FittedParameter[];
  readonly fit: FitResult;
  readonly rmsBefore_K: number;
  readonly rmsAfter_K: number;
}

interface Unknown {
  name: string;
  path: string;
  bank: number | null;
  initial: number;
}

/** The multipliers to fit: the line's, and with perBank every bank that is on and has zones. */
function unknowns(c: Case, perBank: boolean): Unknown[] {
  const line = (c.cooling as Extract<Case["cooling"], { line: unknown }>).line;
  const list: Unknown[] = [{ name: "htc_multiplier", path: "cooling.line.htc_multiplier", bank: null, initial: line.htc_multiplier }];
  if (perBank) {
    line.banks.forEach((b, i) => {
      if (b.on && line.zones.some((z) => z.bank === b.name)) list.push({ name: `bank ${b.name}`, path: `cooling.line.banks[${i}].multiplier`, bank: i, initial: b.multiplier });
    });
  }
  return list;
}

/** The case with the given multipliers and pyrometers at the logged positions. */
function caseWith(c: Case, list: readonly Unknown[], multipliers: readonly number[], positions: readonly number[]): Case {
  const out = structuredClone(c);
  const line = (out.cooling as Extract<Case["cooling"], { line: unknown }>).line;
  list.forEach((u, j) => {
    if (u.bank === null) line.htc_multiplier = multipliers[j];
    else line.banks[u.bank].multiplier = multipliers[j];
  });
  line.pyrometers_m = [...positions];
  return out;
}

const rms = (v: readonly number[]) => Math.sqrt(v.reduce((s, x) => s + x * x, 0) / v.length);

export async function calibrateCase(file: string, c: Case, logFile: string, request: CalibrateRequest, options: PoolOptions = {}): Promise<CalibrationOutcome> {
  if (!("line" in c.cooling)) throw new InputError(file, "cooling", "calibration needs a run-out table (cooling.line); this case gives stages");
  const coil = c.cooling.coil;
  const readings = readMeasuredLog(logFile, { length_m: c.cooling.line.length_m, segments: coil ? coil.segments : null });
  const positions = [...new Set(readings.map((r) => r.position_m))].sort((a, b) => a - b);
  const allSegments = coil ? coilSegments(file, coil) : null;
  const used: Array<CoilSegment | null> = allSegments ? [...new Set(readings.map((r) => r.segment!))].sort((a, b) => a - b).map((s) => allSegments[s - 1]) : [null];
  const list = unknowns(c, request.perBank);
  const slot = readings.map((r) => ({ run: allSegments ? used.findIndex((s) => s!.index === r.segment! - 1) : 0, pyrometer: positions.indexOf(r.position_m) }));

  // A batch holds one run per segment for each of 1 + p parameter vectors (the Jacobian's).
  const workers = Math.min(options.workers ?? availableParallelism(), used.length * (1 + list.length));
  return withPool({ ...options, workers }, async (pool) => {
    /** Predicted readings [°C] for each multiplier vector. */
    const predict = async (multiplierSets: readonly number[][]): Promise<number[][]> => {
      const tasks: ReadingsTask[] = [];
      for (const m of multiplierSets) {
        const kase = caseWith(c, list, m, positions);
        for (const segment of used) tasks.push({ kind: "readings", file, caseData: kase, segment });
      }
      const runs = await pool.map<number[]>(tasks);
      return multiplierSets.map((_, k) => slot.map((s) => runs[k * used.length + s.run][s.pyrometer]));
    };
    const residuals = async (thetas: readonly number[][]) => {
      const predicted = await predict(thetas.map((t) => t.map(Math.exp)));
      return predicted.map((p) => p.map((v, i) => v - readings[i].T_C));
    };
    const theta0 = list.map((u) => Math.log(u.initial));
    const fit = await fitLeastSquares(residuals, theta0, {
      weights: list.map((u) => (u.bank === null ? 0 : request.regularisation_K2)),
      centres: list.map(() => 0),
      step: 0.01,
      maxIterations: 25,
      stepTolerance: 1e-4,
    });
    if (fit.unidentified.includes(0)) {
      throw new InputError(logFile, "position_m", "no reading depends on the line's heat transfer (every position lies before the first water); log positions after water");
    }
    const fitted = fit.theta.map((t) => Number(Math.exp(t).toFixed(MULTIPLIER_DECIMALS)));
    const [before_C, after_C] = await predict([list.map((u) => u.initial), fitted]);
    const parameters = list.map((u, j) => ({
      name: u.name,
      path: u.path,
      initial: u.initial,
      fitted: fitted[j],
      sigma: Number((fitted[j] * fit.sigma[j]).toPrecision(3)),
      regularised: u.bank !== null,
    }));
    return {
      file,
      logFile,
      request,
      readings,
      before_C,
      after_C,
      parameters,
      fit,
      rmsBefore_K: rms(before_C.map((v, i) => v - readings[i].T_C)),
      rmsAfter_K: rms(after_C.map((v, i) => v - readings[i].T_C)),
    };
  });
}
