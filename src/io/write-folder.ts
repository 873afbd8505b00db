/**
 * Writes a whole result folder in one go through ResultFolder: the files appear together when
 * `fill` succeeds, and nothing is left behind when it throws.
 */
import { ResultFolder } from "./result-folder.js";

export function writeResultFolder<T>(outDir: string, fill: (folder: ResultFolder) => T): T {
  const folder = new ResultFolder(outDir);
  try {
    const result = fill(folder);
    folder.commit();
    return result;
  } catch (e) {
    folder.abort();
    throw e;
  }
}

/** Writes JSON documents (2-space indented, final newline) and text files as one result folder. */
export function writeJsonFolder(outDir: string, json: Record<string, unknown>, text: Record<string, string> = {}): void {
  writeResultFolder(outDir, (folder) => {
    for (const [name, value] of Object.entries(json)) folder.writeFile(name, JSON.stringify(value, null, 2) + "\n");
    for (const [name, value] of Object.entries(text)) folder.writeFile(name, value);
  });
}
