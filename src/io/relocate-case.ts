/**
 * A case file written into another folder (designed.json, calibrated.json, …) must still find the
 * files it names. Relative paths in a case are relative to the case file, so they are rewritten to
 * point from the new folder to the same file.
 */
import { dirname, isAbsolute, relative, resolve } from "node:path";
import { parseJson, readTextFile } from "./load-case.js";

/** The case file as written (no defaults filled in), for writing a modified copy. */
export function readRawCase(file: string): Record<string, unknown> {
  return parseJson(file, readTextFile(file)) as Record<string, unknown>;
}

/** Rewrites the relative paths in a raw case read from `fromFile` for a file in `toDir`. */
export function relocateCase(raw: Record<string, unknown>, fromFile: string, toDir: string): void {
  const coil = (raw.cooling as { coil?: { entry_csv?: unknown } } | undefined)?.coil;
  if (coil && typeof coil.entry_csv === "string" && !isAbsolute(coil.entry_csv)) {
    const target = resolve(dirname(fromFile), coil.entry_csv);
    coil.entry_csv = relative(resolve(toDir), target).split("\\").join("/");
  }
}

/** The raw line object of a case (`cooling.line`). */
export function rawLine<L>(raw: Record<string, unknown>): L {
  return (raw.cooling as { line: L }).line;
}
