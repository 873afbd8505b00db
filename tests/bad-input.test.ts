/**
 * Bad input through the compiled CLI: every generated invalid case makes `recalesce run` exit 2
 * with exactly one line on stderr that names the file and the field path (or the file alone for a
 * whole-file problem), never a stack trace, and never an output folder (nor a hidden partial one).
 *
 * fast-check generates the variants from a small valid steel case: each kind of mistake has its
 * own generator (a value range or a choice of field), sampled a couple of times with a fixed seed,
 * so about 40 processes run, four at a time.
 */
import { mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildCli, removeBuild, type BuiltCli } from "./support/built-cli.js";
import { finished, inPool, startCli, type CliEnd } from "./support/cli-process.js";

/** A small valid steel case (table kinetics, so the kinetics checks have something to break). */
function validCase(): Record<string, any> {
  return {
    title: "6 mm 0.10C-0.50Mn strip, invented, for input checks",
    product: { thickness_mm: 6, initial_C: 880 },
    material: {
      composition_wt_pct: { C: 0.1, Mn: 0.5, Si: 0.05 },
      austenite_grain_um: 20,
      kinetics: {
        model: "table",
        ferrite: { points: [{ T_C: 600, start_s: 1, finish_s: 10 }, { T_C: 650, start_s: 0.8, finish_s: 8 }, { T_C: 700, start_s: 2, finish_s: 20 }] },
      },
    },
    cooling: { stages: [{ duration_s: 2, top: { htc_W_m2K: 1000, medium_C: 30 }, bottom: { htc_W_m2K: 800, medium_C: 30 } }] },
    numerics: { scheme: "implicit", cells: 6, time_step_s: 0.1 },
    output: { depths_mm: [0, 3], interval_s: 0.5 },
  };
}

/** What a variant's file holds, and what its one error line must contain. */
interface Variant {
  readonly kind: string;
  /** File content; "folder" makes a folder, "absent" makes no file at all. */
  readonly content: string | Buffer | "folder" | "absent";
  /** Substrings the error line must contain besides the file name (field path, cause). */
  readonly mentions: readonly string[];
  /** Substrings it must NOT contain (a present key of the wrong type is not "missing"). */
  readonly never?: readonly string[];
}

function edited(kind: string, edit: (c: Record<string, any>) => void, mentions: string[], never?: string[]): Variant {
  const c = validCase();
  edit(c);
  return { kind, content: JSON.stringify(c, null, 2), mentions, never };
}

/** Fields that hold numbers, with their path as the CLI prints it. */
const NUMBER_FIELDS: ReadonlyArray<[string, (c: Record<string, any>, v: unknown) => void]> = [
  ["product.thickness_mm", (c, v) => (c.product.thickness_mm = v)],
  ["product.initial_C", (c, v) => (c.product.initial_C = v)],
  ["numerics.cells", (c, v) => (c.numerics.cells = v)],
  ["numerics.time_step_s", (c, v) => (c.numerics.time_step_s = v)],
  ["output.interval_s", (c, v) => (c.output.interval_s = v)],
  ["cooling.stages[0].duration_s", (c, v) => (c.cooling.stages[0].duration_s = v)],
];

/** Required keys: the path printed, and how to delete the key. */
const REQUIRED: ReadonlyArray<[string, (c: Record<string, any>) => void]> = [
  ["title", (c) => delete c.title],
  ["product.thickness_mm", (c) => delete c.product.thickness_mm],
  ["product.initial_C", (c) => delete c.product.initial_C],
  ["numerics.cells", (c) => delete c.numerics.cells],
  ["numerics.time_step_s", (c) => delete c.numerics.time_step_s],
  ["output.depths_mm", (c) => delete c.output.depths_mm],
  ["cooling.stages[0].duration_s", (c) => delete c.cooling.stages[0].duration_s],
];

/** Objects that reject unknown keys: the printed path prefix, and the object itself. */
const STRICT_OBJECTS: ReadonlyArray<[string, (c: Record<string, any>) => Record<string, unknown>]> = [
  ["", (c) => c],
  ["product.", (c) => c.product],
  ["numerics.", (c) => c.numerics],
  ["output.", (c) => c.output],
  ["material.", (c) => c.material],
  ["cooling.stages[0].", (c) => c.cooling.stages[0]],
  ["cooling.stages[0].top.", (c) => c.cooling.stages[0].top],
];

const nonPositive = (min: number) => fc.double({ min, max: 0, noNaN: true });

const KINDS: ReadonlyArray<fc.Arbitrary<Variant>> = [
  fc
    .tuple(fc.constantFrom(...NUMBER_FIELDS), fc.constantFrom<unknown>("12", "twelve", true, [1], { value: 1 }, null))
    .map(([[path, set], v]) => edited("wrong type", (c) => set(c, v), [path], ["missing"])),
  fc.constantFrom(...REQUIRED).map(([path, remove]) => edited("missing key", remove, [path, "missing"])),
  fc
    .tuple(fc.constantFrom(...STRICT_OBJECTS), fc.stringMatching(/^[a-z]{3,8}_[a-z]{2,5}$/))
    .map(([[prefix, at], key]) => edited("unknown key", (c) => (at(c)[key] = 1), [`${prefix}${key}`])),
  nonPositive(-1000).map((v) => edited("thickness ≤ 0", (c) => (c.product.thickness_mm = v), ["product.thickness_mm", "mm"])),
  fc.integer({ min: -10, max: 2 }).map((v) => edited("cells < 3", (c) => (c.numerics.cells = v), ["numerics.cells", "3"])),
  nonPositive(-10).map((v) => edited("time step ≤ 0", (c) => (c.numerics.time_step_s = v), ["numerics.time_step_s", "s"])),
  fc
    .tuple(fc.double({ min: 6.001, max: 1000, noNaN: true }), fc.integer({ min: 0, max: 1 }))
    .map(([d, i]) => edited("depth outside the piece", (c) => (c.output.depths_mm[i] = d), [`output.depths_mm[${i}]`, "mm"])),
  fc
    .uniqueArray(fc.integer({ min: 0, max: 1200 }), { minLength: 2, maxLength: 5 })
    .map((ts) => ts.sort((a, b) => b - a))
    .map((ts) => edited("unsorted property table", (c) => (c.material.conductivity_W_mK = ts.map((t, i) => [t, 30 + i])), ["material.conductivity_W_mK", "increasing"])),
  fc.constantFrom("Zz", "Xq", "Carbon", "mn", "Fe").map((e) => edited("unknown element", (c) => (c.material.composition_wt_pct[e] = 0.1), [`material.composition_wt_pct.${e}`, e])),
  fc.double({ min: 2.0001, max: 30, noNaN: true }).map((v) => edited("C > 2 %", (c) => (c.material.composition_wt_pct.C = v), ["material.composition_wt_pct.C", "wt%"])),
  nonPositive(-100).map((v) => edited("grain ≤ 0", (c) => (c.material.austenite_grain_um = v), ["material.austenite_grain_um", "µm"])),
  fc
    .tuple(fc.integer({ min: 0, max: 2 }), fc.double({ min: 0.01, max: 1, noNaN: true }))
    .map(([i, f]) =>
      edited("finish before start", (c) => {
        const p = c.material.kinetics.ferrite.points[i];
        p.finish_s = p.start_s * f;
      }, [`material.kinetics.ferrite.points[${i}].finish_s`]),
    ),
  fc.double({ min: 1.0001, max: 100, noNaN: true }).map((v) => edited("emissivity > 1", (c) => (c.cooling.stages[0].top.emissivity = v), ["cooling.stages[0].top.emissivity", "[0, 1]"])),
  // JSON has no Infinity; 1e400 parses to it.
  fc.constant<Variant>({ kind: "non-finite number", content: JSON.stringify(validCase()).replace('"initial_C":880', '"initial_C":1e400'), mentions: ["product.initial_C"], never: ["missing"] }),
  fc.integer({ min: 1, max: 400 }).map((cut) => {
    const text = JSON.stringify(validCase(), null, 2);
    return { kind: "broken JSON", content: text.slice(0, Math.min(cut, text.length - 2)), mentions: ["malformed JSON", "line", "column"] };
  }),
  fc.constantFrom("", "   \n\t\n").map((t) => ({ kind: "empty file", content: t, mentions: ["empty"] })),
  fc.constant<Variant>({ kind: "folder instead of a file", content: "folder", mentions: ["folder"] }),
  fc.constantFrom(Buffer.from([0xff]), Buffer.from([0xc3, 0x28]), Buffer.from([0xe2, 0x82])).map((bad) => {
    const [head, tail] = JSON.stringify(validCase()).split("invented");
    return { kind: "non-UTF-8 bytes", content: Buffer.concat([Buffer.from(head), bad, Buffer.from(tail)]), mentions: ["UTF-8"] };
  }),
  fc.constant<Variant>({ kind: "missing file", content: "absent", mentions: ["not found"] }),
];

/** Two samples of every kind (the constant kinds repeat; harmless), from a fixed seed. */
const VARIANTS: Variant[] = KINDS.flatMap((k, i) => fc.sample(k, { numRuns: 2, seed: 20260 + i }));

interface Outcome {
  readonly v: Variant;
  readonly file: string;
  readonly r: CliEnd;
  readonly leftovers: string[];
}

let cli: BuiltCli;
let scratch: string;
let outcomes: Outcome[];

beforeAll(async () => {
  cli = buildCli();
  scratch = mkdtempSync(join(tmpdir(), "recalesce-bad-input-"));
  outcomes = await inPool(VARIANTS.map((v, i) => ({ v, i })), 4, async ({ v, i }) => {
    const dir = join(scratch, `v${i}`);
    mkdirSync(dir);
    const file = join(dir, "case.json");
    if (v.content === "folder") mkdirSync(file);
    else if (v.content !== "absent") writeFileSync(file, v.content);
    const r = await finished(startCli(cli, ["run", file, "--out", join(dir, "out")]));
    return { v, file, r, leftovers: readdirSync(dir).filter((f) => f !== "case.json") };
  });
});
afterAll(() => {
  removeBuild(cli);
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

/** Every outcome that breaks a rule, described with its stderr; listing all at once shows the whole picture. */
function violations(rule: (o: Outcome, line: string) => string | null): string[] {
  const found: string[] = [];
  for (const o of outcomes) {
    const problem = rule(o, o.r.stderr.trimEnd().split("\n")[0] ?? "");
    if (problem) found.push(`${o.v.kind}: ${problem}\n    stderr: ${JSON.stringify(o.r.stderr)}`);
  }
  return found;
}

describe("bad input", () => {
  it("every kind of mistake was generated", () => {
    expect(new Set(outcomes.map((o) => o.v.kind)).size).toBe(KINDS.length);
  });

  it("exits 2 with exactly one line on stderr and no stack trace", () => {
    const found = violations((o) => {
      if (o.r.status !== 2) return `exit ${o.r.status}, expected 2`;
      const lines = o.r.stderr.trimEnd().split("\n").length;
      if (lines !== 1) return `${lines} stderr lines, expected 1`;
      return /^\s+at /m.test(o.r.stderr) ? "stack trace on stderr" : null;
    });
    expect(found, found.join("\n")).toEqual([]);
  });

  it("names the file and the field path, or the cause of a whole-file problem", () => {
    const found = violations((o, line) => {
      if (!line.includes(o.file)) return "the line does not name the file";
      const absent = o.v.mentions.filter((m) => !line.includes(m));
      return absent.length ? `the line does not mention ${absent.map((m) => JSON.stringify(m)).join(", ")}` : null;
    });
    expect(found, found.join("\n")).toEqual([]);
  });

  it("does not call a present value of the wrong type, or a non-finite number, missing", () => {
    const found = violations((o, line) => ((o.v.never ?? []).some((m) => line.includes(m)) ? "the line says the key is missing, but it is there" : null));
    expect(found, found.join("\n")).toEqual([]);
  });

  it("leaves no output folder and no hidden partial folder", () => {
    const found = violations((o) => (o.leftovers.length ? `left ${o.leftovers.join(", ")}` : null));
    expect(found, found.join("\n")).toEqual([]);
  });
});
