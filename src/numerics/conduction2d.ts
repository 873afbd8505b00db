/**
 * Two-dimensional transient conduction over the cross-section of a strip or plate (thickness ×
 * width, per unit length along the rolling direction), with temperature- and phase-dependent
 * properties and latent heat in enthalpy form, for edge effects and thick sections.
 *
 * Grid (node-based finite volumes, Incropera & DeWitt §5.10 extended to 2-D — section number from
 * memory): y through the
 * thickness H, nodes y_j = jΔy (j = 0 … N_y, j = 0 the top face); x across the modelled width X,
 * nodes x_i = iΔx (i = 0 … N_x). X = W for the full width (x = 0 and x = W are the two edges), or
 * X = W/2 with `symmetric` (x = 0 is the mid-width plane, insulated by symmetry; x = W/2 the
 * edge). Control volumes: w_x,i = Δx (Δx/2 at i = 0, N_x), w_y,j likewise, V_ij = w_x,i·w_y,j —
 * half volumes on faces, quarter volumes at corners — so face and corner nodes ARE surface and
 * corner temperatures. Field layout: one Float64Array, index p = i·(N_y+1) + j (thickness axis
 * last: a through-thickness line is a contiguous subarray), viewed as ndarray [N_x+1, N_y+1].
 *
 * Node balance per unit length, E the volumetric mixture enthalpy Σ_p X_p E_p(T) [J/m³]:
 *
 *   V_ij dE_ij/dt = F^x_ij + F^y_ij
 *   F^x_ij = G^x_{i+½,j}(T_{i+1,j} − T_ij) − G^x_{i−½,j}(T_ij − T_{i−1,j}) − w_y,j q_edge(T_ij)|_{edge nodes}
 *   F^y_ij = G^y_{i,j+½}(T_{i,j+1} − T_ij) − G^y_{i,j−½}(T_ij − T_{i,j−1}) − w_x,i q_top/bottom(T_ij)|_{face nodes}
 *   G^x_{i+½,j} = ½(k_ij + k_{i+1,j}) w_y,j / Δx,   G^y_{i,j+½} = ½(k_ij + k_{i,j+1}) w_x,i / Δy
 *
 * with q the heat flux LEAVING through a face [W/m²] (face-law.ts). Second order in space.
 * Time schemes:
 *
 * - `explicit` (forward Euler): V(E^{n+1} − E^n)/Δt = F^x(T^n) + F^y(T^n). Stable when every
 *   old-temperature coefficient is ≥ 0 (Incropera Table 5.2 method): Δt ≤ V_ij C_ij / (ΣG + Σ_faces
 *   A q'), i.e. for Δx = Δy: Fo ≤ ¼ inside, Fo(1 + Bi_Δ/2) ≤ ¼ on a face, Fo(1 + Bi_Δ) ≤ ¼ at a
 *   corner (Fo = αΔt/Δx², Bi_Δ = q'Δx/k), radiation included through q' = h + 4εσT³. A requested
 *   step above the limit is split into equal sub-steps at `explicitSafety` × the limit; the sub-
 *   steps are counted. First order in time.
 * - `adi`, alternating-direction implicit in enthalpy form, each stage a set of tridiagonal
 *   (Thomas) solves along lines — x-lines (strided) then y-lines (contiguous):
 *     stage A: V(E* − E^n)/(τΔt) = F^x(T*) + F^y(T^n)
 *     stage B: V(E^{n+1} − E^n)/Δt = F^x(T*) + (1 − θ) F^y(T^n) + θ F^y(T^{n+1})
 *   `peaceman-rachford` (τ = θ = ½; Peaceman & Rachford, J. SIAM 3 (1955) 28, citation from
 *   memory): stage B is the classical second half-step written from E^n; second order in time for
 *   constant properties (midpoint rule in x, trapezoidal in y) and unconditionally stable for
 *   constant coefficients, but stiff modes are not damped: with λ = αΔt/Δx² ≫ 1 the amplification
 *   is ≈ ±1 (sign flipping for modes stiff in one direction only), so steps with λ of a few are
 *   pre-asymptotic. `douglas-rachford` (τ = θ = 1; Douglas & Rachford, Trans. AMS 82 (1956) 421,
 *   citation from memory): first order in time, unconditionally stable, amplification in [0, 1]
 *   (no sign flips). Both are conservative (every stage is a flux balance).
 *
 * Nonlinearity (Picard/Newton on the enthalpy, as in conduction1d.ts): within each stage E, k, q
 * and the phase fractions are evaluated at an iterate T°, linearised E ≈ E(T°) + C(T°)(T − T°),
 * q ≈ q(T°) + q'(T°)(T − T°), the lines solved, and the stage repeated until max|T − T°| < tol.
 * With phase evolution C is replaced by the secant slope of E (mixture-properties.ts). The
 * fractions advance over τΔt in stage A (trial only) and over Δt in stage B (accepted), so they
 * are committed once per step. The committed temperature is corrected so that its true enthalpy
 * equals the one the solve balanced (T += (E_lin − E)/C, ≤ 3 passes). A stage that does not
 * converge makes the whole step retry as two halves (to 1/256), then it is counted as unconverged.
 *
 * Fixed-temperature faces: their nodes are prescribed (a corner shared by two fixed faces takes the
 * mean of the two temperatures); a flux law meeting a fixed face at a corner is not applied there.
 * The heat through a fixed face is the residual of its nodes' balances (split equally at a
 * corner of two fixed faces).
 *
 * Energy ledger per unit length of the modelled domain (half the section when symmetric):
 * Σ V ΔE = −Σ_faces Q_face, each flux face's Q the time integral of the flux the balances used
 * (old flux where explicit, the linearised flux q(T°) + q'(T°)(T − T°) at the solved temperature
 * where implicit; it differs from q(T) by ½q''δ² with δ < tol). With the enthalpy correction the
 * ledger closes to round-off whenever the stages converge, properties constant or not.
 * `stats.iterations` counts Picard passes of every stage (two stages per ADI step).
 *
 * The solver allocates only in its constructor; `step` is allocation-free.
 */
import ndarray from "ndarray";
import { solveTridiagonal } from "./tridiagonal.js";
import { ConvectionRadiation, type FaceLaw } from "./face-law.js";
import type { PropertyTables } from "./property-table.js";
import type { PhaseEvolution, SolverStatistics } from "./conduction1d.js";
import { evaluateMixture, secantHeatCapacity, SOLVER_DEFAULTS } from "./mixture-properties.js";

export type CrossSectionScheme = "explicit" | "adi";
export type AdiSplitting = "peaceman-rachford" | "douglas-rachford";

/** Face laws of the cross-section. */
export interface CrossSectionFaces {
  /** Face y = 0. */
  readonly top: FaceLaw;
  /** Face y = H. */
  readonly bottom: FaceLaw;
  /** Face x = X: the edge (with `symmetric`, the only edge). */
  readonly edge: FaceLaw;
  /** Face x = 0 of a full-width section (defaults to `edge`); must be absent with `symmetric`. */
  readonly otherEdge?: FaceLaw;
}

/** Heat that has left through each face since the start, per unit length [J/m]. */
export interface FaceHeat {
  top: number;
  bottom: number;
  edge: number;
  /** Always 0 with `symmetric` (the mid-width plane is insulated). */
  otherEdge: number;
}

export interface CrossSectionOptions {
  /** Thickness H [m] */
  readonly thickness_m: number;
  /** Full width W of the piece [m] (the modelled width is W/2 with `symmetric`). */
  readonly width_m: number;
  /** Model half the width, x = 0 being the insulated mid-width plane (default false). */
  readonly symmetric?: boolean;
  /** Cells through the thickness N_y (N_y + 1 nodes), at least 2. */
  readonly thicknessCells: number;
  /** Cells across the modelled width N_x (N_x + 1 nodes), at least 2. */
  readonly widthCells: number;
  readonly scheme: CrossSectionScheme;
  /** ADI splitting (default peaceman-rachford). */
  readonly splitting?: AdiSplitting;
  readonly tables: PropertyTables;
  /** Initial temperature [K]: uniform, per node (index i·(N_y+1) + j), or a function of x, y [m]. */
  readonly initial_K: number | Float64Array | ((x_m: number, y_m: number) => number);
  /** Phase evolution over all (N_x+1)(N_y+1) nodes; absent for a material that does not transform. */
  readonly evolution?: PhaseEvolution;
  /** When false, the enthalpy and heat capacity of phase 0 serve every phase: no latent heat. */
  readonly latentHeat?: boolean;
  /** Picard stop: largest temperature change between iterates [K] (default 1e-3). */
  readonly tolerance_K?: number;
  /** Iteration cap per stage (default 60). */
  readonly maxIterations?: number;
  /** Fraction of the explicit stability limit used for sub-steps (default 0.9; above 1 only to show instability). */
  readonly explicitSafety?: number;
}

const TOP = 0;
const BOTTOM = 1;
const EDGE = 2;
const OTHER = 3;

/** Stage of a step, selecting the linear solve the Picard loop performs. */
const EXPLICIT = 0;
const STAGE_X = 1;
const STAGE_Y = 2;

const SCRATCH = new Float64Array(2);

export class CrossSectionSolver {
  /** Cells across the modelled width N_x and through the thickness N_y. */
  readonly widthCells: number;
  readonly thicknessCells: number;
  /** Nodes (N_x + 1)(N_y + 1). */
  readonly nodes: number;
  /** Stride of x in the field (N_y + 1). */
  readonly stride: number;
  readonly thickness_m: number;
  readonly width_m: number;
  /** Modelled width X [m] (W, or W/2 with symmetric). */
  readonly domainWidth_m: number;
  readonly symmetric: boolean;
  readonly dx_m: number;
  readonly dy_m: number;
  readonly scheme: CrossSectionScheme;
  readonly splitting: AdiSplitting;
  /** Control-volume widths along x (N_x + 1) and y (N_y + 1) [m]. */
  readonly widthX: Float64Array;
  readonly widthY: Float64Array;
  /** Control-volume area per node [m²] (per unit length). */
  readonly volume: Float64Array;
  /** Committed temperatures [K], index i·(N_y+1) + j. */
  readonly T: Float64Array;
  /** ndarray view [N_x+1, N_y+1] of T for setup and output (not for inner loops). */
  readonly field: ndarray.NdArray<Float64Array>;
  /** Committed phase fractions [phase][node] (the evolution's, or a single phase of ones). */
  readonly fractions: Float64Array[];
  readonly evolution: PhaseEvolution | undefined;
  /** Simulated time [s]. */
  time_s = 0;
  /** Heat out through each face since the start [J/m]. */
  readonly heatOut_J_m: FaceHeat = { top: 0, bottom: 0, edge: 0, otherEdge: 0 };
  /** Enthalpy per unit length at the start [J/m]. */
  readonly initialEnthalpy_J_m: number;
  readonly stats: SolverStatistics = { steps: 0, substeps: 0, iterations: 0, maxIterationsInStep: 0, halvings: 0, unconvergedSteps: 0 };

  private readonly tables: PropertyTables;
  private readonly latentHeat: boolean;
  private readonly tolerance_K: number;
  private readonly maxIterations: number;
  private readonly explicitSafety: number;
  /** Stage A length as a fraction of the step (τ) and implicit weight of y in stage B (θ). */
  private readonly tau: number;
  private readonly theta: number;
  private readonly trialFractions: Float64Array[];
  /** x-conductance per unit k for row j: w_y,j/Δx; y-conductance per unit k for column i: w_x,i/Δy. */
  private readonly gx: Float64Array;
  private readonly gy: Float64Array;
  // Field workspace (allocated once).
  private readonly Tprev: Float64Array;
  private readonly Tstar: Float64Array;
  private readonly Tnew: Float64Array;
  private readonly E: Float64Array;
  private readonly C: Float64Array;
  private readonly k: Float64Array;
  private readonly Eold: Float64Array;
  private readonly Elin: Float64Array;
  private readonly Eiter: Float64Array;
  private readonly Titer: Float64Array;
  /** Net x- and y-conduction into each node at the committed state [W/m]. */
  private readonly condX: Float64Array;
  private readonly condY: Float64Array;
  /** F^y(T^n) including the top and bottom faces' old fluxes [W/m]. */
  private readonly oldY: Float64Array;
  /**
   * The part of a stage's balance its iteration does not change [W/m]: F^x(T^n) + F^y(T^n) for
   * forward Euler, F^x(T*) + (1 − θ) F^y(T^n) for ADI stage B (stage A uses oldY).
   */
  private readonly fixedPart: Float64Array;
  /** Prescribed temperature per node [K], NaN where free. */
  private readonly fixed: Float64Array;
  private anyFixed = false;
  // Line workspace (length max(N_x, N_y) + 1).
  private readonly a: Float64Array;
  private readonly b: Float64Array;
  private readonly c: Float64Array;
  private readonly d: Float64Array;
  private readonly x: Float64Array;
  private readonly lineScratch: Float64Array;
  // Per face: q at the committed state, q and q' at the iterate, linearised q at the solution [W/m²].
  private readonly qOld: Float64Array[];
  private readonly qIter: Float64Array[];
  private readonly dqIter: Float64Array[];
  private readonly qUsed: Float64Array[];
  /** Laws of the current step; null for the insulated mid-width plane. */
  private laws: (FaceLaw | null)[] = [null, null, null, null];
  private linearFaces = true;
  private lastDt = 0;

  constructor(o: CrossSectionOptions) {
    if (!(Number.isInteger(o.thicknessCells) && o.thicknessCells >= 2)) throw new RangeError("thicknessCells must be an integer ≥ 2");
    if (!(Number.isInteger(o.widthCells) && o.widthCells >= 2)) throw new RangeError("widthCells must be an integer ≥ 2");
    if (!(o.thickness_m > 0 && o.width_m > 0)) throw new RangeError("thickness and width must be positive");
    this.widthCells = o.widthCells;
    this.thicknessCells = o.thicknessCells;
    const nx1 = o.widthCells + 1;
    const ny1 = o.thicknessCells + 1;
    const n = nx1 * ny1;
    this.nodes = n;
    this.stride = ny1;
    this.thickness_m = o.thickness_m;
    this.width_m = o.width_m;
    this.symmetric = o.symmetric ?? false;
    this.domainWidth_m = this.symmetric ? o.width_m / 2 : o.width_m;
    this.dx_m = this.domainWidth_m / o.widthCells;
    this.dy_m = o.thickness_m / o.thicknessCells;
    this.scheme = o.scheme;
    this.splitting = o.splitting ?? "peaceman-rachford";
    const pr = this.splitting === "peaceman-rachford";
    this.tau = pr ? 0.5 : 1;
    this.theta = pr ? 0.5 : 1;
    this.tables = o.tables;
    this.evolution = o.evolution;
    this.latentHeat = o.latentHeat ?? true;
    this.tolerance_K = o.tolerance_K ?? SOLVER_DEFAULTS.tolerance_K;
    this.maxIterations = o.maxIterations ?? SOLVER_DEFAULTS.maxIterations;
    this.explicitSafety = o.explicitSafety ?? SOLVER_DEFAULTS.explicitSafety;
    if (!(this.explicitSafety > 0)) throw new RangeError("explicitSafety must be positive");

    const field = () => new Float64Array(n);
    this.widthX = halfEnded(nx1, this.dx_m);
    this.widthY = halfEnded(ny1, this.dy_m);
    this.volume = field();
    this.gx = new Float64Array(ny1);
    this.gy = new Float64Array(nx1);
    for (let j = 0; j < ny1; j++) this.gx[j] = this.widthY[j] / this.dx_m;
    for (let i = 0; i < nx1; i++) {
      this.gy[i] = this.widthX[i] / this.dy_m;
      for (let j = 0; j < ny1; j++) this.volume[i * ny1 + j] = this.widthX[i] * this.widthY[j];
    }

    this.T = field();
    this.field = ndarray(this.T, [nx1, ny1]);
    const init = o.initial_K;
    if (typeof init === "number") this.T.fill(init);
    else if (init instanceof Float64Array) {
      if (init.length !== n) throw new RangeError(`initial_K has ${init.length} values for ${n} nodes`);
      this.T.set(init);
    } else {
      for (let i = 0; i < nx1; i++) for (let j = 0; j < ny1; j++) this.field.set(i, j, init(i * this.dx_m, j * this.dy_m));
    }
    if (o.evolution) {
      if (o.evolution.current.length !== o.tables.phases) throw new RangeError("phase count of evolution and tables differ");
      if (o.evolution.current[0].length !== n) throw new RangeError(`the phase evolution covers ${o.evolution.current[0].length} nodes, the section has ${n}`);
      this.fractions = o.evolution.current;
      this.trialFractions = o.evolution.trial;
    } else {
      if (o.tables.phases !== 1) throw new RangeError("a material without phase evolution needs one phase");
      const ones = field().fill(1);
      this.fractions = [ones];
      this.trialFractions = [ones];
    }
    [this.Tprev, this.Tstar, this.Tnew, this.E, this.C, this.k, this.Eold, this.Elin, this.Eiter, this.Titer] = Array.from({ length: 10 }, field);
    [this.condX, this.condY, this.oldY, this.fixedPart, this.fixed] = Array.from({ length: 5 }, field);
    this.Tprev.set(this.T);
    this.fixed.fill(NaN);
    const line = Math.max(nx1, ny1);
    this.a = new Float64Array(line);
    this.b = new Float64Array(line);
    this.c = new Float64Array(line);
    this.d = new Float64Array(line);
    this.x = new Float64Array(line);
    this.lineScratch = new Float64Array(line);
    const faceLength = [nx1, nx1, ny1, ny1];
    this.qOld = faceLength.map((m) => new Float64Array(m));
    this.qIter = faceLength.map((m) => new Float64Array(m));
    this.dqIter = faceLength.map((m) => new Float64Array(m));
    this.qUsed = faceLength.map((m) => new Float64Array(m));

    this.evaluate(this.T, this.fractions);
    this.commitState();
    this.initialEnthalpy_J_m = this.enthalpy_J_m();
  }

  /** Field index of node (i along x, j through the thickness). */
  index(i: number, j: number): number {
    return i * this.stride + j;
  }

  /** Enthalpy per unit length of the committed state [J/m]. */
  enthalpy_J_m(): number {
    let H = 0;
    for (let p = 0; p < this.nodes; p++) H += this.volume[p] * this.Eold[p];
    return H;
  }

  /** Total heat out through all faces since the start [J/m]. */
  heatOutTotal_J_m(): number {
    const h = this.heatOut_J_m;
    return h.top + h.bottom + h.edge + h.otherEdge;
  }

  /**
   * Relative closure error of the energy ledger |ΔH + Q_out| / scale, with scale the largest of
   * |ΔH|, Σ|Q_face| and 1e-6·|H_0| (as conduction1d.ts: an insulated piece is judged against its
   * enthalpy content rather than against zero).
   */
  ledgerError(): number {
    const dH = this.enthalpy_J_m() - this.initialEnthalpy_J_m;
    const h = this.heatOut_J_m;
    const absQ = Math.abs(h.top) + Math.abs(h.bottom) + Math.abs(h.edge) + Math.abs(h.otherEdge);
    const scale = Math.max(Math.abs(dH), absQ, 1e-6 * Math.abs(this.initialEnthalpy_J_m), 1e-300);
    return Math.abs(dH + this.heatOutTotal_J_m()) / scale;
  }

  /** Area-weighted mean temperature of the modelled domain [K]. */
  meanTemperature_K(): number {
    let s = 0;
    let v = 0;
    for (let p = 0; p < this.nodes; p++) {
      s += this.volume[p] * this.T[p];
      v += this.volume[p];
    }
    return s / v;
  }

  /**
   * Temperature at (x, y) [K] by bilinear interpolation between the four surrounding nodes; x [m]
   * from the x = 0 face (the mid-width plane when symmetric), y [m] depth from the top face;
   * points outside the domain are clamped onto it.
   */
  temperatureAt_K(x_m: number, y_m: number): number {
    const u = clamp(x_m / this.dx_m, 0, this.widthCells);
    const v = clamp(y_m / this.dy_m, 0, this.thicknessCells);
    const i = Math.min(Math.floor(u), this.widthCells - 1);
    const j = Math.min(Math.floor(v), this.thicknessCells - 1);
    const fu = u - i;
    const fv = v - j;
    const p = i * this.stride + j;
    const T = this.T;
    const s = this.stride;
    return (1 - fu) * ((1 - fv) * T[p] + fv * T[p + 1]) + fu * ((1 - fv) * T[p + s] + fv * T[p + s + 1]);
  }

  /** Node column nearest to x [m] (from the x = 0 face). */
  columnAt(x_m: number): number {
    return clamp(Math.round(x_m / this.dx_m), 0, this.widthCells);
  }

  /** Through-thickness temperatures of column i (j = 0 top … N_y bottom): a live subarray of T. */
  throughThickness(i: number): Float64Array {
    if (!(Number.isInteger(i) && i >= 0 && i <= this.widthCells)) throw new RangeError(`column ${i} outside 0 … ${this.widthCells}`);
    return this.T.subarray(i * this.stride, (i + 1) * this.stride);
  }

  /** Largest stable explicit step [s] at the committed state for these faces. */
  explicitLimit_s(faces: CrossSectionFaces): number {
    this.setFaces(faces);
    return this.stableStep_s();
  }

  /**
   * Advances the state by dt_s under the given face laws. The explicit scheme splits the step into
   * sub-steps within its stability limit. Returns the number of (sub-)steps taken.
   */
  step(dt_s: number, faces: CrossSectionFaces): number {
    this.setFaces(faces);
    if (this.scheme === "explicit") {
      const limit = this.stableStep_s() * this.explicitSafety;
      const m = Math.max(1, Math.ceil(dt_s / limit - 1e-12));
      const h = dt_s / m;
      for (let s = 0; s < m; s++) this.singleStep(h, 0);
      this.stats.substeps += m;
      this.stats.steps++;
      return m;
    }
    this.singleStep(dt_s, 0);
    this.stats.substeps += 1;
    this.stats.steps++;
    return 1;
  }

  /** Stores the step's laws and marks the nodes of fixed-temperature faces. */
  private setFaces(faces: CrossSectionFaces): void {
    if (this.symmetric && faces.otherEdge !== undefined) throw new RangeError("a symmetric section has no other edge: x = 0 is the insulated mid-width plane");
    const laws = this.laws;
    laws[TOP] = faces.top;
    laws[BOTTOM] = faces.bottom;
    laws[EDGE] = faces.edge;
    laws[OTHER] = this.symmetric ? null : (faces.otherEdge ?? faces.edge);
    let linear = true;
    for (let f = 0; f < 4; f++) if (!isLinearFace(laws[f])) linear = false;
    this.linearFaces = linear;
    // Clear the perimeter, then mark fixed faces (a corner of two fixed faces takes their mean).
    const fixed = this.fixed;
    const s = this.stride;
    const nx = this.widthCells;
    const ny = this.thicknessCells;
    for (let i = 0; i <= nx; i++) {
      fixed[i * s] = NaN;
      fixed[i * s + ny] = NaN;
    }
    for (let j = 0; j <= ny; j++) {
      fixed[j] = NaN;
      fixed[nx * s + j] = NaN;
    }
    this.anyFixed = false;
    for (let f = 0; f < 4; f++) {
      const law = laws[f];
      if (law === null || law.kind !== "fixed") continue;
      this.anyFixed = true;
      const m = this.faceLength(f);
      for (let e = 0; e < m; e++) {
        const p = this.faceNode(f, e);
        fixed[p] = fixed[p] === fixed[p] ? 0.5 * (fixed[p] + law.T_K) : law.T_K;
      }
    }
  }

  private faceLength(f: number): number {
    return f === TOP || f === BOTTOM ? this.widthCells + 1 : this.thicknessCells + 1;
  }

  /** Field index of the e-th node of face f. */
  private faceNode(f: number, e: number): number {
    const s = this.stride;
    if (f === TOP) return e * s;
    if (f === BOTTOM) return e * s + this.thicknessCells;
    if (f === EDGE) return this.widthCells * s + e;
    return e;
  }

  /** Face area per unit length of the e-th node of face f [m]. */
  private faceArea(f: number, e: number): number {
    return f === TOP || f === BOTTOM ? this.widthX[e] : this.widthY[e];
  }

  /** Stability limit of forward Euler at the committed state (every old coefficient ≥ 0). */
  private stableStep_s(): number {
    const nx = this.widthCells;
    const ny = this.thicknessCells;
    const s = this.stride;
    const k = this.k;
    const g = this.fixedPart; // free until the step starts
    g.fill(0);
    for (let i = 0; i <= nx; i++) {
      const gy = this.gy[i];
      for (let j = 0; j <= ny; j++) {
        const p = i * s + j;
        let sum = 0;
        if (i > 0) sum += 0.5 * (k[p - s] + k[p]) * this.gx[j];
        if (i < nx) sum += 0.5 * (k[p] + k[p + s]) * this.gx[j];
        if (j > 0) sum += 0.5 * (k[p - 1] + k[p]) * gy;
        if (j < ny) sum += 0.5 * (k[p] + k[p + 1]) * gy;
        g[p] = sum;
      }
    }
    for (let f = 0; f < 4; f++) {
      const law = this.laws[f];
      if (law === null || law.kind !== "flux") continue;
      const m = this.faceLength(f);
      for (let e = 0; e < m; e++) {
        const p = this.faceNode(f, e);
        law.evaluate(this.T[p], SCRATCH);
        if (SCRATCH[1] > 0) g[p] += this.faceArea(f, e) * SCRATCH[1];
      }
    }
    let limit = Infinity;
    for (let p = 0; p < this.nodes; p++) {
      if (this.fixed[p] === this.fixed[p]) continue;
      const dt = (this.volume[p] * this.C[p]) / g[p];
      if (dt < limit) limit = dt;
    }
    return limit;
  }

  private singleStep(dt: number, depth: number): void {
    const n = this.nodes;
    const T = this.T;
    const Tstar = this.Tstar;
    const explicit = this.scheme === "explicit";
    this.oldFaceFluxes();
    if (explicit) {
      const fixedPart = this.fixedPart;
      for (let p = 0; p < n; p++) fixedPart[p] = this.oldY[p] + this.condX[p];
      this.subtractFaceFlux(fixedPart, this.qOld, EDGE);
      this.subtractFaceFlux(fixedPart, this.qOld, OTHER);
    }

    const ratio = this.lastDt > 0 ? dt / this.lastDt : 0;
    let converged: boolean;
    if (explicit) {
      for (let p = 0; p < n; p++) Tstar[p] = T[p] + (T[p] - this.Tprev[p]) * ratio;
      converged = this.iterate(EXPLICIT, dt);
    } else {
      const tauRatio = this.tau * ratio;
      for (let p = 0; p < n; p++) Tstar[p] = T[p] + (T[p] - this.Tprev[p]) * tauRatio;
      converged = this.iterate(STAGE_X, this.tau * dt);
      if (converged) {
        this.stageBFixedPart();
        for (let p = 0; p < n; p++) Tstar[p] = T[p] + (T[p] - this.Tprev[p]) * ratio;
        converged = this.iterate(STAGE_Y, dt);
      }
    }
    if (!converged) {
      // Nothing is committed yet: retry as two halves, down to 1/256 of the step.
      if (depth < 8) {
        this.stats.halvings++;
        this.singleStep(dt / 2, depth + 1);
        this.singleStep(dt / 2, depth + 1);
        return;
      }
      this.stats.unconvergedSteps++;
    }
    this.commitStep(dt);
  }

  /**
   * q at the committed temperatures for every flux face (0 at fixed nodes), and oldY := F^y(T^n):
   * committed y-conduction minus the top and bottom faces' old heat.
   */
  private oldFaceFluxes(): void {
    const T = this.T;
    for (let f = 0; f < 4; f++) {
      const q = this.qOld[f];
      const law = this.laws[f];
      if (law === null || law.kind !== "flux") {
        q.fill(0);
        continue;
      }
      const m = q.length;
      for (let e = 0; e < m; e++) {
        const p = this.faceNode(f, e);
        if (this.fixed[p] === this.fixed[p]) q[e] = 0;
        else {
          law.evaluate(T[p], SCRATCH);
          q[e] = SCRATCH[0];
        }
      }
    }
    this.oldY.set(this.condY);
    this.subtractFaceFlux(this.oldY, this.qOld, TOP);
    this.subtractFaceFlux(this.oldY, this.qOld, BOTTOM);
  }

  /** F[p] −= area · q[e] over the nodes of face f. */
  private subtractFaceFlux(F: Float64Array, q: Float64Array[], f: number): void {
    const qf = q[f];
    const m = qf.length;
    for (let e = 0; e < m; e++) F[this.faceNode(f, e)] -= this.faceArea(f, e) * qf[e];
  }

  /**
   * Picard/Newton loop of one stage: evaluates the mixture at the iterate, solves the stage's lines
   * (or the diagonal explicit update), and repeats until the largest change is below the tolerance.
   * `dtBalance` is the stage length in its enthalpy balance, also the kinetics interval.
   */
  private iterate(stage: number, dtBalance: number): boolean {
    const n = this.nodes;
    const evolution = this.evolution;
    // One pass is exact when nothing depends on temperature: constant tables, no phase evolution,
    // and (for an implicit stage) faces whose flux is linear in T; forward Euler uses old fluxes only.
    const linear = this.tables.constant && !evolution && (stage === EXPLICIT || this.linearFaces);
    let iterations = 0;
    let change = Infinity;
    while (iterations < this.maxIterations) {
      iterations++;
      if (evolution) evolution.advance(this.T, this.Tstar, dtBalance);
      this.evaluate(this.Tstar, this.trialFractions);
      if (evolution) {
        if (iterations > 1) secantHeatCapacity(n, this.E, this.Tstar, this.Eiter, this.Titer, this.C);
        this.Eiter.set(this.E);
        this.Titer.set(this.Tstar);
      }
      if (stage === STAGE_X) change = this.solveLines(true, dtBalance, 1, this.oldY);
      else if (stage === STAGE_Y) change = this.solveLines(false, dtBalance, this.theta, this.fixedPart);
      else change = this.updateExplicit(dtBalance);
      if (linear || change < this.tolerance_K) break;
    }
    this.stats.iterations += iterations;
    if (iterations > this.stats.maxIterationsInStep) this.stats.maxIterationsInStep = iterations;
    return linear || change < this.tolerance_K;
  }

  /** Forward Euler: T = T° + (E^n + Δt F(T^n)/V − E(T°))/C per node; returns the largest change. */
  private updateExplicit(dt: number): number {
    const n = this.nodes;
    const { Tstar, Tnew, E, C, Eold, Elin, volume, fixedPart, fixed } = this;
    let change = 0;
    for (let p = 0; p < n; p++) {
      const Tf = fixed[p];
      const t = Tf === Tf ? Tf : Tstar[p] + (Eold[p] + (dt * fixedPart[p]) / volume[p] - E[p]) / C[p];
      const diff = takeIterate(p, t, E, C, Elin, Tnew, Tstar);
      if (diff > change) change = diff;
    }
    return change;
  }

  /**
   * One Picard pass of an implicit stage: for every line along x (stage A) or y (stage B), with w
   * the implicit weight, G∓ the conductances to the neighbours along the line and A the area of a
   * face at a line end, the rows
   *   (VC/Δτ + w(G⁻ + G⁺) + wAq') T_m − wG⁻T_{m−1} − wG⁺T_{m+1}
   *     = VC T°/Δτ + V(E^n − E(T°))/Δτ + fixedPart − wA(q(T°) − q'T°)
   * solved by the Thomas algorithm. Returns the largest change of the iterate.
   */
  private solveLines(alongX: boolean, dtStage: number, weight: number, fixedPart: Float64Array): number {
    const s = this.stride;
    const lines = alongX ? this.thicknessCells + 1 : this.widthCells + 1;
    const last = alongX ? this.widthCells : this.thicknessCells;
    const lineStep = alongX ? 1 : s; // offset between the first nodes of successive lines
    const nodeStep = alongX ? s : 1; // offset between neighbours along a line
    const conductance = alongX ? this.gx : this.gy; // per unit k, per line
    const areas = alongX ? this.widthY : this.widthX; // end-face area per unit length, per line
    const startFace = alongX ? OTHER : TOP;
    const endFace = alongX ? EDGE : BOTTOM;
    const startLaw = this.laws[startFace];
    const endLaw = this.laws[endFace];
    const inv = 1 / dtStage;
    const { a, b, c, d, x, Tstar, Tnew, E, C, k, Eold, Elin, volume, fixed, qIter, dqIter, qUsed } = this;
    let change = 0;
    for (let line = 0; line < lines; line++) {
      const base = line * lineStep;
      const g = weight * 0.5 * conductance[line];
      for (let m = 0; m <= last; m++) {
        const p = base + m * nodeStep;
        const Tf = fixed[p];
        if (Tf === Tf) {
          a[m] = 0;
          b[m] = 1;
          c[m] = 0;
          d[m] = Tf;
          continue;
        }
        const V = volume[p];
        const cap = V * C[p] * inv;
        const gPrev = m > 0 ? (k[p - nodeStep] + k[p]) * g : 0;
        const gNext = m < last ? (k[p] + k[p + nodeStep]) * g : 0;
        a[m] = -gPrev;
        c[m] = -gNext;
        b[m] = cap + gPrev + gNext;
        d[m] = cap * Tstar[p] + V * (Eold[p] - E[p]) * inv + fixedPart[p];
      }
      const pEnd = base + last * nodeStep;
      const area = areas[line];
      linearisedFace(startLaw, base, Tstar, fixed, area, weight, 0, b, d, qIter[startFace], dqIter[startFace], line);
      linearisedFace(endLaw, pEnd, Tstar, fixed, area, weight, last, b, d, qIter[endFace], dqIter[endFace], line);
      solveTridiagonal(last + 1, a, b, c, d, x, this.lineScratch);
      recordFaceFlux(startLaw, base, Tstar, x[0], fixed, qIter[startFace], dqIter[startFace], qUsed[startFace], line);
      recordFaceFlux(endLaw, pEnd, Tstar, x[last], fixed, qIter[endFace], dqIter[endFace], qUsed[endFace], line);
      for (let m = 0; m <= last; m++) {
        const diff = takeIterate(base + m * nodeStep, x[m], E, C, Elin, Tnew, Tstar);
        if (diff > change) change = diff;
      }
    }
    return change;
  }

  /**
   * After stage A: fixedPart := F^x(T*) + (1 − θ) F^y(T^n), F^x(T*) the x-conduction with the
   * conductivities stage A balanced minus the edges' linearised heat.
   */
  private stageBFixedPart(): void {
    const fixedPart = this.fixedPart;
    conductionX(this.widthCells, this.thicknessCells, this.k, this.Tnew, this.gx, fixedPart);
    this.subtractFaceFlux(fixedPart, this.qUsed, EDGE);
    this.subtractFaceFlux(fixedPart, this.qUsed, OTHER);
    const explicitWeight = 1 - this.theta;
    for (let p = 0; p < this.nodes; p++) fixedPart[p] += explicitWeight * this.oldY[p];
  }

  /** Commits the solved step: fractions, enthalpy, ledger, conduction at the new state. */
  private commitStep(dt: number): void {
    const n = this.nodes;
    const explicit = this.scheme === "explicit";
    const theta = this.theta;
    const Tnew = this.Tnew;
    // Heat into fixed nodes by conduction as the balances used it [W/m] (before k is re-evaluated).
    const fixedIn = this.Eiter; // free now: the secant history restarts each stage
    if (this.anyFixed) {
      if (explicit) fixedIn.set(this.fixedPart);
      else {
        conductionY(this.widthCells, this.thicknessCells, this.k, Tnew, this.gy, fixedIn);
        for (let p = 0; p < n; p++) fixedIn[p] = this.fixedPart[p] + theta * fixedIn[p];
      }
    }
    this.Tprev.set(this.T);
    if (this.evolution) this.evolution.accept();
    this.evaluate(Tnew, this.fractions);
    if (this.evolution || !this.tables.constant) this.conserveEnthalpy(Tnew);

    const heat = this.heatOut_J_m;
    const used = explicit ? this.qOld : this.qUsed;
    heat.edge += dt * this.faceHeat(EDGE, used, 1, null, 0);
    heat.otherEdge += dt * this.faceHeat(OTHER, used, 1, null, 0);
    const yUsedWeight = explicit ? 0 : theta;
    heat.top += dt * this.faceHeat(TOP, this.qUsed, yUsedWeight, this.qOld, 1 - yUsedWeight);
    heat.bottom += dt * this.faceHeat(BOTTOM, this.qUsed, yUsedWeight, this.qOld, 1 - yUsedWeight);
    if (this.anyFixed) this.fixedFaceHeat(dt, fixedIn);

    this.T.set(Tnew);
    this.commitState();
    this.time_s += dt;
    this.lastDt = dt;
  }

  /** Σ_e area_e (w1 q1[f][e] + w2 q2[f][e]) over face f [W/m] (flux laws only; 0 at fixed nodes). */
  private faceHeat(f: number, q1: Float64Array[], w1: number, q2: Float64Array[] | null, w2: number): number {
    const law = this.laws[f];
    if (law === null || law.kind !== "flux") return 0;
    const a = q1[f];
    const bq = q2 === null ? a : q2[f];
    let sum = 0;
    for (let e = 0; e < a.length; e++) sum += this.faceArea(f, e) * (w1 * a[e] + w2 * bq[e]);
    return sum;
  }

  /**
   * Heat out through fixed faces: per fixed node, what conduction brought in over the step minus
   * its enthalpy rise, shared equally between the fixed faces that meet there.
   */
  private fixedFaceHeat(dt: number, fixedIn: Float64Array): void {
    const heat = this.heatOut_J_m;
    for (let f = 0; f < 4; f++) {
      const law = this.laws[f];
      if (law === null || law.kind !== "fixed") continue;
      const m = this.faceLength(f);
      let sum = 0;
      for (let e = 0; e < m; e++) {
        const p = this.faceNode(f, e);
        const residual = dt * fixedIn[p] - this.volume[p] * (this.E[p] - this.Eold[p]);
        sum += residual / this.fixedFacesAt(f, e);
      }
      if (f === TOP) heat.top += sum;
      else if (f === BOTTOM) heat.bottom += sum;
      else if (f === EDGE) heat.edge += sum;
      else heat.otherEdge += sum;
    }
  }

  /** Number of fixed faces meeting at the e-th node of fixed face f (2 at a corner of two). */
  private fixedFacesAt(f: number, e: number): number {
    const last = this.faceLength(f) - 1;
    if (e !== 0 && e !== last) return 1;
    let across: number;
    if (f === TOP || f === BOTTOM) across = e === 0 ? OTHER : EDGE;
    else across = e === 0 ? TOP : BOTTOM;
    const law = this.laws[across];
    return law !== null && law.kind === "fixed" ? 2 : 1;
  }

  /**
   * Enthalpy is the conserved variable: the committed temperature is moved (Newton per node,
   * T += (E_lin − E)/C, at most 3 passes, stopping below 1e-10 K) until its true enthalpy equals the
   * one the solve balanced. Fixed nodes keep their prescribed temperature.
   */
  private conserveEnthalpy(Tnew: Float64Array): void {
    const n = this.nodes;
    const { E, C, Elin, fixed } = this;
    for (let pass = 0; pass < 3; pass++) {
      let worst = 0;
      for (let p = 0; p < n; p++) {
        if (fixed[p] === fixed[p]) continue;
        const r = Math.abs(Elin[p] - E[p]) / C[p];
        if (r > worst) worst = r;
      }
      if (worst < 1e-10) return;
      for (let p = 0; p < n; p++) if (!(fixed[p] === fixed[p])) Tnew[p] += (Elin[p] - E[p]) / C[p];
      this.evaluate(Tnew, this.fractions);
    }
  }

  /** Stores E of the committed state and its net x- and y-conduction into each node. */
  private commitState(): void {
    this.Eold.set(this.E);
    conductionX(this.widthCells, this.thicknessCells, this.k, this.T, this.gx, this.condX);
    conductionY(this.widthCells, this.thicknessCells, this.k, this.T, this.gy, this.condY);
  }

  private evaluate(T_K: Float64Array, X: Float64Array[]): void {
    evaluateMixture(this.tables, this.latentHeat, this.nodes, T_K, X, this.E, this.C, this.k);
  }
}

/**
 * Takes the solved temperature t of node p as the new iterate: E_lin = E(T°) + C(T°)(t − T°) is
 * the enthalpy the solve balanced; returns |t − T°|.
 */
function takeIterate(p: number, t: number, E: Float64Array, C: Float64Array, Elin: Float64Array, Tnew: Float64Array, Tstar: Float64Array): number {
  const change = t - Tstar[p];
  Elin[p] = E[p] + C[p] * change;
  Tnew[p] = t;
  Tstar[p] = t;
  return change < 0 ? -change : change;
}

/** Control-volume widths of m nodes spaced h apart: h inside, h/2 at both ends. */
function halfEnded(m: number, h: number): Float64Array {
  const w = new Float64Array(m).fill(h);
  w[0] = h / 2;
  w[m - 1] = h / 2;
  return w;
}

function clamp(v: number, lo: number, hi: number): number {
  return v < lo ? lo : v > hi ? hi : v;
}

/** A face whose heat flux is linear in the surface temperature (the insulated plane is null). */
function isLinearFace(law: FaceLaw | null): boolean {
  return law === null || law.kind === "fixed" || (law instanceof ConvectionRadiation && law.emissivity === 0);
}

/**
 * Adds the implicit part of a flux face at line position `at` (field node p) to its row:
 * b += w·A·q'(T°), d −= w·A·(q(T°) − q'(T°)T°); stores q(T°), q'(T°) at slot e of the face.
 * Nothing for the insulated plane (null), a fixed-temperature face, or a fixed node.
 */
function linearisedFace(
  law: FaceLaw | null,
  p: number,
  Tstar: Float64Array,
  fixed: Float64Array,
  area: number,
  weight: number,
  at: number,
  b: Float64Array,
  d: Float64Array,
  q: Float64Array,
  dq: Float64Array,
  e: number,
): void {
  if (law === null || law.kind !== "flux" || fixed[p] === fixed[p]) return;
  const T0 = Tstar[p];
  law.evaluate(T0, SCRATCH);
  q[e] = SCRATCH[0];
  dq[e] = SCRATCH[1];
  b[at] += weight * area * SCRATCH[1];
  d[at] -= weight * area * (SCRATCH[0] - SCRATCH[1] * T0);
}

/** used[e] := q(T°) + q'(T°)(T − T°), the flux the solved row balanced (0 off flux faces). */
function recordFaceFlux(
  law: FaceLaw | null,
  p: number,
  Tstar: Float64Array,
  T_solved: number,
  fixed: Float64Array,
  q: Float64Array,
  dq: Float64Array,
  used: Float64Array,
  e: number,
): void {
  if (law === null || law.kind !== "flux" || fixed[p] === fixed[p]) {
    used[e] = 0;
    return;
  }
  used[e] = q[e] + dq[e] * (T_solved - Tstar[p]);
}

/** out := net x-conduction into each node, G^x = ½(k + k')·gx[j] [W/m]. */
function conductionX(nx: number, ny: number, k: Float64Array, T: Float64Array, gx: Float64Array, out: Float64Array): void {
  const s = ny + 1;
  out.fill(0);
  for (let i = 0; i < nx; i++) {
    const base = i * s;
    for (let j = 0; j <= ny; j++) {
      const p = base + j;
      const flow = 0.5 * (k[p] + k[p + s]) * gx[j] * (T[p + s] - T[p]);
      out[p] += flow;
      out[p + s] -= flow;
    }
  }
}

/** out := net y-conduction into each node, G^y = ½(k + k')·gy[i] [W/m]. */
function conductionY(nx: number, ny: number, k: Float64Array, T: Float64Array, gy: Float64Array, out: Float64Array): void {
  const s = ny + 1;
  out.fill(0);
  for (let i = 0; i <= nx; i++) {
    const base = i * s;
    const g = gy[i];
    for (let j = 0; j < ny; j++) {
      const p = base + j;
      const flow = 0.5 * (k[p] + k[p + 1]) * g * (T[p + 1] - T[p]);
      out[p] += flow;
      out[p + 1] -= flow;
    }
  }
}
