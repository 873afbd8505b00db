/**
 * Converts a validated case (units in key names) into an SI Scenario the model runs. All unit
 * conversions happen here, once.
 */
import type { Case, FaceInput } from "./case-schema.js";
import { ConvectionRadiation, type FaceLaw } from "../numerics/face-law.js";
import { buildPropertyTables, evaluateProperty } from "../numerics/property-table.js";
import { KELVIN, type MaterialModel, type Scenario, type Stage } from "../model/scenario.js";
import type { Scheme } from "../numerics/conduction1d.js";
import { InputError } from "./errors.js";
import { resolveSteel, type SteelSetup } from "../model/steel.js";
import { DEFAULT_IMPINGEMENT_m, trackPoint, type LineSpec, type TrackedPoint, type ZoneFace } from "../model/line.js";
import { SpeedProfile, constantSpeed, type SpeedSchedule } from "../model/speed.js";
import type { WaterCurveParams } from "../physics/water-cooling.js";
import { applyZonePattern, type LineLike } from "./header-pattern.js";
import { readTextFile } from "./load-case.js";
import { parse as parseCsv } from "csv-parse/sync";
import { dirname, resolve as resolvePath } from "node:path";

/**
 * Steel set-up (property tables, kinetics set-up) is immutable and costs 10–20 ms to build, so the
 * segments of a coil and the points of a design search share it: cached by material and entry
 * temperature (which selects the density of a density table and the below-Ae3 warning).
 */
const steelCache = new Map<string, SteelSetup>();
export function cachedSteel(material: Case["material"], initial_C: number): SteelSetup {
  const key = JSON.stringify([material, initial_C]);
  let s = steelCache.get(key);
  if (!s) {
    s = resolveSteel(material, initial_C);
    if (steelCache.size >= 16) steelCache.delete(steelCache.keys().next().value as string);
    steelCache.set(key, s);
  }
  return s;
}

/** Face input → boundary law. */
export function faceLaw(f: FaceInput): FaceLaw {
  if (f.surface_C !== undefined) return { kind: "fixed", T_K: f.surface_C + KELVIN };
  if (f.insulated) return new ConvectionRadiation(0, 0, 0, 0, 0);
  if (f.flux_W_m2 !== undefined) return new ConvectionRadiation(0, 0, 0, 0, f.flux_W_m2);
  const h = f.htc_W_m2K ?? 0;
  const medium = (f.medium_C ?? f.surroundings_C ?? 0) + KELVIN;
  const surroundings = (f.surroundings_C ?? f.medium_C ?? 0) + KELVIN;
  return new ConvectionRadiation(h, medium, f.emissivity ?? 0, surroundings);
}

/** Formats a depth as written in the case (shortest round-trip form, e.g. 2.5). */
export function depthLabel(d_mm: number): string {
  return String(d_mm);
}

export interface ResolvedCase {
  readonly scenario: Scenario;
  /** Steel description when the case has a composition. */
  readonly steel?: SteelSetup;
  /** The run-out table and the tracked point, for line cases. */
  readonly line?: { readonly spec: LineSpec; readonly profile: SpeedProfile; readonly point: TrackedPoint; readonly coilPosition_m: number };
}

type LineInput = Extract<Case["cooling"], { line: unknown }>["line"];
type CoilInput = NonNullable<Extract<Case["cooling"], { line: unknown }>["coil"]>;

function zoneFace(f: NonNullable<LineInput["zones"][number]["top"]>, stripWidth_m: number): ZoneFace {
  if ("water" in f && f.water) {
    const w = f.water;
    const zoneCurve = w.curve ?? {};
    const overrides: Partial<WaterCurveParams> = {
      rewetting_K: zoneCurve.rewetting_C === undefined ? undefined : zoneCurve.rewetting_C + KELVIN,
      criticalHeatFlux_K: zoneCurve.critical_heat_flux_C === undefined ? undefined : zoneCurve.critical_heat_flux_C + KELVIN,
      criticalHeatFlux_W_m2: zoneCurve.critical_heat_flux_W_m2,
      filmBoilingHtc_W_m2K: zoneCurve.film_boiling_htc_W_m2K,
      singlePhaseHtc_W_m2K: zoneCurve.single_phase_htc_W_m2K,
      nucleateOnset_K: zoneCurve.nucleate_onset_C === undefined ? undefined : zoneCurve.nucleate_onset_C + KELVIN,
      waterFluxExponent: zoneCurve.flux_exponent,
      referenceWaterFlux_L_m2s: zoneCurve.reference_flux_L_m2s,
    };
    // flux_L_m2s is the zone-average flux density; flow_m3_h is per header over the strip width.
    return {
      kind: "water",
      header: w.header,
      flowPerWidth_m3_hm: w.flow_m3_h !== undefined ? w.flow_m3_h / stripWidth_m : Number.NaN,
      on: w.on,
      impingement_m: w.impingement_m ?? DEFAULT_IMPINGEMENT_m,
      overrides,
      ...(w.flux_L_m2s !== undefined ? { zoneFlux_L_m2s: w.flux_L_m2s } : {}),
    } as ZoneFace;
  }
  const d = f as FaceInput;
  const law = faceLaw(d);
  if (law.kind === "fixed") return { kind: "direct", htc_W_m2K: 0, medium_K: 0, emissivity: 0, surroundings_K: 0, flux_W_m2: 0, fixed_K: law.T_K };
  const c = law as ConvectionRadiation;
  return { kind: "direct", htc_W_m2K: c.htc_W_m2K, medium_K: c.medium_K, emissivity: c.emissivity, surroundings_K: c.surroundings_K, flux_W_m2: c.extraFlux_W_m2, fixed_K: null };
}

/** The case's line in SI units. */
export function lineSpec(l: LineInput): LineSpec {
  const width = l.strip_width_mm / 1000;
  const zones = l.zones
    .map((z) => {
      const fixFlux = (f: ZoneFace | null): ZoneFace | null => {
        if (!f || f.kind !== "water") return f;
        const zf = (f as ZoneFace & { zoneFlux_L_m2s?: number }).zoneFlux_L_m2s;
        if (zf === undefined) return f;
        // W̄ over the zone ⇒ flow per width = W̄·zone length·3.6 m³/(h·m).
        return { ...f, flowPerWidth_m3_hm: (zf * (z.end_m - z.start_m) * 3600) / 1000 };
      };
      return {
        start_m: z.start_m,
        end_m: z.end_m,
        bank: z.bank ?? null,
        top: fixFlux(z.top ? zoneFace(z.top, width) : null),
        bottom: fixFlux(z.bottom ? zoneFace(z.bottom, width) : null),
      };
    })
    .sort((a, b) => a.start_m - b.start_m);
  return {
    length_m: l.length_m,
    water_K: l.water_C + KELVIN,
    air_K: l.air_C + KELVIN,
    width_m: width,
    emissivity: l.emissivity,
    airConvection: l.air_convection,
    htcMultiplier: l.htc_multiplier,
    bankMultipliers: new Map(l.banks.map((b) => [b.name, b.multiplier])),
    banksOff: new Set(l.banks.filter((b) => !b.on).map((b) => b.name)),
    zones,
    pyrometers_m: l.pyrometers_m,
  };
}

export function speedSchedule(l: LineInput): SpeedSchedule {
  if (l.speed_m_s !== undefined) return constantSpeed(l.speed_m_s);
  const s = l.speed!;
  return {
    threading_m_s: s.threading_m_s,
    acceleration_m_s2: s.acceleration_m_s2,
    max_m_s: s.max_m_s,
    deceleration_m_s2: s.deceleration_m_s2,
    tail_m_s: s.tail_m_s ?? s.max_m_s,
  };
}

/** Entry (finishing) temperature along the coil: `position_m,T_C` rows, linear in between. */
export function readEntryProfile(caseFile: string, csvPath: string): Array<[number, number]> {
  const file = resolvePath(dirname(caseFile), csvPath);
  const text = readTextFile(file);
  let parsed: Array<{ record: string[]; info: { lines: number } }>;
  try {
    parsed = parseCsv(text, { skip_empty_lines: true, trim: true, relax_column_count: true, info: true }) as unknown as Array<{ record: string[]; info: { lines: number } }>;
  } catch (e) {
    throw new InputError(file, "", `malformed CSV: ${(e as Error).message.split("\n")[0]}`);
  }
  if (parsed.length < 2) throw new InputError(file, "", "expected a header `position_m,T_C` and at least one row");
  const header = parsed[0].record.map((h) => h.trim());
  const ip = header.indexOf("position_m");
  const it = header.indexOf("T_C");
  if (ip < 0 || it < 0) throw new InputError(file, "header", "expected columns position_m,T_C");
  const out: Array<[number, number]> = [];
  for (let r = 1; r < parsed.length; r++) {
    const row = parsed[r].record;
    // The row number as a text editor counts lines (blank lines included).
    const where = `row ${parsed[r].info.lines}`;
    const x = Number(row[ip]);
    const T = Number(row[it]);
    if (row.length !== header.length || row[ip] === "" || row[it] === "" || !Number.isFinite(x) || !Number.isFinite(T)) {
      throw new InputError(file, where, "expected two numbers: position_m [m], T_C [°C]");
    }
    if (T <= 0 || T > 1500) throw new InputError(file, where, `T_C ${T} outside 0–1500 °C`);
    if (out.length && x <= out[out.length - 1][0]) throw new InputError(file, where, "position_m must increase from row to row (m)");
    out.push([x, T]);
  }
  return out;
}

/** The line as a segment sees it: with its `patterns` entry applied, when it has one. */
export function lineForSegment(l: LineInput, segment: number | undefined): LineInput {
  if (segment === undefined || !l.patterns) return l;
  const p = l.patterns.find((q) => segment + 1 >= q.from_segment && segment + 1 <= q.to_segment);
  return p ? applyZonePattern(l as LineInput & LineLike, p) : l;
}

/** One tracked segment of a coil. */
export interface CoilSegment {
  readonly index: number;
  /** Distance of the segment centre from the head [m] */
  readonly position_m: number;
  readonly entry_C: number;
}

export function coilSegments(file: string, coil: CoilInput): CoilSegment[] {
  const profile = coil.entry_csv ? readEntryProfile(file, coil.entry_csv) : null;
  const segs: CoilSegment[] = [];
  for (let k = 0; k < coil.segments; k++) {
    const x = ((k + 0.5) * coil.length_m) / coil.segments;
    segs.push({ index: k, position_m: x, entry_C: profile ? evaluateProperty(profile, x) : coil.entry_C! });
  }
  return segs;
}

/** A warning when coil segments lie beyond the entry-temperature CSV (held at its end values). */
export function entryProfileWarning(file: string, coil: CoilInput): string | null {
  if (!coil.entry_csv) return null;
  const profile = readEntryProfile(file, coil.entry_csv);
  const first = (0.5 * coil.length_m) / coil.segments;
  const last = ((coil.segments - 0.5) * coil.length_m) / coil.segments;
  const lo = profile[0][0];
  const hi = profile[profile.length - 1][0];
  if (first >= lo && last <= hi) return null;
  return `coil.entry_csv covers ${lo}–${hi} m of the coil but segments lie at ${first.toFixed(1)}–${last.toFixed(1)} m; beyond the file the nearest end temperature is used`;
}

export interface PointOptions {
  /** Distance of the tracked point from the head of the coil [m] (line cases). */
  readonly coilPosition_m?: number;
  /** Coil segment (0-based) of the tracked point, which selects its header pattern. */
  readonly segment?: number;
  /** Entry temperature override [°C] (coil segments). */
  readonly entry_C?: number;
}

/**
 * The material of a case: a steel (cached set-up, see cachedSteel) or a non-transforming material
 * from constant-or-table k, c_p and ρ (volumetric heat capacity ρ·c_p tabulated once).
 */
export function resolveMaterial(c: Case): { material: MaterialModel; steel?: SteelSetup } {
  if (c.material.composition_wt_pct) {
    const steel = cachedSteel(c.material, c.product.initial_C);
    return { material: steel.material, steel };
  }
  const m = c.material;
  const k = m.conductivity_W_mK!;
  const cp = m.specific_heat_J_kgK!;
  const rho = m.density_kg_m3!;
  const constant = typeof k === "number" && typeof cp === "number" && typeof rho === "number";
  const tables = buildPropertyTables(
    [{ heatCapacity: (T) => evaluateProperty(rho, T - KELVIN) * evaluateProperty(cp, T - KELVIN), conductivity: (T) => evaluateProperty(k, T - KELVIN) }],
    constant,
  );
  return { material: { tables, latentHeat: true } };
}

export function resolveCase(file: string, c: Case, options: PointOptions = {}): ResolvedCase {
  const { material, steel } = resolveMaterial(c);
  let stages: Stage[];
  let line: ResolvedCase["line"];
  if ("stages" in c.cooling) {
    stages = c.cooling.stages.map((s, i) => ({
      duration_s: s.duration_s,
      top: faceLaw(s.top),
      bottom: faceLaw(s.bottom),
      label: s.label ?? `stage ${i + 1}`,
    }));
  } else {
    const l = lineForSegment(c.cooling.line, options.segment);
    const spec = lineSpec(l);
    const coilLength = c.cooling.coil?.length_m ?? 0;
    const profile = new SpeedProfile(speedSchedule(l), l.length_m, coilLength);
    const coilPosition_m = options.coilPosition_m ?? 0;
    for (const z of spec.zones) {
      for (const f of [z.top, z.bottom]) {
        if (f && f.kind === "water" && !(f.flowPerWidth_m3_hm >= 0)) throw new InputError(file, "cooling.line.zones", "water needs flow_m3_h or flux_L_m2s");
      }
    }
    const point = trackPoint(spec, profile, coilPosition_m);
    stages = point.stages;
    line = { spec, profile, point, coilPosition_m };
  }
  if (c.numerics.time_step_s > stages.reduce((s, st) => s + st.duration_s, 0)) {
    throw new InputError(file, "numerics.time_step_s", "is longer than the whole cooling; expected a step shorter than the total duration (s)");
  }
  const scenario: Scenario = {
    title: c.title,
    thickness_m: c.product.thickness_mm / 1000,
    initial_K: (options.entry_C ?? c.product.initial_C) + KELVIN,
    material,
    stages,
    numerics: {
      scheme: c.numerics.scheme as Scheme, // ADI schemes are refused for strips by the schema
      cells: c.numerics.cells,
      dt_s: c.numerics.time_step_s,
      tolerance_K: c.numerics.picard_tolerance_K ?? 1e-3,
      maxIterations: c.numerics.max_iterations ?? 60,
    },
    output: {
      depths_m: c.output.depths_mm.map((d) => d / 1000),
      depthLabels: c.output.depths_mm.map(depthLabel),
      interval_s: c.output.interval_s,
    },
  };
  return { scenario, steel, line };
}
