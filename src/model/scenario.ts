/**
 * A cooling scenario in SI units, ready to simulate: what the case file says, resolved. The io
 * layer builds it from a validated case; tests and the design tools may build it directly.
 */
import type { FaceLaw } from "../numerics/face-law.js";
import type { PhaseEvolution, Scheme } from "../numerics/conduction1d.js";
import type { PropertyTables } from "../numerics/property-table.js";

/** One period of constant boundary laws. */
export interface Stage {
  /** Duration [s] */
  readonly duration_s: number;
  readonly top: FaceLaw;
  readonly bottom: FaceLaw;
  readonly label: string;
  /** Strip position at the stage start and end [m] (line runs only). */
  readonly position_m?: readonly [number, number];
}

/** What a material contributes to the solver. */
export interface MaterialModel {
  readonly tables: PropertyTables;
  /** Creates the phase-fraction model for a given node count; absent when nothing transforms. */
  readonly createEvolution?: (nodes: number) => PhaseEvolution;
  readonly latentHeat: boolean;
}

export interface Scenario {
  readonly title: string;
  /** Thickness [m] */
  readonly thickness_m: number;
  /** Initial (uniform) temperature [K] */
  readonly initial_K: number;
  readonly material: MaterialModel;
  readonly stages: readonly Stage[];
  readonly numerics: {
    readonly scheme: Scheme;
    readonly cells: number;
    /** Requested time step [s] */
    readonly dt_s: number;
    readonly tolerance_K: number;
    readonly maxIterations: number;
  };
  readonly output: {
    /** Output depths [m] from the top face */
    readonly depths_m: readonly number[];
    /** Depth labels as written in the case (mm), used in column names */
    readonly depthLabels: readonly string[];
    /** Output interval [s] */
    readonly interval_s: number;
  };
}

export const KELVIN = 273.15;
