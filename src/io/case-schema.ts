/**
 * The case file: one JSON document describing the piece, the steel, the cooling and the numerics.
 * Units are declared once in every key name (`thickness_mm`, `htc_W_m2K`, `T_C`) and converted to SI
 * on load (see resolve-case.ts). Unknown keys are errors (strict objects), so a typo never
 * silently falls back to a default.
 *
 * Messages name the expected unit or range; the loader prefixes the file and the field path.
 */
import { z } from "zod";
import { ELEMENTS } from "../physics/composition.js";

const num = (unit: string) => z.number({ error: `expected a number [${unit}]` }).refine(Number.isFinite, `expected a finite number [${unit}]`);
const positive = (unit: string) => num(unit).refine((v) => v > 0, `must be > 0 ${unit}`);
const nonNegative = (unit: string) => num(unit).refine((v) => v >= 0, `must be ≥ 0 ${unit}`);
/** A temperature in °C that a steel-cooling case can meaningfully hold. */
const celsius = num("°C").refine((v) => v > -273.15 && v <= 2000, "must lie between −273.15 and 2000 °C");

/** A constant, or `[T_C, value]` pairs with strictly increasing temperatures (piecewise linear). */
const propertyTable = (unit: string, min: number) =>
  z.union([
    num(unit).refine((v) => v > min, `must be > ${min} ${unit}`),
    z
      .array(
        z.tuple([celsius, num(unit).refine((v) => v > min, `values must be > ${min} ${unit}`)], {
          error: `expected [T_C, value ${unit}] pairs`,
        }),
        { error: `expected a number ${unit} or a table of [T_C, value] pairs` },
      )
      .min(1, "a table needs at least one [T_C, value] pair")
      .refine((pairs) => pairs.every((p, i) => i === 0 || p[0] > pairs[i - 1][0]), "table temperatures must be strictly increasing (°C)"),
  ], { error: `expected a number ${unit} or a table of [T_C, value] pairs` });

/**
 * One face's boundary condition. Accepted forms:
 *   { htc_W_m2K, medium_C [, emissivity, surroundings_C] }  convection (plus radiation)
 *   { emissivity, surroundings_C }                           radiation alone
 *   { flux_W_m2 }                                            prescribed flux, positive = leaving
 *   { insulated: true }
 *   { surface_C }                                            prescribed surface temperature
 */
export const faceSchema = z
  .strictObject({
    htc_W_m2K: nonNegative("W/(m²·K)").optional(),
    medium_C: celsius.optional(),
    emissivity: num("-").refine((v) => v >= 0 && v <= 1, "must lie in [0, 1]").optional(),
    surroundings_C: celsius.optional(),
    flux_W_m2: num("W/m²").optional(),
    insulated: z.literal(true, { error: "expected true" }).optional(),
    surface_C: celsius.optional(),
  })
  .superRefine((f, ctx) => {
    const has = (k: keyof typeof f) => f[k] !== undefined;
    const exclusive = ["flux_W_m2", "insulated", "surface_C"] as const;
    const chosen = exclusive.filter(has);
    const conv = has("htc_W_m2K") || has("medium_C") || has("emissivity") || has("surroundings_C");
    if (chosen.length > 1 || (chosen.length === 1 && conv)) {
      ctx.addIssue({ code: "custom", message: "give one face form: convection/radiation, flux_W_m2, insulated or surface_C" });
      return;
    }
    if (chosen.length === 1) return;
    if (has("htc_W_m2K") !== has("medium_C")) {
      ctx.addIssue({ code: "custom", message: "convection needs both htc_W_m2K [W/(m²·K)] and medium_C [°C]" });
    }
    if (!has("htc_W_m2K") && !has("emissivity")) {
      ctx.addIssue({ code: "custom", message: "expected htc_W_m2K with medium_C, emissivity with surroundings_C, flux_W_m2, insulated or surface_C" });
    }
    if (!has("htc_W_m2K") && has("emissivity") && !has("surroundings_C")) {
      ctx.addIssue({ code: "custom", path: ["surroundings_C"], message: "radiation alone needs surroundings_C [°C]" });
    }
  });
export type FaceInput = z.infer<typeof faceSchema>;

export const stageSchema = z.strictObject({
  duration_s: positive("s"),
  label: z.string().optional(),
  top: faceSchema,
  bottom: faceSchema,
  /** The strip edge (cross-sections only). */
  edge: faceSchema.optional(),
});

const compositionSchema = z
  .strictObject(Object.fromEntries(ELEMENTS.map((e) => [e, nonNegative("wt%").optional()])) as unknown as Record<(typeof ELEMENTS)[number], z.ZodOptional<z.ZodNumber>>, {
    error: (iss) => (iss.code === "unrecognized_keys" ? `unknown element ${iss.keys.join(", ")}; known: ${ELEMENTS.join(" ")}` : "expected an object of element: wt%"),
  })
  .superRefine((c, ctx) => {
    if ((c.C ?? 0) > 2) ctx.addIssue({ code: "custom", path: ["C"], message: "carbon above 2 wt% is cast iron, not steel (expected 0–2 wt%)" });
    let sum = 0;
    for (const v of Object.values(c)) sum += v ?? 0;
    if (sum > 50) ctx.addIssue({ code: "custom", message: `alloying elements sum to ${sum} wt%; expected well under 50 wt%` });
    for (const [e, v] of Object.entries(c)) if (e !== "C" && (v ?? 0) > 30) ctx.addIssue({ code: "custom", path: [e], message: "above 30 wt% is not a steel this tool models" });
  });

const kineticsCurveSchema = z
  .strictObject({
    start_fraction: num("-").refine((v) => v > 0 && v < 1, "must lie in (0, 1)").default(0.01),
    finish_fraction: num("-").refine((v) => v > 0 && v < 1, "must lie in (0, 1)").default(0.99),
    points: z
      .array(z.strictObject({ T_C: celsius, start_s: positive("s"), finish_s: positive("s") }))
      .min(2, "needs at least two temperatures")
      .superRefine((pts, ctx) => {
        pts.forEach((p, i) => {
          if (p.finish_s <= p.start_s) ctx.addIssue({ code: "custom", path: [i, "finish_s"], message: "finish time must be after the start time (s)" });
          if (i > 0 && p.T_C <= pts[i - 1].T_C) ctx.addIssue({ code: "custom", path: [i, "T_C"], message: "temperatures must be strictly increasing (°C)" });
        });
      }),
  })
  .refine((c) => c.finish_fraction > c.start_fraction, { message: "finish_fraction must exceed start_fraction", path: ["finish_fraction"] });

const timeScaleSchema = z.strictObject({
  ferrite: positive("-").default(1),
  pearlite: positive("-").default(1),
  bainite: positive("-").default(1),
});

const kineticsSchema = z.discriminatedUnion("model", [
  z.strictObject({ model: z.literal("li1998"), time_scale: timeScaleSchema.optional() }),
  z.strictObject({
    model: z.literal("table"),
    time_scale: timeScaleSchema.optional(),
    ferrite: kineticsCurveSchema.optional(),
    pearlite: kineticsCurveSchema.optional(),
    bainite: kineticsCurveSchema.optional(),
  }),
], { error: 'expected kinetics.model "li1998" or "table"' });

export const materialSchema = z
  .strictObject({
    conductivity_W_mK: propertyTable("W/(m·K)", 0).optional(),
    specific_heat_J_kgK: propertyTable("J/(kg·K)", 0).optional(),
    density_kg_m3: propertyTable("kg/m³", 0).optional(),
    composition_wt_pct: compositionSchema.optional(),
    austenite_grain_um: positive("µm").refine((v) => v < 5000, "must be < 5000 µm").optional(),
    retained_strain: num("-").refine((v) => v >= 0 && v <= 1, "must lie in [0, 1]").optional(),
    grain_model: z.enum(["empirical", "mechanistic"], { error: 'expected "empirical" or "mechanistic"' }).optional(),
    interface_energy_J_m2: num("J/m²").refine((v) => v > 0 && v <= 5, "must lie in (0, 5] J/m²").optional(),
    transformation: z.enum(["on", "off"], { error: 'expected "on" or "off"' }).optional(),
    latent_heat: z.enum(["on", "off"], { error: 'expected "on" or "off"' }).optional(),
    critical_C: z.strictObject({ Ae3: celsius.optional(), Ae1: celsius.optional(), Bs: celsius.optional(), Ms: celsius.optional() }).optional(),
    formulas: z
      .strictObject({
        Ae3: z.enum(["andrews", "andrews-extended"]).optional(),
        Bs: z.enum(["steven-haynes", "li"]).optional(),
      })
      .optional(),
    kinetics: kineticsSchema.optional(),
    stored_energy_fraction: z
      .strictObject({
        bainite: num("-").refine((v) => v >= 0 && v < 1, "must lie in [0, 1)").optional(),
        martensite: num("-").refine((v) => v >= 0 && v < 1, "must lie in [0, 1)").optional(),
      })
      .optional(),
  })
  .superRefine((m, ctx) => {
    if (!m.composition_wt_pct) {
      for (const key of ["conductivity_W_mK", "specific_heat_J_kgK", "density_kg_m3"] as const) {
        if (m[key] === undefined) ctx.addIssue({ code: "custom", path: [key], message: "required when no composition_wt_pct is given" });
      }
      for (const key of ["austenite_grain_um", "grain_model", "interface_energy_J_m2", "transformation", "latent_heat", "critical_C", "kinetics", "formulas", "stored_energy_fraction", "retained_strain"] as const) {
        if (m[key] !== undefined) ctx.addIssue({ code: "custom", path: [key], message: "only meaningful with composition_wt_pct (a steel)" });
      }
    }
  });

export const numericsSchema = z.strictObject({
  scheme: z
    .enum(["explicit", "implicit", "crank-nicolson", "adi", "adi-douglas"], { error: 'expected "explicit", "implicit", "crank-nicolson" (strip) or "explicit", "adi", "adi-douglas" (cross-section)' })
    .default("crank-nicolson"),
  /** Cells across the (half-)width of a cross-section. */
  width_cells: z.number({ error: "expected a whole number of cells" }).int("expected a whole number of cells").refine((v) => v >= 2 && v <= 2000, "must lie in 2–2000").optional(),
  /** Model half the width with a symmetry plane at mid-width (default true). */
  symmetric: z.boolean({ error: "expected true or false" }).optional(),
  cells: z
    .number({ error: "expected a whole number of cells" })
    .int("expected a whole number of cells")
    .refine((v) => v >= 3, "must be at least 3 cells"),
  time_step_s: positive("s"),
  picard_tolerance_K: positive("K").optional(),
  max_iterations: z.number().int().refine((v) => v >= 1 && v <= 1000, "must lie in 1–1000").optional(),
});

export const outputSchema = z.strictObject({
  depths_mm: z.array(nonNegative("mm"), { error: "expected a list of depths in mm" }).min(1, "give at least one depth (mm)"),
  interval_s: positive("s"),
  /** Cross-sections: extra output points, x from mid-width towards the edge, y depth from the top [mm]. */
  points_mm: z.array(z.strictObject({ x_mm: nonNegative("mm"), y_mm: nonNegative("mm") })).optional(),
  /** Also run the case with latent heat off and report the grain-size penalty per depth (default true). */
  recalescence_penalty: z.boolean({ error: "expected true or false" }).optional(),
});

export const stagesCoolingSchema = z.strictObject({
  stages: z.array(stageSchema, { error: "expected a list of stages" }).min(1, "give at least one stage"),
});

/** Water on a zone face: header kind and flow (per header, or flux density over the zone). */
const waterFaceSchema = z
  .strictObject({
    header: z.enum(["laminar", "curtain", "spray"], { error: 'expected header "laminar", "curtain" or "spray"' }),
    flow_m3_h: nonNegative("m³/h").optional(),
    flux_L_m2s: nonNegative("L/(m²·s)").optional(),
    on: z.boolean({ error: "expected true or false" }).default(true),
    impingement_m: positive("m").optional(),
    curve: z
      .strictObject({
        rewetting_C: celsius.optional(),
        critical_heat_flux_C: celsius.optional(),
        critical_heat_flux_W_m2: positive("W/m²").optional(),
        film_boiling_htc_W_m2K: positive("W/(m²·K)").optional(),
        single_phase_htc_W_m2K: positive("W/(m²·K)").optional(),
        nucleate_onset_C: celsius.optional(),
        flux_exponent: nonNegative("-").optional(),
        reference_flux_L_m2s: positive("L/(m²·s)").optional(),
      })
      .optional(),
  })
  .refine((w) => (w.flow_m3_h === undefined) !== (w.flux_L_m2s === undefined), { message: "give either flow_m3_h [m³/h per header] or flux_L_m2s [L/(m²·s)]" });

/** A zone face: water headers, or a direct boundary condition as in a stage. */
const zoneFaceSchema = z.union([z.strictObject({ water: waterFaceSchema }), faceSchema], {
  error: "expected { water: {...} } or a face boundary condition (htc_W_m2K/medium_C, emissivity/surroundings_C, ...)",
});

const speedScheduleSchema = z
  .strictObject({
    threading_m_s: positive("m/s"),
    acceleration_m_s2: nonNegative("m/s²").default(0),
    max_m_s: positive("m/s"),
    deceleration_m_s2: nonNegative("m/s²").default(0),
    tail_m_s: positive("m/s").optional(),
  })
  .refine((s) => s.max_m_s >= s.threading_m_s, { message: "max_m_s must not be below threading_m_s (m/s)", path: ["max_m_s"] });

/**
 * Per-segment header patterns of a coil (written by `recalesce design`): for segments
 * from_segment … to_segment (1-based, as in coil.csv) exactly the water zones listed in open_zones
 * (0-based indices into zones) are on, and the flows of scaled_zones (default: the open ones), as
 * written in the zones, are multiplied by flow_scale. A bank that holds an open zone is switched
 * on for those segments.
 */
const patternSchema = z.strictObject({
  from_segment: z.number().int("expected a whole segment number").refine((v) => v >= 1, "must be ≥ 1"),
  to_segment: z.number().int("expected a whole segment number").refine((v) => v >= 1, "must be ≥ 1"),
  open_zones: z.array(z.number().int("expected zone indices").refine((v) => v >= 0, "zone indices start at 0")),
  flow_scale: positive("-").default(1),
  scaled_zones: z.array(z.number().int("expected zone indices").refine((v) => v >= 0, "zone indices start at 0")).optional(),
});

export const lineSchema = z
  .strictObject({
    length_m: positive("m").refine((v) => v <= 2000, "must be ≤ 2000 m"),
    speed_m_s: positive("m/s").optional(),
    speed: speedScheduleSchema.optional(),
    water_C: celsius.refine((v) => v > 0 && v < 100, "must be liquid water, 0–100 °C"),
    air_C: celsius,
    strip_width_mm: positive("mm").default(1500), // a typical hot-strip width, common practice (no source)
    // Oxidised hot strip ε ≈ 0.7–0.9, 0.8 the usual default (common practice, physics.md §6).
    emissivity: num("-").refine((v) => v > 0 && v <= 1, "must lie in (0, 1]").default(0.8),
    air_convection: z.enum(["natural", "moving-sheet", "none"], { error: 'expected "natural", "moving-sheet" or "none"' }).default("natural"),
    htc_multiplier: positive("-").default(1),
    banks: z
      .array(z.strictObject({ name: z.string().min(1), multiplier: positive("-").default(1), on: z.boolean().default(true) }))
      .default([]),
    zones: z.array(
      z.strictObject({
        start_m: nonNegative("m"),
        end_m: positive("m"),
        bank: z.string().optional(),
        top: zoneFaceSchema.optional(),
        bottom: zoneFaceSchema.optional(),
      }),
    ),
    pyrometers_m: z.array(nonNegative("m")).default([]),
    patterns: z.array(patternSchema).optional(),
  })
  .superRefine((l, ctx) => {
    if ((l.speed_m_s === undefined) === (l.speed === undefined)) ctx.addIssue({ code: "custom", path: ["speed_m_s"], message: "give either speed_m_s [m/s] or a speed schedule" });
    const names = new Set(l.banks.map((b) => b.name));
    let prevEnd = -Infinity;
    const order = l.zones.map((z, i) => ({ z, i })).sort((a, b) => a.z.start_m - b.z.start_m);
    for (const { z, i } of order) {
      if (z.end_m <= z.start_m) ctx.addIssue({ code: "custom", path: ["zones", i, "end_m"], message: `must exceed start_m (${z.start_m} m)` });
      if (z.end_m > l.length_m) ctx.addIssue({ code: "custom", path: ["zones", i, "end_m"], message: `lies outside the line (0–${l.length_m} m)` });
      if (z.start_m < prevEnd) ctx.addIssue({ code: "custom", path: ["zones", i, "start_m"], message: `overlaps the zone ending at ${prevEnd} m` });
      prevEnd = Math.max(prevEnd, z.end_m);
      if (z.bank !== undefined && !names.has(z.bank)) ctx.addIssue({ code: "custom", path: ["zones", i, "bank"], message: `unknown bank "${z.bank}"; declare it under banks` });
    }
    l.pyrometers_m.forEach((p, i) => {
      if (p > l.length_m) ctx.addIssue({ code: "custom", path: ["pyrometers_m", i], message: `lies outside the line (0–${l.length_m} m)` });
    });
  });

export const coilSchema = z
  .strictObject({
    length_m: positive("m"),
    segments: z.number().int("expected a whole number of segments").refine((v) => v >= 1 && v <= 1000, "must lie in 1–1000"),
    entry_C: celsius.optional(),
    entry_csv: z.string().min(1).optional(),
    workers: z.number().int().refine((v) => v >= 1 && v <= 64, "must lie in 1–64").optional(),
  })
  .refine((c) => (c.entry_C === undefined) !== (c.entry_csv === undefined), { message: "give either entry_C [°C] or entry_csv (position_m,T_C)" });

export const lineCoolingSchema = z
  .strictObject({ line: lineSchema, coil: coilSchema.optional() })
  .superRefine((c, ctx) => {
    const patterns = c.line.patterns ?? [];
    if (patterns.length === 0) return;
    if (!c.coil) {
      ctx.addIssue({ code: "custom", path: ["line", "patterns"], message: "per-segment patterns need a coil" });
      return;
    }
    const taken = new Set<number>();
    patterns.forEach((p, i) => {
      if (p.to_segment < p.from_segment) ctx.addIssue({ code: "custom", path: ["line", "patterns", i, "to_segment"], message: "must not be below from_segment" });
      if (p.to_segment > c.coil!.segments) ctx.addIssue({ code: "custom", path: ["line", "patterns", i, "to_segment"], message: `the coil has ${c.coil!.segments} segments` });
      for (let k = p.from_segment; k <= p.to_segment; k++) {
        if (taken.has(k)) ctx.addIssue({ code: "custom", path: ["line", "patterns", i, "from_segment"], message: `segment ${k} already has a pattern` });
        taken.add(k);
      }
      for (const [key, list] of [["open_zones", p.open_zones], ["scaled_zones", p.scaled_zones ?? []]] as const) {
        list.forEach((z, j) => {
          const zone = c.line.zones[z];
          const wet = zone && [zone.top, zone.bottom].some((f) => f !== undefined && "water" in f);
          if (!wet) ctx.addIssue({ code: "custom", path: ["line", "patterns", i, key, j], message: `zone ${z} is not a water zone of this line` });
        });
      }
    });
  });

export const caseSchema = z
  .strictObject({
    $schema: z.string().optional(),
    title: z.string({ error: "expected a text title" }).min(1, "title must not be empty"),
    product: z.strictObject({
      thickness_mm: positive("mm").refine((v) => v <= 1000, "must be ≤ 1000 mm"),
      initial_C: celsius,
      width_mm: positive("mm").optional(),
      /** "strip" (1-D through the thickness, default) or "cross-section" (2-D thickness × width). */
      section: z.enum(["strip", "cross-section"], { error: 'expected "strip" or "cross-section"' }).optional(),
    }),
    material: materialSchema,
    cooling: z.union([stagesCoolingSchema, lineCoolingSchema], { error: "expected cooling.stages (a list of stages) or cooling.line (a run-out table)" }),
    numerics: numericsSchema,
    output: outputSchema,
  })
  .superRefine((c, ctx) => {
    const section = c.product.section === "cross-section";
    const strip = ["implicit", "crank-nicolson"];
    if (section) {
      if (c.product.width_mm === undefined) ctx.addIssue({ code: "custom", path: ["product", "width_mm"], message: "a cross-section needs width_mm (mm)" });
      if (c.numerics.width_cells === undefined) ctx.addIssue({ code: "custom", path: ["numerics", "width_cells"], message: "a cross-section needs width_cells (cells across the half-width)" });
      if (strip.includes(c.numerics.scheme)) ctx.addIssue({ code: "custom", path: ["numerics", "scheme"], message: 'a cross-section runs with "explicit", "adi" or "adi-douglas"' });
      if (!("stages" in c.cooling)) ctx.addIssue({ code: "custom", path: ["cooling"], message: "a cross-section runs with cooling.stages (line and coil runs are 1-D)" });
      else
        c.cooling.stages.forEach((st, i) => {
          if (!st.edge) ctx.addIssue({ code: "custom", path: ["cooling", "stages", i, "edge"], message: "missing; a cross-section needs a boundary condition on the edge" });
        });
      const halfWidth = (c.product.width_mm ?? 0) / 2;
      (c.output.points_mm ?? []).forEach((p, i) => {
        if (p.x_mm > halfWidth) ctx.addIssue({ code: "custom", path: ["output", "points_mm", i, "x_mm"], message: `lies outside the half-width (0–${halfWidth} mm from mid-width)` });
        if (p.y_mm > c.product.thickness_mm) ctx.addIssue({ code: "custom", path: ["output", "points_mm", i, "y_mm"], message: `lies outside the thickness (0–${c.product.thickness_mm} mm)` });
      });
    } else {
      if (c.numerics.scheme === "adi" || c.numerics.scheme === "adi-douglas") ctx.addIssue({ code: "custom", path: ["numerics", "scheme"], message: 'ADI schemes are for product.section "cross-section"' });
      for (const key of ["width_cells", "symmetric"] as const) {
        if (c.numerics[key] !== undefined) ctx.addIssue({ code: "custom", path: ["numerics", key], message: 'only for product.section "cross-section"' });
      }
      if (c.output.points_mm !== undefined) ctx.addIssue({ code: "custom", path: ["output", "points_mm"], message: 'only for product.section "cross-section"' });
      if ("stages" in c.cooling) {
        c.cooling.stages.forEach((st, i) => {
          if (st.edge) ctx.addIssue({ code: "custom", path: ["cooling", "stages", i, "edge"], message: 'only for product.section "cross-section"' });
        });
      }
    }
    c.output.depths_mm.forEach((d, i) => {
      if (c.output.depths_mm.indexOf(d) !== i) ctx.addIssue({ code: "custom", path: ["output", "depths_mm", i], message: `depth ${d} mm is listed twice` });
      if (d > c.product.thickness_mm) ctx.addIssue({ code: "custom", path: ["output", "depths_mm", i], message: `depth ${d} mm lies outside the piece (0–${c.product.thickness_mm} mm)` });
    });
  });

export type CaseInput = z.input<typeof caseSchema>;
export type Case = z.output<typeof caseSchema>;
