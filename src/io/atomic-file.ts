/**
 * Writes one file atomically: the text goes to a hidden sibling `.NAME.tmp-PID` that is renamed
 * over the target only when it is complete, so a reader (or an interrupted writer) never sees a
 * half-written file, and the previous content survives any failure.
 */
import { renameSync, rmSync, writeFileSync } from "node:fs";
import { basename, dirname, join, resolve } from "node:path";
import { WriteError } from "./result-folder.js";

/** A one-line reason for a failed write, from the system error code. */
export function writeFailureReason(e: unknown): string {
  const code = (e as { code?: string }).code;
  switch (code) {
    case "EACCES":
    case "EPERM":
    case "EROFS":
      return "permission denied (read-only folder?)";
    case "ENOSPC":
      return "disk full";
    case "ENOENT":
      return "parent folder does not exist";
    case "ENOTDIR":
      return "a path component is not a folder";
    case "EISDIR":
      return "is a folder";
    default:
      return code ?? (e instanceof Error ? e.message : String(e));
  }
}

export function writeFileAtomic(file: string, text: string): void {
  const target = resolve(file);
  const temporary = join(dirname(target), `.${basename(target)}.tmp-${process.pid}`);
  try {
    writeFileSync(temporary, text);
    renameSync(temporary, target);
  } catch (e) {
    try {
      rmSync(temporary, { force: true });
    } catch {
      // the temporary file never existed (its folder is missing or not a folder)
    }
    throw new WriteError(file, writeFailureReason(e));
  }
}
