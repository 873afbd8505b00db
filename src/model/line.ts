/**
 * The run-out table as a line: water zones at positions, air everywhere else, pyrometers, and a
 * strip moving at a scheduled speed. A tracked strip point (at a given distance from the head of
 * the coil) turns into a sequence of stages, one per stretch of table between consecutive
 * breakpoints (zone ends, the end of each impingement region, pyrometers). Zone crossings are
 * therefore integrated exactly: a step never straddles a change of boundary condition, however
 * short the impingement region and however fast the strip.
 *
 * Top water under a laminar jet or curtain: an impingement region of `impingement_m` at the start
 * of the zone, then the wetted (parallel-flow) region to the zone end. Bottom water (and top
 * sprays): the spray curve over the whole zone. Water flux density per region is the header flow
 * spread over the strip width times that region's length. All water heat transfer, and the htc of
 * direct-form zones, is multiplied by the line multiplier times the bank multiplier.
 */
import { ConvectionRadiation, type FaceLaw } from "../numerics/face-law.js";
import { WaterBoilingFace, resolveWaterCurve, type WaterCurveParams, type WaterRegion } from "../physics/water-cooling.js";
import { AirCoolingFace } from "../physics/air-convection.js";
import type { Stage } from "./scenario.js";
import type { SpeedProfile } from "./speed.js";

/** A face given directly as a boundary condition (as in a stage). */
export interface DirectFace {
  readonly kind: "direct";
  readonly htc_W_m2K: number;
  readonly medium_K: number;
  readonly emissivity: number;
  readonly surroundings_K: number;
  readonly flux_W_m2: number;
  readonly fixed_K: number | null;
}

/** A face under water headers. */
export interface WaterFace {
  readonly kind: "water";
  readonly header: "laminar" | "curtain" | "spray";
  /** Flow per unit strip width [m³/(h·m)] = header flow / strip width. */
  readonly flowPerWidth_m3_hm: number;
  readonly on: boolean;
  /** Length of the impingement region for top laminar/curtain headers [m] */
  readonly impingement_m: number;
  readonly overrides: Partial<WaterCurveParams>;
}

export type ZoneFace = DirectFace | WaterFace;

export interface LineZone {
  readonly start_m: number;
  readonly end_m: number;
  readonly bank: string | null;
  readonly top: ZoneFace | null;
  readonly bottom: ZoneFace | null;
}

export interface LineSpec {
  readonly length_m: number;
  readonly water_K: number;
  readonly air_K: number;
  /** Strip width [m] (water flux density, natural-convection length) */
  readonly width_m: number;
  /** Emissivity of the strip in air zones [-] */
  readonly emissivity: number;
  readonly airConvection: "natural" | "moving-sheet" | "none";
  readonly htcMultiplier: number;
  readonly bankMultipliers: ReadonlyMap<string, number>;
  /** Banks switched off as a whole. */
  readonly banksOff: ReadonlySet<string>;
  readonly zones: readonly LineZone[];
  readonly pyrometers_m: readonly number[];
}

/** Default impingement-region length under a laminar jet or curtain [m] (from memory: ~0.05–0.15 m). */
export const DEFAULT_IMPINGEMENT_m = 0.1;

export interface TrackedPoint {
  readonly stages: Stage[];
  /** Time the point enters the table, from the head leaving the last stand [s]. */
  readonly entry_s: number;
  /** pyrometerAfterStage[k] lists pyrometer indices read at the END of stage k. */
  readonly pyrometerAfterStage: number[][];
  /** Whether each stage is under water (either face). */
  readonly stageWet: boolean[];
  /** Pyrometers at x = 0 (read before the first stage). */
  readonly pyrometersAtEntry: number[];
  /** Table position of the point at local time t (since entry) [m]. */
  positionAt(t_s: number): number;
  /** Time under water [s] and the whole time on the table [s]. */
  readonly waterTime_s: number;
  readonly tableTime_s: number;
}

function zoneMultiplier(line: LineSpec, zone: LineZone): number {
  return line.htcMultiplier * (zone.bank ? line.bankMultipliers.get(zone.bank) ?? 1 : 1);
}

function directLaw(f: DirectFace, multiplier: number): FaceLaw {
  if (f.fixed_K !== null) return { kind: "fixed", T_K: f.fixed_K };
  return new ConvectionRadiation(f.htc_W_m2K * multiplier, f.medium_K, f.emissivity, f.surroundings_K, f.flux_W_m2);
}

function waterLaw(line: LineSpec, f: WaterFace, region: WaterRegion, regionLength_m: number, multiplier: number): FaceLaw {
  const curve = resolveWaterCurve(region, f.overrides);
  const flux_L_m2s = (f.flowPerWidth_m3_hm * 1000) / 3600 / regionLength_m;
  return new WaterBoilingFace({ curve, waterFlux_L_m2s: flux_L_m2s, water_K: line.water_K, multiplier });
}

function airLaw(line: LineSpec, facing: "up" | "down", speed_m_s: number, length_m: number): FaceLaw {
  if (line.airConvection === "none") return new ConvectionRadiation(0, line.air_K, line.emissivity, line.air_K);
  return new AirCoolingFace({
    air_K: line.air_K,
    emissivity: line.emissivity,
    convection:
      line.airConvection === "natural"
        ? { kind: "natural", facing, width_m: line.width_m, length_m: Math.max(length_m, line.width_m) }
        : { kind: "moving-sheet", speed_m_s: Math.max(speed_m_s, 1e-3), length_m: Math.max(length_m, 1e-3) },
  });
}

function isWet(f: ZoneFace | null, line: LineSpec, zone: LineZone): boolean {
  if (!f) return false;
  if (zone.bank && line.banksOff.has(zone.bank)) return false;
  if (f.kind === "water") return f.on;
  return f.htc_W_m2K > 0 && f.emissivity === 0;
}

/**
 * The stages seen by a strip point at distance `coilPosition_m` from the head, on this line with
 * this speed profile.
 */
export function trackPoint(line: LineSpec, profile: SpeedProfile, coilPosition_m: number): TrackedPoint {
  const L = line.length_m;
  const cuts = new Set<number>([0, L]);
  for (const z of line.zones) {
    cuts.add(z.start_m);
    cuts.add(z.end_m);
    if (z.top && z.top.kind === "water" && z.top.header !== "spray") cuts.add(Math.min(z.end_m, z.start_m + z.top.impingement_m));
  }
  for (const p of line.pyrometers_m) cuts.add(p);
  const xs = [...cuts].filter((x) => x >= 0 && x <= L).sort((a, b) => a - b);
  const entry = profile.timeAt(coilPosition_m);
  const timeAt = (x: number) => profile.timeAt(coilPosition_m + x) - entry;
  const stages: Stage[] = [];
  const pyrometerAfterStage: number[][] = [];
  const pyrometersAtEntry: number[] = [];
  line.pyrometers_m.forEach((p, i) => {
    if (p === 0) pyrometersAtEntry.push(i);
  });
  let waterTime = 0;
  const stageWet: boolean[] = [];
  for (let j = 0; j + 1 < xs.length; j++) {
    const xa = xs[j];
    const xb = xs[j + 1];
    const ta = timeAt(xa);
    const tb = timeAt(xb);
    const mid = 0.5 * (xa + xb);
    const speed = profile.speed(entry + 0.5 * (ta + tb));
    const zone = line.zones.find((z) => z.start_m <= mid && mid < z.end_m) ?? null;
    const face = (which: "top" | "bottom"): FaceLaw => {
      const f = zone ? zone[which] : null;
      const facing = which === "top" ? "up" : "down";
      if (!zone || !f) return airLaw(line, facing, speed, xb - xa);
      const off = zone.bank !== null && line.banksOff.has(zone.bank);
      const M = zoneMultiplier(line, zone);
      if (f.kind === "direct") return off ? airLaw(line, facing, speed, xb - xa) : directLaw(f, M);
      if (!f.on || off) return airLaw(line, facing, speed, xb - xa);
      if (which === "top" && f.header !== "spray") {
        const impEnd = Math.min(zone.end_m, zone.start_m + f.impingement_m);
        if (mid < impEnd) return waterLaw(line, f, "impingement", impEnd - zone.start_m, M);
        return waterLaw(line, f, "wetted", zone.end_m - impEnd, M);
      }
      return waterLaw(line, f, "spray", zone.end_m - zone.start_m, M);
    };
    const wet = zone !== null && (isWet(zone.top, line, zone) || isWet(zone.bottom, line, zone));
    if (wet) waterTime += tb - ta;
    stageWet.push(wet);
    stages.push({ duration_s: tb - ta, top: face("top"), bottom: face("bottom"), label: `${xa}–${xb} m`, position_m: [xa, xb] });
    pyrometerAfterStage.push(line.pyrometers_m.flatMap((p, i) => (p === xb ? [i] : [])));
  }
  return {
    stages,
    entry_s: entry,
    pyrometerAfterStage,
    stageWet,
    pyrometersAtEntry,
    positionAt: (t) => Math.min(L, Math.max(0, profile.travelled(entry + t) - coilPosition_m)),
    waterTime_s: waterTime,
    tableTime_s: timeAt(L),
  };
}
