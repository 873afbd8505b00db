/**
 * Regularised nonlinear least squares by Levenberg–Marquardt with a forward-difference Jacobian.
 *
 * Minimises  S(θ) = Σᵢ rᵢ(θ)² + Σⱼ λⱼ (θⱼ − cⱼ)²  (Tikhonov terms pull θⱼ toward cⱼ; λⱼ = 0 leaves
 * θⱼ free). Each iteration solves (A + μ·diag A) δ = −g with A = JᵀJ + diag λ, g = Jᵀr + λ(θ − c)
 * (Marquardt 1963 scaling), accepts δ when S falls (μ ÷ 3) and otherwise retries with μ × 4.
 * J is the forward difference (r(θ + h eⱼ) − r(θ)) / h.
 *
 * Uncertainty (1σ): with the residual variance s² = Σ rᵢ² / ν, where ν = n − tr H are the effective
 * degrees of freedom (H = J (JᵀJ + diag λ)⁻¹ Jᵀ, so ν = n − p without regularisation), the
 * covariance is s² (JᵀJ + diag λ)⁻¹ at the solution — the usual Gauss–Newton estimate, and with
 * regularisation the posterior covariance when λⱼ = s²/σⱼ² for a prior spread σⱼ.
 *
 * Residuals are evaluated in batches (all trial points of an iteration at once) so that the caller
 * can run them in parallel.
 */

/** Evaluates the residual vector at each of several parameter vectors. */
export type BatchResiduals = (thetas: readonly number[][]) => Promise<number[][]>;

export interface FitOptions {
  /** Tikhonov weight per parameter (0 = free) [residual unit² per parameter unit²] */
  readonly weights: readonly number[];
  /** What each regularised parameter is pulled toward. */
  readonly centres: readonly number[];
  /** Forward-difference step [parameter units] */
  readonly step: number;
  readonly maxIterations: number;
  /** Stop when every |δⱼ| is below this [parameter units] */
  readonly stepTolerance: number;
}

export interface FitResult {
  readonly theta: number[];
  /** Residuals at the start and at the solution. */
  readonly initialResiduals: number[];
  readonly residuals: number[];
  /** 1σ of each parameter. */
  readonly sigma: number[];
  readonly covariance: number[][];
  readonly degreesOfFreedom: number;
  /** √(Σ r² / ν) [residual unit] */
  readonly residualSigma: number;
  readonly iterations: number;
  readonly evaluations: number;
  /** Parameters the residuals do not depend on and nothing regularises (ill-posed). */
  readonly unidentified: number[];
}

/** Solves M x = b by Gaussian elimination with partial pivoting; null when M is singular. */
export function solveDense(M: readonly number[][], b: readonly number[]): number[] | null {
  const n = b.length;
  const a = M.map((row, i) => [...row, b[i]]);
  for (let k = 0; k < n; k++) {
    let piv = k;
    for (let i = k + 1; i < n; i++) if (Math.abs(a[i][k]) > Math.abs(a[piv][k])) piv = i;
    if (!(Math.abs(a[piv][k]) > 1e-300)) return null;
    [a[k], a[piv]] = [a[piv], a[k]];
    for (let i = k + 1; i < n; i++) {
      const f = a[i][k] / a[k][k];
      for (let j = k; j <= n; j++) a[i][j] -= f * a[k][j];
    }
  }
  const x = new Array<number>(n);
  for (let i = n - 1; i >= 0; i--) {
    let s = a[i][n];
    for (let j = i + 1; j < n; j++) s -= a[i][j] * x[j];
    x[i] = s / a[i][i];
  }
  return x;
}

function cost(r: readonly number[], theta: readonly number[], o: FitOptions): number {
  let s = 0;
  for (const v of r) s += v * v;
  theta.forEach((t, j) => (s += o.weights[j] * (t - o.centres[j]) ** 2));
  return s;
}

/** JᵀJ + diag λ and Jᵀr + λ(θ − c). */
function normalEquations(J: number[][], r: readonly number[], theta: readonly number[], o: FitOptions): { A: number[][]; g: number[] } {
  const p = theta.length;
  const A = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const g = new Array<number>(p).fill(0);
  for (let i = 0; i < r.length; i++) {
    for (let j = 0; j < p; j++) {
      g[j] += J[i][j] * r[i];
      for (let k = 0; k < p; k++) A[j][k] += J[i][j] * J[i][k];
    }
  }
  for (let j = 0; j < p; j++) {
    A[j][j] += o.weights[j];
    g[j] += o.weights[j] * (theta[j] - o.centres[j]);
  }
  return { A, g };
}

export async function fitLeastSquares(residuals: BatchResiduals, theta0: readonly number[], o: FitOptions): Promise<FitResult> {
  const p = theta0.length;
  let evaluations = 0;
  const evaluate = async (thetas: number[][]) => {
    evaluations += thetas.length;
    return residuals(thetas);
  };
  /** Residuals at θ and the forward-difference Jacobian there (one batch). */
  const linearise = async (theta: number[], r?: number[]): Promise<{ r: number[]; J: number[][] }> => {
    const points = Array.from({ length: p }, (_, j) => theta.map((t, k) => (k === j ? t + o.step : t)));
    const out = await evaluate(r ? points : [theta, ...points]);
    const r0 = r ?? out[0];
    const shifted = r ? out : out.slice(1);
    const J = r0.map((v, i) => shifted.map((rj) => (rj[i] - v) / o.step));
    return { r: r0, J };
  };
  let theta = [...theta0];
  let { r, J } = await linearise(theta);
  const initialResiduals = [...r];
  let S = cost(r, theta, o);
  let mu = 1e-3;
  let iterations = 0;
  let jacobianCurrent = true;
  for (; iterations < o.maxIterations; iterations++) {
    const { A, g } = normalEquations(J, r, theta, o);
    let accepted = false;
    let delta: number[] | null = null;
    for (let tries = 0; tries < 12 && !accepted; tries++) {
      const damped = A.map((row, j) => row.map((v, k) => (j === k ? v * (1 + mu) + 1e-12 : v)));
      delta = solveDense(damped, g.map((v) => -v));
      if (!delta) break;
      const trial = theta.map((t, j) => t + delta![j]);
      const [rt] = await evaluate([trial]);
      const St = cost(rt, trial, o);
      if (St < S) {
        theta = trial;
        r = rt;
        S = St;
        mu = Math.max(mu / 3, 1e-9);
        accepted = true;
        jacobianCurrent = false;
      } else mu *= 4;
    }
    if (!accepted || !delta) break;
    if (Math.max(...delta.map(Math.abs)) < o.stepTolerance) {
      iterations++;
      break;
    }
    ({ J } = await linearise(theta, r));
    jacobianCurrent = true;
  }
  // Covariance from the Jacobian at the solution.
  if (!jacobianCurrent) ({ J } = await linearise(theta, r));
  const { A } = normalEquations(J, r, theta, o);
  const unidentified = A.map((row, j) => j).filter((j) => o.weights[j] === 0 && J.every((row) => row[j] === 0));
  const inverse = Array.from({ length: p }, (_, k) => solveDense(A, Array.from({ length: p }, (_, j) => (j === k ? 1 : 0))));
  const covUnit = inverse.every((col) => col !== null) ? Array.from({ length: p }, (_, j) => Array.from({ length: p }, (_, k) => inverse[k]![j])) : null;
  // Effective degrees of freedom ν = n − tr[(JᵀJ + Λ)⁻¹ JᵀJ].
  let trace = 0;
  if (covUnit) {
    for (let j = 0; j < p; j++) {
      for (let k = 0; k < p; k++) {
        let jtj = 0;
        for (const row of J) jtj += row[k] * row[j];
        trace += covUnit[j][k] * jtj;
      }
    }
  }
  const n = r.length;
  const dof = Math.max(1, n - trace);
  const rss = r.reduce((s, v) => s + v * v, 0);
  const s2 = rss / dof;
  const covariance = covUnit ? covUnit.map((row) => row.map((v) => v * s2)) : Array.from({ length: p }, () => new Array<number>(p).fill(Infinity));
  return {
    theta,
    initialResiduals,
    residuals: r,
    sigma: covariance.map((row, j) => Math.sqrt(row[j])),
    covariance,
    degreesOfFreedom: dof,
    residualSigma: Math.sqrt(s2),
    iterations,
    evaluations,
    unidentified,
  };
}
